import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { spawnSync } from 'node:child_process';
import { main, waveFlags } from '../../core/cli/main';

const made: string[] = [];
after(() => made.forEach((dir) => fs.rmSync(dir, { recursive: true, force: true })));

function workspace(files: Record<string, string>): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-cli-'));
  made.push(dir);
  for (const [name, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    fs.writeFileSync(path.join(dir, name), text);
  }
  return dir;
}

function run(argv: string[], cwd: string, color = false) {
  let out = '';
  let err = '';
  const code = main(argv, { out: (t) => (out += t), err: (t) => (err += t), cwd, color });
  return { code, out, err };
}

// 16 MHz / 64 / 250 = 1 kHz (timer law; counter passes 0); reload 255 gives 976.6 Hz.
const goodNote = ['# tick', '', '```timing tick', 'circuit: timer', 'clock: 16 MHz', 'prescaler: 64', 'reload: 249', 'expect: 1 kHz', '```', ''].join('\n');
const staleNote = goodNote.replace('reload: 249', 'reload: 255');

describe('tickmark check', () => {
  it('exits 0 when every claim holds, 1 when one does not', () => {
    const dir = workspace({ 'good.md': goodNote, 'stale.md': staleNote });
    assert.equal(run(['check', 'good.md'], dir).code, 0);
    const stale = run(['check', 'stale.md'], dir);
    assert.equal(stale.code, 1);
    assert.match(stale.out, /^stale\.md:8:9: warning: tick: computes 976\.6 Hz, expect says 1 kHz \(default tolerance ±1 %\) \(−2\.34 % from the claim\); `reload: 249` gives 1 kHz$/m);
    assert.match(stale.out, /^stale\.md:3: tick \(timer\) warning — 976\.6 Hz/m);
    assert.match(stale.out, /^1 block in 1 file: 0 errors, 1 warning, 0 notes$/m);
  });

  it('names a block\'s status by its worst severity and prints info findings as notes, as SARIF does', () => {
    const broken = goodNote.replace('prescaler: 64', 'prescaler: 0');
    // An E24 resistor solved for 1 kHz: a note, not a warning (the block is fine).
    const solved = ['```timing blink', 'circuit: schmitt-rc', 'supply: 5 V', 'vt+: 3 V', 'vt-: 2 V', 'r: ?', 'c: 100n', 'target: 1 kHz ±10%', '```', ''].join('\n');
    const dir = workspace({ 'broken.md': broken, 'solved.md': solved });
    const r = run(['check', 'broken.md', 'solved.md'], dir);
    assert.match(r.out, /^broken\.md:3: tick \(timer\) error — ⛔ /m);
    assert.match(r.out, /^broken\.md:6:\d+: error: `prescaler` must be at least 1/m);
    assert.match(r.out, /^solved\.md:1: blink \(schmitt-rc\) ok — /m);
    assert.match(r.out, /^solved\.md:6:\d+: note: `r`: exact value .* \(\S+ % from the target\)$/m);
    assert.doesNotMatch(r.out, /\b(info|check|failed)\b/);
    assert.match(r.out, /: 1 error, 0 warnings, 1 note$/m);
  });

  it('keeps `startup` beside `first-edge` in JSON for one more version', () => {
    const dir = workspace({ 'n.md': ['```timing blink', 'circuit: schmitt-rc', 'supply: 5 V', 'vt+: 3 V', 'vt-: 2 V', 'r: 10k ±1%', 'c: 1u', '```', ''].join('\n') });
    const block = JSON.parse(run(['check', '--json', 'n.md'], dir).out).files[0].blocks[0];
    // RC charging law (common practice): from 0 V toward 5 V, the first edge at 3 V comes after RC·ln(5/2).
    assert.ok(Math.abs(block.values['first-edge'] / (10e3 * 1e-6 * Math.log(5 / 2)) - 1) < 1e-9);
    assert.equal(block.values.startup, block.values['first-edge']);
    assert.deepEqual(block.spread.startup, block.spread['first-edge']);
  });

  it('exits 2 for usage errors and unreadable paths', () => {
    const dir = workspace({ 'good.md': goodNote });
    assert.equal(run(['check'], dir).code, 2);
    assert.equal(run(['check', '--frobnicate', 'good.md'], dir).code, 2);
    assert.equal(run(['check', '--json', '--sarif', 'good.md'], dir).code, 2);
    assert.equal(run(['check', '--data-model', 'lp32', 'good.md'], dir).code, 2);
    const missing = run(['check', 'nowhere.md'], dir);
    assert.equal(missing.code, 2);
    assert.match(missing.err, /cannot read nowhere\.md/);
    assert.equal(run(['bogus'], dir).code, 2);
  });

  it('reads the header beside a file checked by itself', () => {
    const dir = workspace({
      'fw/tick.c': '#include "board.h"\n// @timing tick\n// circuit: timer\n// clock: CLK\n// prescaler: 64\n// reload: TOP\n// expect: 1 kHz\n',
      'fw/board.h': '#define CLK 16000000u\n#define TOP 249u\n',
    });
    const r = run(['check', path.join(dir, 'fw', 'tick.c')], os.tmpdir());
    assert.equal(r.code, 0, r.out);
  });

  it('refuses a file that is neither a note nor C, and warns for a file above the size limit', () => {
    const dir = workspace({ 'notes.txt': goodNote, 'big.md': goodNote + ' '.repeat(3000) });
    assert.equal(run(['check', 'notes.txt'], dir).code, 2);
    const big = run(['check', '--max-size-kb', '2', 'big.md'], dir);
    assert.equal(big.code, 1);
    assert.match(big.out, /big\.md:1:1: warning: file is larger than the size limit of 2 KB/);
  });

  it('applies --tolerance to claims without their own', () => {
    // 976.6 Hz is 2.34 % below 1 kHz: outside ±1 %, inside ±3 %.
    const dir = workspace({ 'stale.md': staleNote });
    assert.equal(run(['check', '--tolerance', '3', 'stale.md'], dir).code, 0);
  });

  it('prints help for each command with exit 0', () => {
    const dir = workspace({});
    for (const argv of [['--help'], ['check', '--help'], ['wave', '--help']]) {
      const r = run(argv, dir);
      assert.equal(r.code, 0);
      assert.match(r.out, /^usage: tickmark/);
    }
  });

  it('prints the documented JSON in SI units with 1-based lines', () => {
    const dir = workspace({ 'notes/stale.md': staleNote });
    const r = run(['check', '--json', 'notes'], dir);
    const json = JSON.parse(r.out);
    assert.equal(json.files[0].path, 'notes/stale.md');
    const block = json.files[0].blocks[0];
    assert.equal(block.name, 'tick');
    assert.equal(block.line, 3);
    assert.equal(block.circuit, 'timer');
    assert.equal(block.params.clock, 16e6);
    assert.equal(block.params.mode, 'up');
    assert.equal(block.values.frequency, 16e6 / 64 / 256);
    assert.deepEqual(block.diagnostics.map((d: { severity: string; line: number; code: string }) => [d.severity, d.line, d.code]), [['warning', 8, 'expect-mismatch']]);
    const numbers: number[] = [];
    JSON.stringify(json, (_k, v) => (typeof v === 'number' && numbers.push(v), v));
    assert.ok(numbers.every(Number.isFinite));
  });

  it('prints SARIF 2.1.0 with rules, levels and physical locations', () => {
    // OASIS SARIF 2.1.0: version string, tool.driver.rules, result.level, physicalLocation.region.
    const dir = workspace({ 'stale.md': staleNote, 'bad.md': '```timing\ncircuit: ring\nstages: 4\ntpd: 1n\n```\n' });
    const r = run(['check', '--sarif', '.'], dir);
    assert.equal(r.code, 1);
    const log = JSON.parse(r.out);
    assert.equal(log.version, '2.1.0');
    const sarifRun = log.runs[0];
    assert.equal(sarifRun.tool.driver.name, 'Tickmark');
    const ids = sarifRun.tool.driver.rules.map((rule: { id: string }) => rule.id);
    assert.deepEqual([...new Set(ids)], ids);
    const mismatch = sarifRun.results.find((x: { ruleId: string }) => x.ruleId === 'expect-mismatch');
    assert.equal(mismatch.level, 'warning');
    assert.equal(ids[mismatch.ruleIndex], 'expect-mismatch');
    const location = mismatch.locations[0].physicalLocation;
    assert.equal(location.artifactLocation.uri, 'stale.md');
    assert.equal(location.region.startLine, 8);
    assert.equal(location.region.startColumn, 9);
    const even = sarifRun.results.find((x: { ruleId: string }) => x.ruleId === 'physics');
    assert.equal(even.level, 'error');
    assert.equal(even.locations[0].physicalLocation.region.startLine, 3);
  });

  it('colours only when asked, and the installed command never colours a pipe', () => {
    const dir = workspace({ 'stale.md': staleNote });
    assert.match(run(['check', 'stale.md'], dir, true).out, /\x1b\[33m/);
    assert.doesNotMatch(run(['check', 'stale.md'], dir, false).out, /\x1b\[/);
    const bin = path.resolve(__dirname, '../../bin/tickmark.js');
    // No NO_COLOR here: a pipe alone must keep the output plain (spawnSync's stdout is a pipe, not a TTY).
    const env = { ...process.env };
    delete env.NO_COLOR;
    delete env.FORCE_COLOR;
    const piped = spawnSync(process.execPath, [bin, 'check', 'stale.md'], { cwd: dir, encoding: 'utf8', env });
    assert.equal(piped.status, 1);
    assert.doesNotMatch(piped.stdout, /\x1b\[/);
  });
});

describe('tickmark wave', () => {
  const note = ['```timing blink', 'circuit: schmitt-rc', 'supply: 5 V', 'vt+: 3 V', 'vt-: 2 V', 'r: 10k', 'c: 1u', '```', ''].join('\n');

  it('writes an SVG of the named block', () => {
    const dir = workspace({ 'n.md': note });
    const r = run(['wave', 'n.md', '--block', 'blink', '--out', 'blink.svg'], dir);
    assert.equal(r.code, 0, r.err);
    const svg = fs.readFileSync(path.join(dir, 'blink.svg'), 'utf8');
    assert.match(svg, /^<svg[^>]+xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    assert.match(svg, /VT\+/);
    assert.doesNotMatch(svg, /<script/);
  });

  it('lists every option it takes in its usage line', () => {
    const usage = run(['wave', '--help'], os.tmpdir()).out.split('\n\n')[0];
    // One-letter flags are spelled as the compiler's (`-D NAME`), the others with two dashes.
    const spelled = (flag: string) => (flag.length === 1 ? `-${flag}` : `--${flag}`);
    for (const flag of Object.keys(waveFlags)) assert.ok(usage.includes(`[${spelled(flag)}`) || usage.includes(` ${spelled(flag)} `), `${spelled(flag)} missing from: ${usage}`);
  });

  it('names the blocks there are when the name is wrong', () => {
    const dir = workspace({ 'n.md': note });
    const r = run(['wave', 'n.md', '--block', 'blnk'], dir);
    assert.equal(r.code, 2);
    assert.match(r.err, /no block `blnk` in n\.md \(blocks: blink\)/);
    assert.equal(run(['wave', 'n.md'], dir).code, 2);
    assert.equal(run(['wave', 'n.md', '--block', 'blink', '--cycles', '0'], dir).code, 2);
  });
});
