// Reference check: every expression below is compiled (never run) by the compiler firmware of each data model is
// built with, and its value, signedness, size (sizeof) and floating type (_Generic) are read from the object file
// and compared with the evaluator's: gcc 12.2 on x86-64 for lp64, arm-none-eabi-gcc 12.2 (Cortex-M4) for ilp32,
// avr-gcc 5.4 with avr-libc for ip16 (all from Debian 12; see gcc-print.ts). The clause beside each case names the
// rule of ISO C11 it exercises. Where the compiler refuses an expression as undefined (an overflow or a shift out
// of range in a constant expression, gcc -pedantic), the evaluator must report it as undefined too.
import { skipUnlessCi } from '../helpers/reference';
import { strict as assert } from 'assert';
import { buildConstantTable, type CValue, type DataModel } from '../../core/c';
import { Code } from '../../core/codes';
import { typeSystem, type CType } from '../../core/c/ctypes';
import { compileConstants, compilerAvailable, REFERENCE_COMPILERS, type CompiledConstant, type Target } from './gcc-print';

// Definitions seen by both gcc and the evaluator; invented values of a small product.
const PRELUDE = `
#define F_CPU 16000000UL
#define BAUD 9600
#define UART_DIVISOR_VALUE ((F_CPU / (16UL * BAUD)) - 1)
#define SQ(x) ((x) * (x))
#define TWICE(x) (2 * (x))
#define ADD(a, b) ((a) + (b))
#define MUL(a, b) ((a) * (b))
#define ID(x) x
#define BIT(n) (1u << (n))
#define FIRST(a, ...) (a)
#define REG(n) REG_##n
#define REG_TIMER2 0x44
#define USE_FAST_CLOCK 1
#if USE_FAST_CLOCK
#define TICK_DIV 8
#else
#define TICK_DIV 64
#endif
#ifdef NOT_DEFINED_ANYWHERE_IN_THIS_BUILD
#define LED_PIN 4
#endif
enum led_state { LED_OFF = 3, LED_DIM, LED_ON = LED_DIM * 2, LED_BLINK };
typedef uint16_t ticks_t;
static const uint32_t TICK_HZ = 1000u;
static const uint8_t WRAPPED_BYTE = 300;
const double VREF = 3.3;
`;

interface Case { expr: string; rule: string }

