// The Markdown scanner against outside references: the CommonMark 0.31.2 specification's own examples (npm
// `commonmark-spec`, every section, tabs written `→` there) and markdown-it's CommonMark preset (a parser that
// passes that specification) decide where each fenced code block opens, what its content lines are and where
// it ends. Our own placements (quotes, lists at any depth, indented code, HTML blocks) are checked against
// markdown-it too, down to the offset of every key.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import MarkdownIt from 'markdown-it';
import { walkFences } from '../../core/scan/commonmark';
import { scanMarkdown } from '../../core/scan/markdown';
import { lineOf, lineStarts } from '../../core/scan/lines';
import { Code } from '../../core/codes';

// eslint-disable-next-line @typescript-eslint/no-require-imports
const spec: { tests: { markdown: string; section: string; number: number }[] } = require('commonmark-spec');
const md = new MarkdownIt('commonmark');

interface SeenFence {
  open: number;
  end: number;
  info: string;
  content: string[];
}

const trimStart = (line: string) => line.replace(/^[ \t]+/, '');

function lineCount(text: string, starts: number[]): number {
  // CommonMark §2.1: a final line ending does not begin another line.
  return starts[starts.length - 1] === text.length && text.length > 0 ? starts.length - 1 : starts.length;
}

/** Fences as markdown-it sees them: map lines, first info word, content lines without leading blanks. */
function referenceFences(text: string): SeenFence[] {
  return md
    .parse(text, {})
    .filter((t) => t.type === 'fence')
    .map((t) => ({ open: t.map![0], end: t.map![1], info: t.info.trim().split(/\s+/)[0], content: t.content.split('\n').slice(0, -1).map(trimStart) }));
}

function ourFences(text: string): SeenFence[] {
  const starts = lineStarts(text);
  const fences: SeenFence[] = [];
  let current: SeenFence | undefined;
  walkFences(text, {
    open(at, lineEnd, infoAt) {
      current = { open: lineOf(starts, at), end: 0, info: text.slice(infoAt, lineEnd).trim().split(/\s+/)[0], content: [] };
      return true;
    },
    line(from, to) {
      current!.content.push(trimStart(text.slice(from, to)));
    },
    close(_closing, next) {
      current!.end = next >= text.length ? lineCount(text, starts) : lineOf(starts, next);
      fences.push(current!);
    },
  });
  return fences;
}

describe('Markdown fences where CommonMark sees them', () => {
  it('agrees with markdown-it on every example of the CommonMark 0.31.2 specification', () => {
    // All 652 examples: fences, block quotes, list items, tabs, HTML blocks, indented code, setext headings.
    assert.ok(spec.tests.length >= 600);
    const disagreements: string[] = [];
    for (const example of spec.tests) {
      const text = example.markdown.replace(/→/g, '\t');
      const expected = referenceFences(text);
      const actual = ourFences(text);
      if (JSON.stringify(actual) !== JSON.stringify(expected)) {
        disagreements.push(`example ${example.number} (${example.section}): expected ${JSON.stringify(expected)}, got ${JSON.stringify(actual)}`);
      }
    }
    assert.deepEqual(disagreements, []);
  });

  // Containers and leaves combined at random: every timing block, and every key in it, where markdown-it has it.
  const prefixes = ['', '> ', '>', ' > ', '- ', '* ', '+ ', '1. ', '2) ', '10. ', '  ', '   ', '    ', '\t', '-   ', '1.     ', '>\t', '-\t'];
  const bodies = [
    '```timing a', '```timing', '~~~timing b', '````timing c', '```', '~~~', '````', '```js', 'K', 'K', 'K', '# K',
    'text', '', '', '<div>', '</div>', '<!--', '-->', '<x-note>', '# heading', '---', '***', '===', '- - -',
  ];
  const line = fc.tuple(fc.array(fc.constantFrom(...prefixes), { maxLength: 3 }), fc.constantFrom(...bodies)).map(([p, b]) => p.join('') + b);
  const document = fc.tuple(fc.array(line, { maxLength: 20 }), fc.constantFrom('\n', '\r\n'));

  /**
   * markdown-it continues a block quote at a `>` behind four or more columns of indentation (also inside
   * another quote or a list item); CommonMark §5.1 allows at most three (such a line is paragraph continuation
   * text or indented code). Lines with a `>` behind a tab or four spaces are left out of the comparison; the
   * scanner follows the specification there.
   */
  const markdownItLeniency = (line: string) => /(?:\t| {4})[ \t]*>/.test(line);

  it('finds the timing blocks and keys markdown-it finds, at their exact offsets (fast-check)', () => {
    fc.assert(
      fc.property(document, ([lines, eol]) => {
        let counter = 0;
        // Unique keys, so a repeated key never hides one.
        const text = lines.join(eol).replace(/K/g, () => `k${counter}: ${counter++}k`);
        fc.pre(!lines.some(markdownItLeniency));
        const starts = lineStarts(text);
        const expected = md
          .parse(text, {})
          .filter((t) => t.type === 'fence' && t.info.trim().split(/\s+/)[0] === 'timing')
          .map((t) => ({
            open: t.map![0],
            name: t.info.trim().split(/\s+/)[1],
            entries: t.content
              .split('\n')
              .map((l, i) => ({ match: /^[ \t]*([a-z][a-z0-9+_.-]*)[ \t]*:[ \t]*(\S.*?)[ \t]*$/.exec(l), line: t.map![0] + 1 + i }))
              .filter((e) => e.match)
              .map((e) => ({ key: e.match![1], value: e.match![2], line: e.line })),
          }));
        const actual = scanMarkdown(text).map((b) => {
          for (const e of b.entries) {
            assert.equal(text.slice(e.keySpan.start, e.keySpan.end), e.key);
            assert.equal(text.slice(e.valueSpan.start, e.valueSpan.end), e.valueText);
          }
          return { open: lineOf(starts, b.headerSpan.start), name: b.name, entries: b.entries.map((e) => ({ key: e.key, value: e.valueText, line: lineOf(starts, e.keySpan.start) })) };
        });
        assert.deepEqual(actual, expected, JSON.stringify(text));
      }),
      { numRuns: Number(process.env.RUNS ?? 1500) },
    );
  });
});

