// The analysis cache against its oracle, a fresh analysis of the same text: every reuse must give exactly
// what analysing from scratch gives, and only blocks whose text or firmware answers changed are re-analysed.
import { strict as assert } from 'assert';
import * as path from 'node:path';
import fc from 'fast-check';
import { Analyzer, analyzeDocument } from '../../core/analyze';
import type { DocumentAnalysis } from '../../core/types';
import { memoryOptions, root } from '../helpers/analyze';

const block = (name: string, r: string) => ['```timing ' + name, 'circuit: schmitt-rc', 'supply: 3.3 V ±5%', 'vt+: 0.6 * supply', 'vt-: 0.3 * supply', `r: ${r} ±1%`, 'c: 100n ±10%', 'expect: 150 Hz ±5%', '```'].join('\n');
const note = (rs: string[]) => '# note\n\n' + rs.map((r, i) => block(`b${i}`, r) + '\n\nSome words.\n').join('\n');
const doc = (text: string, name = 'notes/a.md') => ({ uri: path.join(root, name), text, languageId: name.endsWith('.md') ? 'markdown' : 'c' });
const same = (a: DocumentAnalysis, b: DocumentAnalysis) => assert.equal(JSON.stringify(a), JSON.stringify(b));

describe('analysis cache', () => {
  it('re-analyses only the edited block, and agrees with a fresh analysis', () => {
    const options = memoryOptions();
    const analyzer = new Analyzer();
    const rs = ['47k', '56k', '68k', '82k'];
    analyzer.analyze(doc(note(rs)), options);
    assert.deepEqual(analyzer.stats, { blocks: 4, evaluated: 4 });
    rs[2] = '69k';
    const text = note(rs);
    const cached = analyzer.analyze(doc(text), options);
    assert.deepEqual(analyzer.stats, { blocks: 4, evaluated: 1 });
    same(cached, analyzeDocument(doc(text), options));
  });

  it('moves the spans and lines of blocks below an inserted line', () => {
    const options = memoryOptions();
    const analyzer = new Analyzer();
    const rs = ['47k', '56k', '68k'];
    analyzer.analyze(doc(note(rs)), options);
    const text = note(rs).replace('Some words.', 'Some words,\nand a new line of prose.');
    const cached = analyzer.analyze(doc(text), options);
    assert.equal(analyzer.stats.evaluated, 0);
    same(cached, analyzeDocument(doc(text), options));
    // The mismatch warning of the last block points at its `expect:` value in the new text.
    const last = cached.blocks[2];
    const warning = last.findings.find((f) => f.code === 'expect-mismatch');
    assert.ok(warning);
    assert.equal(text.slice(warning.span.start, warning.span.end), '150 Hz ±5%');
  });

  it('re-analyses a C block when a constant it reads changes elsewhere in the file', () => {
    const options = memoryOptions();
    const analyzer = new Analyzer();
    const source = (top: string) => `#define DIV 64u\n#define TOP ${top}\n/* @timing tick\n * circuit: timer\n * clock: 16 MHz\n * prescaler: DIV\n * reload: TOP\n */\n/* @timing other\n * circuit: timer\n * clock: 16 MHz\n * prescaler: 8\n * reload: 999\n */\n`;
    analyzer.analyze(doc(source('249u'), 'src/t.c'), options);
    const cached = analyzer.analyze(doc(source('124u'), 'src/t.c'), options);
    assert.equal(analyzer.stats.evaluated, 1);
    // Timer law (fact of the trade): 16 MHz / 64 / 125 = 2 kHz.
    assert.equal(cached.blocks[0].values.frequency, 2000);
    same(cached, analyzeDocument(doc(source('124u'), 'src/t.c'), options));
  });

  it('drops its answers when a setting changes', () => {
    const analyzer = new Analyzer();
    const text = note(['47k']);
    analyzer.analyze(doc(text), memoryOptions());
    const wider = memoryOptions({}, { defaultTolerance: 0.2 });
    const cached = analyzer.analyze(doc(text), wider);
    assert.equal(analyzer.stats.evaluated, 1);
    same(cached, analyzeDocument(doc(text), wider));
  });

  it('never differs from a fresh analysis over random edit sequences', () => {
    const options = memoryOptions();
    const base = note(['47k', '56k', '68k']);
    const edit = fc.record({ at: fc.nat({ max: base.length }), remove: fc.nat({ max: 3 }), insert: fc.constantFrom('', '1', '\n', 'x', ' ', '`', ':', '%', '```') });
    fc.assert(
      fc.property(fc.array(edit, { minLength: 1, maxLength: 6 }), (edits) => {
        const analyzer = new Analyzer();
        let text = base;
        analyzer.analyze(doc(text), options);
        for (const e of edits) {
          const at = Math.min(e.at, text.length);
          text = text.slice(0, at) + e.insert + text.slice(at + e.remove);
          same(analyzer.analyze(doc(text), options), analyzeDocument(doc(text), options));
        }
      }),
      { numRuns: 60 },
    );
  });
});
