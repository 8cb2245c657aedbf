// Recursive descent over the tokens of a value body: sums of products of signed primaries.
import type { Finding, Span } from '../types';
import { Code } from '../codes';
import type { ValueNode } from './ast';
import { error, shown, type Token } from './lexer';

/** Parentheses and signs nested deeper than this are refused, not recursed into. */
export const MAX_DEPTH = 64;

class Stop extends Error {
  constructor(readonly finding: Finding) {
    super(finding.message);
  }
}

function describe(token: Token): string {
  switch (token.t) {
    case 'num': return `\`${shown(token.text)}\``;
    case 'id': return `\`${shown(token.name)}\``;
    case 'op': return `\`${token.op}\``;
    case 'pm': return '`±`';
    case 'q': return '`?`';
  }
}

const join = (a: Span, b: Span): Span => ({ start: a.start, end: b.end });

/** Parses tokens that hold no tolerance; `whole` is the span of the body for end-of-text findings. */
export function parseExpression(tokens: readonly Token[], whole: Span): { expr?: ValueNode; findings: Finding[] } {
  let at = 0;
  const peek = (): Token | undefined => tokens[at];
  const isOp = (t: Token | undefined, ...ops: string[]): boolean => t?.t === 'op' && ops.includes(t.op);

  const primary = (depth: number, after: Token | undefined): ValueNode => {
    const token = tokens[at];
    if (!token) {
      const where = after ? after.span : whole;
      throw new Stop(error(Code.valueSyntax,
        after ? `expected a number or name after ${describe(after)}` : 'empty value', where));
    }
    if (token.t === 'num') { at++; return { kind: 'number', value: token.value, dim: token.dim, span: token.span }; }
    if (token.t === 'id') { at++; return token.ref ? { kind: 'ident', name: token.name, span: token.span, ref: token.ref } : { kind: 'ident', name: token.name, span: token.span }; }
    if (isOp(token, '(')) {
      if (depth >= MAX_DEPTH) throw new Stop(error(Code.valueTooDeep, `parentheses nested more than ${MAX_DEPTH} deep`, token.span));
      at++;
      const inner = sum(depth + 1, token);
      const close = tokens[at];
      if (!isOp(close, ')')) {
        throw new Stop(error(Code.valueSyntax, close
          ? `expected \`)\` before ${describe(close)} to close the \`(\``
          : 'unclosed `(`: add a `)`', close ? close.span : token.span));
      }
      at++;
      return { ...inner, span: join(token.span, close!.span) };
    }
    if (token.t === 'q') throw new Stop(error(Code.valueSyntax, '`?` stands alone as the whole value to solve for', token.span));
    if (isOp(token, ')')) throw new Stop(error(Code.valueSyntax, '`)` without a matching `(`', token.span));
    throw new Stop(error(Code.valueSyntax,
      `expected a number or name${after ? ` after ${describe(after)}` : ''}, found ${describe(token)}`, token.span));
  };

  const signed = (depth: number, after: Token | undefined): ValueNode => {
    const token = tokens[at];
    if (token?.t === 'op' && (token.op === '+' || token.op === '-')) {
      if (depth >= MAX_DEPTH) throw new Stop(error(Code.valueTooDeep, `signs nested more than ${MAX_DEPTH} deep`, token.span));
      at++;
      const arg = signed(depth + 1, token);
      return { kind: 'unary', op: token.op, arg, span: join(token.span, arg.span), opSpan: token.span };
    }
    return primary(depth, after);
  };

  const product = (depth: number, after: Token | undefined): ValueNode => {
    let left = signed(depth, after);
    for (let t = peek(); t?.t === 'op' && (t.op === '*' || t.op === '/'); t = peek()) {
      at++;
      const right = signed(depth, t);
      left = { kind: 'binary', op: t.op, left, right, span: join(left.span, right.span), opSpan: t.span };
    }
    return left;
  };

  const sum = (depth: number, after: Token | undefined): ValueNode => {
    let left = product(depth, after);
    for (let t = peek(); t?.t === 'op' && (t.op === '+' || t.op === '-'); t = peek()) {
      at++;
      const right = product(depth, t);
      left = { kind: 'binary', op: t.op, left, right, span: join(left.span, right.span), opSpan: t.span };
    }
    return left;
  };

  try {
    const expr = sum(0, undefined);
    const rest = tokens[at];
    if (rest) {
      const last = tokens[tokens.length - 1];
      const message = isOp(rest, ')')
        ? '`)` without a matching `(`'
        : rest.t === 'num' || rest.t === 'id' || isOp(rest, '(')
          ? `expected an operator (+ − * /) before ${describe(rest)}`
          : `unexpected ${describe(rest)} after the value`;
      return { findings: [error(Code.valueSyntax, message, isOp(rest, ')') ? rest.span : join(rest.span, last.span))] };
    }
    return { expr, findings: [] };
  } catch (e) {
    if (e instanceof Stop) return { findings: [e.finding] };
    throw e;
  }
}
