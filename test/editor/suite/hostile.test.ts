// A megabyte of hostile text in an open editor: the extension answers with findings, and keeps answering for
// the other documents (responsiveness as behaviour, not as a timed assertion).
import { strict as assert } from 'assert';
import { after, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { demoUri, eventually, lensTitles, tickmarkDiagnostics } from './host';

/** About 1 MB: nested parentheses, a 200,000-character value line, and a fence left open at the end. */
function hostileNote(): string {
  const parts: string[] = [];
  for (let i = 0; parts.join('').length < 700_000; i++) {
    parts.push(['```timing h' + i, 'circuit: schmitt-rc', 'supply: ' + '('.repeat(300) + '3.3 V' + ')'.repeat(300), 'vt+: 2 V', 'vt-: 1 V', 'r: 10k', 'c: 1u', '```', ''].join('\n'));
  }
  parts.push('```timing long', 'circuit: ring', 'stages: 5', 'tpd: ' + '1+'.repeat(100_000) + '1n', '```', '');
  parts.push('```timing open', 'circuit: ring', 'stages: 5', 'tpd: 1n', '');
  return parts.join('\n');
}

export function hostileTests(): void {
  describe('hostile input in the editor', () => {
    let doc: vscode.TextDocument | undefined;
    after(async () => {
      if (doc) {
        await vscode.window.showTextDocument(doc);
        await vscode.commands.executeCommand('workbench.action.revertAndCloseActiveEditor');
      }
    });

    it('answers a 1 MB hostile note with positioned findings and keeps serving other documents', async function () {
      // The note travels to the language server's process and is analysed there; on a loaded machine that takes
      // longer than the suite's default limit (the waits below bound each step).
      this.timeout(120_000);
      const text = hostileNote();
      assert.ok(text.length > 900_000 && Buffer.byteLength(text) < 1024 * 1024, `note is ${text.length} characters`);
      doc = await vscode.workspace.openTextDocument({ language: 'markdown', content: text });
      await vscode.window.showTextDocument(doc);
      const findings = await eventually(() => {
        const found = tickmarkDiagnostics(doc!.uri);
        return found.length > 0 ? found : undefined;
      }, 'findings on the hostile note', 60_000);
      // Values beyond the value parser's bounds (length, nesting) are findings on that value, never a crash.
      assert.ok(findings.some((d) => /too long|nest|deep/i.test(d.message)), findings.slice(0, 3).map((d) => d.message).join(' | '));
      assert.ok(findings.some((d) => d.code === 'block-unterminated'));
      for (const d of findings) assert.ok(d.range.end.line < doc.lineCount);
      // RC charging law, as in the lens tests: the other documents still get their numbers.
      const titles = await eventually(async () => {
        const t = await lensTitles(await demoUri('notes/power-and-clock.md'));
        return t.length >= 2 ? t : undefined;
      }, 'lenses of power-and-clock.md after the hostile note', 30_000);
      assert.match(titles[0], /120\.4 ms/);
    });
  });
}
