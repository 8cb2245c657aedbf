// DESIGN.md "Timing blocks": a header is `@timing` (or the fence's `timing`) optionally followed by the block's
// name, one word. Text after that word is not part of the block: a warning on exactly that text, never a silent drop.
import { strict as assert } from 'assert';
import { scanC } from '../../core/scan/c';
import { scanMarkdown } from '../../core/scan/markdown';
import { Code } from '../../core/codes';
import type { RawBlock } from '../../core/types';

function ignored(text: string, block: RawBlock): string[] {
  return block.findings
    .filter((f) => f.code === Code.blockLineMalformed && f.severity === 'warning')
    .map((f) => text.slice(f.span.start, f.span.end));
}

describe('text after a block name', () => {
  it('warns on a // header whose name is followed by more words, and keeps the first word as the name', () => {
    const text = '// @timing spaced name  \n// circuit: ring\n';
    const [block] = scanC(text);
    assert.equal(block.name, 'spaced');
    assert.deepEqual(ignored(text, block), ['name']);
    assert.match(block.findings[0].message, /one word/);
    assert.match(block.findings[0].message, /`name` after it is ignored/);
    assert.deepEqual(block.entries.map((e) => e.key), ['circuit']);
  });

  it('warns on a key written on the header line of a one-line /* */ comment, and says where keys go', () => {
    const text = 'int a; /* @timing x circuit: ring */\n';
    const [block] = scanC(text);
    assert.equal(block.name, 'x');
    assert.deepEqual(block.entries, []);
    assert.deepEqual(ignored(text, block), ['circuit: ring']);
    assert.match(block.findings[0].message, /a line of its own/);
  });

  it('warns in a Markdown info string too, on the text after the name only', () => {
    const text = '```timing status-led extra words\t\nr: 1k\n```\n';
    const [block] = scanMarkdown(text);
    assert.equal(block.name, 'status-led');
    assert.deepEqual(ignored(text, block), ['extra words']);
  });

  it('stays quiet for a header with a name alone or no name, trailing blanks included', () => {
    for (const text of ['// @timing tick   \n// r: 1k\n', '/* @timing\n * r: 1k */', '/** @timing tick */']) {
      assert.deepEqual(scanC(text)[0].findings, [], text);
    }
    for (const text of ['```timing tick  \nr: 1k\n```\n', '```timing\nr: 1k\n```\n', '~~~ timing  spaced\n~~~\n']) {
      assert.deepEqual(scanMarkdown(text)[0].findings, [], text);
    }
  });

  it('shortens a long ignored tail in the message but spans all of it', () => {
    const tail = 'a'.repeat(40) + ' b';
    const text = `// @timing n ${tail}\n`;
    const [block] = scanC(text);
    assert.deepEqual(ignored(text, block), [tail]);
    assert.ok(block.findings[0].message.length < 120, block.findings[0].message);
  });
});