const CASES: Case[] = [
  { expr: '-7 / 2', rule: 'C11 6.5.5p6 division truncates toward zero' },
  { expr: '-7 % 2', rule: 'C11 6.5.5p6 (a/b)*b + a%b == a' },
  { expr: '7 % -2', rule: 'C11 6.5.5p6' },
  { expr: '-7 % -2', rule: 'C11 6.5.5p6' },
  { expr: '10 / 3 * 3 + 10 % 3', rule: 'C11 6.5.5p6' },
  { expr: '0u - 1', rule: 'C11 6.2.5p9 unsigned arithmetic wraps' },
  { expr: '65535u + 1', rule: 'C11 6.2.5p9' },
  { expr: '-1 < 0u', rule: 'C11 6.3.1.8 usual arithmetic conversions: -1 becomes UINT_MAX' },
  { expr: '-1L < 0u', rule: 'C11 6.3.1.8: ilp32 converts to unsigned long, lp64 keeps long' },
  { expr: '-1 / 2u', rule: 'C11 6.3.1.8' },
  { expr: '5 ^ 3', rule: 'C11 6.5.11 ^ is exclusive or' },
  { expr: '0xF0 ^ 0xFF', rule: 'C11 6.5.11' },
  { expr: '0x0F | 0x30 & 0x3C', rule: 'C11 6.5.10, 6.5.12 & binds tighter than |' },
  { expr: '(uint8_t)300', rule: 'C11 6.3.1.3p2 conversion to unsigned is modulo 2^N' },
  { expr: '(int8_t)200', rule: 'C11 6.3.1.3p3 implementation-defined; gcc wraps modulo 2^N' },
  { expr: '(uint16_t)-1', rule: 'C11 6.3.1.3p2' },
  { expr: '(int16_t)40000', rule: 'C11 6.3.1.3p3, gcc wraps' },
  { expr: '(unsigned long)-1', rule: 'C11 6.3.1.3p2 at the width of long' },
  { expr: '(ticks_t)70000', rule: 'C11 6.7.8 a typedef names the same type' },
  { expr: '(unsigned char)-1 + 1', rule: 'C11 6.3.1.1p2 integer promotion to int' },
  { expr: '(uint8_t)1 << 8', rule: 'C11 6.5.7p3 the left operand is promoted first' },
  { expr: '~(uint8_t)0', rule: 'C11 6.5.3.3p4 ~ applies to the promoted operand' },
  { expr: '~0u', rule: 'C11 6.5.3.3p4' },
  { expr: '(short)-1 == 0xFFFF', rule: 'C11 6.3.1.1p2' },
  { expr: '0xFFFFFFFF', rule: 'C11 6.4.4.1p5 a hex constant may become unsigned int' },
  { expr: '0x80000000', rule: 'C11 6.4.4.1p5' },
  { expr: '2147483648', rule: 'C11 6.4.4.1p5 a decimal constant stays signed: long long or long' },
  { expr: '4294967296', rule: 'C11 6.4.4.1p5' },
  { expr: '1ul', rule: 'C11 6.4.4.1p5 suffix ul' },
  { expr: '1ull << 63', rule: 'C11 6.4.4.1p5 suffix ull' },
  { expr: '0x7FFFFFFFFFFFFFFF', rule: 'C11 6.4.4.1p5' },
  { expr: '0xFFFFFFFFFFFFFFFF', rule: 'C11 6.4.4.1p5 hex becomes unsigned long long / unsigned long' },
  { expr: '18446744073709551615u', rule: 'C11 6.4.4.1p5 suffix u' },
  { expr: '017 + 0b101', rule: 'C11 6.4.4.1p4 octal; 0b binary is a gcc extension (C23)' },
  { expr: '-2147483647 - 1', rule: 'C11 6.5.6 INT_MIN without overflow' },
  { expr: '-9223372036854775807LL - 1', rule: 'C11 6.5.6' },
  { expr: '0xFFFFFFFFFFFFFFFFull * 3', rule: 'C11 6.2.5p9 64-bit wrap' },
  { expr: '(uint64_t)1 << 40', rule: 'C11 6.5.7' },
  { expr: '(int64_t)-1 / 2', rule: 'C11 6.5.5p6' },
  { expr: '100000 * 100000LL', rule: 'C11 6.3.1.8' },
  { expr: '1u << 31', rule: 'C11 6.5.7p4' },
  { expr: '1 << 30', rule: 'C11 6.5.7p4' },
  { expr: '0x40000000 >> 30 << 30', rule: 'C11 6.5.7 shifts group left to right (1 << 31, undefined by 6.5.7p4, is checked in gcc-ubsan.test.ts)' },
  { expr: '-16 >> 2', rule: 'C11 6.5.7p5 implementation-defined; gcc shifts arithmetically' },
  { expr: '!5 + !0', rule: 'C11 6.5.3.3p5' },
  { expr: '3 > 2 > 1', rule: 'C11 6.5.8p6 a comparison yields int 0 or 1' },
  { expr: '1 && 2', rule: 'C11 6.5.13p3' },
  { expr: '0 || 3', rule: 'C11 6.5.14p3' },
  { expr: '1 ? -1 : 0u', rule: 'C11 6.5.15p5 the arms meet in their common type' },
  { expr: '0 ? 1 : 2.5', rule: 'C11 6.5.15p5' },
  { expr: '1 ? (uint8_t)255 : (int8_t)-1', rule: 'C11 6.5.15p5 both promoted to int' },
  { expr: "'A'", rule: 'C11 6.4.4.4p10 a character constant has type int' },
  { expr: "'A' + 1", rule: 'C11 6.4.4.4p10' },
  { expr: "'\\n' + '\\x41' + '\\101' + '\\0'", rule: 'C11 6.4.4.4 escape sequences' },
  { expr: "'\\xFF'", rule: 'C11 6.4.4.4p10 value of a char: plain char is signed on x86-64 and AVR, unsigned on ARM (6.2.5p15)' },
  { expr: '(char)200 + 0', rule: 'C11 6.2.5p15 plain char: -56 where it is signed, 200 where unsigned' },
  { expr: "sizeof('A')", rule: 'C11 6.4.4.4p10, 6.5.3.4 (size_t)' },
  { expr: 'sizeof(long) + sizeof(short)', rule: 'C11 6.5.3.4 under the data model' },
  { expr: '(uint32_t)(16e6 / 9600.0 + 0.5)', rule: 'C11 6.3.1.4 floating to integer truncates' },
  { expr: '16e6 / 9600', rule: 'C11 6.4.4.2 an unsuffixed floating constant is double' },
  { expr: '(int)-2.7', rule: 'C11 6.3.1.4p1 truncation toward zero' },
  { expr: '(unsigned long)(20000001UL * 1.0)', rule: 'C11 6.3.1.8 the integer becomes a double first; avr-gcc\'s double is binary32, so 20000001 rounds to 20000000 under ip16' },
  { expr: '16000000UL / 3.0', rule: 'C11 6.3.1.8 double division, rounded to binary32 under ip16 (avr-gcc)' },
  { expr: '1.0f / 3', rule: 'C11 6.4.4.2p4 suffix f: float arithmetic' },
  { expr: '1.5f * 2', rule: 'C11 6.3.1.8 int converts to float' },
  { expr: '0x1p4 + 1e3', rule: 'C11 6.4.4.2 hexadecimal floating constant' },
  { expr: '0.1 + 0.2 == 0.3', rule: 'IEC 60559 double rounding (C11 Annex F)' },
  { expr: 'UART_DIVISOR_VALUE', rule: 'C11 6.10.3 object-like macros rescanned' },
  { expr: 'SQ(TWICE(3) + 1)', rule: 'C11 6.10.3.1 arguments expanded before substitution' },
  { expr: 'MUL(ADD(1, 2), ADD(3, 4))', rule: 'C11 6.10.3.1' },
  { expr: 'ID(ID(ID(5)))', rule: 'C11 6.10.3.4' },
  { expr: 'BIT(3) | BIT(5)', rule: 'C11 6.10.3' },
  { expr: 'FIRST(7, 8, 9)', rule: 'C11 6.10.3p12 variadic macro' },
  { expr: 'REG(TIMER2)', rule: 'C11 6.10.3.3 ## pastes tokens' },
  { expr: 'TICK_DIV', rule: 'C11 6.10.1 the #if branch taken' },
  { expr: 'LED_OFF + LED_DIM * 10 + LED_ON * 100 + LED_BLINK * 1000', rule: 'C11 6.7.2.2p3 implicit enum values count on by one' },
  { expr: 'TICK_HZ * 2', rule: 'C11 6.7.3 const object of type uint32_t' },
  { expr: 'WRAPPED_BYTE', rule: 'C11 6.5.16.1 initialiser converted to uint8_t' },
  { expr: 'VREF / 2', rule: 'C11 6.7.9 const double' },
];

