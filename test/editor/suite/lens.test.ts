// Code lenses in the real host show the headline numbers, and follow edits and settings.
import { strict as assert } from 'assert';
import { afterEach, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { demoUri, eventually, lensTitles, replaceText, revert } from './host';

export function lensTests(): void {
  describe('code lens', () => {
    afterEach(async () => {
      await revert(await demoUri('notes/heartbeat.md'));
      await vscode.workspace.getConfiguration('tickmark').update('lens.enabled', undefined, vscode.ConfigurationTarget.Global);
    });

    it('shows the RC delay to 0.7 of the supply as 120.4 ms', async () => {
      // RC charging v(t) = V·(1 − e^(−t/RC)) (any circuit-theory handbook): t = RC·ln(1/0.3) = 0.1 s · 1.20397 = 120.4 ms.
      const titles = await eventually(async () => {
        const t = await lensTitles(await demoUri('notes/power-and-clock.md'));
        return t.length >= 2 ? t : undefined;
      }, 'lenses of power-and-clock.md');
      assert.match(titles[0], /120\.4 ms/);
    });

    it('repeats the whole headline in the tooltip, which a narrow editor cannot cut off', async () => {
      const uri = await demoUri('notes/power-and-clock.md');
      await vscode.workspace.openTextDocument(uri);
      const lenses = await eventually(async () => {
        const found = (await vscode.commands.executeCommand<vscode.CodeLens[]>('vscode.executeCodeLensProvider', uri)) ?? [];
        return found.length >= 2 ? found : undefined;
      }, 'lenses of power-and-clock.md');
      for (const lens of lenses) {
        const title = lens.command?.title ?? '';
        assert.ok(title.length > 0);
        assert.equal(lens.command?.tooltip?.split('\n')[0], title);
      }
      // RC charging to 0.7 of the supply, t = RC·ln(1/0.3) = 120.4 ms (as in the test above).
      assert.match(lenses[0].command?.tooltip ?? '', /120\.4 ms/);
    });

    it('shows the scheduler tick of 16 MHz / 64 / 250 as 1 kHz', async () => {
      // Up-counting timer: one period is reload + 1 ticks of clock/prescaler (common practice, MCU reference manuals).
      const titles = await eventually(async () => {
        const t = await lensTitles(await demoUri('firmware/src/scheduler.c'));
        return t.length === 1 ? t : undefined;
      }, 'lens of scheduler.c');
      assert.match(titles[0], /(^|[^\d.])1(\.0+)? kHz/);
    });

    it('halving r: doubles the Schmitt oscillator frequency on the lens', async () => {
      // Schmitt relaxation oscillator T = RC·[ln((V−VT−)/(V−VT+)) + ln(VT+/VT−)] (standard derivation, from memory):
      // V 3.3, VT+ 1.914, VT− 1.089, RC 0.47 s → T 0.48455 s, f 2.064 Hz; with 235k, f 4.128 Hz.
      const uri = await demoUri('notes/heartbeat.md');
      const before = await eventually(async () => (await lensTitles(uri))[0] || undefined, 'heartbeat lens');
      assert.match(before, /2\.064 Hz/);
      await replaceText(uri, 'r: 470k', 'r: 235k');
      const after = await eventually(async () => {
        const title = (await lensTitles(uri))[0];
        return title && /4\.128 Hz/.test(title) ? title : undefined;
      }, 'lens after editing r:');
      assert.doesNotMatch(after, /2\.064 Hz/);
    });

    it('shows no lens when tickmark.lens.enabled is false', async () => {
      const uri = await demoUri('notes/heartbeat.md');
      assert.ok((await lensTitles(uri)).length > 0);
      await vscode.workspace.getConfiguration('tickmark').update('lens.enabled', false, vscode.ConfigurationTarget.Global);
      await eventually(async () => ((await lensTitles(uri)).length === 0 ? true : undefined), 'lenses to go away');
    });
  });
}
