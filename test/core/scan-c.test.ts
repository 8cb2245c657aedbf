import { strict as assert } from 'assert';
import { scanC } from '../../core/scan/c';
import { scanDocument } from '../../core/scan/index';
import { Code } from '../../core/codes';

const designExample = [
  '#include "board.h"',
  '/* @timing scheduler-tick',
  ' * circuit: timer',
  ' * clock: SYS_CLOCK_HZ',
  ' * prescaler: TICK_DIV',
  ' * reload: TICK_TOP',
  ' * expect: 1 kHz ±0.5%',
  ' */',
  'void tick_init(void);',
].join('\n');

function entriesOf(text: string, index = 0): Array<[string, string]> {
  const block = scanC(text)[index];
  for (const e of block.entries) assert.equal(text.slice(e.valueSpan.start, e.valueSpan.end), e.valueText);
  return block.entries.map((e) => [e.key, e.valueText]);
}

describe('scanC', () => {
  it('sends a block as JSON with every span, as the language server answers `tickmark/block`', () => {
    // JSON-RPC carries JSON text (JSON.stringify): the places a client reads must be in it, not only in getters.
    const text = '/* @timing tick\n * circuit: timer\n */\n';
    const sent = JSON.parse(JSON.stringify(scanC(text)[0]));
    const at = (s: string) => ({ start: text.indexOf(s), end: text.indexOf(s) + s.length });
    assert.deepStrictEqual(sent, {
      host: 'c',
      name: 'tick',
      nameSpan: at('tick'),
      headerSpan: at('@timing tick'),
      span: { start: text.indexOf('@timing'), end: text.indexOf('timer') + 'timer'.length },
      entries: [{ key: 'circuit', keySpan: at('circuit'), valueText: 'timer', valueSpan: at('timer') }],
      findings: [],
    });
  });

  it('reads the DESIGN.md example with exact spans', () => {
    const [block] = scanC(designExample);
    assert.equal(block.host, 'c');
    assert.equal(block.name, 'scheduler-tick');
    assert.equal(designExample.slice(block.nameSpan!.start, block.nameSpan!.end), 'scheduler-tick');
    assert.equal(designExample.slice(block.headerSpan.start, block.headerSpan.end), '@timing scheduler-tick');
    assert.deepEqual(entriesOf(designExample), [
      ['circuit', 'timer'],
      ['clock', 'SYS_CLOCK_HZ'],
      ['prescaler', 'TICK_DIV'],
      ['reload', 'TICK_TOP'],
      ['expect', '1 kHz ±0.5%'],
    ]);
    assert.ok(designExample.slice(block.span.start, block.span.end).endsWith('expect: 1 kHz ±0.5%'));
    assert.deepEqual(block.findings, []);
  });

  it('reads a run of // lines and stops at the first code line', () => {
    const text = '// @timing blink\n//   circuit: ring\n// stages: 5\nint y; // tpd: 1n\n// tpd: 2n\n';
    assert.deepEqual(entriesOf(text), [['circuit', 'ring'], ['stages', '5']]);
    assert.equal(scanC(text).length, 1);
  });

  it('needs the // lines to follow one another', () => {
    const text = '// @timing a\n\n// circuit: ring\n';
    assert.deepEqual(entriesOf(text), []);
  });

  it('reads /// doc comments and CRLF endings', () => {
    const text = '/// @timing uart\r\n/// circuit: baud\r\n///  baud: 115200\r\n';
    assert.deepEqual(entriesOf(text), [['circuit', 'baud'], ['baud', '115200']]);
  });

  it('reads /* */ lines with and without a leading *', () => {
    const text = '/*\n  @timing plain\n  circuit: rc-delay\n  r: 10k\n*/\n/**\n * @timing starred\n *c: 1u\n */';
    const blocks = scanC(text);
    assert.deepEqual(blocks.map((b) => b.name), ['plain', 'starred']);
    assert.deepEqual(entriesOf(text, 0), [['circuit', 'rc-delay'], ['r', '10k']]);
    assert.deepEqual(entriesOf(text, 1), [['c', '1u']]);
  });

  it('finds `* @timing` after prose in a doc comment and ends at the next prose line', () => {
    const text = '/**\n * Starts the tick.\n * @timing tick\n * circuit: timer\n * Call once at boot.\n * reload: 9\n */';
    assert.deepEqual(entriesOf(text), [['circuit', 'timer']]);
  });

  it('ends a block at a blank comment line, and a second @timing starts another', () => {
    const text = '/* @timing a\n * r: 1k\n *\n * c: 1n\n * @timing b\n * c: 2n\n */';
    const blocks = scanC(text);
    assert.deepEqual(blocks.map((b) => [b.name, b.entries.map((e) => e.key)]), [['a', ['r']], ['b', ['c']]]);
  });

  it('leaves text after */ on the same line out of the block', () => {
    const one = '/* @timing solo */ int x = 3; // stages: 3\n';
    const [block] = scanC(one);
    assert.equal(block.name, 'solo');
    assert.deepEqual(block.entries, []);
    const text = '/* @timing a\n * circuit: ring */ stages: 3\n';
    assert.deepEqual(entriesOf(text), [['circuit', 'ring']]);
  });

  // ISO C17 §6.4.9: comment markers inside string and character literals do not start comments.
  it('skips string, character and raw string literals', () => {
    const text = [
      'const char *a = "/* @timing fake";',
      'const char *b = "// @timing fake2 \\" /*";',
      "char q = '\"'; char s = '/';",
      'auto r = R"x(/* @timing fake3 )" */ )x";',
      "long n = 1'000'000; // @timing real",
      '// circuit: ring',
    ].join('\n');
    const blocks = scanC(text);
    assert.deepEqual(blocks.map((b) => b.name), ['real']);
    assert.deepEqual(entriesOf(text), [['circuit', 'ring']]);
  });

  it('ends an unterminated /* cleanly with a finding on the opener', () => {
    const text = 'int a;\n/* @timing open\n * r: 1k\n * c: 1n';
    const [block] = scanC(text);
    assert.deepEqual(block.entries.map((e) => e.key), ['r', 'c']);
    assert.equal(block.findings[0].code, Code.blockUnterminated);
    assert.equal(text.slice(block.findings[0].span.start, block.findings[0].span.end), '/*');
    assert.equal(block.findings[0].span.start, 7);
  });

  it('flags a repeated key on its second use', () => {
    const text = '// @timing a\n// r: 1k\n// R: 2k\n';
    const [block] = scanC(text);
    assert.deepEqual(block.entries.map((e) => e.valueText), ['1k']);
    assert.equal(block.findings[0].code, Code.blockKeyRepeated);
    assert.equal(text.slice(block.findings[0].span.start, block.findings[0].span.end), 'R');
  });

  it('finds every block in a multi-megabyte source file', () => {
    const chunk = 'static const char *m = "/* not */"; /* @timing t\n * r: 1k\n */\nint f(void) { return \'/\'; }\n';
    const text = chunk.repeat(30000);
    assert.ok(text.length > 2_000_000);
    const blocks = scanC(text);
    assert.equal(blocks.length, 30000);
    assert.equal(blocks[29999].entries[0].valueText, '1k');
  });

  it('needs @timing as a whole word at the start of the comment text', () => {
    assert.deepEqual(scanC('// see @timing a\n// @timings b\n'), []);
  });
});