function typeOf(v: CValue, model: DataModel): CType {
  const named = typeSystem(model).named;
  return (named.get(v.type) ?? named.get(v.type === 'ticks_t' ? 'uint16_t' : '')) as CType;
}

for (const model of ['lp64', 'ilp32', 'ip16'] as Target[]) {
  const compiler = REFERENCE_COMPILERS[model];
  describe(`C constants against ${compiler.label} as reference, ${model}`, function () {
    let reference: CompiledConstant[] | undefined;
    before(function () {
      if (!compilerAvailable(model)) skipUnlessCi(this, `${compiler.command} is not installed; reference check skipped`);
      reference = compileConstants(model, { prelude: PRELUDE, expressions: CASES.map((c) => c.expr) });
    });
    const table = buildConstantTable('/firmware/cases.c', PRELUDE, { dataModel: model, includeDirs: [], workspaceRoots: ['/firmware'], read: () => undefined });

    CASES.forEach((c, i) => {
      it(`${c.expr}  [${c.rule}]`, function () {
        if (!reference) this.skip();
        const expected = (reference as CompiledConstant[])[i];
        const got = table.evaluate(c.expr);
        if (!expected.ok) {
          assert.ok(!got.ok, `${compiler.command} refuses it:\n${expected.diagnostic}\nthe evaluator gives ${got.ok ? `${got.value.value} ${got.value.type}` : ''}`);
          assert.ok(got.code === Code.cUndefined || got.code === Code.cDivZero, `${got.code}: ${got.message}`);
          return;
        }
        assert.ok(got.ok, `evaluator failed: ${got.ok ? '' : got.message}; ${compiler.command} gives ${expected.value}`);
        const t = typeOf(got.value, model);
        assert.ok(t, `unknown type name ${got.value.type}`);
        if (!expected.floating) {
          assert.equal(t.kind, 'int', `${compiler.command} says integer, evaluator says ${got.value.type}`);
          assert.equal(BigInt(got.value.value).toString(), expected.value.toString());
          assert.equal(t.kind === 'int' && t.signed, expected.signed, `signedness of ${got.value.type}`);
          assert.equal(t.kind === 'int' ? Math.max(1, t.bits / 8) : 0, expected.size, `size of ${got.value.type}`);
        } else {
          assert.equal(t.kind, 'float', `${compiler.command} says floating, evaluator says ${got.value.type}`);
          assert.equal(t.name, expected.floating);
          assert.equal(Number(got.value.value), expected.value);
        }
      });
    });
  });
}

