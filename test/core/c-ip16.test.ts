// ip16 (int 16-bit, long 32-bit, float and double 32-bit, as avr-gcc): each value worked by hand from the rules
// of ISO C11 cited beside it. The same rules are checked against avr-gcc itself in test/reference/gcc-constants,
// gcc-ubsan and end-to-end.
import { strict as assert } from 'assert';
import { buildConstantTable, type DataModel } from '../../core/c';

const evalIn = (model: DataModel, expr: string): string => {
  const t = buildConstantTable('/w/a.c', '#define F_CPU 16000000UL\n#define BAUD 9600\n', { dataModel: model, includeDirs: [], workspaceRoots: ['/w'], read: () => undefined });
  const r = t.evaluate(expr);
  return r.ok ? `${r.value.value} ${r.value.type}` : `error ${r.code}`;
};
const ip16 = (expr: string): string => evalIn('ip16', expr);

describe('C constants under ip16, by hand', () => {
  it('200 * 200 overflows a 16-bit int: undefined behaviour (C11 6.5p5, by hand), a finding rather than a wrapped -25536', () => {
    assert.equal(ip16('200 * 200'), 'error c-undefined');
    assert.equal(evalIn('ilp32', '200 * 200'), '40000 int');
    assert.equal(ip16('(int16_t)(200L * 200)'), '-25536 int16_t', 'a cast of an out-of-range long wraps: implementation-defined, gcc wraps (C11 6.3.1.3p3)');
  });

  it('200u * 200u stays unsigned int: 40000 (C11 6.2.5p9, by hand)', () => {
    assert.equal(ip16('200u * 200u'), '40000 unsigned int');
  });

  it('types decimal 40000 as long and hex 0xFFFF as unsigned int (C11 6.4.4.1p5, by hand)', () => {
    assert.equal(ip16('40000'), '40000 long');
    assert.equal(ip16('0xFFFF'), '65535 unsigned int');
    assert.equal(ip16('65536'), '65536 long');
    assert.equal(ip16('32767'), '32767 int');
  });

  it('promotes uint8_t to int, and uint16_t to unsigned int (C11 6.3.1.1p2, by hand)', () => {
    assert.equal(ip16('(uint8_t)200 + (uint8_t)100'), '300 int');
    assert.equal(ip16('(uint16_t)65535 + 1'), '0 unsigned int');
  });

  it('compares -1 with 0u as unsigned, but -1L with 0u as long (C11 6.3.1.8, by hand)', () => {
    assert.equal(ip16('-1 < 0u'), '0 int');
    assert.equal(ip16('-1L < 0u'), '1 int');
  });

  it('sizeof(int) is 2 and sizeof(long) is 4 (the ip16 data model)', () => {
    assert.equal(ip16('sizeof(int) * 10 + sizeof(long)'), '24 unsigned int');
  });

  it('16 * BAUD overflows int on an 8-bit MCU, the reason AVR baud macros write 16UL (common practice, from memory)', () => {
    // 16 * 9600 = 153600 > INT_MAX = 32767: undefined (C11 6.5p5); a wrapping compiler would give 22528.
    assert.equal(ip16('16 * BAUD'), 'error c-undefined');
    assert.equal(evalIn('ilp32', '16 * BAUD'), '153600 int');
    assert.equal(ip16('F_CPU / (16UL * BAUD) - 1'), '103 unsigned long');
  });

  it('double is binary32: 20000001 needs 25 significant bits, so it rounds to even, 20000000 (IEC 60559, by hand)', () => {
    assert.equal(ip16('(unsigned long)(20000001UL * 1.0)'), '20000000 unsigned long');
    assert.equal(evalIn('ilp32', '(unsigned long)(20000001UL * 1.0)'), '20000001 unsigned long', 'binary64 holds it exactly');
    assert.equal(ip16('sizeof(double) * 10 + sizeof(long double)'), '44 unsigned int');
    // 16e6 / 3 = 5333333.33…; binary32 neighbours there are 0.5 apart, so the quotient rounds to 5333333.5.
    assert.equal(ip16('16e6 / 3'), '5333333.5 double');
  });

  it('shifting a 16-bit int by 16 is out of range (C11 6.5.7p3)', () => {
    assert.equal(ip16('1 << 16'), 'error c-undefined');
    assert.equal(ip16('1L << 16'), '65536 long');
  });
});
