// Evaluates a parsed constant expression with C's rules (ISO C11 6.3, 6.5).
// `live` is false inside an operand that C does not evaluate (the untaken arm of ?:, the right of a
// short-circuited && or ||): its type still counts, its division by zero does not.
import { Code } from '../codes';
import { commonType, convert, promote, roundFloating, wrap, type CType, type FloatType, type IntType, type TypeSystem, type Val } from './ctypes';
import { parseChar, parseNumber } from './literals';
import { arithmeticOverflow, leftShiftOverflow, negationOverflow, operationToken } from './overflow';
import type { Node } from './parse';
import type { SourceToken } from './tokens';

export interface EvalError {
  err: string; code: string; tok?: SourceToken;
  /** The message already names the constant whose definition holds the problem. */
  named?: boolean;
  /** For a run-time value: what the expression reads, after "it" (`calls read_clock()`). */
  runtime?: string;
}
export type EvalResult = Val | EvalError;

export const isError = (r: unknown): r is EvalError => typeof r === 'object' && r !== null && 'err' in r;

export interface EvalContext {
  ts: TypeSystem;
  /** Inside #if: integers act as intmax_t (C11 6.10.1p4). */
  pp?: boolean;
  identifier(tok: SourceToken): EvalResult;
}

const truth = (x: Val): boolean => (typeof x.v === 'bigint' ? x.v !== 0n : x.v !== 0);
const bool = (b: boolean, ts: TypeSystem): Val => ({ v: b ? 1n : 0n, t: ts.int });

/** Undefined behaviour in an operand C evaluates is an error; in one it does not, the result is a zero of its type. */
const undefinedBehaviour = (err: string, tok: SourceToken, t: CType, live: boolean): EvalResult =>
  live ? { err, code: Code.cUndefined, tok } : { v: t.kind === 'float' ? 0 : 0n, t };

const integerOnly = (op: string, a: Val, b: Val, tok: SourceToken): EvalError =>
  ({ err: `'${op}' needs integer operands, not ${a.t.name} and ${b.t.name}`, code: Code.cSyntax, tok });

export function evaluate(node: Node, ctx: EvalContext, live = true): EvalResult {
  const { ts } = ctx;
  switch (node.k) {
    case 'num': {
      const r = parseNumber(node.tok.text, ts, ctx.pp);
      return typeof r === 'string' ? { err: r, code: Code.cSyntax, tok: node.tok } : r;
    }
    case 'char': {
      const r = parseChar(node.tok.text, ts);
      return typeof r === 'string' ? { err: r, code: Code.cSyntax, tok: node.tok } : r;
    }
    case 'ident':
      if (node.tok.text === 'true' || node.tok.text === 'false') {
        const r = ctx.identifier(node.tok);
        return isError(r) && r.code === Code.cUnknown ? bool(node.tok.text === 'true', ts) : r;
      }
      return ctx.identifier(node.tok);
    case 'unary': {
      const a = evaluate(node.arg, ctx, live);
      if (isError(a)) return a;
      if (node.op === '!') return bool(!truth(a), ts);
      const t = promote(a.t, ts);
      const x = convert(a, t) as Val;
      if (node.op === '+') return x;
      if (typeof x.v === 'number') return node.op === '-' ? { v: -x.v, t } : { err: `'~' needs an integer operand`, code: Code.cSyntax, tok: node.tok };
      const overflow = node.op === '-' && live ? negationOverflow(x.v, t as IntType, ts) : undefined;
      if (overflow) return { err: overflow, code: Code.cUndefined, tok: operationToken(node) };
      return { v: wrap(node.op === '-' ? -x.v : ~x.v, t as IntType), t };
    }
    case 'cast': {
      const a = evaluate(node.arg, ctx, live);
      if (isError(a)) return a;
      const r = convert(a, node.type);
      return typeof r === 'string' ? undefinedBehaviour(r, node.tok, node.type, live) : r;
    }
    case 'sizeof': {
      let t = node.type;
      if (!t) {
        const a = evaluate(node.arg as Node, ctx, false);
        if (isError(a)) return a;
        t = a.t;
      }
      const bytes = t.kind === 'int' ? Math.max(1, t.bits / 8) : t.name !== 'long double' || t.bits === 32 ? t.bits / 8 : undefined;
      if (bytes === undefined) return { err: `sizeof(${t.name}) depends on the compiler`, code: Code.cSyntax, tok: node.tok };
      return { v: BigInt(bytes), t: ts.sizeT };
    }
    case 'cond': {
      const c = evaluate(node.c, ctx, live);
      if (isError(c)) return c;
      const take = truth(c);
      const a = evaluate(node.a, ctx, live && take);
      if (isError(a)) return a;
      const b = evaluate(node.b, ctx, live && !take);
      if (isError(b)) return b;
      // Both arms arithmetic: the result has their common type (C11 6.5.15p5).
      return convert(take ? a : b, commonType(a.t, b.t, ts)) as Val;
    }
    case 'binary':
      return binary(node, ctx, live);
    case 'call':
      return { err: `${node.tok.text}() is a function call: its value is only known at run time`, code: Code.cRuntime, tok: node.tok, runtime: `calls ${node.tok.text}()` };
  }
}

