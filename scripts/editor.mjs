// `npm run editor`: the real browser-served editor (code-server 4.100.3, VS Code 1.100) on 127.0.0.1 with
// this project loaded as a development extension and the demo workspace open. Prints the URL to open and
// runs until Ctrl-C. `npm run editor -- PATH` opens another folder instead of demo/.
import { execFileSync } from 'node:child_process';
import path from 'node:path';
import { log, runFolder, startCodeServer, stopAll, workbenchUrl } from './editor-host.mjs';
import { projectRoot } from './prepare-editor-host.mjs';

const folder = path.resolve(process.argv[2] ?? path.join(projectRoot, 'demo'));
execFileSync(process.execPath, [path.join(projectRoot, 'scripts', 'build.mjs')], { cwd: projectRoot, stdio: 'inherit' });

const run = { runDir: runFolder('editor') };
let stopping = false;
const stop = async () => {
  if (stopping) return;
  stopping = true;
  log('stopping code-server');
  await stopAll(run);
  process.exit(0);
};
process.on('SIGINT', stop);
process.on('SIGTERM', stop);

try {
  run.server = await startCodeServer(run.runDir);
  run.server.child.once('exit', (code) => {
    if (!stopping) {
      log(`code-server exited (${code})`);
      void stop();
    }
  });
  const url = workbenchUrl(run.server.port, { folder });
  process.stdout.write(`\nTickmark in the browser editor, workspace ${path.relative(projectRoot, folder) || '.'}:\n\n  ${url}\n\n`);
  process.stdout.write('Only this machine can reach it (127.0.0.1). After a code change, rebuild (npm run build) and reload the page.\nCtrl-C stops it.\n');
} catch (error) {
  log(error instanceof Error ? error.message : String(error));
  await stopAll(run);
  process.exit(1);
}
