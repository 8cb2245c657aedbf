// Where each constant is defined: what a quick fix needs to rewrite the literal in place.
import { strict as assert } from 'assert';
import { valueOf, workspace } from './c-helpers';

const FILE = [
  '/* timer setup */',                              // line 1
  '#define TICK_TOP 255u',                          // line 2
  '#define TICK_DIV (64)',                          // line 3
  '#define SYS_CLOCK_HZ (8000000UL * 2)',           // line 4
  'static const uint32_t TICK_HZ = 1000u, SLOW_HZ = TICK_HZ / 10;', // line 5
  'enum { PWM_A = 0x10, PWM_B };',                  // line 6
  '#define LONG_MACRO (1 + \\',                     // line 7
  '  2)',                                           // line 8
].join('\n');

describe('C constant definitions', () => {
  const t = workspace({ '/ws/timer.h': FILE }).table('/ws/timer.h');
  const def = (name: string) => { const r = t.lookup(name); assert.ok(r.ok, name); return r.definition; };

  it('gives 1-based lines and a name span that slices back to the name', () => {
    for (const [name, line] of [['TICK_TOP', 2], ['TICK_DIV', 3], ['SYS_CLOCK_HZ', 4], ['TICK_HZ', 5], ['SLOW_HZ', 5], ['PWM_A', 6], ['PWM_B', 6], ['LONG_MACRO', 7]] as const) {
      const d = def(name);
      assert.equal(d.line, line, name);
      assert.equal(FILE.slice(d.nameSpan.start, d.nameSpan.end), name);
      assert.equal(d.uri, '/ws/timer.h');
    }
  });

  it('counts lines as the editor and the scanners do, a lone carriage return included', () => {
    // CommonMark 0.31.2 §2.1 and VS Code end a line at \r\n, \n or a lone \r: a comment written on an old editor
    // keeps its \r, and the definition below it is on line 4 in the editor, not line 3.
    const text = '/* board setup\rrev B */\r\n\n#define TOP 255u\n';
    const r = workspace({ '/ws/old.h': text }).table('/ws/old.h').lookup('TOP');
    assert.ok(r.ok);
    assert.equal(r.definition.line, 4);
  });

  it('spans a #define from # to its last token, across a line splice', () => {
    const d = def('LONG_MACRO');
    assert.equal(FILE.slice(d.span.start, d.span.end), '#define LONG_MACRO (1 + \\\n  2)');
    assert.equal(valueOf(t, 'LONG_MACRO'), 3n);
  });

  it('gives the literal\'s span and text only when the body is one literal', () => {
    const top = def('TICK_TOP').literal;
    assert.deepEqual(top && { text: top.text, at: FILE.slice(top.span.start, top.span.end) }, { text: '255u', at: '255u' });
    assert.equal(def('TICK_DIV').literal?.text, '64');
    assert.equal(def('TICK_HZ').literal?.text, '1000u');
    assert.equal(def('PWM_A').literal?.text, '0x10');
    assert.equal(def('SYS_CLOCK_HZ').literal, undefined);
    assert.equal(def('SLOW_HZ').literal, undefined);
    assert.equal(def('PWM_B').literal, undefined);
  });

  it('resolves values through one another (C11 6.7.2.2p3: PWM_B = PWM_A + 1)', () => {
    assert.equal(valueOf(t, 'SLOW_HZ'), 100n);
    assert.equal(valueOf(t, 'PWM_B'), 17n);
  });
});
