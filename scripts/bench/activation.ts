// Figure 6: release bundle sizes (the activation path and all the editor loads), activation outside the
// host against a stand-in API, and activation in the real editor host (scripts/editor-activation.mjs).
import { execFileSync, spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { median, ms, type Row } from './measure';

const root = path.resolve(__dirname, '..', '..');
/**
 * What the installed extension loads: the activation path first, the language client library (just after
 * activation), the panel script. The preview's in-process core and the server (its own process) are counted apart.
 */
const activationPath = 'out/extension.js';
const editorBundles = [activationPath, 'out/client.js', 'media/dist/panel.js'];
const previewCore = 'out/engine.js';
const serverBundle = 'out/server.js';
const kB = (bytes: number) => `${(bytes / 1024).toFixed(0)} kB`;

interface ActivationRecord {
  activationMs: number;
  moduleLoadMs: number;
  hostWaitMs: number;
  activateMs: number;
  engineLoadedAtActivation: boolean;
  /** The host's own performance marks for the extension (test/editor/suite/activationMeasure.test.ts). */
  host?: { loadCodeMs: number; activateMs: number };
}

export function bundle(): Row[] {
  const rows: Row[] = [];
  try {
    execFileSync(process.execPath, [path.join(root, 'scripts', 'build.mjs'), '--release'], { cwd: root, stdio: 'pipe' });
    const size = (file: string) => (fs.existsSync(path.join(root, file)) ? fs.statSync(path.join(root, file)).size : 0);
    const sizes = editorBundles.map((file) => [file, size(file)] as const);
    const total = sizes.reduce((sum, [, bytes]) => sum + bytes, 0);
    const first = sizes[0][1];
    rows.push(
      { figure: '6a bundles the editor loads (release), total', value: kB(total), target: '< 500 kB', met: total < 500 * 1024, note: sizes.map(([f, b]) => `${path.basename(f)} ${kB(b)}`).join(', ') },
      { figure: `6b   activation path ${activationPath}`, value: kB(first), target: '< 500 kB', met: first < 500 * 1024, note: 'the language client (out/client.js) loads on the next turn after activation' },
      { figure: '6b   with the preview\'s in-process core', value: kB(total + size(previewCore)), target: '< 500 kB', met: total + size(previewCore) < 500 * 1024, note: `${path.basename(previewCore)} ${kB(size(previewCore))}, loaded when a Markdown preview renders a timing fence or the panel opens` },
      { figure: '6b   the language server (its own process)', value: kB(size(serverBundle)), target: '—', met: true, note: `${serverBundle}: the core, vscode-languageserver and the server; not loaded by the editor host` },
      activationOutsideHost(),
      ...activationInHost(),
    );
  } finally {
    // Put the development build back: the editor tests load out/ with source maps.
    execFileSync(process.execPath, [path.join(root, 'scripts', 'build.mjs')], { cwd: root, stdio: 'pipe' });
  }
  return rows;
}

/** Fresh real extension hosts (code-server), each activating the release build once. */
function activationInHost(): Row[] {
  const runs = 5;
  const run = spawnSync(process.execPath, [path.join(root, 'scripts', 'editor-activation.mjs'), '--runs', String(runs)], { cwd: root, encoding: 'utf8', timeout: 10 * 60_000 });
  const line = run.stdout?.split('\n').find((l) => l.startsWith('{"runs"'));
  if (run.status !== 0 || !line) {
    const why = (run.stderr || String(run.error ?? `exit ${run.status}`)).trim().split('\n').pop();
    return [{ figure: '6d activation in the real editor host', value: 'n/a', target: '< 50 ms', met: false, note: `could not run: ${why}` }];
  }
  const records = (JSON.parse(line) as { runs: ActivationRecord[] }).runs;
  const span = (pick: (r: ActivationRecord) => number) => {
    const values = records.map(pick);
    return { median: median(values), range: `${ms(Math.min(...values))}–${ms(Math.max(...values))}` };
  };
  const eager = records.some((r) => r.engineLoadedAtActivation);
  const rows: Row[] = [];
  const marked = records.filter((r) => r.host);
  if (marked.length === records.length) {
    const host = span((r) => r.host!.loadCodeMs + r.host!.activateMs);
    const load = median(records.map((r) => r.host!.loadCodeMs));
    rows.push({ figure: '6d activation in the real editor host, host marks: load code + activate()', value: ms(host.median), target: '< 50 ms', met: host.median < 50 && !eager,
      note: `median of ${records.length} fresh hosts (${host.range}); load code ${ms(load)}; ${eager ? 'the engine loaded during activation' : 'engine not loaded during activation'}` });
  } else {
    rows.push({ figure: '6d activation in the real editor host, host marks', value: 'n/a', target: '< 50 ms', met: false, note: 'the host left no performance marks' });
  }
  const own = span((r) => r.activationMs);
  const wait = median(records.map((r) => r.hostWaitMs));
  rows.push({ figure: '6e   extension clock: first module line to activate() returned', value: ms(own.median), target: '—', met: true,
    note: `${own.range}; of it ${ms(wait)} waiting for the host to prepare the extension context before it calls activate()` });
  return rows;
}

/**
 * Loading the release bundle and calling activate() against a stand-in API that accepts every call. This is
 * the extension's own share of activation without the host's work.
 */
function activationOutsideHost(): Row {
  const Module = require('node:module') as { _load: (request: string, ...rest: unknown[]) => unknown };
  // The bundle copies the API's own keys (esbuild's ESM interop), so the stand-in lists the names the sources use.
  const names = new Set<string>();
  for (const file of fs.readdirSync(path.join(root, 'extension')).filter((f) => f.endsWith('.ts'))) {
    for (const m of fs.readFileSync(path.join(root, 'extension', file), 'utf8').matchAll(/\bvscode\.([A-Za-z]+)/g)) names.add(m[1]);
  }
  const target = function () {};
  const standIn: unknown = new Proxy(target, {
    get: (_t, key) => (key === Symbol.toPrimitive ? () => '' : key === 'then' ? undefined : standIn),
    ownKeys: () => [...Reflect.ownKeys(target), ...[...names].filter((n) => !Reflect.ownKeys(target).includes(n))],
    getOwnPropertyDescriptor: (_t, key) => Reflect.getOwnPropertyDescriptor(target, key) ?? { configurable: true, enumerable: true, value: standIn },
    apply: () => standIn,
    construct: () => standIn as object,
  });
  const load = Module._load;
  Module._load = (request: string, ...rest: unknown[]) => (request === 'vscode' ? standIn : load(request, ...rest));
  try {
    const file = path.join(root, 'out', 'extension.js');
    const start = performance.now();
    const extension = require(file) as { activate: (context: unknown) => unknown };
    extension.activate({ subscriptions: [], extension: standIn, extensionUri: standIn, extensionMode: 1, logUri: standIn, storageUri: standIn, globalStorageUri: standIn, extensionPath: root, globalState: standIn, workspaceState: standIn, asAbsolutePath: (p: string) => path.join(root, p) });
    const elapsed = performance.now() - start;
    return { figure: '6c activation: load bundle + activate() (stand-in API)', value: ms(elapsed), target: '< 50 ms', met: elapsed < 50, note: 'outside the editor host' };
  } catch (cause) {
    return { figure: '6c activation (stand-in API)', value: 'n/a', target: '< 50 ms', met: false, note: `could not run: ${cause instanceof Error ? cause.message : String(cause)}` };
  } finally {
    Module._load = load;
  }
}
