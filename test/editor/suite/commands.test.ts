// The commands in a real host: workspace check into the Problems list, block templates, snap to series,
// and the file size limit. Demo files are only read; edits go to untitled documents or unsaved fixtures.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { after, describe, it } from 'mocha';
import * as vscode from 'vscode';
import { activeExtension, demoUri, eventually, fixtureUri, lensTitles, revert, tickmarkDiagnostics } from './host';

interface WorkspaceSummary {
  files: number;
  blocks: number;
  errors: number;
  warnings: number;
  skipped: string[];
}

async function untitled(language: string): Promise<vscode.TextEditor> {
  const doc = await vscode.workspace.openTextDocument({ language, content: '' });
  return vscode.window.showTextDocument(doc);
}

function countBlocks(dir: string): number {
  let count = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) count += countBlocks(full);
    else if (/\.md$/.test(entry.name)) count += (fs.readFileSync(full, 'utf8').match(/^ {0,3}```timing\b/gm) ?? []).length;
    else if (/\.(c|h)$/.test(entry.name)) count += (fs.readFileSync(full, 'utf8').match(/^\s*(\/\/|\/\*|\*)\s*@timing\b/gm) ?? []).length;
  }
  return count;
}

const closeActive = () => vscode.commands.executeCommand('workbench.action.revertAndCloseActiveEditor');

export function commandTests(): void {
  describe('commands', () => {
    it('checkWorkspace reports the buzzer mismatch of a note nobody opened', async () => {
      await activeExtension();
      const buzzer = await demoUri('notes/buzzer.md');
      assert.equal(vscode.workspace.textDocuments.some((d) => d.uri.toString() === buzzer.toString()), false, 'buzzer.md is already open');
      assert.equal(tickmarkDiagnostics(buzzer).length, 0);
      const summary = await vscode.commands.executeCommand<WorkspaceSummary>('tickmark.checkWorkspace');
      // 555 astable: high 0.693·(RA + RB)·C, low 0.693·RB·C (NE555 data sheet, TI SLFS022, from memory; 0.693 = ln 2):
      // RA 6.8k, RB 33k, C 10n in buzzer.md give 1.982 kHz against its 2.4 kHz claim.
      const astableHz = 1 / (Math.LN2 * (6.8e3 + 2 * 33e3) * 10e-9);
      assert.equal(astableHz.toPrecision(4), '1982');
      const [warning] = tickmarkDiagnostics(buzzer, 'expect-mismatch');
      assert.ok(warning, 'no mismatch for buzzer.md');
      assert.match(warning.message, /1\.982 kHz/);
      assert.equal(warning.severity, vscode.DiagnosticSeverity.Warning);
      // Blocks counted independently: fences opening with ```timing and comments with @timing in the demo files.
      const demo = path.dirname(path.dirname(buzzer.fsPath));
      assert.equal(summary.blocks, countBlocks(demo));
      // Three claims are off: the buzzer above, valve_pwm.c's 16 MHz / (999 + 1) = 16 kHz against 20 kHz, and
      // radio_uart.c on the 4 MHz slow bus (clock-tree.md): 4 MHz / (16 · 104) = 2404 baud against 9600, which is
      // also beyond the ±2 % an 8-N-1 link tolerates: four warnings.
      assert.equal(summary.warnings, 4);
      assert.equal(summary.errors, 0);
      assert.deepEqual(summary.skipped, []);
    });

    it('insertBlock puts a timer template fence into an untitled note', async () => {
      const editor = await untitled('markdown');
      try {
        assert.equal(await vscode.commands.executeCommand('tickmark.insertBlock', 'timer'), true);
        const text = editor.document.getText();
        // Timer keys without defaults in DESIGN.md: clock, prescaler, reload; then the claim.
        assert.match(text, /^```timing name\ncircuit: timer\nclock: Hz\nprescaler: .+\nreload: .+\nexpect: Hz\n```\n$/);
        assert.equal((await lensTitles(editor.document.uri)).length, 1, 'the inserted block is a block');
      } finally {
        await closeActive();
      }
    });

    it('insertBlock writes a /* @timing */ comment in C', async () => {
      const editor = await untitled('c');
      try {
        assert.equal(await vscode.commands.executeCommand('tickmark.insertBlock', 'baud'), true);
        assert.match(editor.document.getText(), /^\/\* @timing name\n \* circuit: baud\n \* clock: Hz\n \* baud: baud\n \* expect: baud\n \*\/\n$/);
      } finally {
        await closeActive();
      }
    });

    it('snapToSeries replaces 47.5k by the E24 part 47 kΩ, also offered as a quick fix', async () => {
      // IEC 60063:2015 table 1, E24: 4.3, 4.7, 5.1; 47.5k is 1.1 % from 47k.
      const uri = await fixtureUri('notes/series.md');
      const doc = await vscode.workspace.openTextDocument(uri);
      const editor = await vscode.window.showTextDocument(doc, { preview: false });
      try {
        const [info] = await eventually(() => {
          const found = tickmarkDiagnostics(uri, 'series-snap');
          return found.length > 0 ? found : undefined;
        }, 'the series-snap diagnostic');
        assert.equal(info.severity, vscode.DiagnosticSeverity.Information);
        const actions = (await vscode.commands.executeCommand<vscode.CodeAction[]>('vscode.executeCodeActionProvider', uri, info.range)) ?? [];
        assert.ok(actions.some((a) => a.title === 'Snap r to 47 kΩ (E24)'), actions.map((a) => a.title).join('; '));
        editor.selection = new vscode.Selection(info.range.start, info.range.start);
        assert.equal(await vscode.commands.executeCommand('tickmark.snapToSeries'), true);
        assert.match(doc.getText(), /^r: 47 kΩ ±1%$/m);
        await eventually(() => (tickmarkDiagnostics(uri, 'series-snap').length === 0 ? true : undefined), 'the info to clear');
      } finally {
        await revert(uri);
      }
    });

    describe('with tickmark.files.maxSizeKB = 1', () => {
      const config = () => vscode.workspace.getConfiguration('tickmark');
      after(async () => {
        await config().update('files.maxSizeKB', undefined, vscode.ConfigurationTarget.Global);
      });

      it('skips the larger files in the workspace check and marks an open one once', async () => {
        await config().update('files.maxSizeKB', 1, vscode.ConfigurationTarget.Global);
        const demo = path.dirname(path.dirname((await demoUri('notes/buzzer.md')).fsPath));
        // Sizes as the file system reports them; 1 KB is 1024 bytes here, as the setting's description says.
        const larger = ['README.md', 'firmware/include/board.h', 'notes/clock-tree.md'].filter((f) => fs.statSync(path.join(demo, f)).size > 1024);
        assert.equal(larger.length, 3, 'the demo files changed size; pick other ones');
        const summary = await vscode.commands.executeCommand<WorkspaceSummary>('tickmark.checkWorkspace');
        assert.deepEqual([...summary.skipped].sort(), larger.sort());
        const readme = await vscode.workspace.openTextDocument(await demoUri('README.md'));
        const found = await eventually(() => {
          const all = tickmarkDiagnostics(readme.uri);
          return all.length > 0 ? all : undefined;
        }, 'the file-too-large notice');
        assert.deepEqual(found.map((d) => [d.code, d.severity]), [['file-too-large', vscode.DiagnosticSeverity.Warning]]);
      });
    });
  });
}
