// The waveform panel in a real editor host: opened for a block, fed the right block, following the cursor,
// redrawn after an edit, and drawn by its script inside the webview under the panel's CSP.
import { strict as assert } from 'assert';
import { afterEach, describe, it } from 'mocha';
import * as vscode from 'vscode';
import type { TickmarkApi } from '../../../extension/extension';
import type { DrawnReport } from '../../../extension/panel/events';
import type { HostMessage } from '../../../media/messages';
import { activeExtension, demoUri, eventually, replaceText, revert, showDemo } from './host';

type ShowMessage = Extract<HostMessage, { type: 'show' }>;

function waveformTabs(): vscode.Tab[] {
  return vscode.window.tabGroups.all
    .flatMap((group) => group.tabs)
    .filter((tab) => tab.input instanceof vscode.TabInputWebview && tab.input.viewType.includes('tickmark.waveform'));
}

/** Everything the panel posts and the webview reports from now on. */
async function recordPanel(): Promise<{ shows: ShowMessage[]; drawn: DrawnReport[]; stop(): void }> {
  const api = (await activeExtension()).exports as TickmarkApi;
  const shows: ShowMessage[] = [];
  const drawn: DrawnReport[] = [];
  const subscriptions = [
    api.waveformPanel.onDidPost((m) => m.type === 'show' && shows.push(m)),
    api.waveformPanel.onDidDraw((d) => drawn.push(d)),
  ];
  return { shows, drawn, stop: () => subscriptions.forEach((s) => s.dispose()) };
}

/**
 * Schmitt-trigger RC oscillator, from the RC charging law v(t) = V∞ + (V0 − V∞)·e^(−t/RC) (common practice):
 * charging from VT− to VT+ toward the supply takes RC·ln((V − VT−)/(V − VT+)), discharging toward 0 V
 * takes RC·ln(VT+/VT−).
 */
function schmittFrequency(supply: number, upper: number, lower: number, r: number, c: number): number {
  return 1 / (r * c * (Math.log((supply - lower) / (supply - upper)) + Math.log(upper / lower)));
}

const relativelyClose = (actual: number | undefined, expected: number, tolerance = 1e-6): boolean =>
  actual !== undefined && Math.abs(actual - expected) <= tolerance * Math.abs(expected);

