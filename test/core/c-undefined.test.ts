// Signed overflow is undefined behaviour (ISO C11 6.5p5): a positioned finding naming the constant and the data
// model, never a wrapped number. Values worked by hand from the clause cited beside each check; the same rules are
// checked against gcc's sanitizer in test/reference/gcc-ubsan.test.ts for ilp32 and lp64.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { Code } from '../../core/codes';
import { valueOf, workspace } from './c-helpers';

const ip16 = (text: string) => workspace({ '/ws/main.c': text }, { dataModel: 'ip16' }).table('/ws/main.c');
const ilp32 = (text: string) => workspace({ '/ws/main.c': text }).table('/ws/main.c');

describe('C constants: signed overflow is undefined', () => {
  it('30000 + 30000 in a 16-bit int is a finding at the sum, naming the constant and ip16 (C11 6.5p5, by hand)', () => {
    const text = '#define LIMIT 30000\n#define I16 (LIMIT + 30000)\n';
    const r = ip16(text).lookup('I16');
    assert.ok(!r.ok);
    assert.equal(r.code, Code.cUndefined);
    assert.match(r.message, /^I16: 30000 \+ 30000 = 60000 overflows int, 16-bit under ip16/);
    assert.equal(r.at && text.slice(r.at.span.start, r.at.span.end), '(LIMIT + 30000)');
    // The same sum fits a 32-bit int (C11 5.2.4.2.1: INT_MAX at least 32767; 2147483647 under ilp32).
    assert.equal(valueOf(ilp32(text), 'I16'), 60000n);
  });

  it('a constant built on an undefined one reports the inner constant once, at its definition', () => {
    const text = 'static const int TICKS = 20000 * 2;\n#define PERIOD (TICKS + 1)\n';
    const r = ip16(text).lookup('PERIOD');
    assert.ok(!r.ok && r.code === Code.cUndefined);
    assert.match(r.message, /^TICKS: 20000 \* 2 = 40000 overflows/);
    assert.equal(r.at && text.slice(r.at.span.start, r.at.span.end), '20000 * 2');
    // A macro expands into the constant that uses it: the finding names that constant, placed in the macro's body.
    const m = '#define TICKS (20000 * 2)\nstatic const long PERIOD = TICKS + 1;\n';
    const viaMacro = ip16(m).lookup('PERIOD');
    assert.ok(!viaMacro.ok && /^PERIOD: 20000 \* 2/.test(viaMacro.message));
    assert.equal(viaMacro.at && m.slice(viaMacro.at.span.start, viaMacro.at.span.end), '(20000 * 2)');
  });

  it('an expression span is 0-based into the expression text', () => {
    const r = ip16('').evaluate('1 + (32767 + 1)');
    assert.ok(!r.ok && r.code === Code.cUndefined);
    assert.deepEqual(r.span, { start: 4, end: 15 });
  });

  it('INT_MIN / -1, INT_MIN % -1 and -INT_MIN are undefined (C11 6.5.5p6, 6.5p5; INT_MIN of a 16-bit int is -32768)', () => {
    const t = ip16('#define INT16_LOW (-32767 - 1)\n');
    for (const e of ['INT16_LOW / -1', 'INT16_LOW % -1', '-INT16_LOW']) assert.equal(t.evaluate(e).ok ? 'ok' : (t.evaluate(e) as { code: string }).code, Code.cUndefined, e);
    assert.equal(valueOf(t, 'INT16_LOW'), -32768n);
    const half = t.evaluate('INT16_LOW / 2');
    assert.ok(half.ok && half.value.value === -16384n);
  });

  it('left shift into the sign bit, or of a negative value, is undefined (C11 6.5.7p4); right shift of a negative is not (6.5.7p5)', () => {
    const t = ip16('');
    const code = (e: string): string => { const r = t.evaluate(e); return r.ok ? String(r.value.value) : r.code; };
    assert.equal(code('1 << 14'), '16384');
    assert.equal(code('1 << 15'), Code.cUndefined);
    assert.equal(code('-1 << 1'), Code.cUndefined);
    assert.equal(code('1u << 15'), '32768');
    assert.equal(code('1L << 16'), '65536');
    assert.equal(code('-16 >> 2'), '-4');
    const r = t.evaluate('1 << 15');
    assert.ok(!r.ok && /1u << 15 is defined/.test(r.message));
  });

  it('unsigned arithmetic wraps (C11 6.2.5p9), and a cast to a signed type wraps as gcc documents (6.3.1.3p3)', () => {
    const t = ip16('');
    const value = (e: string): bigint | number | undefined => { const r = t.evaluate(e); return r.ok ? r.value.value : undefined; };
    assert.equal(value('30000u + 30000u'), 60000n);
    assert.equal(value('65535u * 65535u'), 1n);
    assert.equal(value('0u - 1'), 65535n);
    assert.equal(value('(int)40000u'), -25536n);
    assert.equal(value('(int16_t)60000L'), -5536n);
  });

  it('an operand C does not evaluate is not undefined (C11 6.5.15p4, 6.5.13p4, 6.5.3.4p2)', () => {
    const t = ip16('');
    for (const e of ['0 ? 30000 + 30000 : 1', '!(0 && (1 << 15))', '1 || -(-32767 - 1)', 'sizeof(30000 + 30000) == 2']) {
      const r = t.evaluate(e);
      assert.ok(r.ok && r.value.value === 1n, `${e}: ${r.ok ? r.value.value : r.message}`);
    }
  });

  it('#if arithmetic overflowing intmax_t is a c-undefined finding, and the branches stay undecided (C11 6.10.1p4, 6.5p5)', () => {
    const t = ilp32('#if 9223372036854775807 + 1 > 0\n#define WIDE 1\n#else\n#define WIDE 2\n#endif\n');
    const f = t.findings.find((x) => x.code === Code.cUndefined);
    assert.ok(f, JSON.stringify(t.findings));
    assert.match(f.message, /overflows long long, 64-bit under ilp32/);
    assert.equal(valueOf(t, 'WIDE').toString().startsWith(Code.cConditional), true);
  });

  it('property: a 32-bit signed sum is a finding exactly when the true sum leaves [-2^31, 2^31) (C11 6.5p5, 5.2.4.2.1)', () => {
    const t = ilp32('');
    fc.assert(fc.property(fc.integer({ min: -(2 ** 31), max: 2 ** 31 - 1 }), fc.integer({ min: 0, max: 2 ** 31 - 1 }), (a, b) => {
      const r = t.evaluate(`(${a}) + ${b}`);
      const exact = BigInt(a) + BigInt(b);
      const representable = exact <= 2147483647n;
      return representable ? r.ok && r.value.value === exact : !r.ok && r.code === Code.cUndefined;
    }), { numRuns: 300 });
  });

  it('property: unsigned products never fail and equal the product modulo 2^32 (C11 6.2.5p9)', () => {
    const t = ilp32('');
    fc.assert(fc.property(fc.integer({ min: 0, max: 2 ** 32 - 1 }), fc.integer({ min: 0, max: 2 ** 32 - 1 }), (a, b) => {
      const r = t.evaluate(`${a}u * ${b}u`);
      return r.ok && r.value.value === BigInt.asUintN(32, BigInt(a) * BigInt(b));
    }), { numRuns: 300 });
  });
});
