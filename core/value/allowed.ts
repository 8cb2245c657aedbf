// `?` with the values it may take (`? 1..63`, `? 2, 4, 6, 8`), and limits written as a range with units
// (`vco-range: 96 MHz .. 344 MHz`).
import type { Dim, Finding, Span } from '../types';
import type { IntegerSet } from '../circuits/model';
import { Code } from '../codes';
import { compileValue } from './compile';
import { dimOf } from './dim';
import { error, isSpace, shown } from './lexer';
import { parseIntegerSet } from './list';
import { parseValue } from './parse';

export interface ParsedUnknown {
  /** The `?` itself. */
  span: Span;
  /** Allowed values after it, when given. */
  allowed?: IntegerSet;
  findings: Finding[];
}

/** `?`, `? 1..63` or `? 2, 4, 6, 8`; undefined when the value does not start with `?`. */
export function parseUnknown(text: string, offset: number): ParsedUnknown | undefined {
  let start = 0;
  while (start < text.length && isSpace(text[start])) start++;
  if (text[start] !== '?') return undefined;
  const span = { start: offset + start, end: offset + start + 1 };
  const rest = text.slice(start + 1);
  if (rest.trim() === '') return { span, findings: [] };
  const parsed = parseIntegerSet(rest, offset + start + 1);
  if (!parsed.set) return { span, findings: parsed.findings };
  const empty = parsed.set.kind === 'list' && parsed.set.values.length === 0;
  if (empty) return { span, findings: [error(Code.valueSyntax, '`?` is followed by no allowed value: write `? 1..63` or `? 2, 4, 6, 8`', span)] };
  return { span, allowed: parsed.set, findings: parsed.findings };
}

export interface ParsedRange {
  min?: number;
  max?: number;
  findings: Finding[];
}

/** `96 MHz .. 344 MHz` (or `96 .. 344 MHz`: a bare number takes the other end's unit), in SI units of `dim`. */
export function parseRange(text: string, offset: number, dim: Dim, key: string): ParsedRange {
  const whole = { start: offset, end: offset + text.length };
  const at = text.indexOf('..');
  if (at < 0) return { findings: [error(Code.valueSyntax, `\`${key}\` takes a range \`low .. high\` (e.g. \`96 MHz .. 344 MHz\`)`, whole)] };
  const ends = [
    { text: text.slice(0, at), offset },
    { text: text.slice(at + 2), offset: offset + at + 2 },
  ].map((piece) => endOf(piece.text, piece.offset, key));
  const findings = ends.flatMap((e) => e.findings);
  if (findings.length) return { findings };
  const dims = ends.map((e) => e.dim);
  const unitDim = dims.find((d) => d !== '');
  if (dims.some((d) => d !== '' && d !== dim) || (dim !== '' && unitDim === undefined)) {
    const unit = dim === '' ? 'plain numbers' : `${dim}`;
    return { findings: [error(Code.keyDimension, `\`${key}\` is a range in ${unit}, but \`${shown(text.trim())}\` is not`, whole)] };
  }
  const [min, max] = ends.map((e) => e.value!);
  if (min > max) return { findings: [error(Code.valueSyntax, `range \`${shown(text.trim())}\` runs backwards: write the smaller end first`, whole)] };
  return { min, max, findings: [] };
}

function endOf(text: string, offset: number, key: string): { value?: number; dim?: Dim; findings: Finding[] } {
  const span = { start: offset, end: offset + text.length };
  const parsed = parseValue(text, offset);
  if (parsed.findings.length) return { findings: parsed.findings };
  if (!parsed.expr || parsed.tolerance || parsed.unknown) return { findings: [error(Code.valueSyntax, `\`${key}\`: each end of the range is a number with a unit`, span)] };
  const dim = dimOf(parsed.expr, () => undefined);
  if ('finding' in dim) return { findings: [error(Code.valueSyntax, `\`${key}\`: a range takes numbers, not names`, span)] };
  let value = NaN;
  try {
    value = compileValue(parsed.expr)({});
  } catch {
    value = NaN;
  }
  if (!Number.isFinite(value)) return { findings: [error(Code.valueSyntax, `\`${key}\`: \`${shown(text.trim())}\` is not a number`, span)] };
  return { value, dim: dim.dim, findings: [] };
}
