// Problems list, quick fixes, and a header edit reaching the files that include it.
import { strict as assert } from 'assert';
import { afterEach, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { demoUri, eventually, lensTitles, replaceText, revert, showDemo, tickmarkDiagnostics } from './host';

export function diagnosticsTests(): void {
  describe('diagnostics and quick fixes', () => {
    afterEach(async () => {
      await revert(await demoUri('firmware/include/board.h'));
      await revert(await demoUri('notes/heartbeat.md'));
    });

    it('warns that valve-pwm computes 16 kHz against its 20 kHz claim', async () => {
      // 16 MHz / 1 / (999 + 1) = 16 kHz (up-counter period is reload + 1 ticks, common practice).
      const editor = await showDemo('firmware/src/valve_pwm.c');
      const [warning] = await eventually(() => {
        const found = tickmarkDiagnostics(editor.document.uri, 'expect-mismatch');
        return found.length > 0 ? found : undefined;
      }, 'the expect-mismatch diagnostic');
      assert.equal(warning.severity, vscode.DiagnosticSeverity.Warning);
      assert.match(warning.message, /16 kHz/);
      assert.equal(editor.document.lineAt(warning.range.start.line).text.includes('expect:'), true);
    });

    it('offers setting VALVE_PWM_TOP to 799 in board.h, which clears the warning', async () => {
      // 16 MHz / (799 + 1) = 20 kHz exactly.
      const editor = await showDemo('firmware/src/valve_pwm.c');
      const uri = editor.document.uri;
      const [warning] = await eventually(() => {
        const found = tickmarkDiagnostics(uri, 'expect-mismatch');
        return found.length > 0 ? found : undefined;
      }, 'the expect-mismatch diagnostic');
      const actions = (await vscode.commands.executeCommand<vscode.CodeAction[]>('vscode.executeCodeActionProvider', uri, warning.range)) ?? [];
      const fix = actions.find((a) => /VALVE_PWM_TOP/.test(a.title) && /799/.test(a.title));
      assert.ok(fix?.edit, `no register fix among: ${actions.map((a) => a.title).join('; ')}`);
      const header = await demoUri('firmware/include/board.h');
      assert.deepEqual(fix.edit.entries().map(([u]) => u.toString()), [header.toString()]);
      assert.equal(await vscode.workspace.applyEdit(fix.edit), true);
      const headerDoc = await vscode.workspace.openTextDocument(header);
      assert.match(headerDoc.getText(), /#define VALVE_PWM_TOP\s+799u/);
      await eventually(() => (tickmarkDiagnostics(uri, 'expect-mismatch').length === 0 ? true : undefined), 'the warning to clear');
    });

    it('re-checks scheduler.c when an unsaved edit of board.h changes TICK_TOP', async () => {
      // 16 MHz / 64 / (499 + 1) = 500 Hz, outside the 1 kHz ±0.5 % claim.
      const editor = await showDemo('firmware/src/scheduler.c');
      const uri = editor.document.uri;
      await eventually(async () => ((await lensTitles(uri)).length === 1 ? true : undefined), 'scheduler.c analysed');
      assert.equal(tickmarkDiagnostics(uri, 'expect-mismatch').length, 0);
      await replaceText(await demoUri('firmware/include/board.h'), 'TICK_TOP          249u', 'TICK_TOP          499u');
      const [warning] = await eventually(() => {
        const found = tickmarkDiagnostics(uri, 'expect-mismatch');
        return found.length > 0 ? found : undefined;
      }, 'a mismatch in the including file');
      assert.match(warning.message, /500 Hz/);
      assert.match((await lensTitles(uri))[0], /500(\.0+)? Hz/);
    });

    it('fills in a solved r: with the E24 part through tickmark.solveBlock', async () => {
      // Two-inverter oscillator T = RC·[ln((V+Vth)/Vth) + ln((2V−Vth)/(V−Vth))] = 2·ln 3·RC at Vth = V/2:
      // R = 1 / (10 kHz · 2.1972 · 4.7 nF) = 9.683 kΩ; log-nearest E24 value is 10 (IEC 60063:2015 table 1: … 9.1, 10).
      const editor = await showDemo('notes/heartbeat.md');
      const at = editor.document.getText().indexOf('r: ?');
      editor.selection = new vscode.Selection(editor.document.positionAt(at), editor.document.positionAt(at));
      assert.equal(await vscode.commands.executeCommand('tickmark.solveBlock'), true);
      assert.match(editor.document.getText(), /^r: 10 kΩ$/m);
    });
  });
}
