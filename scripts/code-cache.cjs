// Writes out/cli.code-cache: V8's compiled code of out/cli.js after one check of the demo workspace, so a later
// `tickmark` start skips compiling the half-megabyte bundle and the functions a check runs (bin/tickmark.js
// reads it). V8 refuses a cache made by another Node.js version or for other flags, and the start then compiles
// as usual; a rebuilt bundle no longer matches its cache either. Run by scripts/build.mjs in its own process.
'use strict';
const fs = require('node:fs');
const path = require('node:path');
const vm = require('node:vm');
const Module = require('node:module');

const root = path.resolve(__dirname, '..');
const bundle = path.join(root, 'out', 'cli.js');
const script = new vm.Script(Module.wrap(fs.readFileSync(bundle, 'utf8')), { filename: bundle });
const cli = new Module(bundle, module);
cli.filename = bundle;
script.runInThisContext().call(cli.exports, cli.exports, Module.createRequire(bundle), cli, bundle, path.dirname(bundle));
// One check of the demo (a note and firmware with a build configuration): the functions it compiles join the cache.
const quiet = () => undefined;
cli.exports.main(['check', '--json', path.join(root, 'demo')], { out: quiet, err: quiet, cwd: root, color: false });
// The first line names the bundle it was made from (size and modification time): V8 itself checks only the length.
const { size, mtimeMs } = fs.statSync(bundle);
fs.writeFileSync(path.join(root, 'out', 'cli.code-cache'), Buffer.concat([Buffer.from(`${size} ${mtimeMs}\n`), script.createCachedData()]));
