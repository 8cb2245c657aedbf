// The reader the core gets for headers: open buffers first, and tickmark.files.maxSizeKB applied to a buffer
// exactly as to a file on disk, counted in UTF-8 bytes (the setting's description in package.json).
import { strict as assert } from 'assert';
import { describe, it } from 'mocha';
import * as vscode from 'vscode';
import { analyzeOptionsFor } from '../../../extension/options';
import { readSettings } from '../../../extension/settings';
import { demoUri, revert } from './host';

export function optionsTests(): void {
  describe('header reader and tickmark.files.maxSizeKB', () => {
    it('counts an unsaved buffer in UTF-8 bytes and refuses it above the limit', async () => {
      const uri = await demoUri('firmware/include/board.h');
      const doc = await vscode.workspace.openTextDocument(uri);
      // Headers have their own limit (tickmark.c.maxHeaderSizeKB, DESIGN.md); both are set so either would refuse.
      const read = (kB: number) => {
        const settings = readSettings(uri);
        return analyzeOptionsFor(uri, { ...settings, maxSizeKB: kB, firmware: { ...settings.firmware, maxHeaderSizeKB: kB } }).read(uri.fsPath);
      };
      // board.h is plain ASCII, so its bytes are its characters; the check needs it above 1 KB (1024 bytes).
      assert.ok(doc.getText().length > 1024, 'board.h shrank: pick a larger header');
      try {
        assert.equal(read(1), undefined);
        assert.equal(read(2), doc.getText());
        // U+00B5 MICRO SIGN is two bytes in UTF-8 (RFC 3629): 600 of them are 600 characters but 1200 bytes.
        const whole = new vscode.WorkspaceEdit();
        whole.replace(uri, new vscode.Range(doc.positionAt(0), doc.positionAt(doc.getText().length)), 'µ'.repeat(600));
        assert.ok(await vscode.workspace.applyEdit(whole));
        assert.equal(read(1), undefined, 'a buffer of 1200 bytes passed a 1024-byte limit');
        // 500 of them are 1000 bytes: served from the buffer (the file on disk is over the limit).
        const shorter = new vscode.WorkspaceEdit();
        shorter.replace(uri, new vscode.Range(doc.positionAt(0), doc.positionAt(doc.getText().length)), 'µ'.repeat(500));
        assert.ok(await vscode.workspace.applyEdit(shorter));
        assert.equal(read(1), 'µ'.repeat(500));
      } finally {
        await revert(uri);
      }
    });
  });
}
