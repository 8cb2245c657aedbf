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

let main;
if (bundleIsCurrent()) {
  main = require(bundle).main;
} else {
  require('tsx/cjs');
  main = require(source).main;
}
process.exitCode = main(process.argv.slice(2), {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
  cwd: process.cwd(),
  color: Boolean(process.stdout.isTTY) && !process.env.NO_COLOR,
});
