// Lists in a value: `expect: 1 kHz ±1%, 50 %` and the integer sets of `prescalers:`.
import type { Finding } from '../types';
import type { IntegerSet } from '../circuits/model';
import { Code } from '../codes';
import type { ValueNode } from './ast';
import { error, isSpace, shown } from './lexer';
import { parseValue } from './parse';

/** Splits at commas outside parentheses; each piece is trimmed, with its own document offset. */
export function splitList(text: string, offset: number): Array<{ text: string; offset: number }> {
  const pieces: Array<{ text: string; offset: number }> = [];
  // Most lists are one item: the native search says so without walking the characters.
  if (text.indexOf(',') < 0) {
    pushPiece(pieces, text, offset, 0, text.length);
    return pieces;
  }
  let depth = 0;
  let from = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (c === '(') depth++;
    else if (c === ')') depth = Math.max(0, depth - 1);
    else if (c === ',' && depth === 0) {
      pushPiece(pieces, text, offset, from, i);
      from = i + 1;
    }
  }
  pushPiece(pieces, text, offset, from, text.length);
  return pieces;
}

/** text[from, to) trimmed, as a piece with its document offset. */
function pushPiece(pieces: Array<{ text: string; offset: number }>, text: string, offset: number, from: number, to: number): void {
  while (from < to && isSpace(text[from])) from++;
  while (to > from && isSpace(text[to - 1])) to--;
  pieces.push({ text: text.slice(from, to), offset: offset + from });
}

/** Evaluates a name-free constant; undefined when the tree reads a name. */
function constant(node: ValueNode): number | undefined {
  switch (node.kind) {
    case 'number': return node.value;
    case 'ident': return undefined;
    case 'unary': {
      const v = constant(node.arg);
      return v === undefined ? undefined : node.op === '-' ? -v : v;
    }
    case 'binary': {
      const a = constant(node.left);
      const b = constant(node.right);
      if (a === undefined || b === undefined) return undefined;
      return node.op === '+' ? a + b : node.op === '-' ? a - b : node.op === '*' ? a * b : a / b;
    }
  }
}

function integerAt(text: string, offset: number, findings: Finding[]): number | undefined {
  const parsed = parseValue(text, offset);
  const span = { start: offset, end: offset + text.length };
  if (parsed.findings.length > 0) {
    findings.push(...parsed.findings);
    return undefined;
  }
  if (parsed.tolerance || parsed.unknown || !parsed.expr) {
    findings.push(error(Code.valueSyntax, `\`${shown(text)}\`: expected a whole number`, span));
    return undefined;
  }
  const value = constant(parsed.expr);
  if (value === undefined) {
    findings.push(error(Code.valueSyntax, `\`${shown(text)}\`: a list takes plain numbers, not names`, span));
    return undefined;
  }
  if (!Number.isSafeInteger(value) || (parsed.expr.kind === 'number' && parsed.expr.dim !== '')) {
    findings.push(error(Code.valueSyntax, `\`${shown(text)}\`: expected a whole number without a unit`, span));
    return undefined;
  }
  return value;
}

/** `1, 8, 64, 256, 1024` (sorted, duplicates dropped) or the inclusive range `1..65536`. */
export function parseIntegerSet(text: string, offset: number): { set?: IntegerSet; findings: Finding[] } {
  const findings: Finding[] = [];
  const range = text.indexOf('..');
  if (range >= 0) {
    const low = splitList(text.slice(0, range), offset)[0];
    const high = splitList(text.slice(range + 2), offset + range + 2)[0];
    const min = integerAt(low.text, low.offset, findings);
    const max = integerAt(high.text, high.offset, findings);
    if (min === undefined || max === undefined) return { findings };
    if (min > max) {
      findings.push(error(Code.valueSyntax, `range \`${shown(text.trim())}\` runs backwards: write the smaller number first`,
        { start: low.offset, end: high.offset + high.text.length }));
      return { findings };
    }
    return { set: { kind: 'range', min, max }, findings };
  }
  const values: number[] = [];
  for (const piece of splitList(text, offset)) {
    const value = integerAt(piece.text, piece.offset, findings);
    if (value !== undefined) values.push(value);
  }
  if (findings.length > 0) return { findings };
  return { set: { kind: 'list', values: [...new Set(values)].sort((a, b) => a - b) }, findings };
}
