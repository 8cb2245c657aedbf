// The value language of DESIGN.md "Values": forms, spans, tolerances, `?`, words and the errors users see.
import { strict as assert } from 'assert';
import { parseValue, compileValue, type ValueNode } from '../../core/value';
import { Code } from '../../core/codes';

const OFFSET = 100;

function number(text: string): { value: number; dim: string } {
  const parsed = parseValue(text, OFFSET);
  assert.deepEqual(parsed.findings, [], text);
  assert.ok(parsed.expr?.kind === 'number', `${text} should be one number`);
  return { value: parsed.expr.value, dim: parsed.expr.dim };
}

function evaluate(text: string, env: Record<string, number> = {}): number {
  const parsed = parseValue(text, OFFSET);
  assert.deepEqual(parsed.findings, [], text);
  return compileValue(parsed.expr as ValueNode)(env);
}

function onlyFinding(text: string): { code: string; message: string; start: number; end: number } {
  const parsed = parseValue(text, OFFSET);
  assert.equal(parsed.findings.length, 1, `${text}: ${JSON.stringify(parsed.findings)}`);
  const f = parsed.findings[0];
  return { code: f.code, message: f.message, start: f.span.start - OFFSET, end: f.span.end - OFFSET };
}

describe('value forms', () => {
  it('numbers with a prefix and a unit, with or without a space', () => {
    // SI prefix factors: BIPM SI Brochure 9th ed. table 7; unit symbols: ibid. table 4.
    assert.deepEqual(number('47k'), { value: 47000, dim: '' });
    assert.deepEqual(number('47 kΩ'), { value: 47000, dim: 'Ω' });
    assert.deepEqual(number('47kΩ'), { value: 47000, dim: 'Ω' });
    assert.deepEqual(number('4.7kohm'), { value: 4700, dim: 'Ω' });
    assert.deepEqual(number('0.1 uF'), { value: 1e-7, dim: 'F' });
    assert.deepEqual(number('16 MHz'), { value: 16e6, dim: 'Hz' });
    assert.deepEqual(number('2.5 ms'), { value: 0.0025, dim: 's' });
    assert.deepEqual(number('3.3 V'), { value: 3.3, dim: 'V' });
    assert.deepEqual(number('20 mA'), { value: 0.02, dim: 'A' });
  });

  it('percent is a fraction, ppm a millionth, baud a rate of its own', () => {
    // BIPM SI Brochure 9th ed., quantities of dimension one: % is the number 0.01 (from memory); ppm = 10^-6 is common practice for crystals.
    assert.deepEqual(number('50 %'), { value: 0.5, dim: '%' });
    assert.deepEqual(number('46.8%'), { value: 0.468, dim: '%' });
    assert.deepEqual(number('20 ppm'), { value: 2e-5, dim: '%' });
    assert.deepEqual(number('115200 baud'), { value: 115200, dim: 'baud' });
    assert.deepEqual(number('9.6 kBd'), { value: 9600, dim: 'baud' });
  });

  it('scientific notation', () => {
    // Same e-notation as C floating constants, ISO/IEC 9899:2018 6.4.4.2.
    assert.deepEqual(number('1e-6'), { value: 1e-6, dim: '' });
    assert.deepEqual(number('1.5E3'), { value: 1500, dim: '' });
    assert.deepEqual(number('1e3 Hz'), { value: 1000, dim: 'Hz' });
  });

  it('number spans cover the unit and are document offsets', () => {
    const parsed = parseValue('  47 kΩ  ', OFFSET);
    assert.deepEqual(parsed.expr?.span, { start: OFFSET + 2, end: OFFSET + 7 });
  });

  it('arithmetic with precedence, parentheses, signs and names', () => {
    // Ordinary operator precedence: * and / bind tighter than + and − (ISO 80000-2).
    assert.equal(evaluate('8 MHz * 9'), 72e6);
    assert.equal(evaluate('1 / (50 Hz)'), 0.02);
    assert.equal(evaluate('1 + 2 * 3'), 7);
    assert.equal(evaluate('(1 + 2) * 3'), 9);
    assert.equal(evaluate('-2 * -3'), 6);
    assert.equal(evaluate('10 / 4 / 5'), 0.5);
    assert.equal(evaluate('10 − 4'), 6); // U+2212, as the formatter writes it
    assert.equal(evaluate('0.6 * supply', { supply: 5 }), 3);
    assert.ok(Number.isNaN(evaluate('0.6 * supply', {})));
  });

  it('binary nodes keep the operator span', () => {
    const parsed = parseValue('(a + b) * c', OFFSET);
    const e = parsed.expr;
    assert.ok(e?.kind === 'binary');
    assert.deepEqual(e.opSpan, { start: OFFSET + 8, end: OFFSET + 9 });
    assert.deepEqual(e.left.span, { start: OFFSET, end: OFFSET + 7 });
  });
});

