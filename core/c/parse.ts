// Parser for C constant expressions (ISO C11 6.5, 6.6) over macro-expanded tokens, with a depth bound.
import { Code } from '../codes';
import { keywordTypeName, TYPE_KEYWORDS, type CType, type TypeConflict } from './ctypes';
import type { SourceToken } from './tokens';

export type Node = (
  | { k: 'num' | 'char' | 'ident'; tok: SourceToken }
  | { k: 'unary'; op: string; arg: Node; tok: SourceToken }
  | { k: 'binary'; op: string; l: Node; r: Node; tok: SourceToken }
  | { k: 'cond'; c: Node; a: Node; b: Node; tok: SourceToken }
  | { k: 'cast'; type: CType; arg: Node; tok: SourceToken }
  | { k: 'sizeof'; type?: CType; arg?: Node; tok: SourceToken }
  | { k: 'call'; tok: SourceToken; args: Node[] }
) & Parenthesised;

/** Set on a parenthesised expression: its '(' and ')', so a finding can cover the whole of it. */
export interface Parenthesised { open?: SourceToken; close?: SourceToken }

/** `code`: a diagnostic code other than a syntax error (a typedef that depends on the build configuration). */
export interface ParseError { error: string; tok?: SourceToken; code?: string }

// Binary precedence, C11 6.5.5–6.5.14; higher binds tighter.
const PREC: Record<string, number> = {
  '||': 1, '&&': 2, '|': 3, '^': 4, '&': 5, '==': 6, '!=': 6, '<': 7, '>': 7, '<=': 7, '>=': 7,
  '<<': 8, '>>': 8, '+': 9, '-': 9, '*': 10, '/': 10, '%': 10,
};

export const MAX_EXPRESSION_DEPTH = 200;

class Failure { constructor(readonly error: ParseError) {} }

/** `typedefName` resolves an identifier used as a type name (`uint8_t`, a file's own typedef). */
export function parseExpression(tokens: SourceToken[], typedefName: (name: string) => CType | TypeConflict | undefined): Node | ParseError {
  let pos = 0;
  let depth = 0;
  const peek = (): SourceToken | undefined => tokens[pos];
  const fail = (error: string, tok = tokens[pos] ?? tokens[tokens.length - 1], code?: string): never => { throw new Failure({ error, tok, code }); };
  const expect = (text: string): SourceToken => {
    const t = peek();
    if (t?.text !== text || (t.kind !== 'punct')) fail(t ? `expected '${text}' before '${t.text}'` : `expected '${text}' at end of expression`);
    pos++;
    return t as SourceToken;
  };
  const enter = (): void => { if (++depth > MAX_EXPRESSION_DEPTH) fail(`expression nested more than ${MAX_EXPRESSION_DEPTH} deep`); };

  /** A parenthesised type name at `pos` (after '('), or undefined without consuming. */
  const typeAt = (): { type: CType; length: number } | undefined => {
    const words: string[] = [];
    let j = pos;
    while (tokens[j]?.kind === 'ident' && TYPE_KEYWORDS.has(tokens[j].text)) words.push(tokens[j++].text);
    let type: CType | undefined;
    if (words.every((w) => w === 'const' || w === 'volatile') && tokens[j]?.kind === 'ident') {
      const named = typedefName(tokens[j].text);
      if (named?.kind === 'conflict') fail(named.message, tokens[j], Code.cConditional);
      type = named as CType | undefined;
      if (type) j++;
      while (tokens[j]?.text === 'const' || tokens[j]?.text === 'volatile') j++;
    } else {
      const name = words.length ? keywordTypeName(words) : undefined;
      const keyword = name ? typedefName(name) : undefined;
      type = keyword?.kind === 'conflict' ? undefined : keyword;
    }
    if (!type || tokens[j]?.text !== ')') return undefined;
    return { type, length: j - pos + 1 };
  };

  const primary = (): Node => {
    const t = peek();
    if (!t) return fail('expression ends too early');
    if (t.error) fail(t.error, t);
    if (t.kind === 'number') { pos++; return { k: 'num', tok: t }; }
    if (t.kind === 'char') { pos++; return { k: 'char', tok: t }; }
    if (t.kind === 'ident') {
      pos++;
      // A call is no constant expression (C11 6.6p3), but it is parsed so the finding can say what it is.
      if (peek()?.text === '(' && peek()?.kind === 'punct') {
        pos++;
        const args: Node[] = [];
        if (peek()?.text !== ')') {
          for (;;) {
            args.push(conditional());
            if (peek()?.text !== ',') break;
            pos++;
          }
        }
        expect(')');
        return { k: 'call', tok: t, args };
      }
      return { k: 'ident', tok: t };
    }
    if (t.text === '(') {
      pos++;
      const inner = conditional();
      inner.close = expect(')');
      inner.open = t;
      return inner;
    }
    if (t.kind === 'string') return fail('a string is not a number', t);
    return fail(`unexpected '${t.text}'`, t);
  };

  const unary = (): Node => {
    enter();
    try {
      const t = peek();
      if (t && t.kind === 'punct' && (t.text === '-' || t.text === '+' || t.text === '!' || t.text === '~')) {
        pos++;
        return { k: 'unary', op: t.text, arg: unary(), tok: t };
      }
      if (t && t.kind === 'punct' && (t.text === '++' || t.text === '--')) fail(`'${t.text}' is not allowed in a constant expression`, t);
      if (t && t.kind === 'ident' && t.text === 'sizeof') {
        pos++;
        if (peek()?.text === '(') {
          pos++;
          const ty = typeAt();
          if (ty) { pos += ty.length; return { k: 'sizeof', type: ty.type, tok: t }; }
          pos--;
        }
        return { k: 'sizeof', arg: unary(), tok: t };
      }
      if (t?.text === '(' && t.kind === 'punct') {
        pos++;
        const ty = typeAt();
        if (ty) { pos += ty.length; return { k: 'cast', type: ty.type, arg: unary(), tok: t }; }
        pos--;
      }
      return primary();
    } finally { depth--; }
  };

  const binary = (minPrec: number): Node => {
    let left = unary();
    for (;;) {
      const t = peek();
      const prec = t && t.kind === 'punct' ? PREC[t.text] : undefined;
      if (!t || prec === undefined || prec < minPrec) return left;
      pos++;
      enter();
      const right = binary(prec + 1);
      depth--;
      left = { k: 'binary', op: t.text, l: left, r: right, tok: t };
    }
  };

  const conditional = (): Node => {
    enter();
    try {
      const c = binary(1);
      const q = peek();
      if (q?.text !== '?' || q.kind !== 'punct') return c;
      pos++;
      const a = conditional();
      expect(':');
      const b = conditional();
      return { k: 'cond', c, a, b, tok: q };
    } finally { depth--; }
  };

  try {
    if (tokens.length === 0) return { error: 'empty expression' };
    const node = conditional();
    const rest = peek();
    if (rest) {
      if (rest.text === ',') return { error: 'a comma operator is not allowed in a constant expression (C11 6.6p3)', tok: rest };
      return { error: `unexpected '${rest.text}' after the expression`, tok: rest };
    }
    return node;
  } catch (e) {
    if (e instanceof Failure) return e.error;
    throw e;
  }
}
