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
  if (tokens.length === 0) return { error: 'empty expression' };
  const parser = new Parser(tokens, typedefName);
  try {
    const node = parser.conditional();
    const rest = tokens[parser.pos];
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

/** Precedence climbing over the tokens; one object per expression (methods, not closures made per call). */
class Parser {
  // Assigned in the constructor, not defined as class fields (a step each per parse in the interpreter).
  declare pos: number;
  declare private depth: number;
  declare private readonly tokens: SourceToken[];
  declare private readonly typedefName: (name: string) => CType | TypeConflict | undefined;

  constructor(tokens: SourceToken[], typedefName: (name: string) => CType | TypeConflict | undefined) {
    this.pos = 0;
    this.depth = 0;
    this.tokens = tokens;
    this.typedefName = typedefName;
  }

  private peek(): SourceToken | undefined {
    return this.tokens[this.pos];
  }

  private fail(error: string, tok = this.tokens[this.pos] ?? this.tokens[this.tokens.length - 1], code?: string): never {
    throw new Failure({ error, tok, code });
  }

  private expect(text: string): SourceToken {
    const t = this.peek();
    if (t?.text !== text || (t.kind !== 'punct')) this.fail(t ? `expected '${text}' before '${t.text}'` : `expected '${text}' at end of expression`);
    this.pos++;
    return t as SourceToken;
  }

  private enter(): void {
    if (++this.depth > MAX_EXPRESSION_DEPTH) this.fail(`expression nested more than ${MAX_EXPRESSION_DEPTH} deep`);
  }

  /** A parenthesised type name at `pos` (after '('), or undefined without consuming. */
  private typeAt(): { type: CType; length: number } | undefined {
    const tokens = this.tokens;
    // A type name is words: after '(' anything else is an expression (most parentheses), decided at once.
    if (tokens[this.pos]?.kind !== 'ident') return undefined;
    const words: string[] = [];
    let j = this.pos;
    while (tokens[j]?.kind === 'ident' && TYPE_KEYWORDS.has(tokens[j].text)) words.push(tokens[j++].text);
    let type: CType | undefined;
    if (words.every((w) => w === 'const' || w === 'volatile') && tokens[j]?.kind === 'ident') {
      const named = this.typedefName(tokens[j].text);
      if (named?.kind === 'conflict') this.fail(named.message, tokens[j], Code.cConditional);
      type = named as CType | undefined;
      if (type) j++;
      while (tokens[j]?.text === 'const' || tokens[j]?.text === 'volatile') j++;
    } else {
      const name = words.length ? keywordTypeName(words) : undefined;
      const keyword = name ? this.typedefName(name) : undefined;
      type = keyword?.kind === 'conflict' ? undefined : keyword;
    }
    if (!type || tokens[j]?.text !== ')') return undefined;
    return { type, length: j - this.pos + 1 };
  }

  private primary(): Node {
    const t = this.peek();
    if (!t) return this.fail('expression ends too early');
    if (t.error) this.fail(t.error, t);
    if (t.kind === 'number') { this.pos++; return { k: 'num', tok: t }; }
    if (t.kind === 'char') { this.pos++; return { k: 'char', tok: t }; }
    if (t.kind === 'ident') {
      this.pos++;
      // A call is no constant expression (C11 6.6p3), but it is parsed so the finding can say what it is.
      if (this.peek()?.text === '(' && this.peek()?.kind === 'punct') {
        this.pos++;
        const args: Node[] = [];
        if (this.peek()?.text !== ')') {
          for (;;) {
            args.push(this.conditional());
            if (this.peek()?.text !== ',') break;
            this.pos++;
          }
        }
        this.expect(')');
        return { k: 'call', tok: t, args };
      }
      return { k: 'ident', tok: t };
    }
    if (t.text === '(') {
      this.pos++;
      const inner = this.conditional();
      inner.close = this.expect(')');
      inner.open = t;
      return inner;
    }
    if (t.kind === 'string') return this.fail('a string is not a number', t);
    return this.fail(`unexpected '${t.text}'`, t);
  }

  private unary(): Node {
    this.enter();
    try {
      const t = this.peek();
      if (t && t.kind === 'punct' && (t.text === '-' || t.text === '+' || t.text === '!' || t.text === '~')) {
        this.pos++;
        return { k: 'unary', op: t.text, arg: this.unary(), tok: t };
      }
      if (t && t.kind === 'punct' && (t.text === '++' || t.text === '--')) this.fail(`'${t.text}' is not allowed in a constant expression`, t);
      if (t && t.kind === 'ident' && t.text === 'sizeof') {
        this.pos++;
        if (this.peek()?.text === '(') {
          this.pos++;
          const ty = this.typeAt();
          if (ty) { this.pos += ty.length; return { k: 'sizeof', type: ty.type, tok: t }; }
          this.pos--;
        }
        return { k: 'sizeof', arg: this.unary(), tok: t };
      }
      if (t?.text === '(' && t.kind === 'punct') {
        this.pos++;
        const ty = this.typeAt();
        if (ty) { this.pos += ty.length; return { k: 'cast', type: ty.type, arg: this.unary(), tok: t }; }
        this.pos--;
      }
      return this.primary();
    } finally { this.depth--; }
  }

  private binary(minPrec: number): Node {
    let left = this.unary();
    for (;;) {
      const t = this.peek();
      const prec = t && t.kind === 'punct' ? PREC[t.text] : undefined;
      if (!t || prec === undefined || prec < minPrec) return left;
      this.pos++;
      this.enter();
      const right = this.binary(prec + 1);
      this.depth--;
      left = { k: 'binary', op: t.text, l: left, r: right, tok: t };
    }
  }

  conditional(): Node {
    this.enter();
    try {
      const c = this.binary(1);
      const q = this.peek();
      if (q?.text !== '?' || q.kind !== 'punct') return c;
      this.pos++;
      const a = this.conditional();
      this.expect(':');
      const b = this.conditional();
      return { k: 'cond', c, a, b, tok: q };
    } finally { this.depth--; }
  }
}