describe('value tolerances', () => {
  it('symmetric, in every spelling', () => {
    for (const text of ['47k ±5%', '47k +-5%', '47k +/-5%', '47k ± 5 %', '47k±5%']) {
      const parsed = parseValue(text, OFFSET);
      assert.deepEqual(parsed.findings, [], text);
      assert.deepEqual(parsed.tolerance, { kind: 'relative', plus: 0.05, minus: 0.05 }, text);
      assert.equal(parsed.expr?.kind === 'number' && parsed.expr.value, 47000, text);
    }
  });

  it('asymmetric, as electrolytic and ceramic capacitors are specified', () => {
    // +80 % −20 % is the tolerance letter Z of IEC 60062:2016 (from memory).
    const parsed = parseValue('100n +80% -20%', OFFSET);
    assert.deepEqual(parsed.findings, []);
    assert.deepEqual(parsed.tolerance, { kind: 'relative', plus: 0.8, minus: 0.2 });
    assert.deepEqual(parsed.toleranceSpan, { start: OFFSET + 5, end: OFFSET + 14 });
    assert.deepEqual(parseValue('100n -20% +80%', 0).tolerance, { kind: 'relative', plus: 0.8, minus: 0.2 });
  });

  it('absolute, in SI', () => {
    const parsed = parseValue('3.3 V ±100 mV', OFFSET);
    assert.deepEqual(parsed.findings, []);
    assert.deepEqual(parsed.tolerance, { kind: 'absolute', plus: 0.1, minus: 0.1 });
    assert.equal(parsed.toleranceDim, 'V');
  });

  it('without a sign-glued pair, + and − stay arithmetic', () => {
    const parsed = parseValue('supply - 0.5 V + 0.1 V', OFFSET);
    assert.equal(parsed.tolerance, undefined);
    assert.equal(parsed.expr?.kind, 'binary');
  });

  it('tolerance mistakes are findings at the tolerance', () => {
    assert.deepEqual(onlyFinding('47k ±'), { code: Code.valueTolerance, message: 'tolerance without a number: write e.g. `±5%` or `±0.1 V`', start: 4, end: 5 });
    assert.equal(onlyFinding('47k ±-5%').message, 'negative tolerance: a `±` tolerance is a size, write it without a sign');
    assert.deepEqual({ ...onlyFinding('47k ±5'), message: '' }, { code: Code.valueTolerance, message: '', start: 5, end: 6 });
    assert.equal(onlyFinding('47k ±5% extra').code, Code.valueTolerance);
    assert.equal(onlyFinding('1u +10% -120%').code, Code.valueTolerance);
  });
});

describe('value unknowns and words', () => {
  it('`?` alone, with or without a tolerance', () => {
    assert.deepEqual(parseValue(' ? ', OFFSET).unknown, { start: OFFSET + 1, end: OFFSET + 2 });
    const withTolerance = parseValue('? ±1%', OFFSET);
    assert.ok(withTolerance.unknown);
    assert.deepEqual(withTolerance.tolerance, { kind: 'relative', plus: 0.01, minus: 0.01 });
    assert.equal(onlyFinding('2 * ?').message, '`?` stands alone as the whole value to solve for');
  });

  it('a bare word is a word, and a name when it is an identifier', () => {
    const upDown = parseValue('up-down', OFFSET);
    assert.equal(upDown.word, 'up-down');
    assert.equal(upDown.expr, undefined);
    assert.deepEqual(upDown.findings, []);
    const e24 = parseValue('E24', OFFSET);
    assert.equal(e24.word, 'E24');
    assert.deepEqual(e24.expr, { kind: 'ident', name: 'E24', span: { start: OFFSET, end: OFFSET + 3 } });
    assert.equal(parseValue('SYS_CLOCK_HZ', 0).expr?.kind, 'ident');
    assert.equal(parseValue('R47', 0).word, undefined); // a letter-and-digit code, not a word
  });
});

