// Block references (`@name.result`): a clock chain across a note and a C file, tolerance carried down it, and the
// findings for cycles, unknown, ambiguous and repeated names. Expected values are derived by hand below.
import { strict as assert } from 'assert';
import * as path from 'node:path';
import fc from 'fast-check';
import { analyzeWorkspace } from '../../core/analyze';
import type { BlockAnalysis, DocumentAnalysis } from '../../core/types';
import { memoryOptions, root } from '../helpers/analyze';

function workspace(files: Record<string, string>): DocumentAnalysis[] {
  const docs = Object.entries(files).map(([name, text]) => ({ uri: path.join(root, name), text, languageId: name.endsWith('.md') ? 'markdown' : 'c' }));
  return analyzeWorkspace(docs, memoryOptions(files));
}

function blockNamed(analyses: DocumentAnalysis[], name: string): BlockAnalysis {
  const found = analyses.flatMap((a) => a.blocks).filter((b) => b.name === name);
  assert.equal(found.length, 1, `one block named ${name}`);
  return found[0];
}

const messages = (block: BlockAnalysis, severity = 'error') => block.findings.filter((f) => f.severity === severity).map((f) => `${f.code}: ${f.message}`);

const note = (...blocks: string[][]) => ['# clocks', '', ...blocks.flatMap(([name, ...lines]) => ['```timing ' + name, ...lines, '```', ''])].join('\n');
const cBlock = (name: string, ...lines: string[]) => [`/* @timing ${name}`, ...lines.map((l) => ` * ${l}`), ' */', ''].join('\n');

describe('block references across a note and a C file', () => {
  // A timer with prescaler p and reload 0 divides its clock by p (timer law: f = clock / (prescaler · (reload + 1))).
  const files = {
    'notes/clocks.md': note(
      ['sysclk', 'circuit: timer', 'clock: 16 MHz ±25 ppm', 'prescaler: 1', 'reload: 0'],
      ['bus', 'circuit: timer', 'clock: @sysclk.frequency', 'prescaler: 2', 'reload: 0'],
    ),
    'src/uart.c': cBlock('console', 'circuit: baud', 'clock: @bus', 'baud: 115200') + 'int main(void) { return 0; }\n',
  };

  it('gives the rate, the error and an error band that holds the crystal tolerance', () => {
    const analyses = workspace(files);
    const console_ = blockNamed(analyses, 'console');
    assert.deepEqual(messages(console_), []);
    // bus = 16 MHz / 2 = 8 MHz. Divisor = round(8e6 / (16 · 115200)) = round(4.3403) = 4 (nearest whole divisor,
    // the 16550 divisor latch); rate = 8e6 / (16 · 4) = 125000 baud; error = 125000 / 115200 − 1 = 0.0850694…
    assert.equal(console_.params.clock, 8e6);
    assert.equal(console_.values.baud, 125000);
    assert.ok(Math.abs(console_.values.error - (125000 / 115200 - 1)) < 1e-12);
    // ±25 ppm at the crystal is ±25 ppm at every divided clock: 125000 · (1 ∓ 25e-6) = 124996.875 … 125003.125.
    const band = console_.spread!.baud;
    assert.ok(Math.abs(band.min - 124996.875) < 1e-6, `min ${band.min}`);
    assert.ok(Math.abs(band.max - 125003.125) < 1e-6, `max ${band.max}`);
    const errorBand = console_.spread!.error;
    assert.ok(Math.abs(errorBand.min - (124996.875 / 115200 - 1)) < 1e-12);
    assert.ok(Math.abs(errorBand.max - (125003.125 / 115200 - 1)) < 1e-12);
    assert.deepEqual(Object.keys(band.shares ?? {}), ['@sysclk.clock']);
  });

  it('lists each reference with the file and line of the block it read', () => {
    const console_ = blockNamed(workspace(files), 'console');
    assert.deepEqual(console_.references?.map(({ name, result, uri, line, value, key }) => ({ name, result, uri, line, value, key })), [
      { name: 'bus', result: 'frequency', uri: path.join(root, 'notes/clocks.md'), line: 10, value: 8e6, key: 'clock' },
    ]);
  });

  it('keeps two references to one source correlated: a ratio of the same clock has no spread', () => {
    // clock = sysclk / bus · 1 MHz = 2 MHz exactly at every corner when both move with the one crystal; treated as
    // independent bounds it would spread by about ±50 ppm.
    const analyses = workspace({
      ...files,
      'notes/ratio.md': note(['ratio', 'circuit: timer', 'clock: @sysclk / @bus * 1 MHz', 'prescaler: 1', 'reload: 0']),
    });
    const ratio = blockNamed(analyses, 'ratio');
    assert.deepEqual(messages(ratio), []);
    assert.ok(Math.abs(ratio.values.frequency - 2e6) < 1e-6);
    const spread = ratio.spread!.frequency;
    assert.ok(spread.max - spread.min < 1e-6, `spread ${spread.min} … ${spread.max}`);
  });

  it('a same-file block wins over one elsewhere', () => {
    const analyses = workspace({
      ...files,
      'src/other.c': cBlock('bus', 'circuit: timer', 'clock: 1 MHz', 'prescaler: 1', 'reload: 0') + cBlock('probe', 'circuit: timer', 'clock: @bus', 'prescaler: 1', 'reload: 0'),
    });
    assert.equal(blockNamed(analyses.filter((a) => a.uri.endsWith('other.c')), 'probe').values.frequency, 1e6);
    // The UART's `@bus` is in neither file of it: two blocks in the workspace share the name.
    assert.match(messages(blockNamed(analyses, 'console')).join('\n'), /reference-ambiguous: `@bus` is ambiguous: 2 blocks in the workspace are named `bus`/);
  });
});

