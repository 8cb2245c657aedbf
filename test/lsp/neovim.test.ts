// `tickmark lsp --stdio` driven end to end by a real outside client: Neovim's built-in LSP client (Debian's
// neovim 0.7), headless, on a temporary copy of a small workspace. The Lua script (neovim/drive.lua) records
// what Neovim saw after each step; this test judges it, so a crash or hang on either side reads as a failed step.
import { strict as assert } from 'assert';
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { skipUnlessCi } from '../helpers/reference';

const root = path.resolve(__dirname, '..', '..');
const nvim = '/usr/bin/nvim';

interface Seen {
  done?: boolean;
  errors: string[];
  serverExited?: boolean;
  publishes: Array<{ uri: string; version: number | null; codes: string[] }>;
  steps: Record<string, any>;
}

function drive(): { seen: Seen; workspace: string; stderr: string } {
  const temp = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-nvim-'));
  const workspace = path.join(temp, 'ws');
  fs.cpSync(path.join(root, 'test', 'lsp', 'fixtures', 'workspace'), workspace, { recursive: true });
  const home = path.join(temp, 'home');
  const out = path.join(temp, 'seen.json');
  const env = {
    ...process.env,
    HOME: home,
    XDG_CONFIG_HOME: path.join(home, 'config'),
    XDG_DATA_HOME: path.join(home, 'data'),
    XDG_STATE_HOME: path.join(home, 'state'),
    XDG_CACHE_HOME: path.join(home, 'cache'),
    ROOT: root,
    WS: workspace,
    OUT: out,
  };
  // The script ends Neovim itself; `cquit 9` ends it when the script raised instead, and the time limit
  // (SIGKILL to this one process) when anything hangs.
  const run = spawnSync(nvim, ['--headless', '-n', '-u', 'NONE', '-i', 'NONE', '-c', `luafile ${path.join(root, 'test', 'lsp', 'neovim', 'drive.lua')}`, '-c', 'cquit 9'], {
    cwd: temp, env, encoding: 'utf8', timeout: 150_000, killSignal: 'SIGKILL',
  });
  const seen = fs.existsSync(out) ? (JSON.parse(fs.readFileSync(out, 'utf8')) as Seen) : { errors: ['Neovim wrote nothing'], publishes: [], steps: {} };
  if (run.error) seen.errors.push(`nvim: ${run.error.message}`);
  if (run.status !== 0) seen.errors.push(`nvim exited with ${run.status ?? run.signal}`);
  fs.rmSync(temp, { recursive: true, force: true });
  return { seen, workspace, stderr: `${run.stdout}\n${run.stderr}` };
}

