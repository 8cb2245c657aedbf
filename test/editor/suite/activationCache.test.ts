// The editor keeps one core Analyzer per open document: a one-character edit re-evaluates one block, and
// closing the document drops the analyzer. The size limit counts UTF-8 bytes, not characters.
import { strict as assert } from 'assert';
import { after, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { eventually, lensTitles, tickmarkDiagnostics } from './host';

interface CacheStats {
  blocks: number;
  evaluated: number;
}

const stats = (uri: vscode.Uri) => vscode.commands.executeCommand<CacheStats | undefined>('tickmark.internal.cacheStats', uri);

function clockBlock(name: string, ohms: string): string {
  return ['```timing ' + name, 'circuit: schmitt-rc', 'supply: 5 V', 'vt+: 3 V', 'vt-: 2 V', `r: ${ohms}`, 'c: 10n', '```', ''].join('\n');
}

async function replaceFirst(doc: vscode.TextDocument, from: string, to: string): Promise<void> {
  const at = doc.getText().indexOf(from);
  assert.ok(at >= 0, `${from} not in the document`);
  const edit = new vscode.WorkspaceEdit();
  edit.replace(doc.uri, new vscode.Range(doc.positionAt(at), doc.positionAt(at + from.length)), to);
  assert.ok(await vscode.workspace.applyEdit(edit));
}

export function activationCacheTests(): void {
  describe('analysis cache per document', () => {
    it('re-evaluates only the edited block of three, and drops the analyzer when the document closes', async () => {
      const content = ['# Three clocks', '', clockBlock('one', '10k'), clockBlock('two', '20k'), clockBlock('three', '30k')].join('\n');
      const doc = await vscode.workspace.openTextDocument({ language: 'markdown', content });
      assert.equal((await lensTitles(doc.uri)).length, 3);
      await replaceFirst(doc, 'r: 20k', 'r: 22k');
      const titles = await lensTitles(doc.uri);
      assert.equal(titles.length, 3);
      assert.deepEqual(await stats(doc.uri), { blocks: 3, evaluated: 1 });
      // VS Code API: changing a document's language closes it and opens it anew (onDidCloseTextDocument).
      await vscode.languages.setTextDocumentLanguage(doc, 'plaintext');
      await eventually(async () => ((await stats(doc.uri)) === undefined ? true : undefined), 'the analyzer to be dropped');
    });
  });

  describe('size limit in bytes', () => {
    const config = () => vscode.workspace.getConfiguration('tickmark');
    after(async () => {
      await config().update('files.maxSizeKB', undefined, vscode.ConfigurationTarget.Global);
    });

    it('marks a note of fewer than 1024 characters but more than 1024 UTF-8 bytes as too large', async () => {
      await config().update('files.maxSizeKB', 1, vscode.ConfigurationTarget.Global);
      const block = clockBlock('sized', '10k');
      // RFC 3629: U+03A9 (Ω) takes two bytes in UTF-8; the padding brings the note to ~700 characters, ~1.2 kB.
      const wide = await vscode.workspace.openTextDocument({ language: 'markdown', content: block + 'Ω'.repeat(560) });
      const narrow = await vscode.workspace.openTextDocument({ language: 'markdown', content: block + 'O'.repeat(560) });
      assert.ok(wide.getText().length < 1024 && Buffer.byteLength(wide.getText(), 'utf8') > 1024);
      assert.ok(Buffer.byteLength(narrow.getText(), 'utf8') < 1024);
      const notice = await eventually(() => {
        const found = tickmarkDiagnostics(wide.uri, 'file-too-large');
        return found.length > 0 ? found : undefined;
      }, 'the file-too-large notice');
      assert.equal(notice.length, 1);
      assert.deepEqual(await lensTitles(wide.uri), []);
      assert.equal((await lensTitles(narrow.uri)).length, 1);
      assert.deepEqual(tickmarkDiagnostics(narrow.uri, 'file-too-large'), []);
    });
  });
}
