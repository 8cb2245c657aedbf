// Letter-and-digit ("RKM") code of IEC 60062:2016, read by the value parser.
import { strict as assert } from 'assert';
import { parseValue } from '../../core/value';
import type { Dim } from '../../core/types';

function read(text: string): { value: number; dim: Dim } {
  const parsed = parseValue(text, 0);
  assert.deepEqual(parsed.findings, [], text);
  const e = parsed.expr;
  assert.ok(e && e.kind === 'number', `${text} is a number`);
  return { value: e.value, dim: e.dim };
}

describe('IEC 60062 letter-and-digit code', () => {
  // IEC 60062:2016, clause on the letter and digit code for resistance and capacitance (RKM code):
  // the letter stands where the decimal point would be and gives the multiplier.
  const cases: Array<[string, number, Dim, string]> = [
    ['4k7', 4700, '', 'IEC 60062:2016 RKM code, k = 10^3'],
    ['2R2', 2.2, 'Ω', 'IEC 60062:2016 RKM code, R = 10^0 for resistance'],
    ['R47', 0.47, 'Ω', 'IEC 60062:2016 RKM code, leading R for values below 1 Ω'],
    ['1M5', 1.5e6, '', 'IEC 60062:2016 RKM code, M = 10^6'],
    ['4n7', 4.7e-9, '', 'IEC 60062:2016 RKM code, n = 10^-9 for capacitance'],
    ['6p8', 6.8e-12, '', 'IEC 60062:2016 RKM code, p = 10^-12'],
    ['2u2', 2.2e-6, '', 'IEC 60062:2016 RKM code, µ written u where µ is not available'],
    ['2µ2', 2.2e-6, '', 'IEC 60062:2016 RKM code, µ = 10^-6'],
    ['1G0', 1e9, '', 'IEC 60062:2016 RKM code, G = 10^9'],
    ['4K7', 4700, '', 'IEC 60062:2016 RKM code uses upper-case K for resistors'],
    ['3V3', 3.3, 'V', 'common practice on schematics: V as the decimal marker for volts'],
    ['0R', 0, 'Ω', 'common practice: 0R for a zero-ohm link'],
    ['47R', 47, 'Ω', 'common practice: R after the digits for whole ohms'],
  ];
  for (const [text, value, dim, source] of cases) {
    it(`${text} = ${value} ${dim}`, () => {
      const got = read(text); // source named in the case table above
      assert.equal(got.value, value, source);
      assert.equal(got.dim, dim, source);
    });
  }

  it('a code may carry a unit after it', () => {
    // IEC 60062:2016 RKM code; the unit symbol after it is common practice on BOMs (4k7Ω).
    assert.deepEqual(read('4k7Ω'), { value: 4700, dim: 'Ω' });
    assert.deepEqual(read('4n7F'), { value: 4.7e-9, dim: 'F' });
  });

  it('a decimal point together with a code letter is not a code', () => {
    // IEC 60062:2016 RKM code: the letter replaces the decimal point, so both at once is malformed.
    const parsed = parseValue('4.7k7', 0);
    assert.equal(parsed.expr, undefined);
    assert.equal(parsed.findings.length, 1);
    assert.deepEqual(parsed.findings[0].span, { start: 3, end: 5 });
  });
});
