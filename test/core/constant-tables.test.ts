// Constant tables kept across edits of one C document: an edit inside a comment (a timing block) keeps the table,
// and what it answers is what a table built afresh from the new text answers, places in the file included;
// an edit of code or of a header builds it again. Checked against the uncached build, differentially.
import { strict as assert } from 'assert';
import { buildConstantTable, type ConstantTable } from '../../core/c';
import { ConstantTableCache } from '../../core/analyze/tables';
import { resolutionData } from './c-helpers';

const header = '#ifndef BOARD_H\n#define BOARD_H\n#define CLOCK_HZ 16000000u\n#define DIV 64u\n#endif\n';
const source = (claim: string, extra = '') => [
  '/* firmware: the tick */',
  '#include "board.h"',
  `/* @timing tick\n * circuit: timer\n * clock: CLOCK_HZ\n * prescaler: DIV\n * reload: TOP\n * expect: ${claim}\n */`,
  `#define TOP ((CLOCK_HZ / DIV / 1000u) - 1u)${extra}`,
  'enum { SLOT_A, SLOT_B, SLOT_COUNT }; // slots',
  '',
].join('\n');

function fresh(text: string, files: Record<string, string>): ConstantTable {
  return buildConstantTable('/fw/tick.c', text, { dataModel: 'ilp32', includeDirs: [], workspaceRoots: ['/fw'], read: (f) => files[f] });
}

function cached(cache: ConstantTableCache, text: string, files: Record<string, string>): ConstantTable {
  const read = (f: string) => files[f];
  return cache.table('/fw/tick.c', text, 'ilp32', read, (r) => buildConstantTable('/fw/tick.c', text, { dataModel: 'ilp32', includeDirs: [], workspaceRoots: ['/fw'], read: r }));
}

const answers = (table: ConstantTable) => ['TOP', 'DIV', 'SLOT_COUNT', 'MISSING'].map((name) => resolutionData(table.lookup(name)));

describe('constant tables kept across edits', () => {
  it('keeps the table through an edit inside the block, with the places of the new text', () => {
    const files = { '/fw/board.h': header };
    const cache = new ConstantTableCache();
    cached(cache, source('1 kHz'), files);
    // A longer claim, and a comment grown by a line: every place below it moves by the difference.
    const edited = source('1000 Hz ±0.5%').replace('/* firmware: the tick */', '/* firmware: the tick,\n   run from the main clock */');
    const kept = cached(cache, edited, files);
    assert.deepEqual(cache.counts, { built: 1, reused: 1 });
    assert.deepEqual(answers(kept), answers(fresh(edited, files)));
    assert.deepEqual(kept.findings, fresh(edited, files).findings);
  });

  it('builds again after an edit of code, or when a header reads differently', () => {
    const files: Record<string, string> = { '/fw/board.h': header };
    const cache = new ConstantTableCache();
    cached(cache, source('1 kHz'), files);
    const code = source('1 kHz', ' /* same */').replace('1000u', '500u');
    assert.deepEqual(answers(cached(cache, code, files)), answers(fresh(code, files)));
    assert.deepEqual(cache.counts, { built: 2, reused: 0 });
    files['/fw/board.h'] = header.replace('64u', '8u');
    const table = cached(cache, code, files);
    assert.deepEqual(cache.counts, { built: 3, reused: 0 });
    // (16 MHz / 8 / 500) − 1 = 3999, as C's unsigned arithmetic gives it.
    const top = table.lookup('TOP');
    assert.ok(top.ok && top.value.value === 3999n, JSON.stringify(top, (_k, v) => (typeof v === 'bigint' ? String(v) : v)));
  });

  it('does not keep a table across an unterminated comment', () => {
    const files = { '/fw/board.h': header };
    const cache = new ConstantTableCache();
    const open = source('1 kHz') + '/* never closed';
    cached(cache, open, files);
    cached(cache, open + ' still', files);
    assert.deepEqual(cache.counts, { built: 2, reused: 0 });
  });
});

describe('answers kept or read again', () => {
  it('answers alike at every lookup, whether a table keeps every answer or only what is read twice', () => {
    // C11 6.5.5 (integer division truncates) and 6.7.2.2 (enum constants count from 0): TOP = 249, SLOT_COUNT = 2,
    // DIV = 64, as gcc 12 prints them for the same definitions (checked by hand; the gcc suites check these rules).
    const files = { '/fw/board.h': header };
    const build = (reused: boolean) => buildConstantTable('/fw/tick.c', source('1 kHz'), { dataModel: 'ilp32', includeDirs: [], workspaceRoots: ['/fw'], read: (f) => files[f as keyof typeof files], reused });
    const once = build(false);
    const kept = build(true);
    const first = answers(once);
    for (let i = 0; i < 3; i++) {
      assert.deepEqual(answers(once), first, `one-pass table, lookup ${i + 2}`);
      assert.deepEqual(answers(kept), first, `kept table, lookup ${i + 1}`);
    }
    const value = (name: string) => { const r = once.lookup(name); return r.ok ? r.value.value : r.message; };
    assert.equal(value('TOP'), 249n);
    assert.equal(value('SLOT_COUNT'), 2n);
    assert.equal(value('DIV'), 64n);
  });
});
