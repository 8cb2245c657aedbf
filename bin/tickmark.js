#!/usr/bin/env node
// The `tickmark` command. An installed package (npm install -g, npx) holds only the bundles out/cli.js and
// out/server.js and runs them with no dependency at all. In a source checkout the bundle runs when it is at
// least as new as every source; with edited sources the TypeScript runs through tsx (a dev dependency), since
// compiling the core at each start costs about a second.
const fs = require('node:fs');
const path = require('node:path');
const root = path.join(__dirname, '..');

function newestSource(folder) {
  let newest = 0;
  for (const entry of fs.readdirSync(folder, { withFileTypes: true })) {
    const full = path.join(folder, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(full));
    else if (entry.name.endsWith('.ts')) newest = Math.max(newest, fs.statSync(full).mtimeMs);
  }
  return newest;
}

/**
 * A bundle with its V8 code cache when the build left one for exactly this file (scripts/code-cache.cjs): the start
 * then skips compiling it. Without one, or for another bundle, plain `require`; a cache V8 refuses (another
 * Node.js version) only costs the compile it would have saved.
 */
function requireBundle(bundle) {
  let cache;
  try {
    cache = fs.readFileSync(bundle.replace(/\.js$/, '.code-cache'));
  } catch {
    return require(bundle);
  }
  const newline = cache.indexOf(10);
  const { size, mtimeMs } = fs.statSync(bundle);
  if (newline < 0 || cache.toString('latin1', 0, newline) !== `${size} ${mtimeMs}`) return require(bundle);
  const Module = require('node:module');
  const vm = require('node:vm');
  const script = new vm.Script(Module.wrap(fs.readFileSync(bundle, 'utf8')), { filename: bundle, cachedData: cache.subarray(newline + 1) });
  const loaded = new Module(bundle, module);
  loaded.filename = bundle;
  script.runInThisContext().call(loaded.exports, loaded.exports, Module.createRequire(bundle), loaded, bundle, path.dirname(bundle));
  loaded.loaded = true;
  return loaded.exports;
}

/** The bundle, or in a checkout whose sources are newer, the TypeScript entry point loaded through tsx. */
function load(bundleName, sourceName, sourceFolders) {
  const bundle = path.join(root, 'out', bundleName);
  const source = path.join(root, sourceName);
  const checkout = fs.existsSync(source);
  if (fs.existsSync(bundle)) {
    if (!checkout) return requireBundle(bundle);
    try {
      const newest = Math.max(...sourceFolders.map((f) => newestSource(path.join(root, f))));
      if (fs.statSync(bundle).mtimeMs >= newest) return requireBundle(bundle);
    } catch {
      // A folder that cannot be read: fall through to the sources.
    }
  }
  if (!checkout) {
    process.stderr.write(`tickmark: ${path.join('out', bundleName)} is missing from this installation; reinstall the package\n`);
    process.exit(2);
  }
  require('tsx/cjs');
  return require(source);
}

const [command, ...rest] = process.argv.slice(2);

// `tickmark lsp --stdio`: the language server, from its own bundle (out/server.js) or its sources.
if (command === 'lsp') {
  if (rest.includes('--version') || rest.includes('-V')) {
    process.stdout.write(`${require('../package.json').version}\n`);
    return;
  }
  const transports = ['--stdio', '--node-ipc', '--socket', '--pipe'];
  if (!rest.some((a) => transports.some((t) => a === t || a.startsWith(t + '=')))) {
    process.stderr.write('usage: tickmark lsp --stdio\n\nServes the analysis over the Language Server Protocol on standard input and output.\n');
    process.exit(rest.includes('--help') || rest.includes('-h') ? 0 : 2);
  }
  load('server.js', path.join('server', 'main.ts'), ['core', 'server']).startServer();
  return;
}

const cli = load('cli.js', path.join('core', 'cli', 'main.ts'), ['core']);
cli.run(process.argv.slice(2));
