// Signed integer overflow is undefined behaviour (ISO C11 6.5p5), not a wrap: the evaluator reports it
// instead of guessing what a compiler would make of it. Unsigned arithmetic wraps by definition (6.2.5p9).
import { fits, type IntType, type TypeSystem } from './ctypes';
import type { Node } from './parse';
import type { SourceToken } from './tokens';

const where = (t: IntType, ts: TypeSystem): string => `${t.name}, ${t.bits}-bit under ${ts.model}`;

/** The message when `x op y` (already computed exactly as `exact`) leaves a signed type, else undefined. */
export function arithmeticOverflow(op: string, x: bigint, y: bigint, exact: bigint, t: IntType, ts: TypeSystem): string | undefined {
  if (!t.signed || t.bits < 2) return undefined;
  // a % b is undefined exactly when a / b is (C11 6.5.5p6): INT_MIN % -1.
  const result = op === '%' ? x / y : exact;
  if (fits(result, t)) return undefined;
  const clause = op === '/' || op === '%' ? 'C11 6.5.5p6' : 'C11 6.5p5';
  const shown = op === '%' ? `${x} % ${y} needs ${x} / ${y} = ${result}, which` : `${x} ${op} ${y} = ${result}`;
  return `${shown} overflows ${where(t, ts)} (signed overflow is undefined behaviour, ${clause})`;
}

export function negationOverflow(x: bigint, t: IntType, ts: TypeSystem): string | undefined {
  if (!t.signed || t.bits < 2 || fits(-x, t)) return undefined;
  return `-(${x}) = ${-x} overflows ${where(t, ts)} (signed overflow is undefined behaviour, C11 6.5p5)`;
}

/** Left shift of a signed value: defined only for a non-negative value whose product with 2^count fits (C11 6.5.7p4). */
export function leftShiftOverflow(x: bigint, count: bigint, t: IntType, ts: TypeSystem): string | undefined {
  if (!t.signed) return undefined;
  if (x < 0n) return `${x} << ${count} shifts a negative ${where(t, ts)} (undefined behaviour, C11 6.5.7p4)`;
  const exact = x << count;
  if (fits(exact, t)) return undefined;
  return `${x} << ${count} = ${exact} overflows ${where(t, ts)} (a signed shift into or past the sign bit is undefined behaviour, C11 6.5.7p4; ${x}u << ${count} is defined)`;
}

const leftmost = (n: Node): SourceToken => n.open ?? (n.k === 'binary' ? leftmost(n.l) : n.k === 'cond' ? leftmost(n.c) : n.tok);
const rightmost = (n: Node): SourceToken => n.close ?? (
  n.k === 'binary' ? rightmost(n.r) : n.k === 'cond' ? rightmost(n.b) : n.k === 'unary' || n.k === 'cast' ? rightmost(n.arg)
    : n.k === 'sizeof' && n.arg ? rightmost(n.arg) : n.tok);

/**
 * A token covering the whole operation where its operands and operator stand in order in one file; otherwise
 * (pieces pasted together from several macros) the operator itself, which is always where the operation is.
 */
export function operationToken(node: Node): SourceToken {
  const first = leftmost(node);
  const last = rightmost(node);
  const op = node.tok;
  if (first.uri !== op.uri || last.uri !== op.uri || first.start > op.start || op.end > last.end) return op;
  return { ...op, start: first.start, end: last.end };
}
