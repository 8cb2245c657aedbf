// The extension loads in a real extension host and registers what package.json promises.
import { strict as assert } from 'assert';
import { describe, it } from 'mocha';
import * as vscode from 'vscode';
import { activeExtension, fixtureUri } from './host';

interface ContributedCommand {
  command: string;
  category?: string;
}

export function activationTests(): void {
  describe('activation', () => {
    it('activates when a Markdown note is opened', async () => {
      // VS Code API: onLanguage:<id> activation fires when a document of that language opens.
      const doc = await vscode.workspace.openTextDocument(await fixtureUri('notes/clock.md'));
      assert.equal(doc.languageId, 'markdown');
      const extension = await activeExtension();
      assert.equal(extension.isActive, true);
    });

    it('registers every command that package.json contributes, under the Tickmark category', async () => {
      const extension = await activeExtension();
      const contributed = (extension.packageJSON.contributes.commands as ContributedCommand[]).map((c) => c.command);
      assert.deepEqual([...contributed].sort(), [
        'tickmark.checkWorkspace',
        'tickmark.insertBlock',
        'tickmark.showWaveform',
        'tickmark.snapToSeries',
        'tickmark.solveBlock',
      ]);
      for (const c of extension.packageJSON.contributes.commands as ContributedCommand[]) assert.equal(c.category, 'Tickmark');
      const registered = new Set(await vscode.commands.getCommands(true));
      const missing = contributed.filter((id) => !registered.has(id));
      assert.deepEqual(missing, []);
    });

    it('reads its settings with the defaults package.json declares', async () => {
      // VS Code API: getConfiguration().inspect() reports the contributed default.
      const config = vscode.workspace.getConfiguration('tickmark');
      assert.equal(config.inspect<number>('check.defaultTolerance')?.defaultValue, 1);
      assert.equal(config.inspect<string>('solve.defaultSeries')?.defaultValue, 'E24');
      assert.equal(config.inspect<string>('c.dataModel')?.defaultValue, 'ilp32');
      assert.equal(config.inspect<boolean>('lens.enabled')?.defaultValue, true);
    });
  });
}
