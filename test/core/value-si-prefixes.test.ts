// SI prefixes in values and in formatted results, against the BIPM SI Brochure, 9th ed. (2019), table 7.
import { strict as assert } from 'assert';
import { parseValue } from '../../core/value';
import { formatQuantity } from '../../core/format';

function numberOf(text: string): number {
  const parsed = parseValue(text, 0);
  assert.deepEqual(parsed.findings, [], text);
  assert.ok(parsed.expr?.kind === 'number', text);
  return parsed.expr.value;
}

describe('SI prefixes', () => {
  // BIPM SI Brochure 9th ed., table 7: symbol and factor.
  const table: Array<[string, number]> = [
    ['f', 1e-15], ['p', 1e-12], ['n', 1e-9], ['µ', 1e-6], ['m', 1e-3], ['k', 1e3], ['M', 1e6], ['G', 1e9], ['T', 1e12],
  ];
  for (const [prefix, factor] of table) {
    it(`${prefix} = ${factor}`, () => {
      assert.equal(numberOf(`1${prefix}`), factor); // BIPM SI Brochure 9th ed. table 7
      assert.equal(numberOf(`1 ${prefix}V`), factor); // BIPM SI Brochure 9th ed. table 7
      assert.equal(formatQuantity(factor, 'V'), `1 ${prefix}V`); // BIPM SI Brochure 9th ed. table 7
    });
  }

  it('micro written as u, as the Greek mu or as the micro sign', () => {
    // BIPM SI Brochure 9th ed. table 7 gives µ; `u` where µ cannot be typed is common practice (ISO 2955, from memory).
    assert.equal(numberOf('1u'), 1e-6);
    assert.equal(numberOf('1\u03bcs'), 1e-6);
    assert.equal(numberOf('1\u00b5s'), 1e-6);
  });

  it('prefixes are case-sensitive: m is milli and M is mega', () => {
    // BIPM SI Brochure 9th ed. 3.1: prefix symbols are printed in the case shown in table 7.
    assert.equal(numberOf('1 mHz'), 1e-3);
    assert.equal(numberOf('1 MHz'), 1e6);
  });

  it('a decimal value times a prefix is the nearest double, not a product with rounding noise', () => {
    // IEEE 754 round-to-nearest of the decimal 100e-9 (ECMAScript Number conversion).
    assert.equal(numberOf('100n'), 1e-7);
    assert.equal(numberOf('4.7 nF'), 4.7e-9);
    assert.equal(numberOf('0.1 uF'), 1e-7);
  });
});
