// Runs the mocha suite of test/editor/suite inside a real extension host (code-server 4.100.3 on
// loopback, driven by headless chromium), prints its output and exits with its result.
// Needs `node scripts/build.mjs` first (npm run test:editor does both).
import { existsSync } from 'node:fs';
import path from 'node:path';
import { format } from 'node:util';
import { launchBrowser, log, restoreChanged, runFolder, snapshotFiles, startCodeServer, stopAll, workbenchUrl } from './editor-host.mjs';
import { projectRoot } from './prepare-editor-host.mjs';

const RUN_LIMIT_MS = 6 * 60_000;
const testsPath = path.join(projectRoot, 'out', 'test', 'suite');
const workspace = path.join(projectRoot, process.env.TICKMARK_TEST_WORKSPACE ?? 'demo');

async function main() {
  if (!existsSync(path.join(testsPath, 'index.js'))) {
    log('out/test/suite/index.js is missing: run `node scripts/build.mjs` first');
    return 2;
  }
  const started = Date.now();
  const run = { runDir: runFolder('suite') };
  const guarded = snapshotFiles([workspace, path.join(projectRoot, 'test', 'editor', 'fixtures')]);
  let code = 1;
  let limitTimer;
  const stopOnSignal = () => void stopAll(run).then(() => process.exit(130));
  process.once('SIGINT', stopOnSignal);
  process.once('SIGTERM', stopOnSignal);
  try {
    run.server = await startCodeServer(run.runDir, { TICKMARK_EDITOR_TEST: '1' });
    log(`code-server on 127.0.0.1:${run.server.port} after ${((Date.now() - started) / 1000).toFixed(1)} s`);
    run.browser = await launchBrowser(run.runDir);
    const page = await run.browser.newPage();
    const exitCode = new Promise((resolve) => {
      page.exposeFunction('codeAutomationExit', (code) => resolve(Number(code)));
    });
    await page.exposeFunction('codeAutomationLog', (type, args) => {
      const line = format(...(Array.isArray(args) ? args : [args]));
      (type === 'error' ? process.stderr : process.stdout).write(line.endsWith('\n') ? line : `${line}\n`);
    });
    const limit = new Promise((resolve) => {
      limitTimer = setTimeout(() => {
        log(`the editor suite did not finish within ${RUN_LIMIT_MS / 60_000} min; stopping`);
        resolve(124);
      }, RUN_LIMIT_MS);
    });
    await page.goto(workbenchUrl(run.server.port, { folder: workspace, testsPath }));
    code = await Promise.race([exitCode, limit]);
    log(`editor suite exit code ${code} after ${((Date.now() - started) / 1000).toFixed(1)} s`);
  } catch (error) {
    log(error instanceof Error ? error.message : String(error));
    code = 1;
  } finally {
    clearTimeout(limitTimer);
    await stopAll(run);
  }
  const restored = restoreChanged(guarded);
  if (restored.length > 0) {
    log(`the suite wrote to workspace files (restored): ${restored.map((f) => path.relative(projectRoot, f)).join(', ')}`);
    return code === 0 ? 1 : code;
  }
  return code;
}

process.exitCode = await main();
