// Comma lists (`expect: 1 kHz ±1%, 50 %`) and integer sets (`prescalers: 1, 8, 64` or `1..65536`).
import { strict as assert } from 'assert';
import { splitList, parseIntegerSet } from '../../core/value';
import { Code } from '../../core/codes';

describe('splitList', () => {
  it('splits at top-level commas with trimmed pieces and their offsets', () => {
    assert.deepEqual(splitList(' 1 kHz ±1%,  50 % ', 20), [{ text: '1 kHz ±1%', offset: 21 }, { text: '50 %', offset: 33 }]);
  });
  it('keeps commas inside parentheses', () => {
    assert.deepEqual(splitList('(a, b), c', 0), [{ text: '(a, b)', offset: 0 }, { text: 'c', offset: 8 }]);
  });
  it('keeps empty pieces so that a stray comma is reported where it is', () => {
    assert.deepEqual(splitList('1,,2', 0).map((p) => p.text), ['1', '', '2']);
  });
});

describe('parseIntegerSet', () => {
  it('a list, sorted and without repeats', () => {
    // AVR Timer0 clock-select prescalers 1, 8, 64, 256, 1024 (ATmega328P datasheet, TCCR0B; from memory).
    assert.deepEqual(parseIntegerSet('1, 8, 64, 256, 1024', 0), { set: { kind: 'list', values: [1, 8, 64, 256, 1024] }, findings: [] });
    assert.deepEqual(parseIntegerSet('64, 8, 8, 1', 0).set, { kind: 'list', values: [1, 8, 64] });
  });
  it('an inclusive range', () => {
    // STM32 16-bit PSC register divides by PSC + 1, i.e. 1..65536 (RM0008 timer chapter; from memory).
    assert.deepEqual(parseIntegerSet('1..65536', 0), { set: { kind: 'range', min: 1, max: 65536 }, findings: [] });
    assert.deepEqual(parseIntegerSet(' 1 .. 64k ', 0).set, { kind: 'range', min: 1, max: 64000 });
  });
  it('refuses fractions, units, names and backward ranges with positioned findings', () => {
    const fraction = parseIntegerSet('1, 2.5', 10);
    assert.equal(fraction.set, undefined);
    assert.deepEqual(fraction.findings.map((f) => [f.code, f.span.start, f.span.end]), [[Code.valueSyntax, 13, 16]]);
    assert.equal(parseIntegerSet('8 Hz', 0).findings.length, 1);
    assert.equal(parseIntegerSet('1, DIV', 0).findings[0].message, '`DIV`: a list takes plain numbers, not names');
    assert.equal(parseIntegerSet('9..2', 0).findings[0].message, 'range `9..2` runs backwards: write the smaller number first');
    assert.deepEqual(parseIntegerSet('1,,8', 0).findings.map((f) => f.span), [{ start: 2, end: 2 }]);
  });
});
