// A plain macro body (no comment, literal, backslash or newline) is tokenized by one native pattern
// (tokenizePlainRange, core/c/tokens.ts); it must give exactly the tokens of the character-by-character lexer, whose
// reading of preprocessing numbers (C11 6.4.8) and longest punctuators (C11 6.4.6p4) the C tokenizer tests check.
// Where it does not answer, the caller reads the range with the lexer, so the check is: same tokens or no answer,
// and an answer for every range made of identifiers, numbers, punctuators and blanks alone.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { tokenizePlainRange, tokenizeSourceRange } from '../../core/c/tokens';

// Pieces that meet each other in every way a body can join them: number edges (e+, p-, ., $), punctuator runs.
const tokenPieces = [
  'A', 'x_1', '_', '$', 'a$b', 'e', 'E', 'p', 'P', 'L', 'u8', '0', '1', '9', '0x1F', '0b10', '1e', '1e+', '1E-', '0x1p', 'p+', 'e-', '.',
  '..', '...', '.5', '1.', '1u', 'UL', '+', '-', '++', '--', '->', '<', '<<', '<<=', '>', '>>', '>>=', '=', '==', '!', '!=', '&', '&&',
  '|', '||', '^', '~', '*', '%', '/', '?', ':', ';', ',', '#', '##', '(', ')', '[', ']', '{', '}',
];
const blanks = [' ', '\t', '\f', '\v', '\r'];
const strangers = ['@', '`', 'é', 'µ', '\u00a0', '\u0000', '\u2028'];

/** A body as the plain-line pattern admits it: `//` and `/*` would begin a comment. */
const bodyOf = (pieces: string[]) => pieces.join('').replace(/\/(?=[/*])/g, '/ ');

describe('plain macro bodies tokenized natively', () => {
  it('give the lexer\'s tokens, and always answer when made of tokens and blanks', () => {
    const piece = fc.oneof({ weight: 6, arbitrary: fc.constantFrom(...tokenPieces) }, { weight: 2, arbitrary: fc.constantFrom(...blanks) });
    fc.assert(fc.property(fc.array(piece, { maxLength: 30 }), fc.nat(3), (pieces, lead) => {
      const text = `#define M${' '.repeat(lead + 1)}${bodyOf(pieces)}\nnext`;
      const from = text.indexOf('M') + 1;
      const to = text.indexOf('\n');
      const quick = tokenizePlainRange(text, from, to, '/fw/a.h');
      assert.ok(quick, JSON.stringify(text));
      assert.deepStrictEqual(quick, tokenizeSourceRange(text, from, to, '/fw/a.h', []), JSON.stringify(text));
    }), { numRuns: 5000 });
  });

  it('answer as the lexer does or not at all when other characters stand in the body', () => {
    const piece = fc.oneof({ weight: 6, arbitrary: fc.constantFrom(...tokenPieces) }, { weight: 2, arbitrary: fc.constantFrom(...blanks) }, { weight: 1, arbitrary: fc.constantFrom(...strangers) });
    let answered = 0;
    fc.assert(fc.property(fc.array(piece, { maxLength: 20 }), (pieces) => {
      const text = bodyOf(pieces);
      const quick = tokenizePlainRange(text, 0, text.length, '/fw/b.h');
      if (quick) { answered++; assert.deepStrictEqual(quick, tokenizeSourceRange(text, 0, text.length, '/fw/b.h', []), JSON.stringify(text)); }
      else assert.ok(tokenizeSourceRange(text, 0, text.length, '/fw/b.h', []).some((t) => t.error), JSON.stringify(text));
    }), { numRuns: 5000 });
    assert.ok(answered > 500);
  });

  it('reads a range that ends between tokens, and leaves one ending inside a token to the lexer', () => {
    const text = 'SYS_CLOCK_HZ/DIV';
    assert.deepStrictEqual(tokenizePlainRange(text, 0, 13, 'f'), tokenizeSourceRange(text, 0, 13, 'f', []));
    assert.equal(tokenizePlainRange(text, 0, 5, 'f'), undefined);
  });
});
