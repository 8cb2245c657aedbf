// IEC 60063:2015 series; the RC charging law (f ∝ 1/R for RC oscillators) and the NE555 law (SLFS022), where a
// part moves the frequency at most in proportion to itself.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { noteBlock } from '../helpers/analyze';
import { neighboursInSeries, seriesValues, type SeriesName } from '../../core/series';

/** The widest ratio between neighbouring values of a series, across the decade (IEC 60063:2015 tables). */
function widestStep(series: SeriesName): number {
  const values = [...seriesValues(series), 10];
  let widest = 1;
  for (let i = 1; i < values.length; i++) widest = Math.max(widest, values[i] / values[i - 1]);
  return widest;
}

describe('solving a part onto a standard series (property)', () => {
  const seriesArb = fc.constantFrom<SeriesName>('E6', 'E12', 'E24', 'E96');

  it('picks a neighbour of the exact value and recomputes within one series step of the target', () => {
    let runs = 0;
    let solvedRuns = 0;
    fc.assert(
      fc.property(seriesArb, fc.double({ min: 1, max: 5, noNaN: true }), fc.constantFrom('schmitt-rc', '555-astable', 'inverter-rc'), (series, decades, circuit) => {
        const target = 10 ** decades; // 10 Hz … 100 kHz
        const lines = {
          'schmitt-rc': ['circuit: schmitt-rc', 'supply: 5 V', 'vt+: 3 V', 'vt-: 1.5 V', 'r: ?', 'c: 10n'],
          '555-astable': ['circuit: 555-astable', 'supply: 9 V', 'ra: 1k', 'rb: ?', 'c: 10n'],
          'inverter-rc': ['circuit: inverter-rc', 'supply: 3.3 V', 'r: ?', 'c: 1n'],
        }[circuit];
        const block = noteBlock([...lines, `target: ${target} Hz ±50%`, `series: ${series}`]);
        runs++;
        const [key, solved] = Object.entries(block.solved ?? {})[0] ?? [];
        if (!solved) {
          // Outside what the part can reach (e.g. RB below zero): then it must be said, never silent.
          assert.ok(block.findings.some((f) => f.code === 'solve-failed'), 'an unsolved `?` is reported');
          return;
        }
        solvedRuns++;
        const { below, above } = neighboursInSeries(solved.exact!, series);
        assert.ok(solved.value === below || solved.value === above, `${key} ${solved.value} is not next to ${solved.exact}`);
        // Frequency moves at most in proportion to the part (f ∝ 1/R for RC oscillators; less for RB of a 555).
        const step = widestStep(series);
        const f = block.values.frequency;
        assert.ok(f / target <= step && target / f <= step, `${f} Hz from ${target} Hz is more than one ${series} step`);
      }),
      { numRuns: 150 },
    );
    // The property must speak of solved parts, not pass by solving nothing.
    assert.ok(solvedRuns >= runs * 0.8, `only ${solvedRuns} of ${runs} targets were solved`);
  });
});