describe('crystal → PLL → divider → UART across a note and a C file', () => {
  const files = {
    'notes/clocks.md': note(
      ['xtal', 'circuit: clock', 'frequency: 8 MHz ±25 ppm'],
      ['sysclk', 'circuit: pll', 'ref: @xtal', 'prediv: 1', 'mult: 6', 'postdiv: 2'],
      ['apb', 'circuit: divider', 'clock: @sysclk.frequency', 'divide: 2'],
    ),
    'src/uart.c': '#define LINK_BAUD 9600u\n' + cBlock('link', 'circuit: baud', 'clock: @apb', 'baud: LINK_BAUD', 'oversampling: 16'),
  };

  it('gives the rate, the error and an error band that holds the crystal\'s ppm (derived by hand)', () => {
    const analyses = workspace(files);
    const link = blockNamed(analyses, 'link');
    assert.deepEqual(messages(link), []);
    // PLL (pfd = ref / prediv, vco = pfd · mult, out = vco / postdiv): 8 MHz · 6 / 2 = 24 MHz; the divider halves
    // it: 12 MHz. UART: divisor = round(12e6 / (16 · 9600)) = round(78.125) = 78 (nearest whole divisor);
    // rate = 12e6 / (16 · 78) = 9615.384615… baud; error = 9615.384615… / 9600 − 1 = +0.160256… %.
    const rate = 12e6 / (16 * 78);
    assert.equal(link.params.clock, 12e6);
    assert.ok(Math.abs(link.values.baud - 9615.384615384615) < 1e-9);
    assert.ok(Math.abs(link.values.error - 0.0016025641025641) < 1e-12);
    // ±25 ppm at the crystal scales every clock below it by (1 ± 25e-6), and the divisor stays 78
    // (78.125 · (1 ± 25e-6) still rounds to 78): rate 9615.144231 … 9615.625000 baud, error +0.157753 … +0.162760 %.
    const band = link.spread!.baud;
    assert.ok(Math.abs(band.min - rate * (1 - 25e-6)) < 1e-6 && Math.abs(band.min - 9615.144230769) < 1e-6, `min ${band.min}`);
    assert.ok(Math.abs(band.max - 9615.625) < 1e-6, `max ${band.max}`);
    const errorBand = link.spread!.error;
    assert.ok(Math.abs(errorBand.min - (9615.144230769231 / 9600 - 1)) < 1e-10, `error min ${errorBand.min}`);
    assert.ok(Math.abs(errorBand.max - (9615.625 / 9600 - 1)) < 1e-10, `error max ${errorBand.max}`);
    assert.deepEqual(Object.keys(band.shares ?? {}), ['@xtal.frequency']);
    assert.deepEqual(link.references?.map((r) => [r.name, r.result, r.value, r.line]), [['apb', 'frequency', 12e6, 16]]);
  });

  it('Monte Carlo in the dependant draws the crystal: its percentiles stay inside the worst case', () => {
    const analyses = workspace({ ...files, 'src/uart.c': files['src/uart.c'].replace(' * oversampling: 16', ' * oversampling: 16\n * samples: 2000') });
    const band = blockNamed(analyses, 'link').spread!.baud;
    assert.ok(band.p1! > band.min && band.p99! < band.max && band.p1! < band.p99!, JSON.stringify(band));
  });
});

