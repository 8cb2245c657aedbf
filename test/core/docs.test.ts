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

describe('MARKETPLACE.md, the page of the .vsix', () => {
  const root = path.join(__dirname, '../..');
  const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
  const page = fs.readFileSync(path.join(root, 'MARKETPLACE.md'), 'utf8');

  it('shows images that ship in the package, by paths the installed extension resolves', () => {
    // vsce refuses relative image paths without `repository`; scripts/package.mjs keeps them relative
    // (--no-rewrite-relative-links), so the editor loads them from the installed .vsix.
    assert.match(pkg.repository.url, /^https:\/\/github\.com\/[^/]+\/[^/]+\.git$/);
    assert.match(fs.readFileSync(path.join(root, 'scripts', 'package.mjs'), 'utf8'), /--no-rewrite-relative-links/);
    const images = [...page.matchAll(/!\[[^\]]*\]\(([^)]+)\)/g)].map((m) => m[1]);
    assert.ok(images.length >= 4);
    for (const image of images) {
      assert.ok(!/^[a-z]+:/.test(image), `${image} is relative, so it is published with the repository`);
      assert.ok(fs.existsSync(path.join(root, image)), `${image} exists`);
      assert.ok(pkg.files.some((pattern: string) => pattern === image || (pattern.endsWith('/*.png') && image.startsWith(pattern.slice(0, -'*.png'.length)))), `${image} is in package.json files`);
    }
  });

  it('gives every setting a scope, so a multi-root workspace can set it per folder where that makes sense', () => {
    for (const [name, setting] of Object.entries(pkg.contributes.configuration.properties as Record<string, { scope?: string }>)) {
      assert.ok(['application', 'machine', 'machine-overridable', 'window', 'resource', 'language-overridable'].includes(setting.scope ?? ''), `${name} has no scope`);
    }
  });

  it('lists every command and setting the extension contributes', () => {
    for (const command of pkg.contributes.commands) assert.ok(page.includes(command.title), command.title);
    for (const setting of Object.keys(pkg.contributes.configuration.properties)) assert.ok(page.includes(`\`${setting}\``), setting);
  });
});
