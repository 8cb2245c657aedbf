// The quick shape of parseValue (a number with its prefix and unit, an optional `±` tolerance) is read by one
// regex; here it must give exactly what the general lexer and parser give, for generated text of that shape and
// near it: the same tree, spans, tolerance and findings, with the same fields in the same order.
// Units and prefixes: BIPM SI Brochure, 9th ed., table 7; letter-and-digit codes: IEC 60062.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { parseValue, parseValueGeneral } from '../../core/value/parse';

const numbers = ['0', '1', '47', '1000', '1.5', '.5', '0.047', '007', '1e3', '1E-3', '2.5e+2', '1e400', '1e-400', '0e5', '9'.repeat(400), '1.', '1e', '4k7', '2R2', '3V3', 'R47', '1_0'];
const suffixes = ['', 'k', 'K', 'M', 'G', 'T', 'm', 'u', 'µ', 'μ', 'n', 'p', 'f', 'Ω', 'Ω', 'R', 'ohm', 'ohms', 'F', 'V', 'A', 'Hz', 'kHz', 'MHz',
  's', 'ms', 'us', 'µs', 'baud', 'Bd', 'kBd', 'bit/s', 'kbit/s', 'Mbit/s', 'bits', 'bit/', 'bit/sx', '%', 'k%', 'ppm', 'mppm', 'kΩ', 'MΩ', 'nF', 'pF',
  'mV', 'hz', 'HZ', 'khz', 'x', 'kx', 'e', 'E', 'Hzz', '_', 'k_', 'mA2', 'k7', 'V3', '/s'];
const spaces = ['', ' ', '  ', '\t', '\u00a0', '\u202f', '\r\n', '\n', '\u2009'];
const signs = ['±', '+-', '+/-', '+', '-', '−', '+ -', '±±', '*', '/', '?', '('];

const quantity = fc.tuple(fc.constantFrom(...numbers), fc.constantFrom(...spaces), fc.constantFrom(...suffixes))
  .map(([n, s, u]) => n + (u === '' ? '' : s) + u);
const shaped = fc.tuple(quantity, fc.option(fc.tuple(fc.constantFrom(...spaces), fc.constantFrom(...signs), fc.constantFrom(...spaces), quantity), { nil: undefined }),
  fc.constantFrom(...spaces), fc.constantFrom(...spaces))
  .map(([q, tol, lead, trail]) => lead + q + (tol ? tol.join('') : '') + trail);
const nearby = fc.tuple(shaped, fc.constantFrom('', ' x', ', 2', ')', '(', ' * 2', '±1%', ' -20%', '%', 'k', '.', '@a'), fc.boolean())
  .map(([text, extra, before]) => (before ? extra + text : text + extra));
const pieces = ['1', '0', '.', 'e', 'k', 'Hz', ' ', '±', '+', '-', '/', 's', 'bit', '%', 'µ', 'Ω', 'R', 'V', '4', '\u00a0', '+/-'];
const jumbled = fc.array(fc.constantFrom(...pieces), { maxLength: 14 }).map((parts) => parts.join(''));

function same(text: string, offset: number): void {
  const quick = parseValue(text, offset);
  const general = parseValueGeneral(text, offset);
  assert.deepStrictEqual(quick, general, JSON.stringify(text));
  assert.equal(JSON.stringify(quick), JSON.stringify(general), `field order of ${JSON.stringify(text)}`);
}

describe('parseValue quick shape', () => {
  it('agrees with the general parser on the written examples', () => {
    for (const text of [
      '1000 Hz ±1%', '1 kHz', '16MHz', '47k', '47 kΩ', '100n', '100 nF', '50 %', '115200 baud', '500 kbit/s', '500kbit/s',
      '3.3 V ± 0.1 V', '1.5e3 Hz +-2%', '1 MHz +/- 50 ppm', '47k ±5%', '10 ±1%', '10 ±1', '1 kHz ±200%', '1 kHz ±100%',
      '47 k', '47 kx', '1e400', '0e5', '1e-400 Hz', '4k7', '2R2', '3V3 ±1%', 'R47', '1 kHz ± -1%', '1 kHz ±', '±1%',
      '1 kHz +80% -20%', '1 Hz±0.5 Hz', '.5 s', '5. s', '1 Hz ±1 %', '  1 Hz ±1%  ', '1\u00a0kHz\u202f±\u00a01\u00a0%',
    ]) {
      same(text, 0);
      same(text, 1234);
    }
  });

  it('agrees with the general parser on generated values of the shape and near it', () => {
    fc.assert(fc.property(fc.oneof(shaped, nearby, jumbled), fc.nat(100_000), (text, offset) => same(text, offset)), { numRuns: 20_000 });
  });

  it('reads words as the grammar says: letter or `_` first, runs of letters, digits and `_` joined by single hyphens', () => {
    const word = fc.array(fc.constantFrom('a', 'Z', '_', '0', '9', '-', 'R', '4', 'x-', '--', 'é', ' '), { minLength: 1, maxLength: 10 }).map((p) => p.join(''));
    fc.assert(fc.property(word, (text) => {
      const body = text.trim();
      const runs = body.split('-');
      const isWord = /^[A-Za-z_]/.test(body) && runs.every((r) => r.length > 0 && /^[A-Za-z0-9_]+$/.test(r));
      const letterDigit = runs.length === 1 && /^R[0-9]+$/.test(body);
      const parsed = parseValue(text, 0);
      assert.equal(parsed.word, isWord && !letterDigit ? body : undefined, JSON.stringify(text));
      assert.equal(parsed.expr?.kind === 'ident', isWord && !letterDigit && runs.length === 1, JSON.stringify(text));
    }), { numRuns: 5000 });
  });
});
