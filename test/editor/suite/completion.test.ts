// Completion inside timing blocks, asked of the real editor through its completion command.
import { strict as assert } from 'assert';
import { afterEach, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { activeExtension } from './host';

async function labelsAt(languageId: string, content: string): Promise<vscode.CompletionItem[]> {
  await activeExtension();
  const offset = content.indexOf('|');
  const doc = await vscode.workspace.openTextDocument({ language: languageId, content: content.replace('|', '') });
  await vscode.window.showTextDocument(doc);
  const list = await vscode.commands.executeCommand<vscode.CompletionList>('vscode.executeCompletionItemProvider', doc.uri, doc.positionAt(offset));
  return list?.items ?? [];
}

const labelOf = (item: vscode.CompletionItem) => (typeof item.label === 'string' ? item.label : item.label.label);
const ours = (items: vscode.CompletionItem[], kind: vscode.CompletionItemKind) => items.filter((i) => i.kind === kind).map(labelOf);

export function completionTests(): void {
  describe('completion', () => {
    afterEach(async () => {
      await vscode.commands.executeCommand('workbench.action.revertAndCloseActiveEditor');
    });

    it('offers the circuit ids of DESIGN.md after `circuit:` in a note', async () => {
      const items = await labelsAt('markdown', '```timing\ncircuit: |\n```\n');
      // DESIGN.md "Circuits" table.
      assert.deepEqual(ours(items, vscode.CompletionItemKind.Class).sort(), [
        '555-astable', '555-monostable', 'adc-sample', 'baud', 'can-bit', 'clock', 'comparator-rc', 'crystal-load', 'divider',
        'i2c-rise', 'inverter-rc', 'pll', 'rc-delay', 'ring', 'schmitt-rc', 'timer', 'watchdog',
      ]);
      const led = items.find((i) => labelOf(i) === 'schmitt-rc');
      assert.match(String((led?.documentation as vscode.MarkdownString | undefined)?.value), /Schmitt trigger/);
    });

    it('offers the timer keys not yet written, with units, in a C comment', async () => {
      const items = await labelsAt('c', '/* @timing tick\n * circuit: timer\n * clock: 16 MHz\n * |\n */\n');
      // DESIGN.md: timer keys clock, prescaler, reload, mode, compare, bits, prescalers.
      assert.deepEqual(ours(items, vscode.CompletionItemKind.Property), ['prescaler', 'reload', 'mode', 'compare', 'bits', 'prescalers']);
      const meta = ours(items, vscode.CompletionItemKind.Keyword);
      assert.ok(meta.includes('expect') && meta.includes('data-model'));
      // `firmware:` names a note's firmware file; a C block reads its own file.
      assert.equal(meta.includes('firmware'), false);
      const bits = items.find((i) => labelOf(i) === 'bits');
      assert.match(String(bits?.detail), /default 16/);
      assert.equal(bits?.insertText, 'bits: ');
    });

    it('offers the counting modes after `mode:`', async () => {
      const items = await labelsAt('markdown', '```timing\ncircuit: timer\nmode: |\n```\n');
      assert.deepEqual(ours(items, vscode.CompletionItemKind.EnumMember), ['up', 'up-down']);
    });
  });
}
