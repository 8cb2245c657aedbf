// docs/blocks.md, the page SARIF `helpUri`s and hover links point to: its code section is the one written from
// core/codes.ts, and every anchor a link uses is a heading there (GitHub's heading anchors: lower case, markup
// and punctuation other than `-` and `_` dropped, spaces to `-`; common practice, from memory).
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { codeTable } from '../../core/codes';
import { withCodes } from '../../core/docs/codes';
import { referenceLink, referenceUrl } from '../../core/project';

const file = path.join(__dirname, '../../docs/blocks.md');
const doc = fs.readFileSync(file, 'utf8');

function anchors(markdown: string): Set<string> {
  const found = new Set<string>();
  let fenced = false;
  for (const line of markdown.split('\n')) {
    if (/^(```|~~~)/.test(line)) fenced = !fenced;
    const heading = !fenced && /^#{1,6}\s+(.*)$/.exec(line);
    if (heading) found.add(heading[1].toLowerCase().replace(/[^\p{L}\p{N}\s_-]/gu, '').trim().replace(/\s/g, '-'));
  }
  return found;
}

describe('docs/blocks.md', () => {
  it('has the diagnostic codes as core/codes.ts describes them (run `npm run docs` after changing the table)', () => {
    assert.equal(withCodes(doc), doc);
  });

  it('has a heading for every anchor the SARIF rules and the hover link to', () => {
    const have = anchors(doc);
    const wanted = [...codeTable.map((c) => referenceLink(c.id)), referenceLink('keys')];
    for (const link of wanted) {
      assert.ok(link.startsWith(referenceUrl + '#'), link);
      const anchor = link.slice(referenceUrl.length + 1);
      assert.ok(have.has(anchor), `docs/blocks.md has no heading for #${anchor}`);
    }
  });
});