describe('block reference problems', () => {
  it('a cycle is an error at each reference in it, on the line of the key, and the blocks get no results', () => {
    const text = note(
      ['a', 'circuit: timer', 'clock: @b * 2', 'prescaler: 1', 'reload: 0'],
      ['b', 'circuit: timer', 'clock: @a', 'prescaler: 1', 'reload: 0'],
      ['c', 'circuit: timer', 'clock: @c', 'prescaler: 1', 'reload: 0'],
    );
    const [doc] = workspace({ 'n.md': text });
    for (const name of ['a', 'b', 'c']) {
      const block = doc.blocks.find((b) => b.name === name)!;
      const errors = block.findings.filter((f) => f.code === 'reference-cycle');
      assert.equal(errors.length, 1, name);
      const line = text.slice(0, errors[0].span.start).split('\n').length;
      assert.equal(line, block.line + 2, `${name}: on the clock line`);
      assert.deepEqual(block.values, {});
    }
    assert.match(doc.blocks[0].findings.find((f) => f.code === 'reference-cycle')!.message, /`a` → `b` → `a`/);
    assert.match(doc.blocks[2].findings.find((f) => f.code === 'reference-cycle')!.message, /its own result/);
  });

  it('an unknown name names the nearest blocks; a missing result lists the results', () => {
    const [doc] = workspace({
      'n.md': note(
        ['sysclk', 'circuit: timer', 'clock: 8 MHz', 'prescaler: 1', 'reload: 0'],
        ['x', 'circuit: timer', 'clock: @sysclck', 'prescaler: 1', 'reload: 0'],
        ['y', 'circuit: timer', 'clock: @sysclk.freq', 'prescaler: 1', 'reload: 0'],
        ['link', 'circuit: baud', 'clock: 8 MHz', 'baud: 9600'],
        ['z', 'circuit: timer', 'clock: @link', 'prescaler: 1', 'reload: 0'],
      ),
    });
    assert.deepEqual(messages(doc.blocks[1]), ['reference-unknown: `@sysclck`: no block named `sysclck` in this file or the workspace — nearest: `sysclk`']);
    assert.deepEqual(messages(doc.blocks[2]), ['reference-result: `@sysclk.freq`: timer block `sysclk` has no result `freq` (its results: `period`, `frequency`, `duty`, `counts`)']);
    assert.match(messages(doc.blocks[4])[0], /`@link` stands for a frequency, and baud block `link` has none: name a result, one of `baud`, `error`, `divisor`/);
  });

  it('a result of the wrong dimension is a dimension error', () => {
    const [doc] = workspace({ 'n.md': note(['t', 'circuit: timer', 'clock: 8 MHz', 'prescaler: 1', 'reload: 0'], ['u', 'circuit: timer', 'clock: @t.period', 'prescaler: 1', 'reload: 0']) });
    assert.match(messages(doc.blocks[1]).join(), /key-dimension: `clock` is a frequency \(Hz\), but `@t.period` is a time/);
  });

  it('blocks sharing a name in one file get a warning each', () => {
    const [doc] = workspace({ 'n.md': note(['t', 'circuit: timer', 'clock: 8 MHz', 'prescaler: 1', 'reload: 0'], ['t', 'circuit: timer', 'clock: 4 MHz', 'prescaler: 1', 'reload: 0']) });
    assert.deepEqual(doc.blocks.map((b) => b.findings.filter((f) => f.code === 'block-name-repeated').length), [1, 1]);
  });

  it('a dependant of a block with errors says so and gets no results', () => {
    const [doc] = workspace({ 'n.md': note(['t', 'circuit: timer', 'clock: -8 MHz', 'prescaler: 1', 'reload: 0'], ['u', 'circuit: timer', 'clock: @t', 'prescaler: 1', 'reload: 0']) });
    assert.match(messages(doc.blocks[1]).join(), /reference-result: `@t`: block `t` has no results to give \(it has errors\)/);
    assert.deepEqual(doc.blocks[1].values, {});
  });
});

describe('reference graphs (property)', () => {
  it('any graph of references ends in results or findings, never a throw or a hang', () => {
    const names = ['a', 'b', 'c', 'd', 'e', 'f'];
    const block = fc.record({
      name: fc.constantFrom(...names),
      refs: fc.array(fc.tuple(fc.constantFrom(...names, 'zz'), fc.constantFrom('', '.frequency', '.period', '.nope')), { maxLength: 3 }),
      file: fc.constantFrom('one.md', 'two.md', 'three.c'),
    });
    fc.assert(
      fc.property(fc.array(block, { maxLength: 10 }), (blocks) => {
        const files: Record<string, string> = { 'one.md': '', 'two.md': '', 'three.c': '' };
        for (const b of blocks) {
          const clock = b.refs.length ? b.refs.map(([n, r]) => `@${n}${r}`).join(' + ') : '1 MHz';
          const lines = ['circuit: timer', `clock: ${clock}`, 'prescaler: 2', 'reload: 0'];
          files[b.file] += b.file.endsWith('.c') ? cBlock(b.name, ...lines) : note([b.name, ...lines]);
        }
        const analyses = workspace(files);
        for (const a of analyses) {
          for (const b of a.blocks) {
            for (const f of b.findings) assert.ok(f.span.start >= 0 && f.span.end <= files[path.relative(root, a.uri)].length);
            for (const v of Object.values(b.values)) assert.ok(Number.isFinite(v));
          }
        }
      }),
      { numRuns: 200 },
    );
  });

  it('a chain longer than the limit is cut with a finding, not a stack overflow', () => {
    const blocks: string[][] = [['n0', 'circuit: timer', 'clock: 1 MHz', 'prescaler: 1', 'reload: 0']];
    for (let i = 1; i <= 80; i++) blocks.push([`n${i}`, 'circuit: timer', `clock: @n${i - 1}`, 'prescaler: 1', 'reload: 0']);
    const [doc] = workspace({ 'n.md': note(...blocks) });
    assert.equal(doc.blocks[64].values.frequency, 1e6);
    assert.match(messages(doc.blocks[70]).join(), /more than 64 blocks down a chain|no results to give/);
  });
});
