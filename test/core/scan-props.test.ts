// Properties that hold for any text at all: the scanners never throw, and every span they report lies
// inside the text, in order, and reproduces the text it stands for.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { scanMarkdown } from '../../core/scan/markdown';
import { scanC } from '../../core/scan/c';
import type { RawBlock, Span } from '../../core/types';

const pieces = [
  '```', '~~~', '````', 'timing', ' ', '\t', '\n', '\r\n', '\r', ':', '#', '@timing', '//', '/*', '*/', '*',
  '"', "'", '\\', 'R"x(', ')x"', 'r', 'VT+', '47k ±1%', 'µ', '🙂', '\uFEFF', 'a', '0',
];
const textArb = fc.oneof(
  fc.string({ unit: 'binary', maxLength: 200 }),
  fc.array(fc.constantFrom(...pieces), { maxLength: 80 }).map((parts) => parts.join('')),
);

function within(span: Span, text: string, outer?: Span): void {
  assert.ok(Number.isInteger(span.start) && Number.isInteger(span.end));
  assert.ok(0 <= span.start && span.start <= span.end && span.end <= text.length, JSON.stringify(span));
  if (outer) assert.ok(outer.start <= span.start && span.end <= outer.end, `${JSON.stringify(span)} in ${JSON.stringify(outer)}`);
}

function checkBlocks(text: string, blocks: RawBlock[]): void {
  let previousEnd = 0;
  for (const block of blocks) {
    within(block.span, text);
    assert.ok(block.span.start >= previousEnd, 'blocks in order, not overlapping');
    previousEnd = block.span.end;
    within(block.headerSpan, text, block.span);
    if (block.nameSpan) {
      within(block.nameSpan, text, block.headerSpan);
      assert.equal(text.slice(block.nameSpan.start, block.nameSpan.end), block.name);
    }
    let entryEnd = block.headerSpan.end;
    for (const entry of block.entries) {
      within(entry.keySpan, text, block.span);
      within(entry.valueSpan, text, block.span);
      assert.ok(entry.keySpan.start >= entryEnd && entry.keySpan.end < entry.valueSpan.start);
      entryEnd = entry.valueSpan.end;
      assert.equal(text.slice(entry.valueSpan.start, entry.valueSpan.end), entry.valueText);
      assert.equal(text.slice(entry.keySpan.start, entry.keySpan.end).toLowerCase(), entry.key);
      assert.ok(entry.valueText.length > 0);
    }
    for (const finding of block.findings) within(finding.span, text);
  }
}

describe('scanner properties (fast-check)', () => {
  it('scanMarkdown never throws and keeps every span inside the text and ordered', () => {
    fc.assert(fc.property(textArb, (text) => checkBlocks(text, scanMarkdown(text))), { numRuns: 2000 });
  });

  it('scanC never throws and keeps every span inside the text and ordered', () => {
    fc.assert(fc.property(textArb, (text) => checkBlocks(text, scanC(text))), { numRuns: 2000 });
  });

  it('finds a Markdown block wherever it is put between random lines', () => {
    const block = '```timing probe\nr: 47k ±1%\n```';
    fc.assert(
      fc.property(fc.array(fc.constantFrom('text', '', '# h', 'r: 1', '    ```timing no', '~~~js\nx\n~~~'), { maxLength: 6 }), (before) => {
        const text = [...before, block].join('\n');
        const found = scanMarkdown(text);
        assert.equal(found.length, 1);
        assert.equal(found[0].entries[0].valueText, '47k ±1%');
      }),
    );
  });
});
