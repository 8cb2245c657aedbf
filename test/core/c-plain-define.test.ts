// A one-line `#define` with no comment, literal or splice is stored without tokenizing it (core/c/preprocess.ts,
// PlainObjectMacro) and tokenized when read. What a block then reads must be what the general path gives: here the
// same file with a comment after each replacement list where the plain file has as many blanks (a comment sends the
// line the general way; it is white space, C11 5.1.1.2 phase 3, so value, type, line and places stay) answers alike.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { buildConstantTable } from '../../core/c';
import { resolutionData } from './c-helpers';

const table = (text: string) => buildConstantTable('/fw/plain.c', text, { dataModel: 'ilp32', includeDirs: [], workspaceRoots: ['/fw'], read: () => undefined });

const bodies = ['16000000u', '(16000000u)', '0x40', "'A'", 'CLK / 64u', '(CLK / DIV / 1000u - 1u)', 'CLK % 7', '1 << 4', 'DIV*2', '', '  ( 3 )  ', 'CLK/DIV', '1.5e3', 'UNDEFINED_NAME + 1', 'CLK ## DIV', '-1', '(-1)'];
const spaces = [' ', '\t', '  ', ' \t '];

describe('plain #define lines read lazily', () => {
  it('answer every lookup as the general path does', () => {
    fc.assert(fc.property(fc.array(fc.tuple(fc.constantFrom(...bodies), fc.constantFrom(...spaces), fc.constantFrom('', ' ', '\t')), { minLength: 1, maxLength: 6 }), (defs) => {
      const names = defs.map((_, i) => `M${i}`);
      const line = (i: number, trailer: string) => `#define ${names[i]}${defs[i][1]}${defs[i][0]}${defs[i][2]}${trailer}`;
      const head = '#define CLK 48000000u\n#define DIV 8u\n';
      const plain = head + defs.map((_, i) => line(i, '       ')).join('\n') + '\n';
      const general = head + defs.map((_, i) => line(i, '/* c */')).join('\n') + '\n';
      const a = table(plain);
      const b = table(general);
      for (const name of [...names, 'CLK', 'DIV']) assert.deepEqual(resolutionData(a.lookup(name)), resolutionData(b.lookup(name)), `${name} in\n${plain}`);
      assert.deepEqual(a.findings, b.findings);
    }), { numRuns: 300 });
  });
});