function binary(node: Extract<Node, { k: 'binary' }>, ctx: EvalContext, live: boolean): EvalResult {
  const { ts } = ctx;
  const { op, tok } = node;
  const a = evaluate(node.l, ctx, live);
  if (isError(a)) return a;
  if (op === '&&' || op === '||') {
    const shortCircuit = op === '&&' ? !truth(a) : truth(a);
    const b = evaluate(node.r, ctx, live && !shortCircuit);
    if (isError(b)) return b;
    return bool(shortCircuit ? op === '||' : truth(b), ts);
  }
  const b = evaluate(node.r, ctx, live);
  if (isError(b)) return b;

  if (op === '<<' || op === '>>') {
    // Each operand is promoted on its own; the result has the left one's type (C11 6.5.7p3).
    const lt = promote(a.t, ts);
    if (lt.kind === 'float' || b.t.kind === 'float') return integerOnly(op, a, b, tok);
    const x = (convert(a, lt) as Val).v as bigint;
    const count = b.v as bigint;
    if (count < 0n || count >= BigInt(lt.bits)) {
      if (!live) return { v: 0n, t: lt };
      return { err: `shift count ${count} is out of range for ${lt.name}, ${lt.bits}-bit under ${ts.model} (undefined behaviour, C11 6.5.7p3)`, code: Code.cUndefined, tok };
    }
    const overflow = op === '<<' && live ? leftShiftOverflow(x, count, lt, ts) : undefined;
    if (overflow) return { err: overflow, code: Code.cUndefined, tok: operationToken(node) };
    return { v: wrap(op === '<<' ? x << count : x >> count, lt), t: lt };
  }

  const t = commonType(a.t, b.t, ts);
  const x = (convert(a, t) as Val).v;
  const y = (convert(b, t) as Val).v;
  if (op === '==' || op === '!=' || op === '<' || op === '>' || op === '<=' || op === '>=') {
    const r = op === '==' ? x === y : op === '!=' ? x !== y : op === '<' ? x < y : op === '>' ? x > y : op === '<=' ? x <= y : x >= y;
    return bool(r, ts);
  }
  if ((op === '/' || op === '%') && (y === 0n || y === 0)) {
    if (!live) return { v: t.kind === 'float' ? 0 : 0n, t };
    return { err: `division by zero in '${op}'`, code: Code.cDivZero, tok };
  }
  if (typeof x === 'number' || typeof y === 'number') {
    const p = x as number;
    const q = y as number;
    const f = op === '+' ? p + q : op === '-' ? p - q : op === '*' ? p * q : op === '/' ? p / q : undefined;
    if (f === undefined) return integerOnly(op, a, b, tok);
    return { v: roundFloating(f, t as FloatType), t };
  }
  // BigInt division and remainder truncate toward zero, as C11 6.5.5p6 requires.
  const r = op === '+' ? x + y : op === '-' ? x - y : op === '*' ? x * y : op === '/' ? x / y : op === '%' ? x % y
    : op === '&' ? x & y : op === '|' ? x | y : x ^ y;
  const overflow = live && (op === '+' || op === '-' || op === '*' || op === '/' || op === '%') ? arithmeticOverflow(op, x, y, r, t as IntType, ts) : undefined;
  if (overflow) return { err: overflow, code: Code.cUndefined, tok: operationToken(node) };
  return { v: wrap(r, t as IntType), t };
}
