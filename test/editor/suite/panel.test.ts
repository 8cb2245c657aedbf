// The waveform panel opens beside the editor for the block a lens names.
import { strict as assert } from 'assert';
import { describe, it } from 'mocha';
import * as vscode from 'vscode';
import { demoUri, eventually } from './host';

function waveformTabs(): vscode.Tab[] {
  return vscode.window.tabGroups.all
    .flatMap((group) => group.tabs)
    .filter((tab) => tab.input instanceof vscode.TabInputWebview && tab.input.viewType.includes('tickmark.waveform'));
}

export function panelTests(): void {
  describe('waveform panel', () => {
    it('opens one panel titled after the block, and reuses it for the next block', async () => {
      const uri = await demoUri('notes/heartbeat.md');
      assert.equal(await vscode.commands.executeCommand('tickmark.showWaveform', uri, 'heartbeat'), true);
      await eventually(() => (waveformTabs().some((t) => t.label === 'Waveform: heartbeat') ? true : undefined), 'the panel tab');
      await vscode.commands.executeCommand('tickmark.showWaveform', uri, 'probe-excite');
      await eventually(() => (waveformTabs().some((t) => t.label === 'Waveform: probe-excite') ? true : undefined), 'the retitled panel');
      assert.equal(waveformTabs().length, 1);
    });
  });
}