describe('scanMarkdown in containers', () => {
  const keys = (text: string) => scanMarkdown(text).map((b) => [b.name, b.entries.map((e) => text.slice(e.keySpan.start, e.valueSpan.end))]);

  it('reads a block in a block quote, with `> ` stripped and offsets into the original text', () => {
    const text = 'Quoted:\n\n> ```timing led\n> r: 47k\n>c: 100n\n> ```\n';
    const [block] = scanMarkdown(text);
    assert.equal(block.name, 'led');
    assert.equal(text.indexOf('```timing'), block.headerSpan.start);
    const r = block.entries[0];
    assert.equal(r.keySpan.start, text.indexOf('r: 47k'));
    assert.equal(r.valueSpan.end, text.indexOf('r: 47k') + 'r: 47k'.length);
    assert.deepEqual(keys(text), [['led', ['r: 47k', 'c: 100n']]]);
    assert.deepEqual(block.findings, []);
    assert.equal(text.slice(block.span.start, block.span.end), '```timing led\n> r: 47k\n>c: 100n\n> ```');
  });

  it('reads blocks in nested quotes and in list items at any depth', () => {
    const text = [
      '> > ```timing deep',
      '> > r: 1k',
      '> > ```',
      '',
      '- item',
      '  1. sub',
      '     - ```timing listed',
      '       c: 1n',
      '       ```',
      '',
      '1.  four-wide item',
      '    ```timing wide',
      '    stages: 5',
      '    ```',
      '',
      '- > ```timing quoted-item',
      '  > tpd: 1n',
      '  > ```',
    ].join('\n');
    assert.deepEqual(keys(text), [
      ['deep', ['r: 1k']],
      ['listed', ['c: 1n']],
      ['wide', ['stages: 5']],
      ['quoted-item', ['tpd: 1n']],
    ]);
  });

  it('finds no block in indented code or in an HTML block', () => {
    assert.deepEqual(scanMarkdown('Code:\n\n    ```timing a\n    r: 1k\n    ```\n'), []);
    assert.deepEqual(scanMarkdown('- item\n\n      ```timing a\n      r: 1k\n      ```\n'), []);
    assert.deepEqual(scanMarkdown('<div>\n```timing a\nr: 1k\n```\n</div>\n'), []);
    assert.deepEqual(scanMarkdown('<!--\n```timing a\nr: 1k\n```\n-->\n'), []);
    // §4.6: a blank line ends a <div> block, so the fence after it is a block again.
    assert.deepEqual(keys('<div>\n\n```timing b\nr: 1k\n```\n</div>\n'), [['b', ['r: 1k']]]);
  });

  it('ends a fence with its block quote and says so', () => {
    const text = '> ```timing cut\n> r: 1k\nc: 1n\n```\n';
    const [block] = scanMarkdown(text);
    assert.deepEqual(block.entries.map((e) => e.key), ['r']);
    assert.equal(block.findings[0].code, Code.blockUnterminated);
    assert.match(block.findings[0].message, /block quote or list item/);
  });

  it('keeps a continuation line that is not `key: value` inside a list item as a positioned finding', () => {
    const text = '- ```timing x\n  r 1k\n  ```\n';
    const [block] = scanMarkdown(text);
    assert.equal(block.findings.length, 1);
    assert.equal(text.slice(block.findings[0].span.start, block.findings[0].span.end), 'r 1k');
  });
});
