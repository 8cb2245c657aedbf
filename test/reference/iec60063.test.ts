// IEC 60063:2015 preferred number series, checked value by value against the standard's tables.
import { strict as assert } from 'assert';
import { seriesValues, type SeriesName } from '../../core/series';

const list = (text: string): number[] => text.trim().split(/\s+/).map(Number);

describe('IEC 60063 preferred number series', () => {
  // IEC 60063:2015 table 1 (E3 … E24, two significant figures).
  const twoFigure: Array<[SeriesName, string]> = [
    ['E3', '1.0 2.2 4.7'],
    ['E6', '1.0 1.5 2.2 3.3 4.7 6.8'],
    ['E12', '1.0 1.2 1.5 1.8 2.2 2.7 3.3 3.9 4.7 5.6 6.8 8.2'],
    ['E24', '1.0 1.1 1.2 1.3 1.5 1.6 1.8 2.0 2.2 2.4 2.7 3.0 3.3 3.6 3.9 4.3 4.7 5.1 5.6 6.2 6.8 7.5 8.2 9.1'],
  ];
  for (const [name, table] of twoFigure) {
    it(`${name} is the full table`, () => {
      assert.deepEqual([...seriesValues(name)], list(table)); // IEC 60063:2015 table 1
    });
  }

  it('E24 keeps the hand-rounded values where the geometric series differs', () => {
    // IEC 60063:2015 table 1: 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2 are not round(10^(i/24), 1).
    const e24 = seriesValues('E24');
    const geometric = e24.map((_, i) => Math.round(Math.pow(10, i / 24) * 10) / 10);
    const departures = e24.filter((v, i) => v !== geometric[i]);
    assert.deepEqual(departures, [2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 8.2]);
  });

  it('E96 is the full table', () => {
    // IEC 60063:2015 table 2, E96 column (from memory; it also matches the EIA-198 list used by resistor makers).
    assert.deepEqual([...seriesValues('E96')], list(`
      1.00 1.02 1.05 1.07 1.10 1.13 1.15 1.18 1.21 1.24 1.27 1.30 1.33 1.37 1.40 1.43 1.47 1.50 1.54 1.58
      1.62 1.65 1.69 1.74 1.78 1.82 1.87 1.91 1.96 2.00 2.05 2.10 2.15 2.21 2.26 2.32 2.37 2.43 2.49 2.55
      2.61 2.67 2.74 2.80 2.87 2.94 3.01 3.09 3.16 3.24 3.32 3.40 3.48 3.57 3.65 3.74 3.83 3.92 4.02 4.12
      4.22 4.32 4.42 4.53 4.64 4.75 4.87 4.99 5.11 5.23 5.36 5.49 5.62 5.76 5.90 6.04 6.19 6.34 6.49 6.65
      6.81 6.98 7.15 7.32 7.50 7.68 7.87 8.06 8.25 8.45 8.66 8.87 9.09 9.31 9.53 9.76`));
  });

  it('E48 spot values', () => {
    // IEC 60063:2015 table 2, E48 column (from memory).
    const e48 = seriesValues('E48');
    assert.equal(e48.length, 48);
    assert.deepEqual([e48[0], e48[1], e48[7], e48[16], e48[24], e48[32], e48[47]], [1.0, 1.05, 1.4, 2.15, 3.16, 4.64, 9.53]);
  });

  it('E192 spot values, including 9.20 where round(10^(185/192), 2) gives 9.19', () => {
    // IEC 60063:2015 table 2, E192 column (from memory). 9.20 is the one departure from the formula we are sure of.
    const e192 = seriesValues('E192');
    assert.equal(e192.length, 192);
    assert.equal(Math.round(Math.pow(10, 185 / 192) * 100) / 100, 9.19);
    assert.deepEqual(
      [e192[1], e192[3], e192[7], e192[57], e192[134], e192[184], e192[185], e192[186], e192[191]],
      [1.01, 1.04, 1.09, 1.98, 4.99, 9.09, 9.2, 9.31, 9.88]);
  });

  it('each coarser series is a subset of the next finer one', () => {
    // IEC 60063:2015 clause 4: E6 ⊂ E12 ⊂ E24 and E48 ⊂ E96 ⊂ E192 (E48 is every second E96 value).
    const pairs: Array<[SeriesName, SeriesName]> = [['E3', 'E6'], ['E6', 'E12'], ['E12', 'E24'], ['E48', 'E96'], ['E96', 'E192']];
    for (const [coarse, fine] of pairs) {
      const f = new Set(seriesValues(fine));
      assert.deepEqual(seriesValues(coarse).filter((v) => !f.has(v)), [], `${coarse} ⊄ ${fine}`);
    }
  });
});
