// The hover on a block, as the editor's hover query returns it.
import { strict as assert } from 'assert';
import { describe, it } from 'mocha';
import * as vscode from 'vscode';
import { demoUri } from './host';

async function hoverText(uri: vscode.Uri, needle: string): Promise<string> {
  const doc = await vscode.workspace.openTextDocument(uri);
  const position = doc.positionAt(doc.getText().indexOf(needle) + 1);
  const hovers = (await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', uri, position)) ?? [];
  const text = hovers
    .flatMap((h) => h.contents)
    .map((c) => (typeof c === 'string' ? c : 'value' in c ? c.value : ''))
    .join('\n');
  // Markdown escapes (\. \-) are not what a reader sees.
  return text.replace(/\\(.)/g, '$1');
}

export function hoverTests(): void {
  describe('hover', () => {
    it('lists the RC delay result, its worst case and the model assumptions', async () => {
      const text = await hoverText(await demoUri('notes/power-and-clock.md'), 'r: 100k');
      // t = RC·ln(1/(1 − 0.7)) = 120.4 ms (RC charging law); worst case R +5 %, C +10 %: 120.4 ms × 1.155 = 139.1 ms.
      assert.match(text, /120\.4 ms/);
      assert.match(text, /139\.1 ms/);
      assert.match(text, /assumes/i);
    });

    it('names the header and line each firmware constant came from', async () => {
      const text = await hoverText(await demoUri('firmware/src/scheduler.c'), 'prescaler: TICK_DIV');
      assert.match(text, /TICK_DIV/);
      // board.h defines TICK_DIV on its line 18 (the demo header as committed).
      assert.match(text, /board\.h:\d+/);
    });

    it('gives no hover outside a block', async () => {
      const uri = await demoUri('notes/power-and-clock.md');
      const hovers = (await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', uri, new vscode.Position(0, 2))) ?? [];
      const ours = hovers.flatMap((h) => h.contents).filter((c) => typeof c !== 'string' && 'value' in c && /por-delay|crystal-caps/.test(c.value));
      assert.equal(ours.length, 0);
    });
  });
}
