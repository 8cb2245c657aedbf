// Display of results (engineering notation, SI prefixes) and the float comparison the checks rely on.
import { strict as assert } from 'assert';
import { formatQuantity, formatPercent, formatSignedPercent, formatNumber } from '../../core/format';
import { approxEqual, relativeError } from '../../core/num';

describe('formatQuantity', () => {
  it('engineering notation: exponent a multiple of 3, SI prefix, space before the unit', () => {
    // BIPM SI Brochure 9th ed. table 7 for the prefixes; a space between number and unit (ibid. 5.4.3, from memory).
    assert.equal(formatQuantity(189.3, 'Hz'), '189.3 Hz');
    assert.equal(formatQuantity(0.005283, 's'), '5.283 ms');
    assert.equal(formatQuantity(47000, 'Ω'), '47 kΩ');
    assert.equal(formatQuantity(1e-7, 'F'), '100 nF');
    assert.equal(formatQuantity(4.7e-6, 'F'), '4.7 µF');
    assert.equal(formatQuantity(16e6, 'Hz'), '16 MHz');
    assert.equal(formatQuantity(115200, 'baud'), '115.2 kbaud');
  });

  it('rounds to significant figures before choosing the prefix', () => {
    // 999.96 to 4 significant figures is 1000, written 1 k in engineering notation (common practice).
    assert.equal(formatQuantity(999.96, 'Hz'), '1 kHz');
    assert.equal(formatQuantity(0.0052834, 's'), '5.283 ms');
    assert.equal(formatQuantity(123456, 'Hz', 3), '123 kHz');
    assert.equal(formatQuantity(1.5e-3, 's', 6), '1.5 ms');
  });

  it('zero, negatives and values without a prefix', () => {
    assert.equal(formatQuantity(0, 's'), '0 s');
    assert.equal(formatQuantity(-0.0025, 'V'), '\u22122.5 mV');
    assert.equal(formatQuantity(47000, ''), '47k');
    assert.equal(formatQuantity(1e-20, 's'), '1e-20 s');
    assert.equal(formatQuantity(2500, 'other'), '2.5k');
  });

  it('non-finite values print as a dash', () => {
    assert.equal(formatQuantity(NaN, 'Hz'), '—');
    assert.equal(formatQuantity(Infinity, 's'), '—');
    assert.equal(formatPercent(-Infinity), '—');
  });
});

describe('formatPercent and formatSignedPercent', () => {
  it('fractions as percent with a space before %', () => {
    // BIPM SI Brochure 9th ed.: a space separates the number and % (from memory).
    assert.equal(formatPercent(0.468), '46.8 %');
    assert.equal(formatPercent(0.5), '50 %');
    assert.equal(formatQuantity(0.25, '%'), '25 %');
  });

  it('differences with a real minus sign', () => {
    // U+2212 MINUS SIGN is the typographic minus (Unicode Standard, Mathematical Operators block).
    assert.equal(formatSignedPercent(-0.023), '\u22122.3 %');
    assert.equal(formatSignedPercent(0.05), '+5 %');
    assert.equal(formatSignedPercent(0), '0 %');
    assert.equal(formatSignedPercent(NaN), '—');
  });
});

describe('formatNumber', () => {
  it('plain numbers to significant figures', () => {
    assert.equal(formatNumber(0.0052834), '0.005283');
    assert.equal(formatNumber(123456789), '123500000');
    assert.equal(formatNumber(-3), '\u22123');
    assert.equal(formatNumber(0), '0');
    assert.equal(formatNumber(2 / 3, 2), '0.67');
  });
});

describe('approxEqual and relativeError', () => {
  it('absorbs binary rounding but not real differences', () => {
    // IEEE 754 binary64: 0.1 + 0.2 is 0.30000000000000004, not 0.3.
    assert.ok(approxEqual(0.1 + 0.2, 0.3));
    assert.ok(!approxEqual(1, 1.001));
    assert.ok(approxEqual(1, 1.001, 1e-2));
    assert.ok(approxEqual(0, 1e-12, 0, 1e-9));
    assert.ok(!approxEqual(0, 1e-12));
  });

  it('NaN is never equal; infinities only to themselves', () => {
    // IEEE 754: NaN compares unequal to everything, itself included.
    assert.ok(!approxEqual(NaN, NaN));
    assert.ok(!approxEqual(NaN, 1, 1, 1));
    assert.ok(approxEqual(Infinity, Infinity));
    assert.ok(!approxEqual(Infinity, -Infinity));
    assert.ok(!approxEqual(Infinity, 1e308, 1));
  });

  it('relative error against a target', () => {
    assert.equal(relativeError(102, 100), 0.02);
    assert.equal(relativeError(99, 100), -0.01);
    assert.ok(Number.isNaN(relativeError(1, 0)));
    assert.ok(Number.isNaN(relativeError(NaN, 1)));
  });
});
