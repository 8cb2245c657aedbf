// The offset adapter agrees with the editor's own TextDocument, so a header read from disk (not open)
// gets the same ranges it would get open.
import { strict as assert } from 'assert';
import { describe, it } from 'mocha';
import * as vscode from 'vscode';
import { spanToRange, textMapper } from '../../../extension/ranges';

export function rangeTests(): void {
  describe('ranges adapter', () => {
    // Characters outside ASCII (Ω, µ, ±, a surrogate pair) as notes and comments contain them.
    const lines = ['r: 47 kΩ ±1%', 'c: 100 µF', '', '// 🔧 tick', 'last'];

    for (const eol of ['\n', '\r\n']) {
      const text = lines.join(eol);
      it(`maps offsets like vscode.TextDocument.positionAt with ${JSON.stringify(eol)} line ends`, async () => {
        // VS Code API: positionAt/offsetAt count UTF-16 code units; an untitled document keeps a uniform EOL.
        const doc = await vscode.workspace.openTextDocument({ language: 'markdown', content: text });
        assert.equal(doc.getText(), text);
        const mapper = textMapper(text);
        for (let offset = 0; offset <= text.length; offset++) {
          if (eol === '\r\n' && text[offset - 1] === '\r') continue;
          const expected = doc.positionAt(offset);
          const actual = mapper.positionAt(offset);
          assert.deepEqual([actual.line, actual.character], [expected.line, expected.character], `offset ${offset}`);
          assert.equal(mapper.offsetAt(expected), doc.offsetAt(expected), `position of offset ${offset}`);
        }
      });
    }

    it('turns a core span into the range of exactly that text', async () => {
      const text = lines.join('\r\n');
      const doc = await vscode.workspace.openTextDocument({ language: 'markdown', content: text });
      const start = text.indexOf('100 µF');
      const range = spanToRange(doc, { start, end: start + '100 µF'.length });
      assert.equal(doc.getText(range), '100 µF');
      assert.deepEqual([range.start.line, range.start.character], [1, 3]);
    });
  });
}