export function panelTests(): void {
  describe('waveform panel', () => {
    const cleanups: Array<() => Promise<void> | void> = [];
    afterEach(async () => {
      for (const cleanup of cleanups.splice(0)) await cleanup();
    });

    /** The heartbeat note open (its edits reverted afterwards) and its block on a recorded panel. */
    async function heartbeatOnPanel() {
      const record = await recordPanel();
      cleanups.push(record.stop);
      const uri = await demoUri('notes/heartbeat.md');
      cleanups.push(() => revert(uri));
      await showDemo('notes/heartbeat.md');
      await vscode.commands.executeCommand('tickmark.showWaveform', uri, 'heartbeat');
      const first = await eventually(() => record.shows.find((m) => m.block.name === 'heartbeat'), 'heartbeat on the panel');
      return { record, uri, first };
    }

    it('opens one panel titled after the block, and reuses it for the next block', async () => {
      const uri = await demoUri('notes/heartbeat.md');
      assert.equal(await vscode.commands.executeCommand('tickmark.showWaveform', uri, 'heartbeat'), true);
      await eventually(() => (waveformTabs().some((t) => t.label === 'Waveform: heartbeat') ? true : undefined), 'the panel tab');
      await vscode.commands.executeCommand('tickmark.showWaveform', uri, 'probe-excite');
      await eventually(() => (waveformTabs().some((t) => t.label === 'Waveform: probe-excite') ? true : undefined), 'the retitled panel');
      assert.equal(waveformTabs().length, 1);
    });

    it('posts the named block with the Schmitt-law frequency, and the webview script draws both traces', async () => {
      const record = await recordPanel();
      cleanups.push(record.stop);
      const uri = await demoUri('notes/heartbeat.md');
      await vscode.commands.executeCommand('tickmark.showWaveform', uri, 'heartbeat');
      const show = await eventually(() => record.shows.find((m) => m.block.name === 'heartbeat'), 'a show message for heartbeat');
      assert.equal(show.block.uri, uri.toString());
      assert.equal(show.block.circuit, 'schmitt-rc');
      // heartbeat: 3.3 V, VT+ = 0.58 · 3.3 V, VT− = 0.33 · 3.3 V, 470 kΩ, 1 µF (demo/notes/heartbeat.md).
      const expected = schmittFrequency(3.3, 0.58 * 3.3, 0.33 * 3.3, 470e3, 1e-6);
      assert.ok(relativelyClose(show.block.values.frequency, expected), `posted ${show.block.values.frequency} Hz, law gives ${expected} Hz`);
      assert.deepEqual(show.waveform?.traces.map((t) => t.name), ['timing node', 'output']);
      assert.deepEqual(show.waveform?.levels.map((l) => Number(l.value.toFixed(6))), [Number((0.58 * 3.3).toFixed(6)), Number((0.33 * 3.3).toFixed(6))]);
      // The capacitor starts discharged and never leaves the band between 0 V and the supply.
      const node = show.waveform!.traces[0].points;
      assert.equal(node[0][1], 0);
      assert.ok(node.every(([, v]) => v >= 0 && v <= 3.3 + 1e-9));
      // Several cycles from power-up: the time axis spans at least the first edge plus two periods.
      assert.ok(show.waveform!.duration >= show.block.values['first-edge'] + 2 / expected);
      // Only a script that ran under the panel's CSP can answer: the webview drew what was posted.
      const drawn = await eventually(() => record.drawn.find((d) => d.block === 'heartbeat'), 'the webview to draw heartbeat', 20_000);
      assert.equal(drawn.traces, 2);
      assert.equal(drawn.points, show.waveform!.traces.reduce((sum, t) => sum + t.points.length, 0));
    });

    it('follows the cursor into another block of the note', async () => {
      const record = await recordPanel();
      cleanups.push(record.stop);
      const editor = await showDemo('notes/heartbeat.md');
      await vscode.commands.executeCommand('tickmark.showWaveform', editor.document.uri, 'heartbeat');
      await eventually(() => record.shows.find((m) => m.block.name === 'heartbeat'), 'heartbeat on the panel');
      const inside = editor.document.positionAt(editor.document.getText().indexOf('c: 4.7n'));
      editor.selection = new vscode.Selection(inside, inside);
      const show = await eventually(() => record.shows.find((m) => m.block.name === 'probe-excite'), 'the panel to follow to probe-excite');
      assert.equal(show.block.circuit, 'inverter-rc');
      // Moving the cursor to prose outside any block keeps the last block on the panel.
      const count = record.shows.length;
      const prose = editor.document.positionAt(editor.document.getText().indexOf('The soil-moisture'));
      editor.selection = new vscode.Selection(prose, prose);
      await new Promise((resolve) => setTimeout(resolve, 400));
      assert.ok(record.shows.slice(count).every((m) => m.block.name === 'probe-excite'));
    });

    it('redraws after an edit of r: with the frequency the RC law gives for the new part', async () => {
      const { record, uri, first: before } = await heartbeatOnPanel();
      await replaceText(uri, 'r: 470k ±1%', 'r: 235k ±1%');
      const after = await eventually(
        () => record.shows.find((m) => m.block.name === 'heartbeat' && m.block.values.frequency !== before.block.values.frequency),
        'a redraw with the new frequency',
      );
      // f ∝ 1/(RC): halving R doubles the frequency.
      const expected = schmittFrequency(3.3, 0.58 * 3.3, 0.33 * 3.3, 235e3, 1e-6);
      assert.ok(relativelyClose(after.block.values.frequency, expected), `posted ${after.block.values.frequency} Hz, law gives ${expected} Hz`);
      assert.ok(relativelyClose(after.block.values.frequency, 2 * before.block.values.frequency));
    });

    it('posts an explanation instead of a waveform when the block breaks the model', async () => {
      const { record, uri } = await heartbeatOnPanel();
      // A lower threshold above the upper one has no oscillation (DESIGN.md: an error, not a number).
      await replaceText(uri, 'vt-: 0.33 * supply', 'vt-: 0.7 * supply');
      const broken = await eventually(() => record.shows.find((m) => m.block.name === 'heartbeat' && m.block.findings.some((f) => f.severity === 'error')), 'the error on the panel');
      assert.equal(broken.waveform, undefined);
      const drawn = await eventually(() => [...record.drawn].reverse().find((d) => d.block === 'heartbeat' && d.points === 0), 'the webview to clear the plot', 20_000);
      assert.equal(drawn.traces, 0);
    });
  });
}
