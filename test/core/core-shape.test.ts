// The core's shape, checked: no import circles (madge over core/), and nothing from Node outside core/cli, so the
// engine bundles for a browser or a worker (esbuild, platform browser). Both read the real sources.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { build } from 'esbuild';

interface MadgeGraph {
  circular(): string[][];
  obj(): Record<string, string[]>;
}
// madge ships no type declarations: its API as used here (README, "API").
// eslint-disable-next-line @typescript-eslint/no-require-imports
const madge = require('madge') as (path: string, config: { fileExtensions: string[]; tsConfig: string }) => Promise<MadgeGraph>;

const root = path.resolve(__dirname, '..', '..');
const core = path.join(root, 'core');

function coreFiles(dir = core): string[] {
  return fs.readdirSync(dir, { withFileTypes: true }).flatMap((entry) => {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) return full === path.join(core, 'cli') ? [] : coreFiles(full);
    return entry.name.endsWith('.ts') ? [full] : [];
  });
}

describe('the core\'s shape', function () {
  // madge parses every module of core/ with TypeScript; on a loaded machine that takes a while.
  this.timeout(180_000);

  it('has no import circles in core/ (type-only imports count too)', async () => {
    const graph = await madge(core, { fileExtensions: ['ts'], tsConfig: path.join(root, 'tsconfig.json') });
    assert.deepEqual(graph.circular(), [], 'import circles in core/ (npx madge --circular --extensions ts core)');
    assert.ok(Object.keys(graph.obj()).length > 50, 'madge read the core');
  });

  it('bundles for the browser: nothing outside core/cli imports from Node', async () => {
    const files = coreFiles();
    const result = await build({ entryPoints: files, bundle: true, platform: 'browser', format: 'esm', write: false, outdir: 'out-browser-check', logLevel: 'silent' }).catch((err: { errors?: Array<{ text: string; location?: { file: string } }> }) => err);
    const errors = 'errors' in result && result.errors ? result.errors.map((e) => `${e.location?.file}: ${e.text}`) : [];
    // Paths go through core/paths.ts, files through AnalyzeOptions.read, byte counts through core/size.ts.
    assert.deepEqual(errors, []);
    assert.ok(files.length > 50 && 'outputFiles' in result && result.outputFiles!.length === files.length);
  });
});