describe('language server in Neovim (built-in LSP client, headless)', function () {
  this.timeout(180_000);
  let seen: Seen;
  let workspace: string;
  const uri = (relative: string) => pathToFileURL(path.join(workspace, relative)).href;

  before(function () {
    if (!fs.existsSync(nvim)) skipUnlessCi(this, `${nvim} is not installed (apt-get install neovim)`);
    const result = drive();
    seen = result.seen;
    workspace = result.workspace;
    assert.deepEqual(seen.errors, [], `Neovim's run failed:\n${seen.errors.join('\n')}\n${result.stderr}`);
    assert.equal(seen.done, true);
  });

  it('starts, and stops when the client asks', () => {
    assert.equal(seen.steps.initialized, true);
    assert.equal(seen.serverExited, true);
  });

  it('publishes the note\'s mismatch: the RC delay to 70 % takes 120.4 ms, not 100 ms', () => {
    // RC charging law v(t) = V·(1 − e^(−t/RC)) (any circuit-theory handbook): t = RC·ln(1/0.3) at 0.7 of the supply.
    const t = 100e3 * 1e-6 * Math.log(1 / 0.3);
    assert.equal((t * 1000).toFixed(1), '120.4');
    const mismatch = seen.steps.noteMismatch;
    assert.match(mismatch.message, /120\.4 ms/);
    assert.equal(mismatch.source, 'tickmark');
    // LSP DiagnosticSeverity.Warning is 2 (Language Server Protocol 3.17, Diagnostic).
    assert.equal(mismatch.severity, 2);
    // 0-based line 10 is `expect: 100 ms ±5%` in notes/lamp.md.
    assert.equal(mismatch.line, 10);
  });

  it('answers a hover on the note\'s block with the result, the working and the assumptions', () => {
    const text = String(seen.steps.noteHover).replace(/\\(.)/g, '$1');
    assert.match(text, /lamp-startup/);
    assert.match(text, /120\.4 ms/);
    assert.match(text, /RC charging law/);
    assert.match(text, /assumes/);
  });

  it('gives one lens on the block\'s header line carrying the waveform command', () => {
    assert.deepEqual(seen.steps.noteLenses.map((l: { line: number }) => l.line), [4]);
    assert.match(seen.steps.noteLenses[0].title, /120\.4 ms/);
    assert.equal(seen.steps.noteLenses[0].command, 'tickmark.showWaveform');
  });

  it('offers the claim update as a quick fix, and the applied fix clears the finding', () => {
    assert.deepEqual(seen.steps.noteActions, ['Update the claim to 120.4 ms']);
    assert.ok(seen.steps.noteAfterFix.includes('expect: 120.4 ms ±5%'), seen.steps.noteAfterFix.join('\n'));
    assert.equal(seen.steps.noteCleared, true);
    // The last publish is for the buffer's version as Neovim counts it (LSP: VersionedTextDocumentIdentifier).
    assert.equal(seen.steps.noteVersions.published, seen.steps.noteVersions.buffer);
  });

  it('reads the C file\'s constants from its header: 8 MHz / 8 / (999 + 1) = 1 kHz against a 500 Hz claim', () => {
    // Up-counting timer: one period is reload + 1 ticks of clock/prescaler (common practice, MCU reference manuals).
    assert.equal(8e6 / 8 / (999 + 1), 1000);
    assert.equal(seen.steps.cDiagnostics, true);
    assert.match(seen.steps.cMismatch.message, /computes 1 kHz, expect says 500 Hz/);
    const hover = String(seen.steps.cHover).replace(/\\(.)/g, '$1');
    assert.match(hover, /DIM_RELOAD` = 999 — firmware\/lamp\.h:7/);
    assert.deepEqual(seen.steps.cLenses, [1, '1 kHz · 1 ms · 1 warning']);
  });

  it('goes from DIM_RELOAD in the block to its #define in the header', () => {
    const found = seen.steps.cDefinition;
    assert.equal(found.uri, uri('firmware/lamp.h'));
    // lamp.h line 7 (0-based 6) is `#define DIM_RELOAD        999u`; the name starts after `#define `.
    assert.deepEqual(found.range, { start: { line: 6, character: 8 }, end: { line: 6, character: 18 } });
  });

  it('fixes the header constant (8 MHz / 8 / (1999 + 1) = 500 Hz) and re-analyses the C file that includes it', () => {
    assert.equal(8e6 / 8 / (1999 + 1), 500);
    assert.ok(seen.steps.cActions.includes('Set DIM_RELOAD = 1999u (meets 500 Hz ±1%)'), seen.steps.cActions.join('; '));
    assert.deepEqual(seen.steps.cActionFiles, [uri('firmware/lamp.h')]);
    assert.ok(seen.steps.headerAfterFix.includes('#define DIM_RELOAD        1999u'));
    assert.equal(seen.steps.cCleared, true);
  });

  it('sees a plain edit of the claim: 500 Hz against 400 Hz is a finding again, published for the edited version', () => {
    assert.equal(seen.steps.cEditedBack, true);
    assert.equal(seen.steps.cVersions.published, seen.steps.cVersions.buffer);
    const last = seen.publishes.filter((p) => p.uri === uri('firmware/dimmer.c')).at(-1);
    assert.deepEqual(last?.codes, ['expect-mismatch']);
  });
});
