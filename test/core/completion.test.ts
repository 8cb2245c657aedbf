// Completion inside timing blocks: circuit ids, a circuit's missing keys, meta keys and allowed words,
// checked against the contract in DESIGN.md (circuit table, `series:` names of IEC 60063, data models).
import { strict as assert } from 'assert';
import { blockCompletions } from '../../core/present/completion';

/** The entries at the `|` of `text` (removed before completing). */
function at(text: string, languageId = 'markdown') {
  const offset = text.indexOf('|');
  const doc = { uri: languageId === 'markdown' ? '/w/a.md' : '/w/a.c', text: text.slice(0, offset) + text.slice(offset + 1), languageId };
  return { entries: blockCompletions(doc, offset), offset };
}

const labels = (text: string, languageId?: string) => at(text, languageId).entries.map((e) => e.label);

describe('block completion', () => {
  it('offers the circuit ids of DESIGN.md after `circuit:`', () => {
    const { entries } = at('```timing\ncircuit: |\n```\n');
    // DESIGN.md "Circuits" table, in its order.
    assert.deepEqual(entries.map((e) => e.label), ['schmitt-rc', 'comparator-rc', '555-astable', '555-monostable', 'inverter-rc', 'ring', 'rc-delay', 'timer', 'baud', 'crystal-load', 'clock', 'divider', 'pll', 'can-bit', 'i2c-rise', 'adc-sample', 'watchdog']);
    assert.ok(entries.every((e) => e.kind === 'circuit' && e.documentation.length > 20));
  });

  it('inserts a space after a bare colon and replaces the word typed so far', () => {
    const bare = at('```timing\ncircuit:|\n```\n');
    assert.equal(bare.entries[0].insertText, ' schmitt-rc');
    assert.deepEqual(bare.entries[0].replace, { start: bare.offset, end: bare.offset });
    const typed = at('```timing\ncircuit: 55|\n```\n');
    assert.equal(typed.entries[0].insertText, 'schmitt-rc');
    assert.deepEqual(typed.entries[0].replace, { start: typed.offset - 2, end: typed.offset });
  });

  it('offers the keys of schmitt-rc not yet written, with unit and default, then the meta keys', () => {
    const { entries } = at('```timing led\ncircuit: schmitt-rc\nsupply: 3.3 V\nr: 47k\n|\n```\n');
    // DESIGN.md: schmitt-rc keys supply, vt+, vt-, r, c, voh (supply), vol (0), tpd (0).
    const keys = entries.filter((e) => e.kind === 'key');
    assert.deepEqual(keys.map((e) => e.label), ['vt+', 'vt-', 'c', 'voh', 'vol', 'tpd']);
    assert.match(keys.find((e) => e.label === 'voh')!.detail, /\[V\].*default supply/);
    assert.match(keys.find((e) => e.label === 'c')!.detail, /\[F\].*required/);
    assert.equal(keys[0].insertText, 'vt+: ');
    // DESIGN.md meta keys; `circuit` is written already.
    assert.deepEqual(entries.filter((e) => e.kind === 'meta').map((e) => e.label), ['expect', 'target', 'series', 'samples', 'seed', 'firmware', 'data-model', 'safety']);
  });

  it('gives the 555 control key its 2/3-supply default and diode its words', () => {
    // DESIGN.md: 555-astable `control` (2/3 supply), `diode` (no).
    const keys = at('```timing\ncircuit: 555-astable\n|\n```\n').entries;
    assert.match(keys.find((e) => e.label === 'control')!.detail, /2\/3 supply/);
    assert.deepEqual(labels('```timing\ncircuit: 555-astable\ndiode: |\n```\n'), ['no', 'yes']);
  });

  it('offers the words of mode, series and data-model', () => {
    // DESIGN.md: timer `mode` (up, up-down); series E3 … E192 of IEC 60063 or none; data models ilp32, lp64, ip16.
    assert.deepEqual(labels('```timing\ncircuit: timer\nmode: u|\n```\n'), ['up', 'up-down']);
    assert.deepEqual(labels('```timing\ncircuit: timer\nseries: |\n```\n'), ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192', 'none']);
    assert.deepEqual(labels('```timing\ncircuit: timer\ndata-model: |\n```\n'), ['ilp32', 'lp64', 'ip16']);
    assert.deepEqual(labels('```timing\ncircuit: timer\nsafety: |\n```\n'), ['yes', 'no']);
    // A numeric key has no words to offer.
    assert.deepEqual(labels('```timing\ncircuit: timer\nclock: |\n```\n'), []);
  });

  it('without a circuit, offers only the meta keys, circuit first', () => {
    assert.deepEqual(labels('```timing\n|\n```\n').slice(0, 2), ['circuit', 'expect']);
  });

  it('completes inside a C block comment, on the line the scanner has not taken yet, without `firmware`', () => {
    const text = '/* @timing tick\n * circuit: timer\n * clock: 16 MHz\n * |\n */\nint x;\n';
    const names = labels(text, 'c');
    assert.deepEqual(names.slice(0, 6), ['prescaler', 'reload', 'mode', 'compare', 'bits', 'prescalers']);
    assert.equal(names.includes('clock'), false);
    assert.equal(names.includes('firmware'), false);
    assert.deepEqual(labels('/* @timing\n * circuit: timer\n * mode:|\n */\n', 'c'), ['up', 'up-down']);
  });

  it('completes in a run of // lines, and stops at the first code line', () => {
    // DESIGN.md's Circuits table: 17 circuits.
    assert.deepEqual(labels('// @timing\n// circuit: |\nint x;\n', 'c').length, 17);
    assert.deepEqual(labels('// @timing\n// circuit: timer\nint x; // mode: |\n', 'c'), []);
  });

  it('offers nothing outside blocks, on the header line, or in a plain fence', () => {
    assert.deepEqual(labels('# note\ncircuit: |\n'), []);
    assert.deepEqual(labels('```timing |\ncircuit: timer\n```\n'), []);
    assert.deepEqual(labels('```js\ncircuit: |\n```\n'), []);
    assert.deepEqual(labels('```timing\ncircuit: timer\n```\nmode: |\n'), []);
    assert.deepEqual(labels('int circuit = 1; /* circuit: | */\n', 'c'), []);
  });
});
