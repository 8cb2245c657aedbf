// The scanners checked against outside implementations: markdown-it (a CommonMark 0.31 parser) for
// where fenced blocks open and close, and the GNU C preprocessor (gcc -E) for what is a comment.
import { skipUnlessCi } from '../helpers/reference';
import { strict as assert } from 'assert';
import { spawnSync } from 'child_process';
import fc from 'fast-check';
import MarkdownIt from 'markdown-it';
import { scanMarkdown } from '../../core/scan/markdown';
import { findComments } from '../../core/scan/c-comments';
import { lineOf, lineStarts } from '../../core/scan/lines';
import { Code } from '../../core/codes';

const markdownLines = [
  '```', '````', '~~~', '~~~~', '```timing', '```timing a', '~~~timing b', '  ```timing c', '   ```',
  '    ```timing d', '```` timing e', '```timing `x`', '~~~timing `y`', '```js', '\t```timing f',
  '```timingx', 'r: 1k', 'text', '', '# heading', '   ~~~   ', '``` ```',
];

describe('scanMarkdown agrees with markdown-it on timing fences', () => {
  const md = new MarkdownIt();
  it('opens, names and closes the same fences (fast-check)', () => {
    const doc = fc.tuple(
      fc.array(fc.constantFrom(...markdownLines), { maxLength: 25 }),
      fc.constantFrom('\n', '\r\n', '\r'),
    );
    fc.assert(
      fc.property(doc, ([lines, eol]) => {
        const text = lines.join(eol);
        const expected = md
          .parse(text, {})
          .filter((t) => t.type === 'fence' && t.info.trim().split(/\s+/)[0] === 'timing')
          .map((t) => ({ open: t.map![0], name: t.info.trim().split(/\s+/)[1], close: t.map![1] }));
        const starts = lineStarts(text);
        // CommonMark 0.31.2 §2.1: a final line ending does not begin another line.
        const lineCount = starts[starts.length - 1] === text.length && text.length > 0 ? starts.length - 1 : starts.length;
        const actual = scanMarkdown(text).map((b) => {
          const closed = !b.findings.some((f) => f.code === Code.blockUnterminated);
          return {
            open: lineOf(starts, b.headerSpan.start),
            name: b.name,
            // markdown-it's map ends past the closing fence, or at the end of the document.
            close: closed ? lineOf(starts, b.span.end) + 1 : lineCount,
          };
        });
        assert.deepEqual(actual, expected);
      }),
      { numRuns: 500 },
    );
  });
});

function gccAvailable(): boolean {
  return spawnSync('gcc', ['--version']).status === 0;
}

const fragments = [
  '/* W */', '// W\n', '"W /* W"', "'\"'", "'/'", '"\\"/* W"', 'R"d(W */ /* W)d"', "1'0", ' W ', '\n',
  '/* W\n * W */', '"a\\\\"', '// W \\\n W\n', 'a/b', '"//W"', '/**/W', '/*/ W */', 'u8"W"', "L'x'",
  ' x/ /W\n', '// W */ W\n', ' */ W ', '//W\r\n', ';',
  // Names and numbers right before a quote: a raw string after `.` or a name, a pp-number that takes `R` in.
  'a.R"d(W /* W)d"', ' 1.R"W"', ' x1 R"q(/* W)q"', "1e+1'0 /* W */", ' 0x1p-2 ', ' .5R"/* W"',
];

describe('findComments agrees with gcc -E on what is a comment', function () {
  before(function () {
    // gcc is part of this project's machine image (machines/node.md); say so plainly when it is missing.
    if (!gccAvailable()) skipUnlessCi(this, 'gcc is not installed; the comment reference check is skipped');
  });

  it('removes exactly the words it calls comment text (fast-check, C++17)', () => {
    fc.assert(
      fc.property(fc.array(fc.constantFrom(...fragments), { minLength: 1, maxLength: 12 }), (parts) => {
        let counter = 0;
        // Unique marker words; gcc leaves undefined identifiers as they are.
        const text = parts.join('').replace(/W/g, () => `QZ${counter++}Z`);
        const result = spawnSync('gcc', ['-E', '-P', '-x', 'c++', '-std=c++17', '-'], { input: text, encoding: 'utf8' });
        assert.equal(result.status, 0, result.stderr);
        const comments = findComments(text);
        for (let n = 0; n < counter; n++) {
          const marker = `QZ${n}Z`;
          const at = text.indexOf(marker);
          const inComment = comments.some((c) => c.start <= at && at < c.end);
          assert.equal(inComment, !result.stdout.includes(marker), `${marker} in ${JSON.stringify(text)}`);
        }
      }),
      { numRuns: 60 },
    );
  });
});
