#!/usr/bin/env node
// Runs the bundle out/cli.js (`npm run build`) when it is at least as new as every core source; otherwise, in a
// checkout with edited sources, the TypeScript through tsx. Compiling the core with tsx at each start costs
// about a second, so the bundle is what CI and the packaged copy run.
const fs = require('node:fs');
const path = require('node:path');
const root = path.join(__dirname, '..');
const source = path.join(root, 'core', 'cli', 'main.ts');
const bundle = path.join(root, 'out', 'cli.js');

function newestSource(folder) {
  let newest = 0;
  for (const entry of fs.readdirSync(folder, { withFileTypes: true })) {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(full));
    else if (entry.name.endsWith('.ts')) newest = Math.max(newest, fs.statSync(full).mtimeMs);
  }
  return newest;
}

function bundleIsCurrent() {
  if (!fs.existsSync(bundle)) return false;
  if (!fs.existsSync(source)) return true;
  try {
    return fs.statSync(bundle).mtimeMs >= newestSource(path.join(root, 'core'));
  } catch {
    return false;
  }
}

// `tickmark lsp --stdio`: the language server, from its own bundle (out/server.js) or its sources.
if (process.argv[2] === 'lsp') {
  const transports = ['--stdio', '--node-ipc', '--socket', '--pipe'];
  if (!process.argv.slice(3).some((a) => transports.some((t) => a === t || a.startsWith(t + '=')))) {
    process.stderr.write('usage: tickmark lsp --stdio\n\nServes the analysis over the Language Server Protocol on standard input and output.\n');
    process.exit(process.argv.includes('--help') || process.argv.includes('-h') ? 0 : 2);
  }
  const serverBundle = path.join(root, 'out', 'server.js');
  const serverSource = path.join(root, 'server', 'main.ts');
  const current = fs.existsSync(serverBundle) && (!fs.existsSync(serverSource) ||
    fs.statSync(serverBundle).mtimeMs >= Math.max(newestSource(path.join(root, 'core')), newestSource(path.join(root, 'server'))));
  if (!current) require('tsx/cjs');
  require(current ? serverBundle : serverSource).startServer();
  return;
}

let cli;
if (bundleIsCurrent()) {
  cli = require(bundle);
} else {
  require('tsx/cjs');
  cli = require(source);
}
process.exitCode = cli.main(process.argv.slice(2), cli.processIo());
