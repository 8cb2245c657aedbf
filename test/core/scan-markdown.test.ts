import { strict as assert } from 'assert';
import { scanMarkdown } from '../../core/scan/markdown';
import { lineOf, lineStarts } from '../../core/scan/lines';
import { Code } from '../../core/codes';
import type { RawBlock } from '../../core/types';

const example = [
  '```timing status-led',
  'circuit: schmitt-rc',
  'supply: 3.3 V',
  'vt+: 2.0 V',
  'vt-: 1.1 V',
  'r: 47k ±1%',
  'c: 100n ±10%',
  'expect: 190 Hz ±5%',
  '```',
];
const exampleValues = ['schmitt-rc', '3.3 V', '2.0 V', '1.1 V', '47k ±1%', '100n ±10%', '190 Hz ±5%'];

/** Every span of a block must reproduce its own text when sliced out of the document. */
function assertSlices(text: string, block: RawBlock): void {
  for (const entry of block.entries) {
    assert.equal(text.slice(entry.valueSpan.start, entry.valueSpan.end), entry.valueText);
    assert.equal(text.slice(entry.keySpan.start, entry.keySpan.end).toLowerCase(), entry.key);
  }
  if (block.nameSpan) assert.equal(text.slice(block.nameSpan.start, block.nameSpan.end), block.name);
}

function checkExample(text: string, headerAt: number): void {
  const blocks = scanMarkdown(text);
  assert.equal(blocks.length, 1);
  const [block] = blocks;
  assert.equal(block.host, 'markdown');
  assert.equal(block.name, 'status-led');
  assert.equal(block.headerSpan.start, headerAt);
  assert.deepEqual(block.entries.map((e) => e.key), ['circuit', 'supply', 'vt+', 'vt-', 'r', 'c', 'expect']);
  assert.deepEqual(block.entries.map((e) => e.valueText), exampleValues);
  const r = block.entries[4];
  assert.equal(text.slice(r.valueSpan.start, r.valueSpan.end), '47k ±1%');
  assert.deepEqual(block.findings, []);
  assertSlices(text, block);
}