describe('value errors', () => {
  it('unknown suffix with a suggestion, at the suffix', () => {
    assert.deepEqual(onlyFinding('47kk'), { code: Code.valueUnit, message: '`47kk`: unknown suffix `kk` — did you mean `47k`?', start: 2, end: 4 });
    assert.equal(onlyFinding('16mhz').message, '`16mhz`: unknown suffix `mhz` — did you mean `16mHz` or `16MHz`?');
    assert.equal(onlyFinding('16 khz').message, '`16 khz`: unknown unit `khz` — did you mean `16 kHz`?');
    assert.match(onlyFinding('5q').message, /^`5q`: unknown suffix `q` — expected an SI prefix/);
  });

  it('a lone prefix after a space', () => {
    const f = onlyFinding('47 k');
    assert.equal(f.message, '`47 k`: write the prefix against the number (`47k`) or add a unit (`47 kΩ`)');
    assert.deepEqual([f.start, f.end], [3, 4]);
  });

  it('unbalanced parentheses at the parenthesis', () => {
    assert.deepEqual(onlyFinding('(1 + 2'), { code: Code.valueSyntax, message: 'unclosed `(`: add a `)`', start: 0, end: 1 });
    assert.deepEqual(onlyFinding('1 + 2)'), { code: Code.valueSyntax, message: '`)` without a matching `(`', start: 5, end: 6 });
    assert.deepEqual(onlyFinding('((1) 2)'), { code: Code.valueSyntax, message: 'expected `)` before `2` to close the `(`', start: 5, end: 6 });
  });

  it('trailing garbage, missing operands, stray characters', () => {
    assert.deepEqual(onlyFinding('47k 3'), { code: Code.valueSyntax, message: 'expected an operator (+ − * /) before `3`', start: 4, end: 5 });
    assert.deepEqual(onlyFinding('8 MHz *'), { code: Code.valueSyntax, message: 'expected a number or name after `*`', start: 6, end: 7 });
    assert.deepEqual({ ...onlyFinding('2 ^ 3'), message: '' }, { code: Code.valueSyntax, message: '', start: 2, end: 3 });
  });

  it('numbers beyond the range of a double', () => {
    // IEEE 754 binary64 overflows above about 1.8e308 and underflows below about 4.9e-324.
    assert.deepEqual(onlyFinding('1e999'), { code: Code.valueSyntax, message: '`1e999`: number out of range', start: 0, end: 5 });
    assert.equal(onlyFinding('1e-999 s').message, '`1e-999 s`: number out of range');
    assert.equal(onlyFinding('9'.repeat(400)).code, Code.valueSyntax);
    assert.deepEqual(number('0.0e5'), { value: 0, dim: '' });
  });

  it('an empty value', () => {
    assert.deepEqual(onlyFinding('   '), { code: Code.valueSyntax, message: 'empty value: write a number, a name, or `?`', start: 0, end: 3 });
    assert.equal(onlyFinding('±5%').message, 'a tolerance needs a value before it, e.g. `47k ±1%`');
  });

  it('nesting beyond the bound is a finding, not a stack overflow', () => {
    const deep = '('.repeat(200) + '1' + ')'.repeat(200);
    assert.equal(onlyFinding(deep).code, Code.valueTooDeep);
    assert.equal(onlyFinding('-'.repeat(5000) + '1').code, Code.valueTooDeep);
    assert.equal(onlyFinding(Array(2000).fill('1').join(' + ')).code, Code.valueTooDeep);
    const ok = '('.repeat(60) + '1' + ')'.repeat(60);
    assert.deepEqual(parseValue(ok, 0).findings, []);
  });
});
