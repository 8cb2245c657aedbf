// Parts off the block's own `series:` are an info finding with a fix to the log-nearest series value.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { Code } from '../../core/codes';
import type { BlockAnalysis } from '../../core/types';
import { analyzeText, noteBlock } from '../helpers/analyze';

const schmitt = (r: string, c: string, series?: string) =>
  noteBlock(['circuit: schmitt-rc', 'supply: 5 V', 'vt+: 3 V', 'vt-: 2 V', `r: ${r}`, `c: ${c}`, ...(series ? [`series: ${series}`] : [])]);

const snaps = (block: BlockAnalysis) => block.findings.filter((f) => f.code === Code.seriesSnap);

describe('series check', () => {
  it('offers the log-nearest E24 value for a part off E24, keeping the tolerance', () => {
    // IEC 60063:2015 table 1, E24: … 4.3, 4.7, 5.1 …; 47.5k lies 1.1 % above 47k and 7 % below 51k.
    const block = schmitt('47.5 kΩ ±1%', '4n7', 'E24');
    const [finding] = snaps(block);
    assert.equal(snaps(block).length, 1);
    assert.equal(finding.severity, 'info');
    assert.match(finding.message, /47\.5 kΩ is not an E24 value.*47 kΩ/);
    const fix = finding.fixes?.[0];
    assert.equal(fix?.edits[0].newText, '47 kΩ');
    const text = block.block.entries.find((e) => e.key === 'r')!;
    // The edit covers the number and unit only; ` ±1%` stays.
    assert.equal(fix?.edits[0].span.start, text.valueSpan.start);
    assert.equal(fix?.edits[0].span.end, text.valueSpan.start + '47.5 kΩ'.length);
  });

  it('rounds a capacitor to E12 where E24 would keep it', () => {
    // IEC 60063:2015 table 1: 2.0 is in E24 only; E12 has 1.8 and 2.2, and ln(2.2/2) < ln(2/1.8).
    assert.equal(snaps(schmitt('47k', '2n', 'E24')).length, 0);
    const [finding] = snaps(schmitt('47k', '2n', 'e12'));
    assert.equal(finding.fixes?.[0].edits[0].newText, '2.2 nF');
  });

  it('accepts E96 and letter-code values that are on the series', () => {
    // E96 … 4.64, 4.75, 4.87 … (IEC 60063:2015 table 2, from memory); 4k7 is 4.7 kΩ by IEC 60062:2016 §4.
    assert.equal(snaps(schmitt('47.5k', '10n', 'E96')).length, 0);
    assert.equal(snaps(schmitt('4k7', '4n7', 'E6')).length, 0);
    // 4.7 is not an E96 value (4.64 and 4.75 are): it snaps to 4.75.
    assert.equal(snaps(schmitt('4k7', '10n', 'E96'))[0]?.fixes?.[0].edits[0].newText, '4.75 kΩ');
  });

  it('stays quiet without `series:`, with `series: none`, and for expressions, names and voltages', () => {
    assert.equal(snaps(schmitt('47.5k', '2.05n')).length, 0);
    assert.equal(snaps(schmitt('47.5k', '2.05n', 'none')).length, 0);
    assert.equal(snaps(schmitt('2 * 23.75k', '10n', 'E24')).length, 0);
    // 3.4 V is no part value: only R and C are checked.
    const block = noteBlock(['circuit: schmitt-rc', 'supply: 3.4 V', 'vt+: 2.1 V', 'vt-: 1.3 V', 'r: 47k', 'c: 10n', 'series: E24']);
    assert.equal(snaps(block).length, 0);
  });

  it('checks both resistors of a 555 and names each', () => {
    const block = noteBlock(['circuit: 555-astable', 'supply: 9 V', 'ra: 1.05k', 'rb: 68k', 'c: 10n', 'series: E12']);
    // E12 has 1.0 and 1.2, and 6.8 (IEC 60063:2015 table 1): ra snaps to 1 kΩ, rb is on the series.
    assert.deepEqual(snaps(block).map((f) => f.fixes?.[0].edits[0].newText), ['1 kΩ']);
    assert.match(snaps(block)[0].message, /`ra`/);
  });

  it('leaves no finding once its fix is applied (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 9.99e6, noNaN: true }), fc.constantFrom('E6', 'E12', 'E24', 'E48', 'E96', 'E192'), (ohms, series) => {
        const before = noteText(`${ohms}`, series);
        const first = analyzeText('notes/a.md', before).blocks[0];
        const fix = snaps(first)[0]?.fixes?.[0].edits[0];
        if (!fix) return true;
        const after = before.slice(0, fix.span.start) + fix.newText + before.slice(fix.span.end);
        return snaps(analyzeText('notes/a.md', after).blocks[0]).length === 0;
      }),
      { numRuns: 200 },
    );
  });
});

function noteText(r: string, series: string): string {
  return ['```timing p', 'circuit: rc-delay', `r: ${r}`, 'c: 1u', 'to: 2 V', 'toward: 3 V', `series: ${series}`, '```', ''].join('\n');
}