describe('scanDocument', () => {
  const md = '```timing m\nr: 1k\n```\n';
  const c = '// @timing k\n// r: 1k\n';
  it('chooses by language id first', () => {
    assert.equal(scanDocument({ uri: 'file:///a.txt', text: md, languageId: 'markdown' })[0].host, 'markdown');
    assert.equal(scanDocument({ uri: 'file:///a.txt', text: c, languageId: 'cpp' })[0].host, 'c');
  });
  it('falls back to the file extension', () => {
    for (const ext of ['md', 'MARKDOWN']) {
      assert.equal(scanDocument({ uri: `file:///n/x.${ext}`, text: md, languageId: 'plaintext' }).length, 1);
    }
    for (const ext of ['c', 'h', 'cc', 'cpp', 'hpp', 'hh', 'cxx']) {
      assert.equal(scanDocument({ uri: `file:///f/x.${ext}?v=1`, text: c, languageId: '' })[0].name, 'k');
    }
    assert.deepEqual(scanDocument({ uri: 'file:///f.d/readme', text: md, languageId: '' }), []);
    assert.deepEqual(scanDocument({ uri: 'file:///f/x.py', text: c, languageId: 'python' }), []);
  });
});

describe('C blocks ended by a blank comment line', () => {
  // DESIGN.md: a C block ends at the first other line; a `key: value` right after a blank comment line is the
  // likely slip, so it is named where it stands.
  it('warns on the first key line left out, in `//` runs and in `/* */`', () => {
    const text = ['// @timing a', '// circuit: ring', '//', '// tpd: 1n', 'int x;', '/* @timing b', ' * circuit: ring', ' *', ' * tpd: 1n', ' */', ''].join('\n');
    const [a, b] = scanC(text);
    for (const block of [a, b]) {
      const left = block.findings.find((f) => /not part of the block above/.test(f.message));
      assert.ok(left, 'a warning for the left-out line');
      assert.equal(text.slice(left.span.start, left.span.end), 'tpd: 1n');
    }
  });

  it('stays quiet when prose or code follows', () => {
    const text = ['// @timing a', '// circuit: ring', '//', '// The ring runs free.', '', '// tpd: 1n', ''].join('\n');
    assert.deepEqual(scanC(text)[0].findings, []);
  });
});
