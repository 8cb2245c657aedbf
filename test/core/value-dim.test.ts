// Unit-aware dimensions of value arithmetic, against the SI's coherent derived units.
import { strict as assert } from 'assert';
import { parseValue, dimOf, type ValueNode } from '../../core/value';
import type { Dim } from '../../core/types';
import { Code } from '../../core/codes';

const keys: Record<string, Dim> = { supply: 'V', r: 'Ω', c: 'F', clock: 'Hz', duty: '%', rate: 'baud', count: '', power: 'other' };
const lookup = (name: string): Dim | undefined => keys[name];

function tree(text: string): ValueNode {
  const parsed = parseValue(text, 0);
  assert.deepEqual(parsed.findings, [], text);
  return parsed.expr as ValueNode;
}

function dim(text: string): Dim {
  const result = dimOf(tree(text), lookup);
  assert.ok('dim' in result, `${text}: ${JSON.stringify(result)}`);
  return result.dim;
}

function mismatch(text: string): { code: string; message: string; span: [number, number] } {
  const result = dimOf(tree(text), lookup);
  assert.ok('finding' in result, `${text} should not check`);
  return { code: result.finding.code, message: result.finding.message, span: [result.finding.span.start, result.finding.span.end] };
}

describe('value dimensions', () => {
  it('products and quotients follow the SI derived units', () => {
    // BIPM SI Brochure 9th ed. table 4: Ω = V/A, F = C/V = A·s/V, Hz = s⁻¹; hence Ω·F = s.
    assert.equal(dim('47 kΩ * 100 nF'), 's');
    assert.equal(dim('r * c'), 's');
    assert.equal(dim('1 / (50 Hz)'), 's');
    assert.equal(dim('1 / (r * c)'), 'Hz');
    assert.equal(dim('3.3 V / 10 mA'), 'Ω');
    assert.equal(dim('supply / r'), 'A');
    assert.equal(dim('2 ms * 1 kHz'), '');
    assert.equal(dim('1 s / 1 ms'), '');
    assert.equal(dim('2 mA * 1 kΩ'), 'V');
  });

  it('scaling by a plain number keeps the unit; a plain-number product stays plain', () => {
    // Common practice: a number without a unit is a pure factor (47k * 100n has no unit, it is 4.7e-3).
    assert.equal(dim('8 MHz * 9'), 'Hz');
    assert.equal(dim('clock / 64'), 'Hz');
    assert.equal(dim('0.6 * supply'), 'V');
    assert.equal(dim('47k * 100n'), '');
    assert.equal(dim('-supply'), 'V');
  });

  it('products outside the table are `other`', () => {
    // BIPM SI Brochure 9th ed. table 4: V·A is the watt, which no timing key takes.
    assert.equal(dim('supply * 1 A'), 'other');
    assert.equal(dim('power * 2'), 'other');
  });

  it('percent is a fraction: scaled, summed, or applied to a quantity', () => {
    // BIPM SI Brochure 9th ed.: % stands for the number 0.01 (from memory).
    assert.equal(dim('50 %'), '%');
    assert.equal(dim('10 % + 5 %'), '%');
    assert.equal(dim('duty / 2'), '%');
    assert.equal(dim('50 % * supply'), 'V');
    assert.equal(dim('1 + 5 %'), '');
  });

  it('baud stands alone or scaled by a plain number', () => {
    assert.equal(dim('115200 baud'), 'baud');
    assert.equal(dim('rate * 2'), 'baud');
    assert.equal(dim('rate / 2'), 'baud');
    assert.equal(mismatch('rate * clock').code, Code.valueUnit);
  });

  it('adding unlike units is a finding at the operator', () => {
    // Quantities of different dimension cannot be added (ISO 80000-1 clause 5, from memory).
    assert.deepEqual(mismatch('1 V + 2 Ω'), { code: Code.valueUnit, message: '`+`: cannot add Ω to V', span: [4, 5] });
    assert.deepEqual(mismatch('supply - 0.1'), { code: Code.valueUnit, message: '`-`: cannot subtract a plain number from V — give the number a unit (V)', span: [7, 8] });
    assert.deepEqual(mismatch('(r * c) + 1 ms * 2 + 3 V').span, [19, 20]);
  });

  it('an unknown name is a finding at the name', () => {
    const result = dimOf(tree('2 * vcc'), lookup);
    assert.ok('finding' in result);
    assert.equal(result.finding.code, Code.identifierUnknown);
    assert.deepEqual(result.finding.span, { start: 4, end: 7 });
  });
});