describe('scanMarkdown', () => {
  it('reads the DESIGN.md example with exact spans', () => {
    const text = '# Power\n\nSome prose.\n\n' + example.join('\n') + '\n\nAfter.\n';
    checkExample(text, text.indexOf('```timing'));
    const block = scanMarkdown(text)[0];
    assert.equal(text.slice(block.span.start, block.span.end), example.join('\n'));
  });

  it('keeps offsets exact with CRLF and lone CR line endings', () => {
    checkExample('intro\r\n' + example.join('\r\n') + '\r\n', 7);
    checkExample('intro\r' + example.join('\r') + '\r', 6);
  });

  it('keeps offsets exact after a byte order mark', () => {
    // The BOM is one UTF-16 unit; spans still index the text as given.
    checkExample('\uFEFF' + example.join('\n'), 1);
  });

  it('trims tabs around keys and values', () => {
    const text = '```timing\n\tr\t:\t47k ±1%\t\n  c:100n\n```\n';
    const [block] = scanMarkdown(text);
    assert.equal(block.name, undefined);
    assert.deepEqual(block.entries.map((e) => [e.key, e.valueText]), [['r', '47k ±1%'], ['c', '100n']]);
    assertSlices(text, block);
  });

  it('keeps UTF-16 offsets through non-ASCII text', () => {
    const text = 'Ω 🙂 naïve\n```timing µ-clock\nc: 4µ7 ±10 %\nnote: 47 kΩ\n```';
    const [block] = scanMarkdown(text);
    assert.equal(block.name, 'µ-clock');
    assert.deepEqual(block.entries.map((e) => e.valueText), ['4µ7 ±10 %', '47 kΩ']);
    assertSlices(text, block);
  });

  it('lower-cases keys and keeps `+` and `-` in them', () => {
    const text = '```timing\nVT+: 2 V\nVT-: 1 V\nData-Model: ip16\n```';
    const [block] = scanMarkdown(text);
    assert.deepEqual(block.entries.map((e) => e.key), ['vt+', 'vt-', 'data-model']);
    assert.equal(text.slice(block.entries[0].keySpan.start, block.entries[0].keySpan.end), 'VT+');
  });

  it('ignores blank lines and # comment lines inside a block', () => {
    const text = '```timing\n# the LED blinker\n\ncircuit: ring\n   # indented comment\nstages: 5\n```';
    const [block] = scanMarkdown(text);
    assert.deepEqual(block.entries.map((e) => e.key), ['circuit', 'stages']);
    assert.deepEqual(block.findings, []);
  });

  // CommonMark 0.31.2 §4.5 fenced code blocks: tildes work, and a backtick line cannot close a tilde fence.
  it('reads ~~~ fences and closes them only with tildes', () => {
    const text = '~~~timing t\nr: 1k\n```\n~~~\nc: 1n\n';
    const [block] = scanMarkdown(text);
    assert.equal(block.name, 't');
    assert.equal(block.entries.length, 1);
    // The ``` line is inside the block, so it is a malformed line, not a closing fence.
    assert.equal(block.findings.length, 1);
    assert.equal(block.findings[0].code, Code.blockLineMalformed);
    assert.equal(text.slice(block.findings[0].span.start, block.findings[0].span.end), '```');
  });

  // CommonMark 0.31.2 §4.5: the closing fence must be at least as long as the opening one.
  it('does not close a longer fence with a shorter one', () => {
    const text = '````timing\nr: 1k\n```\n````\n';
    const [block] = scanMarkdown(text);
    assert.equal(text.slice(block.span.start, block.span.end), '````timing\nr: 1k\n```\n````');
    const closed = '```timing\nr: 1k\n`````   \nc: 1n\n';
    const [short] = scanMarkdown(closed);
    assert.deepEqual(short.entries.map((e) => e.key), ['r']);
    assert.deepEqual(short.findings, []);
  });

  // CommonMark 0.31.2 §4.5: a fence inside another fenced block is content, so an example is not a block.
  it('treats a timing fence shown inside a longer fence as an example', () => {
    const text = '````markdown\n```timing shown\nr: 1k\n```\n````\n```timing real\nc: 1n\n```\n';
    const blocks = scanMarkdown(text);
    assert.deepEqual(blocks.map((b) => b.name), ['real']);
  });

  // CommonMark 0.31.2 §4.5: up to three spaces of indentation; four make an indented code block (§4.4).
  it('accepts up to three spaces of indentation and no more', () => {
    const three = '   ```timing a\n   r: 1k\n  ```\n';
    const [block] = scanMarkdown(three);
    assert.equal(block.name, 'a');
    assert.equal(block.headerSpan.start, 3);
    assert.deepEqual(block.findings, []);
    assert.deepEqual(scanMarkdown('    ```timing b\n    r: 1k\n    ```\n'), []);
    assert.deepEqual(scanMarkdown('\t```timing b\nr: 1k\n```\n'), []);
  });

  // CommonMark 0.31.2 §4.5: the info string of a backtick fence may not contain backticks.
  it('rejects a backtick fence whose info string holds a backtick', () => {
    assert.deepEqual(scanMarkdown('```timing `x`\nr: 1k\n```\n'), []);
    const blocks = scanMarkdown('```timing `x`\nr: 1k\n```timing y\nc: 1n\n```\n');
    assert.deepEqual(blocks.map((b) => b.name), ['y']);
    assert.equal(scanMarkdown('~~~timing `x`\nr: 1k\n~~~\n')[0].name, '`x`');
  });

  it('needs `timing` as a whole first word of the info string', () => {
    assert.deepEqual(scanMarkdown('```timings\nr: 1k\n```\n'), []);
    assert.deepEqual(scanMarkdown('```js timing\nr: 1k\n```\n'), []);
    assert.equal(scanMarkdown('``` timing  spaced\nr: 1k\n```\n')[0].name, 'spaced');
  });

  it('ends an unterminated fence at the end of the file with a finding on the fence', () => {
    const text = 'x\n```timing open\nr: 47k\nc: 100n\n';
    const [block] = scanMarkdown(text);
    assert.deepEqual(block.entries.map((e) => e.key), ['r', 'c']);
    assert.equal(block.findings.length, 1);
    assert.equal(block.findings[0].code, Code.blockUnterminated);
    assert.equal(text.slice(block.findings[0].span.start, block.findings[0].span.end), '```timing open');
    assert.equal(text.slice(block.span.start, block.span.end), '```timing open\nr: 47k\nc: 100n');
  });

  it('flags a line that is not `key: value`, and a repeated key on its second use', () => {
    const text = '```timing\nr 47k\n: 5\nr: 47k\n9x: 1\nc:\nR: 10k\n```';
    const [block] = scanMarkdown(text);
    const found = block.findings.map((f) => [f.code, text.slice(f.span.start, f.span.end)]);
    assert.deepEqual(found, [
      [Code.blockLineMalformed, 'r 47k'],
      [Code.blockLineMalformed, ': 5'],
      [Code.blockLineMalformed, '9x'],
      [Code.blockLineMalformed, 'c:'],
      [Code.blockKeyRepeated, 'R'],
    ]);
    assert.deepEqual(block.entries.map((e) => [e.key, e.valueText]), [['r', '47k']]);
  });

  it('takes the value after the first colon only', () => {
    const text = '```timing\nnote: a: b\n```';
    assert.equal(scanMarkdown(text)[0].entries[0].valueText, 'a: b');
  });

  it('finds every block in a multi-megabyte note', () => {
    const chunk = 'Prose line with `code` and ``` not a fence\n\n```timing b\nr: 4k7\nc: 10n\n```\n';
    const text = chunk.repeat(40000);
    assert.ok(text.length > 2_000_000);
    const blocks = scanMarkdown(text);
    assert.equal(blocks.length, 40000);
    const starts = lineStarts(text);
    assert.equal(lineOf(starts, blocks[39999].headerSpan.start), 39999 * 6 + 2);
  });
});

describe('lineStarts / lineOf', () => {
  it('counts \\n, \\r\\n and lone \\r as line ends', () => {
    const text = 'a\nb\r\nc\rd';
    const starts = lineStarts(text);
    assert.deepEqual(starts, [0, 2, 5, 7]);
    assert.deepEqual([0, 1, 2, 3, 4, 5, 6, 7, 8].map((o) => lineOf(starts, o)), [0, 0, 1, 1, 1, 2, 2, 3, 3]);
  });
});
