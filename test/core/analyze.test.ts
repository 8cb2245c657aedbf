import { strict as assert } from 'assert';
import { analyzeText, errors, noteBlock } from '../helpers/analyze';

const close = (actual: number | undefined, expected: number, rel = 1e-9) => {
  assert.ok(actual !== undefined, 'value missing');
  assert.ok(Math.abs(actual / expected - 1) <= rel, `${actual} is not within ${rel} of ${expected}`);
};

describe('analysis of one block', () => {
  it('computes a timer from its registers', () => {
    // Fact of the trade: 16 MHz / 64 = 250 kHz; 250 counts (reload 249, counter passes 0) give 1 kHz.
    const block = noteBlock(['circuit: timer', 'clock: 16 MHz', 'prescaler: 64', 'reload: 249']);
    assert.deepEqual(errors(block), []);
    close(block.values.frequency, 1000);
    close(block.values.period, 1e-3);
  });

  it('states the computed value, the claim and the difference in a mismatch', () => {
    // 16 MHz / 64 / 256 = 976.5625 Hz, 2.34 % below 1 kHz (arithmetic of the timer law).
    const block = noteBlock(['circuit: timer', 'clock: 16 MHz', 'prescaler: 64', 'reload: 255', 'expect: 1 kHz ±0.5%']);
    const warning = block.findings.find((f) => f.code === 'expect-mismatch');
    assert.ok(warning, 'mismatch reported');
    assert.equal(warning.message, 'probe: computes 976.6 Hz, expect says 1 kHz ±0.5% (−2.34 % from the claim); `reload: 249` gives 1 kHz');
    const titles = (warning.fixes ?? []).map((f) => f.title);
    assert.deepEqual(titles, ['Set reload: 249 (meets 1 kHz ±0.5%)', 'Update the claim to 976.6 Hz']);
  });

  it('offers the #define literal that meets the claim, in the header where it is defined', () => {
    const header = '#define SYS_CLOCK_HZ 16000000u\n#define TICK_DIV 64u\n#define TICK_TOP 255u\n';
    const source = ['#include "board.h"', '/* @timing tick', ' * circuit: timer', ' * clock: SYS_CLOCK_HZ', ' * prescaler: TICK_DIV', ' * reload: TICK_TOP', ' * expect: 1 kHz ±0.5%', ' */', ''].join('\n');
    const doc = analyzeText('src/tick.c', source, { 'src/board.h': header });
    const block = doc.blocks[0];
    const warning = block.findings.find((f) => f.code === 'expect-mismatch')!;
    const fix = warning.fixes![0];
    assert.equal(fix.title, 'Set TICK_TOP = 249u (meets 1 kHz ±0.5%)');
    const edit = fix.edits[0];
    assert.ok(edit.uri.endsWith('board.h'));
    assert.equal(header.slice(edit.span.start, edit.span.end), '255u');
    assert.deepEqual(block.identifiers.map((i) => [i.name, i.value, i.line]), [['SYS_CLOCK_HZ', 16e6, 1], ['TICK_DIV', 64, 2], ['TICK_TOP', 255, 3]]);
    assert.deepEqual(doc.dependencies.map((d) => d.split('/').pop()), ['board.h']);
  });

  it('gives the worst case of a product of toleranced parts', () => {
    // Worst-case tolerance stack of a product (common practice): R·C spans (1−5 %)(1−10 %) … (1+5 %)(1+10 %).
    const block = noteBlock(['circuit: rc-delay', 'r: 100k ±5%', 'c: 1u ±10%', 'toward: 5 V', 'to: 0.632 * toward']);
    const nominal = block.values.time;
    close(block.spread!.time.min, nominal * 0.95 * 0.9);
    close(block.spread!.time.max, nominal * 1.05 * 1.1);
    // First-order shares of a product follow the relative tolerances: 5 : 10.
    close(block.spread!.time.shares!.r, 1 / 3, 1e-9);
    close(block.spread!.time.shares!.c, 2 / 3, 1e-9);
  });

  it('carries a supply tolerance into thresholds that name the supply', () => {
    // Thresholds that track the supply cancel it: t = RC·ln(…) depends only on the ratios (RC charging law).
    const block = noteBlock(['circuit: schmitt-rc', 'supply: 5 V ±10%', 'vt+: 0.6 * supply', 'vt-: 0.3 * supply', 'r: 10k', 'c: 100n']);
    const f = block.values.frequency;
    close(block.spread!.frequency.min, f, 1e-9);
    close(block.spread!.frequency.max, f, 1e-9);
    const fixed = noteBlock(['circuit: schmitt-rc', 'supply: 5 V ±10%', 'vt+: 3 V', 'vt-: 1.5 V', 'r: 10k', 'c: 100n']);
    assert.ok(fixed.spread!.frequency.max > fixed.spread!.frequency.min * 1.05, 'fixed thresholds feel the supply');
  });

  it('keeps Monte Carlo percentiles inside the worst case and repeats them for a seed', () => {
    const lines = ['circuit: 555-astable', 'supply: 5 V', 'ra: 10k ±5%', 'rb: 47k ±5%', 'c: 10n ±10%', 'samples: 2000', 'seed: 7'];
    const a = noteBlock(lines).spread!.frequency;
    const b = noteBlock(lines).spread!.frequency;
    assert.equal(a.p1, b.p1);
    assert.ok(a.min < a.p1! && a.p1! < a.p99! && a.p99! < a.max);
  });

  it('solves a resistor onto E24 and recomputes with the standard part', () => {
    // IEC 60063 E24; the 555 astable law (NE555 datasheet) is linear in RB·C for the low time.
    const block = noteBlock(['circuit: 555-astable', 'supply: 5 V', 'ra: 1k', 'rb: ?', 'c: 10n', 'target: 1 kHz ±5%']);
    const solved = block.solved!.rb;
    // f = 1 / (ln2·(RA + 2RB)·C) → RB = (1/(f·ln2·C) − RA) / 2
    close(solved.exact!, (1 / (1000 * Math.LN2 * 10e-9) - 1000) / 2, 1e-9);
    // Exact 71.6 kΩ lies between E24's 68k and 75k, log-nearer to 75k.
    assert.equal(solved.value, 75000);
    close(block.values.frequency, 1 / (Math.LN2 * (1000 + 2 * 75000) * 10e-9));
  });

  it('searches timer registers for a target', () => {
    // 48 MHz / 1 kHz = 48,000 ticks: prescaler 1 with reload 47,999 fits 16 bits exactly.
    const block = noteBlock(['circuit: timer', 'clock: 48 MHz', 'prescaler: ?', 'reload: ?', 'target: 1 kHz']);
    assert.deepEqual(errors(block), []);
    const { prescaler, reload } = block.solved!;
    assert.equal(48e6 / prescaler.value / (reload.value + 1), 1000);
    assert.ok(reload.value <= 65535);
  });

  it('names the offending key when the physics break', () => {
    const block = noteBlock(['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 1.0 V', 'vt-: 2.0 V', 'r: 10k', 'c: 1n']);
    const error = block.findings.find((f) => f.code === 'physics');
    assert.ok(error, 'physics error');
    assert.match(error.message, /^`vt-`: /);
    assert.deepEqual(block.values, {});
    assert.equal(block.params.r, 10000, 'params still list what resolved');
  });

  it('reports unknown circuits, keys and identifiers where they stand', () => {
    const text = ['```timing x', 'circuit: schmit-rc', '```'].join('\n');
    const doc = analyzeText('n.md', text);
    const f = doc.blocks[0].findings[0];
    assert.equal(f.message, 'unknown circuit `schmit-rc` — did you mean `schmitt-rc`?');
    assert.equal(text.slice(f.span.start, f.span.end), 'schmit-rc');
    const typo = noteBlock(['circuit: ring', 'stages: 5', 'tpd: 1n', 'tdp: 2n']);
    assert.match(typo.findings[0].message, /`tdp` is not a key of ring — did you mean `tpd`\?/);
    const unknown = noteBlock(['circuit: ring', 'stages: STAGES', 'tpd: 1n']);
    assert.match(errors(unknown)[0], /STAGES/);
  });

  it('refuses a `firmware:` file outside the workspace', () => {
    const block = noteBlock(['circuit: timer', 'firmware: ../../../etc/board.h', 'clock: F', 'prescaler: 1', 'reload: 9']);
    assert.match(errors(block)[0], /outside the workspace/);
  });

  it('reads constants from the file `firmware:` names', () => {
    const block = noteBlock(['circuit: timer', 'firmware: ../fw/board.h', 'clock: CLOCK_HZ', 'prescaler: 8', 'reload: TOP'], { 'fw/board.h': '#define CLOCK_HZ (8000000UL)\nenum { TOP = 999 };\n' });
    assert.deepEqual(errors(block), []);
    close(block.values.frequency, 1000);
    assert.deepEqual(block.findings, []);
  });

  it('still reads the older `from:` with a C-family path, with a note and a fix suggesting `firmware:`', () => {
    const block = noteBlock(['circuit: timer', 'from: ../fw/board.h', 'clock: CLOCK_HZ', 'prescaler: 8', 'reload: TOP'], { 'fw/board.h': '#define CLOCK_HZ (8000000UL)\nenum { TOP = 999 };\n' });
    assert.deepEqual(errors(block), []);
    close(block.values.frequency, 1000);
    const renamed = block.findings.filter((f) => f.code === 'key-renamed');
    assert.equal(renamed.length, 1);
    assert.equal(renamed[0].severity, 'info');
    assert.match(renamed[0].message, /`firmware:`/);
    assert.equal(renamed[0].fixes?.[0].edits[0].newText, 'firmware');
  });

  it('reads `from:` as rc-delay\'s start voltage unless it names a firmware file', () => {
    // RC charging law (common practice): from 1 V toward 5 V, reaching 3 V takes RC·ln(4/2) = ln2·RC.
    const block = noteBlock(['circuit: rc-delay', 'r: 10k', 'c: 1u', 'from: 1 V', 'toward: 5 V', 'to: 3 V']);
    assert.deepEqual(errors(block), []);
    close(block.values.time, Math.LN2 * 10e3 * 1e-6);
    const typo = noteBlock(['circuit: timer', 'from: board', 'clock: 1 MHz', 'prescaler: 1', 'reload: 9']);
    assert.match(typo.findings[0].message, /named with `firmware:`/);
  });

  it('refuses an absolute tolerance in another unit than its value', () => {
    const block = noteBlock(['circuit: rc-delay', 'r: 10k ±1 V', 'c: 1u', 'toward: 5 V', 'to: 2 V']);
    assert.match(errors(block)[0], /tolerance of `r` is a voltage \(V\), but `r` is a resistance/);
  });

  it('adds the safety-timing caution to any circuit named for a guard, or marked `safety: yes`', () => {
    // Common practice: watchdog, reset and interlock timing is verified on hardware, apart from its arithmetic.
    const named = noteBlock(['circuit: 555-monostable', 'supply: 5 V', 'r: 100k', 'c: 10u']).findings;
    assert.ok(!named.some((f) => f.code === 'caution'));
    const text = ['```timing door-interlock', 'circuit: 555-monostable', 'supply: 5 V', 'r: 100k', 'c: 10u', '```', ''].join('\n');
    const guarded = analyzeText('n.md', text).blocks[0].findings.filter((f) => f.code === 'caution');
    assert.equal(guarded.length, 1);
    assert.match(guarded[0].message, /verify it independently on the built hardware/);
    const marked = noteBlock(['circuit: rc-delay', 'r: 10k', 'c: 1u', 'toward: 5 V', 'to: 2 V', 'safety: yes']).findings;
    assert.equal(marked.filter((f) => f.code === 'caution').length, 1);
    // A caution one word could remove would protect no one: `safety: no` on a guard-named block keeps it.
    const silenced = analyzeText('n.md', text.replace('c: 10u', 'c: 10u\nsafety: no')).blocks[0].findings;
    assert.equal(silenced.filter((f) => f.code === 'caution').length, 1);
  });

  it('reports a value above the parameter table\'s limit once, not again from the model', () => {
    const block = noteBlock(['circuit: timer', 'clock: 1 MHz', 'prescaler: 0', 'reload: 9']);
    assert.equal(block.findings.filter((f) => f.code === 'register-range').length, 1);
    assert.equal(block.findings.filter((f) => f.code === 'physics').length, 0);
  });

  it('says that `2u` beside a firmware name is 2 µ, not C\'s unsigned 2', () => {
    const source = ['#define SYS_HZ 16000000u', '// @timing t', '// circuit: timer', '// clock: SYS_HZ / 2u', '// prescaler: 8', '// reload: 999', '// @timing cap', '// circuit: rc-delay', '// r: 10k', '// c: 2u', '// toward: 5 V', '// to: 2 V', ''].join('\n');
    const [timer, delay] = analyzeText('src/t.c', source).blocks;
    const hint = timer.findings.find((f) => f.code === 'value-unit')!;
    assert.equal(source.slice(hint.span.start, hint.span.end), '2u');
    assert.ok(!delay.findings.some((f) => f.code === 'value-unit'), 'a lone 2u is a 2 µF capacitor');
    // A register key is a C constant expression (DESIGN.md, "Values"): there `2u` is C's unsigned 2.
    const register = analyzeText('src/r.c', '// @timing r\n// circuit: timer\n// clock: 1 MHz\n// prescaler: 2u\n// reload: 9\n').blocks[0];
    assert.ok(!register.findings.some((f) => f.code === 'value-unit'), 'a register written 2u');
    assert.equal(register.params.prescaler, 2);
  });

  it('warns when a UART divisor misses the wanted rate beyond ±2 %', () => {
    // 16 MHz / (16 · 9) = 111.1 kbaud against 115200: −3.5 % (AVR baud tables, from memory).
    const block = noteBlock(['circuit: baud', 'clock: 16 MHz', 'baud: 115200', 'divisor: 9']);
    const warning = block.findings.find((f) => f.severity === 'warning')!;
    assert.match(warning.message, /^`divisor`: rate error −3\.5/);
  });
});
