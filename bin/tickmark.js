#!/usr/bin/env node
// In a checkout the TypeScript sources run through tsx; a packaged copy runs the bundle.
const fs = require('node:fs');
const path = require('node:path');
const source = path.join(__dirname, '..', 'core', 'cli', 'main.ts');
let main;
if (fs.existsSync(source)) {
  require('tsx/cjs');
  main = require(source).main;
} else {
  main = require(path.join(__dirname, '..', 'out', 'cli.js')).main;
}
process.exitCode = main(process.argv.slice(2), {
  out: (t) => process.stdout.write(t),
  err: (t) => process.stderr.write(t),
  cwd: process.cwd(),
  color: Boolean(process.stdout.isTTY) && !process.env.NO_COLOR,
});