// A typedef picked by an #if that the file leaves to the build: the compiler's answer changes with -DSMALL, so the
// evaluator, which sees no -D here, must report the dependence (c-conditional) instead of either value.
const TICK_TYPEDEF = '#ifndef SMALL\ntypedef uint32_t tick_t;\n#else\ntypedef uint16_t tick_t;\n#endif\n';

for (const model of ['lp64', 'ilp32', 'ip16'] as Target[]) {
  const compiler = REFERENCE_COMPILERS[model];
  describe(`a typedef under an undecided #if, against ${compiler.label}, ${model}`, function () {
    it('the compiler gives ((tick_t)-1) two values, 4294967295 and with -DSMALL 65535; the evaluator names both typedefs', function () {
      if (!compilerAvailable(model)) skipUnlessCi(this, `${compiler.command} is not installed; reference check skipped`);
      const [wide] = compileConstants(model, { prelude: TICK_TYPEDEF, expressions: ['((tick_t)-1)'] });
      const [small] = compileConstants(model, { prelude: TICK_TYPEDEF, expressions: ['((tick_t)-1)'], flags: ['-DSMALL'] });
      assert.deepEqual([wide, small].map((c) => c.ok && c.value), [4294967295n, 65535n]);
      const table = buildConstantTable('/firmware/tick.c', TICK_TYPEDEF, { dataModel: model, includeDirs: [], workspaceRoots: ['/firmware'], read: () => undefined });
      const got = table.evaluate('((tick_t)-1)');
      assert.ok(!got.ok, `the evaluator picks ${got.ok ? got.value.value : ''}`);
      assert.equal(got.code, Code.cConditional);
      assert.match(got.message, /uint32_t at tick\.c:2.*uint16_t at tick\.c:4/);
      const decided = buildConstantTable('/firmware/tick.c', `#define SMALL\n${TICK_TYPEDEF}`, { dataModel: model, includeDirs: [], workspaceRoots: ['/firmware'], read: () => undefined });
      assert.deepEqual(decided.evaluate('((tick_t)-1)'), { ok: true, value: { value: small.ok && small.value, type: 'tick_t' } }, 'with SMALL defined in the file, the value -DSMALL gives');
    });
  });
}
