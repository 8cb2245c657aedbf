// Picking standard parts from the IEC 60063 series: log-nearest value and the neighbours either side.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { nearestInSeries, neighboursInSeries, parseSeriesName, seriesValues, SERIES_NAMES } from '../../core/series';

describe('nearestInSeries', () => {
  it('picks the log-nearest standard value at any decade', () => {
    // IEC 60063:2015 table 1 E24 has 1.1 and 1.2; their geometric mean 1.149 lies below 1.183.
    assert.equal(nearestInSeries(11830, 'E24'), 12000);
    // E12 has 4.7 and 5.6 (IEC 60063:2015 table 1); their geometric mean is 5.13.
    assert.equal(nearestInSeries(5000, 'E12'), 4700);
    assert.equal(nearestInSeries(5200, 'E12'), 5600);
    // E6 4.7 (IEC 60063:2015 table 1) at the nano decade, exactly the double of 4.7e-9.
    assert.equal(nearestInSeries(4.6e-9, 'E6'), 4.7e-9);
    // E96 4.99 (IEC 60063:2015 table 2, from memory).
    assert.equal(nearestInSeries(4990.4, 'E96'), 4990);
  });

  it('crosses the decade boundary both ways', () => {
    // E24 ends at 9.1 (IEC 60063:2015 table 1); the geometric mean of 9.1 and 10 is 9.539.
    assert.equal(nearestInSeries(9.5, 'E24'), 9.1);
    assert.equal(nearestInSeries(9.6, 'E24'), 10);
    assert.equal(nearestInSeries(0.96, 'E24'), 1);
    // E3 is 1.0, 2.2, 4.7 (IEC 60063:2015 table 1): between 4.7 and 10 the mean is 6.86.
    assert.equal(nearestInSeries(690, 'E3'), 1000);
  });

  it('is NaN for values without a standard part', () => {
    assert.ok(Number.isNaN(nearestInSeries(0, 'E24')));
    assert.ok(Number.isNaN(nearestInSeries(-100, 'E24')));
    assert.ok(Number.isNaN(nearestInSeries(Infinity, 'E24')));
  });

  it('every standard value is its own nearest, and the nearest is one of the neighbours', () => {
    fc.assert(fc.property(fc.constantFrom(...SERIES_NAMES), fc.integer({ min: -12, max: 9 }), fc.nat(191), (name, decade, index) => {
      const values = seriesValues(name);
      const standard = Number(`${values[index % values.length]}e${decade}`);
      assert.equal(nearestInSeries(standard, name), standard);
    }));
    fc.assert(fc.property(fc.constantFrom(...SERIES_NAMES), fc.double({ min: 1e-12, max: 1e9, noNaN: true }), (name, x) => {
      const { below, above } = neighboursInSeries(x, name);
      // Within 1e-12 relative a value counts as standard, so that binary noise does not skip a part.
      assert.ok(below <= x * (1 + 1e-12) && x * (1 - 1e-12) <= above, `${below} ≤ ${x} ≤ ${above}`);
      assert.ok([below, above].includes(nearestInSeries(x, name)));
    }));
  });
});

describe('neighboursInSeries', () => {
  it('brackets a value with the standard values either side', () => {
    // IEC 60063:2015 table 1, E12: … 4.7, 5.6 … and E24: … 9.1, then 10 of the next decade.
    assert.deepEqual(neighboursInSeries(5000, 'E12'), { below: 4700, above: 5600 });
    assert.deepEqual(neighboursInSeries(9.5, 'E24'), { below: 9.1, above: 10 });
    assert.deepEqual(neighboursInSeries(4700, 'E12'), { below: 4700, above: 4700 });
  });
});

describe('parseSeriesName', () => {
  it('reads the series names of IEC 60063 in any case, and none', () => {
    assert.equal(parseSeriesName('E24'), 'E24');
    assert.equal(parseSeriesName(' e192 '), 'E192');
    assert.equal(parseSeriesName('None'), 'none');
    assert.equal(parseSeriesName('E25'), undefined);
    assert.equal(parseSeriesName(''), undefined);
  });
});
