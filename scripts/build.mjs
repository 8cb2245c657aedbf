// Bundles the extension, the webview script and the in-editor test suite with esbuild.
// `node scripts/build.mjs` for development (source maps), `--release` to minify, `--watch` to rebuild.
import * as esbuild from 'esbuild';
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const release = process.argv.includes('--release');
const watch = process.argv.includes('--watch');
const at = (p) => path.join(root, p);

const common = {
  bundle: true,
  sourcemap: release ? false : 'linked',
  minify: release,
  logLevel: 'info',
  absWorkingDir: root,
};

// extension/engine.ts requires './engineCore' on first use; in the extension bundle that require stays a
// runtime load of out/engine.js (cjs has no code splitting in esbuild), so activation parses no core code.
const lazyEngine = {
  name: 'lazy-engine',
  setup(build) {
    build.onResolve({ filter: /^\.\/engineCore$/ }, (args) =>
      path.resolve(args.resolveDir) === at('extension') ? { path: './engine.js', external: true } : undefined);
  },
};

// extension/client.ts requires './clientCore' just after activation: out/client.js, the language client library.
const lazyClient = {
  name: 'lazy-client',
  setup(build) {
    build.onResolve({ filter: /^\.\/clientCore$/ }, (args) =>
      path.resolve(args.resolveDir) === at('extension') ? { path: './client.js', external: true } : undefined);
  },
};

// core/value/dim.ts requires './unit-math' (mathjs's Unit class) when a value multiplies or divides units: in the
// command line's, the language server's and the editor engine's bundles that require stays a runtime load of
// out/unit-math.js, so a cold start does not load mathjs (45 % of the command line's bundle) for the checks that never
// need it. (A bundled require of it would also defeat esbuild's tree shaking and pull in all of mathjs.)
const lazyUnitMath = {
  name: 'lazy-unit-math',
  setup(build) {
    build.onResolve({ filter: /^\.\/unit-math$/ }, (args) =>
      path.resolve(args.resolveDir) === at('core/value') ? { path: './unit-math.js', external: true } : undefined);
  },
};

/** @type {esbuild.BuildOptions[]} */
const targets = [
  {
    ...common,
    entryPoints: [at('extension/extension.ts')],
    outfile: at('out/extension.js'),
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    external: ['vscode'],
    plugins: [lazyEngine, lazyClient],
  },
  {
    ...common,
    entryPoints: [at('extension/clientCore.ts')],
    outfile: at('out/client.js'),
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    external: ['vscode'],
  },
  {
    ...common,
    entryPoints: [at('extension/engineCore.ts')],
    outfile: at('out/engine.js'),
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    plugins: [lazyUnitMath],
  },
  // The command line as one file: bin/tickmark.js runs it when it is newer than the sources (no tsx at start).
  {
    ...common,
    entryPoints: [at('core/cli/main.ts')],
    outfile: at('out/cli.js'),
    // Always minified: a CI run starts it cold, and a smaller file parses faster.
    minify: true,
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    plugins: [lazyUnitMath],
  },
  // mathjs's units for the command line, the language server and the editor engine, loaded on first use.
  {
    ...common,
    entryPoints: [at('core/value/unit-math.ts')],
    outfile: at('out/unit-math.js'),
    minify: true,
    format: 'cjs',
    platform: 'node',
    target: 'node20',
  },
  // The language server (`tickmark lsp --stdio`, and the process the extension starts) as one file.
  {
    ...common,
    entryPoints: [at('server/main.ts')],
    outfile: at('out/server.js'),
    // Minified like the CLI: every editor starts it cold.
    minify: true,
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    plugins: [lazyUnitMath],
  },
];

// The webview script sits beside its stylesheet in media/ (git-ignored media/dist/): the panel's
// localResourceRoots is media/ alone.
if (existsSync(at('media/panel.ts'))) {
  targets.push({
    ...common,
    entryPoints: [at('media/panel.ts')],
    outfile: at('media/dist/panel.js'),
    format: 'esm',
    platform: 'browser',
    target: 'es2022',
  });
}

// Test suite only for development builds: a packaged extension never carries it.
if (!release && existsSync(at('test/editor/suite/index.ts'))) {
  targets.push({
    ...common,
    entryPoints: [at('test/editor/suite/index.ts')],
    outfile: at('out/test/suite/index.js'),
    format: 'cjs',
    platform: 'node',
    target: 'node20',
    // mocha is bundled so the suite runs inside any extension host, which has no node_modules of ours.
    external: ['vscode'],
    sourcemap: 'inline',
    // Only mocha's parallel mode resolves its worker files; the suite runs serially.
    logOverride: { 'require-resolve-not-external': 'silent' },
  });
}

if (release) for (const dir of ['out', 'media/dist']) rmSync(at(dir), { recursive: true, force: true });

// `--cli`: only the command line and the language server, the bundles the npm package runs (the packaging
// test builds these without touching the rest of out/).
const only = process.argv.includes('--cli') ? targets.filter((t) => /out\/(cli|server|unit-math)\.js$/.test(t.outfile.split(path.sep).join('/'))) : targets;

try {
  if (watch) {
    const contexts = await Promise.all(only.map((t) => esbuild.context(t)));
    await Promise.all(contexts.map((c) => c.watch()));
  } else {
    await Promise.all(only.map((t) => esbuild.build(t)));
  }
} catch {
  // esbuild has already printed the positioned errors.
  process.exit(1);
}

// esbuild escapes non-ASCII characters in strings but leaves them in regular-expression literals. One such character
// makes Node read a bundle as a two-byte string (twice the memory, and a slower parse at every start): the command
// line's and the language server's bundles stay ASCII; write `\u00b1` in a pattern, not `±`.
for (const name of ['out/cli.js', 'out/server.js']) {
  if (!only.some((t) => t.outfile === at(name)) || !existsSync(at(name))) continue;
  const bytes = readFileSync(at(name));
  const at8 = bytes.findIndex((b) => b > 0x7f);
  if (at8 >= 0) {
    console.error(`build: ${name} holds a non-ASCII character near "${bytes.subarray(Math.max(0, at8 - 30), at8 + 10).toString('utf8')}"; escape it (\\uXXXX) in the source`);
    process.exit(1);
  }
}

// The command line's V8 code cache (scripts/code-cache.cjs); a watch build leaves none behind, so a stale one never
// stands beside a newer bundle (V8 would refuse it anyway).
const codeCache = at('out/cli.code-cache');
rmSync(codeCache, { force: true });
if (!watch && only.some((t) => t.outfile === at('out/cli.js'))) {
  const made = spawnSync(process.execPath, [at('scripts/code-cache.cjs')], { stdio: 'inherit' });
  if (made.status !== 0) console.error('build: out/cli.code-cache not written; the command line compiles its bundle at each start');
}
