// The Markdown preview plugin: through VS Code's own renderer (markdown.api.render), and with a real
// markdown-it given the note as VS Code's preview gives it (env.currentDocument).
import { strict as assert } from 'assert';
import MarkdownIt from 'markdown-it';
import { describe, it } from 'mocha';
import * as vscode from 'vscode';
import { AnalysisStore } from '../../../extension/analysisStore';
import { timingPreviewPlugin } from '../../../extension/preview';
import { activeExtension, demoUri } from './host';

const fence = (info: string, body: string) => '```' + info + '\n' + body + '\n```\n';

const silentLogger = { info: () => {}, warn: () => {}, error: () => {} };

async function render(markdown: string): Promise<string> {
  await activeExtension();
  return (await vscode.commands.executeCommand<string>('markdown.api.render', markdown)) ?? '';
}

/** Visible text of a table row whose first cell is `label`. */
function row(html: string, label: string): string | undefined {
  const match = new RegExp(`<tr><td>${label}</td><td>([^<]*)</td><td>([^<]*)</td></tr>`).exec(html);
  return match ? `${match[1]} | ${match[2]}` : undefined;
}

export function previewTests(): void {
  describe('Markdown preview', () => {
    it('renders a timing fence as a table with the RC delay to 0.7 of the supply, 120.4 ms', async () => {
      const html = await render('# Reset\n\n' + fence('timing por-delay', 'circuit: rc-delay\nr: 100k ±5%\nc: 1u ±10%\ntoward: 3.3 V\nto: 0.7 * toward'));
      // RC charging law (common practice): t = RC·ln(1/(1 − 0.7)) = 0.1 s · 1.20397 = 120.4 ms.
      const expected = 100e3 * 1e-6 * Math.log(1 / (1 - 0.7));
      assert.equal(`${(expected * 1000).toFixed(1)} ms`, '120.4 ms');
      // Worst case: the slowest corner is R and C both high, the fastest both low (t ∝ RC).
      const slow = (expected * 1.05 * 1.1 * 1000).toFixed(1);
      const fast = (expected * 0.95 * 0.9 * 1000).toFixed(1);
      assert.equal(row(html, 'delay to the end level'), `120.4 ms | ${fast}–${slow} ms`);
      assert.match(html, /<h1[^>]*>Reset<\/h1>/, 'the rest of the note still renders');
      assert.match(html, /<svg [^>]*role="img"/, 'the inline waveform');
      assert.match(html, /<details><summary>block text<\/summary><pre><code>```timing por-delay\ncircuit: rc-delay/);
    });

    it('escapes a block name that is markup, in the table, the waveform title and the block text', async () => {
      const name = '<img/src=x/onerror=alert(1)>';
      const html = await render(fence(`timing ${name}`, 'circuit: rc-delay\nr: 10k\nc: 100n\ntoward: 5 V\nto: 2.5 V\nnote: <script>alert(2)</script>'));
      assert.doesNotMatch(html, /<img/i);
      assert.doesNotMatch(html, /<script/i);
      assert.ok(html.includes('&lt;img/src=x/onerror=alert(1)&gt;'), 'the name shows as text');
      // t = RC·ln(5/(5 − 2.5)) = 1 ms · ln 2 = 693.1 µs (RC charging law, common practice).
      assert.match(html, new RegExp(`${(1e-3 * Math.log(2) * 1e6).toFixed(1)} µs`));
    });

    it('lists the findings of a block, and leaves other fences to the usual renderer', async () => {
      const html = await render(fence('timing bad-ring', 'circuit: ring\nstages: 4\ntpd: 1n') + fence('c', 'int x = 1 < 2;'));
      // DESIGN.md: an even ring is an error, not a number.
      assert.match(html, /<li>⛔ error: [^<]*stages/);
      assert.equal(row(html, 'period'), undefined);
      assert.equal(html.split('class="tickmark-block"').length - 1, 1);
      assert.match(html, /<code [^>]*class="[^"]*language-c[^"]*"[^>]*>.*int.* x = .*1.* &lt; .*2/);
    });

    it('puts a caution first, worded as in the hover, and keeps it escaped', async () => {
      // The name says reset (por): DESIGN.md safety cautions. 400 V DC is above the extra-low-voltage band
      // (IEC 61140, from memory: 120 V ripple-free DC at most). Both are cautions; the missed claim is not.
      const html = await render(fence('timing por-<b>x</b>', 'circuit: rc-delay\nr: 100k\nc: 1u\ntoward: 400 V\nto: 0.5 * toward\nexpect: 1 s ±1%'));
      const items = [...html.matchAll(/<li>([^<]*)<\/li>/g)].map((m) => m[1]);
      assert.ok(items.length >= 3, items.join(' | '));
      assert.match(items[0], /^⚠️ Caution: /);
      assert.match(items[1], /^⚠️ Caution: /);
      assert.ok(items.slice(2).every((item) => !item.startsWith('⚠️ Caution')), items.join(' | '));
      assert.ok(items.some((item) => /^⚠️ warning: /.test(item)), 'the missed claim still shows after the cautions');
      assert.ok(!items.some((item) => /ℹ️ info: .*(Safety|extra-low)/.test(item)), 'a caution is not printed as plain info');
      assert.doesNotMatch(html, /<b>x<\/b>/);
    });

    it('leaves the worst-case cell empty when both ends print the same', async () => {
      // RC charging law (common practice): t = RC·ln 2 = 69.3147 ms; ±0.0001 % on R moves it by 0.07 µs, well
      // below the last printed digit (10 µs), so the band would read "69.31–69.31 ms".
      const html = await render(fence('timing tight', 'circuit: rc-delay\nr: 100k ±0.0001%\nc: 1u\ntoward: 5 V\nto: 2.5 V'));
      assert.equal(row(html, 'delay to the end level'), `${(0.1 * Math.log(2) * 1000).toFixed(2)} ms | `);
      // The same block with ±5 % has a band whose ends differ: t ∝ R.
      const wide = await render(fence('timing wide', 'circuit: rc-delay\nr: 100k ±5%\nc: 1u\ntoward: 5 V\nto: 2.5 V'));
      const t = 0.1 * Math.log(2) * 1000;
      assert.equal(row(wide, 'delay to the end level'), `${t.toFixed(2)} ms | ${(t * 0.95).toFixed(2)}–${(t * 1.05).toFixed(2)} ms`);
    });

    it('resolves firmware: against the note when the preview names the document, and says when it cannot', async () => {
      const uri = await demoUri('notes/watchdog.md');
      const doc = await vscode.workspace.openTextDocument(uri);
      const md = timingPreviewPlugin(new MarkdownIt(), new AnalysisStore(silentLogger));
      // board.h: SLOW_OSC_HZ 32000, WATCHDOG_DIV 16, WATCHDOG_TOP 3999; a period of (3999 + 1) · 16 / 32000 Hz = 2 s
      // (counts = reload + 1, DESIGN.md timer model). The note gives the clock ±10 %: the period is 2 s / (1 ± 0.1).
      const withNote = md.render(doc.getText(), { currentDocument: uri });
      assert.equal(row(withNote, 'period'), `2 s | ${(2 / 1.1).toFixed(3)}–${(2 / 0.9).toFixed(3)} s`);
      assert.doesNotMatch(withNote, /not read here/);
      const alone = md.render(doc.getText(), {});
      assert.equal(row(alone, 'period'), undefined);
      assert.match(alone, /Rendered without its note: the firmware file named by firmware: is not read here\./);
    });
  });
}
