// Bench figure 6 in the real editor host: starts code-server on loopback once and, for each run, opens a
// fresh workbench page (a fresh extension host) whose tests entry opens a note and prints the extension's
// own activation record. Prints one JSON line { runs: [record…] } on stdout; exit 0 only with every run.
// Uses whatever out/extension.js is built (the bench builds --release first). `--runs N` (default 3).
import * as esbuild from 'esbuild';
import path from 'node:path';
import { format } from 'node:util';
import { launchBrowser, log, runFolder, startCodeServer, stopAll, workbenchUrl } from './editor-host.mjs';
import { projectRoot } from './prepare-editor-host.mjs';

const RUN_LIMIT_MS = 90_000;
const prefix = 'TICKMARK_ACTIVATION ';
const runsArg = process.argv.indexOf('--runs');
const runs = runsArg > 0 ? Math.max(1, Number(process.argv[runsArg + 1]) || 1) : 3;

async function measureOnce(browser, port, testsPath) {
  const page = await browser.newPage();
  let record;
  try {
    const exitCode = new Promise((resolve) => {
      void page.exposeFunction('codeAutomationExit', (code) => resolve(Number(code)));
    });
    await page.exposeFunction('codeAutomationLog', (type, args) => {
      const line = format(...(Array.isArray(args) ? args : [args]));
      const at = line.indexOf(prefix);
      if (at >= 0) record = JSON.parse(line.slice(at + prefix.length).trim());
      else if (type === 'error') process.stderr.write(line.endsWith('\n') ? line : `${line}\n`);
    });
    let timer;
    const limit = new Promise((resolve) => (timer = setTimeout(() => resolve(124), RUN_LIMIT_MS)));
    await page.goto(workbenchUrl(port, { folder: path.join(projectRoot, 'test', 'editor', 'fixtures'), testsPath }));
    const code = await Promise.race([exitCode, limit]);
    clearTimeout(timer);
    if (code !== 0 || !record) throw new Error(`the activation probe ended with code ${code}${record ? '' : ' and no record'}`);
    return record;
  } finally {
    await page.close().catch(() => {});
  }
}

async function main() {
  const run = { runDir: runFolder('activation') };
  const testsPath = path.join(run.runDir, 'probe');
  try {
    await esbuild.build({
      entryPoints: [path.join(projectRoot, 'test', 'editor', 'suite', 'activationMeasure.test.ts')],
      outfile: path.join(testsPath, 'index.js'),
      bundle: true, format: 'cjs', platform: 'node', target: 'node20', external: ['vscode'], logLevel: 'error',
    });
    run.server = await startCodeServer(run.runDir);
    run.browser = await launchBrowser(run.runDir);
    const records = [];
    for (let i = 0; i < runs; i++) records.push(await measureOnce(run.browser, run.server.port, testsPath));
    process.stdout.write(JSON.stringify({ runs: records }) + '\n');
    return 0;
  } catch (error) {
    log(error instanceof Error ? error.message : String(error));
    return 1;
  } finally {
    await stopAll(run);
  }
}

process.exitCode = await main();
