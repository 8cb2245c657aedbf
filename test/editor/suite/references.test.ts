// Block references in the real editor: an edit to the crystal in one note reaches the UART block's hover in a C
// file, through the PLL and the slow bus (demo/notes/clock-tree.md → demo/firmware/src/radio_uart.c).
import { strict as assert } from 'assert';
import { describe, it } from 'mocha';
import * as vscode from 'vscode';
import { demoUri, eventually, replaceText, revert, tickmarkDiagnostics } from './host';

async function hoverAt(uri: vscode.Uri, needle: string): Promise<string> {
  const doc = await vscode.workspace.openTextDocument(uri);
  const position = doc.positionAt(doc.getText().indexOf(needle) + 2);
  const hovers = (await vscode.commands.executeCommand<vscode.Hover[]>('vscode.executeHoverProvider', uri, position)) ?? [];
  // Markdown escapes (\. \-) are not what a reader sees.
  return hovers.flatMap((h) => h.contents).map((c) => (typeof c === 'string' ? c : 'value' in c ? c.value : '')).join('\n').replace(/\\(.)/g, '$1');
}

export function referenceTests(): void {
  describe('block references across files', () => {
    it('an edit to the crystal in the note updates the UART hover and its diagnostics in the C file', async () => {
      const note = await demoUri('notes/clock-tree.md');
      const uart = await demoUri('firmware/src/radio_uart.c');
      await vscode.window.showTextDocument(await vscode.workspace.openTextDocument(uart), { preview: false });
      // slow bus = 8 MHz / 2 · 8 / 2 / 4 = 4 MHz (pll: pfd = ref / prediv, vco = pfd · mult, out = vco / postdiv).
      const before = await eventually(async () => {
        const text = await hoverAt(uart, 'clock: @slow-bus');
        return /`@slow-bus\.frequency` = 4 MHz/.test(text) ? text : undefined;
      }, 'the UART hover with the 4 MHz slow bus');
      assert.match(before, /clock-tree\.md:\d+/);
      // 4 MHz / (16 · 104) = 2403.8 baud against the 9600 claimed: the planted mismatch.
      assert.ok(tickmarkDiagnostics(uart, 'expect-mismatch').length > 0);
      try {
        await vscode.window.showTextDocument(await vscode.workspace.openTextDocument(note), { preview: false });
        // A 12 MHz crystal: pfd 12 / 2 = 6 MHz, vco 6 · 8 = 48 MHz (both inside their ranges), 24 MHz out, 6 MHz on
        // the slow bus; 6 MHz / (16 · 104) = 3605.8 baud. The C file follows, unsaved, as typed.
        await replaceText(note, 'frequency: 8 MHz ±25 ppm', 'frequency: 12 MHz ±25 ppm');
        await eventually(async () => (/`@slow-bus\.frequency` = 6 MHz/.test(await hoverAt(uart, 'clock: @slow-bus')) ? true : undefined), 'the UART hover with a 6 MHz slow bus');
        await eventually(() => (tickmarkDiagnostics(uart, 'expect-mismatch').some((d) => /3605\.8 baud/.test(d.message)) ? true : undefined), 'the UART mismatch at 3605.8 baud');
      } finally {
        await revert(note);
      }
      await eventually(async () => (/`@slow-bus\.frequency` = 4 MHz/.test(await hoverAt(uart, 'clock: @slow-bus')) ? true : undefined), 'the UART hover back at 4 MHz');
    });
  });
}
