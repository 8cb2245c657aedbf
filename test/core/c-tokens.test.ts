import { strict as assert } from 'assert';
import fc from 'fast-check';
import { buildConstantTable, tokenize } from '../../core/c';

const kinds = (text: string): string[] => tokenize(text).map((t) => `${t.kind}:${t.text}`);

describe('C tokenizer', () => {
  it('keeps integer suffixes, hex, octal, binary and floats as one token each (C11 6.4.8 preprocessing numbers)', () => {
    assert.deepEqual(kinds('10u 20ul 30ULL 0x1Fu 017 0b101 1.5 1e3 1.0f .5e-3 0x1p-2'),
      ['number:10u', 'number:20ul', 'number:30ULL', 'number:0x1Fu', 'number:017', 'number:0b101', 'number:1.5', 'number:1e3', 'number:1.0f', 'number:.5e-3', 'number:0x1p-2']);
  });

  it('takes the longest punctuator (C11 6.4.6p4: <<= before << before <)', () => {
    assert.deepEqual(kinds('a<<=b<<c<d'), ['ident:a', 'punct:<<=', 'ident:b', 'punct:<<', 'ident:c', 'punct:<', 'ident:d']);
  });

  it('drops comments and splices, keeps a newline inside no comment (C11 5.1.1.2 phases 2 and 3)', () => {
    assert.deepEqual(kinds('a /* x\n y */ b // c\nd \\\n e'), ['ident:a', 'ident:b', 'newline:\n', 'ident:d', 'ident:e']);
  });

  it('records offsets that slice back to the token text', () => {
    const text = "#define TOP 'A' /* c */ + \"s\\\"q\" 0x10";
    for (const t of tokenize(text)) assert.equal(text.slice(t.start, t.end), t.text);
  });

  it('marks an unterminated literal or comment instead of throwing', () => {
    assert.match(tokenize("'abc").at(-1)?.error ?? '', /unterminated character/);
    assert.match(tokenize('"abc').at(-1)?.error ?? '', /unterminated string/);
    assert.match(tokenize('x /* never closed').at(-1)?.error ?? '', /unterminated comment/);
  });

  it('never throws and yields ordered, non-overlapping tokens on arbitrary text (fast-check)', () => {
    fc.assert(fc.property(fc.string({ unit: 'binary', maxLength: 300 }), (text) => {
      let last = 0;
      for (const t of tokenize(text)) {
        assert.ok(t.start >= last && t.end > t.start && t.end <= text.length);
        last = t.end;
      }
    }), { numRuns: 500 });
  });
});

const CISH = fc.string({ unit: fc.constantFrom(...'#define if else endif enum const ( ) , ; { } = + - * / % << >> ^ ! ~ ? : \' " 0x1F 1e3 u l A B \\ \n 0 9 '.split(' ')), maxLength: 80 });

describe('C constants never throw (fast-check)', () => {
  it('evaluate() returns a result for arbitrary expression text', () => {
    const table = buildConstantTable('/w/a.c', '#define A (B + 1)\n#define B 2\n#define F(x) ((x) * A)\n', { dataModel: 'ilp32', includeDirs: [], workspaceRoots: ['/w'], read: () => undefined });
    fc.assert(fc.property(fc.oneof(CISH, fc.string({ maxLength: 60 })), (expr) => {
      const r = table.evaluate(expr);
      assert.equal(typeof r.ok, 'boolean');
    }), { numRuns: 800 });
  });

  it('buildConstantTable() and lookup() survive arbitrary file text', () => {
    fc.assert(fc.property(CISH, fc.constantFrom('A', 'B', 'define', 'x'), (text, name) => {
      const table = buildConstantTable('/w/a.c', text, { dataModel: 'ip16', includeDirs: [], workspaceRoots: ['/w'], read: () => undefined });
      assert.equal(typeof table.lookup(name).ok, 'boolean');
    }), { numRuns: 500 });
  });
});
