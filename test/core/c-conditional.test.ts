// #if handling follows ISO C11 6.10.1; what cannot be decided without the build's -D flags is kept apart,
// which is this project's rule (DESIGN.md, Firmware constants): a conflict is a finding, never a guess.
import { strict as assert } from 'assert';
import { Code } from '../../core/codes';
import { valueOf, workspace } from './c-helpers';

const one = (text: string) => workspace({ '/ws/main.c': text }).table('/ws/main.c');

describe('C conditionals', () => {
  it('reports a name defined differently in branches of an undecidable #ifdef, naming it', () => {
    const t = one('#ifdef FAST_CLOCK\n#define TICK_DIV 8\n#else\n#define TICK_DIV 64\n#endif\n');
    const r = t.lookup('TICK_DIV');
    assert.equal(r.ok, false);
    assert.ok(!r.ok && r.code === Code.cConditional && /TICK_DIV/.test(r.message) && /main\.c:2/.test(r.message) && /main\.c:4/.test(r.message));
  });

  it('reports a value redefined under #if over an unconditional one', () => {
    const t = one('#define BAUD 9600\n#if defined(HIGH_SPEED)\n#undef BAUD\n#define BAUD 115200\n#endif\n');
    assert.match(String(valueOf(t, 'BAUD')), /^c-conditional/);
  });

  it('takes the branch when the condition is decidable from the file (C11 6.10.1p4)', () => {
    const t = one('#define BOARD_REV 3\n#if BOARD_REV >= 3\n#define LED_PIN 5\n#elif BOARD_REV == 2\n#define LED_PIN 4\n#else\n#define LED_PIN 1\n#endif\n');
    assert.equal(valueOf(t, 'LED_PIN'), 5n);
    const u = one('#define FAST 1\n#undef FAST\n#ifdef FAST\n#define DIV 8\n#else\n#define DIV 64\n#endif\n');
    assert.equal(valueOf(u, 'DIV'), 64n);
    const z = one('#if 0\n#define DIV 8\n#else\n#define DIV 64\n#endif\n');
    assert.equal(valueOf(z, 'DIV'), 64n);
  });

  it('evaluates #if arithmetic in intmax_t (C11 6.10.1p4): 65536 * 65536 does not wrap', () => {
    const t = one('#if 65536 * 65536 == 4294967296\n#define WIDE 1\n#else\n#define WIDE 0\n#endif\n');
    assert.equal(valueOf(t, 'WIDE'), 1n);
  });

  it('keeps a name defined in only one branch (the #ifndef F_CPU default pattern, common practice in AVR code)', () => {
    const t = one('#ifndef F_CPU\n#define F_CPU 8000000UL\n#endif\n');
    assert.equal(valueOf(t, 'F_CPU'), 8000000n);
  });

  it('treats the same definition in every branch as no conflict', () => {
    const t = one('#ifdef A\n#define N 4\n#else\n#define N 4\n#endif\n');
    assert.equal(valueOf(t, 'N'), 4n);
  });

  it('nests: a conflict inside a decided-false branch does not count', () => {
    const t = one('#if 0\n#ifdef X\n#define N 1\n#else\n#define N 2\n#endif\n#endif\n#define N 3\n');
    assert.equal(valueOf(t, 'N'), 3n);
  });

  it('flags implicit enum values that count across a member under #if', () => {
    const t = one('enum { CH_A, \n#ifdef HAS_B\n CH_B,\n#endif\n CH_C, CH_D = 10, CH_E };\n');
    assert.equal(valueOf(t, 'CH_A'), 0n);
    assert.match(String(valueOf(t, 'CH_C')), /^c-conditional/);
    assert.equal(valueOf(t, 'CH_E'), 11n);
  });

  it('reports a typedef chosen by an undecided #if as a conflict naming both typedefs, never the last one seen', () => {
    const text = '#include <stdint.h>\n#ifndef SMALL\ntypedef uint32_t tick_t;\n#else\ntypedef uint16_t tick_t;\n#endif\nstatic const tick_t PERIOD = 1000;\n#define TOP ((tick_t)-1)\n';
    const t = one(text);
    for (const expr of ['((tick_t)-1)', 'sizeof(tick_t)', 'TOP', 'PERIOD']) {
      const r = t.evaluate(expr);
      assert.ok(!r.ok, `${expr} gives ${r.ok ? r.value.value : ''}`);
      assert.equal(r.code, Code.cConditional, r.message);
      assert.match(r.message, /tick_t/);
      assert.match(r.message, /uint32_t at main\.c:3/);
      assert.match(r.message, /uint16_t at main\.c:5/);
    }
    const cast = t.evaluate('((tick_t)-1)');
    assert.deepEqual(!cast.ok && cast.span, { start: 2, end: 8 }, 'the finding points at the type name');
  });

  it('keeps a typedef that every branch makes the same type, or that one branch alone makes', () => {
    const same = one('#ifdef A\ntypedef unsigned int tick_t;\n#else\ntypedef uint32_t tick_t;\n#endif\n');
    assert.deepEqual(same.evaluate('(tick_t)-1'), { ok: true, value: { value: 4294967295n, type: 'tick_t' } }, 'uint32_t is unsigned int under ilp32');
    const only = one('#ifdef WIDE_TICKS\ntypedef uint32_t tick_t;\n#endif\ntypedef uint8_t small_t;\n');
    assert.deepEqual(only.evaluate('(tick_t)-1'), { ok: true, value: { value: 4294967295n, type: 'tick_t' } });
    const decided = one('#define SMALL 1\n#ifndef SMALL\ntypedef uint32_t tick_t;\n#else\ntypedef uint16_t tick_t;\n#endif\n');
    assert.deepEqual(decided.evaluate('(tick_t)-1'), { ok: true, value: { value: 65535n, type: 'tick_t' } }, 'a decided #if takes its branch (C11 6.10.1)');
  });

  it('reports unbalanced directives with their position', () => {
    const text = '#endif\n#if 1\n#define N 1\n';
    const t = one(text);
    const codes = t.findings.map((f) => [f.code, text.slice(f.span.start, f.span.end)]);
    assert.deepEqual(codes, [[Code.cSyntax, '#'], [Code.cSyntax, '#']]);
    assert.equal(t.findings[0].span.start, 0);
    assert.equal(t.findings[1].span.start, 7);
    assert.equal(valueOf(t, 'N'), 1n);
  });
});
