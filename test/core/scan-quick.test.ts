// The C scanner's quick steps (native regex for a `key: value` line, the `@timing` search that rules out comments
// and lines holding no header) must read exactly as the character-by-character path: the same blocks, entries,
// spans and findings, for generated comment text of every shape the pieces below make.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { scanC, scanCGeneral } from '../../core/scan/c';
import { readEntryLine, readEntryLineGeneral } from '../../core/scan/entry';

const linePieces = [
  'clock', 'VT+', 'data-model', 'a.b', 'x_1', '1key', '-k', 'é', ':', ' : ', '::', ' ', '\t', '\u00a0', '\uFEFF', '\f', '\v', '\u202f',
  '47k ±1%', 'SYS_CLOCK_HZ', '*', '*/', '/', '@timing', '\n', '\r', '#', 'k:', 'Key :',
];
const line = fc.array(fc.constantFrom(...linePieces), { maxLength: 12 }).map((p) => p.join(''));

const cPieces = [
  '/* @timing t\n', '/*@timing\n', '/** @timing a b\n', ' * circuit: timer\n', ' * clock: SYS_CLOCK_HZ\n', ' * expect: 1 kHz ±1%\n', ' *\n', ' */\n',
  '*/', '// @timing x\n', '//! @timing\n', '/// reload: 10\n', '// clock: 8 MHz\n', '//\n', '// note\n', '// k:v\n', '/* 1000 */\n', '/* a: b */',
  ' * a:\n', ' *  B : c \t\n', '**k:v\n', ' * k: v */', ' * vt+: 1 */\n', '\tclock:\u00a0x\uFEFF\n', ' * 1a: b\n', ' * a b: c\n',
  'int x = 1;\n', '\n', '\r\n', '"/* @timing */"', "'/'", 'R"(// @timing)"', '@timing', ' ', '\t', 'x: 1', '\\\n', '/*', '//',
];
const cText = fc.array(fc.constantFrom(...cPieces), { maxLength: 40 }).map((p) => p.join(''));

describe('C scanner quick steps', () => {
  it('readEntryLine agrees with the character steps on any range of any line', () => {
    fc.assert(fc.property(line, fc.nat(40), fc.nat(40), (text, a, b) => {
      const from = Math.min(a, text.length);
      const to = Math.min(Math.max(from, b), text.length);
      assert.deepStrictEqual(readEntryLine(text, from, to), readEntryLineGeneral(text, from, to), JSON.stringify([text, from, to]));
    }), { numRuns: 20_000 });
  });

  it('scanC agrees with reading every comment line in full', () => {
    fc.assert(fc.property(cText, (text) => {
      assert.deepStrictEqual(scanC(text), scanCGeneral(text), JSON.stringify(text));
    }), { numRuns: 5000 });
  });
});
