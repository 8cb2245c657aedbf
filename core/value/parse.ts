// parseValue: the text after `key:` to a tree, a tolerance, `?`, or a word, with document spans.
import type { Dim, Finding, Span } from '../types';
import { Code } from '../codes';
import type { ParsedValue } from './ast';
import { error, isSpaceCode, lex, SPACE_CLASS } from './lexer';
import { parseExpression } from './parser';
import { splitTolerance } from './tolerance';
import { decodeSuffix } from './units';
import { emptyList } from '../empty';


const IDENTIFIER = /^[A-Za-z_][A-Za-z0-9_]*$/;
const HYPHENATED = /^[A-Za-z_][A-Za-z0-9_]*(?:-[A-Za-z0-9_]+)+$/;
const LETTER_DIGIT_OHMS = /^R[0-9]+$/;

/** `yes`, `up-down`, `E24`: letters, digits and `_` in runs joined by single hyphens. */
function wordKind(word: string): 'identifier' | 'hyphenated' | undefined {
  // R47 is a number in the letter-and-digit code, not a word.
  if (IDENTIFIER.test(word)) return LETTER_DIGIT_OHMS.test(word) ? undefined : 'identifier';
  return HYPHENATED.test(word) ? 'hyphenated' : undefined;
}

/*
 * The shape most values have, read by native sticky regex tests: a number, then a unit against it (`16MHz`, `47k`)
 * or after spaces (`1000 Hz`), then optionally `±`, `+-` or `+/-` and a second such number, and nothing else. Only
 * letters, `µ μ Ω Ω %` and `bit/s` make a unit here, so the text after each unit is a space, a `±`/`+` or the end,
 * exactly where the lexer's own run of unit characters stops. Anything else, and any unit the table does not know,
 * goes the general way. Tests rather than one match with groups: no match array or group strings per value.
 */
const Q_MANTISSA = /\d+(?:\.\d+)?|\.\d+/y;
const Q_POWER = /[eE][+-]?\d+/y;
const Q_SPACES = new RegExp(`${SPACE_CLASS}*`, 'y');
const Q_UNIT = /[A-Za-z_\u00b5\u03bc\u03a9\u2126%]*bit\/s|[A-Za-z_\u00b5\u03bc\u03a9\u2126%]+/y;
const Q_PLUS_MINUS = /\u00b1|\+-|\+\/-/y; // ± +- +/-

/** The findings of every value read without one: a shared empty list, never added to (a fresh one is made for any). */
const noFindings: Finding[] = emptyList;

/** Where the number quickNumber last read ends (body index), and its dimension. */
let quickEnd = 0;
let quickDim: Dim = '';

/** Index past the spaces at `at`. */
function spacesEnd(body: string, at: number): number {
  Q_SPACES.lastIndex = at;
  Q_SPACES.test(body);
  return Q_SPACES.lastIndex;
}

/**
 * The number of the quick shape at body index `at`, as the lexer reads it (the same suffix table, the same one-step
 * decimal conversion, the same refusals), with quickEnd and quickDim set; NaN to go the general way.
 */
function quickNumber(body: string, at: number): number {
  Q_MANTISSA.lastIndex = at;
  if (!Q_MANTISSA.test(body)) return NaN;
  let end = Q_MANTISSA.lastIndex;
  const mantissa = body.slice(at, end);
  let exponent = 0;
  Q_POWER.lastIndex = end;
  if (Q_POWER.test(body)) {
    exponent = Number(body.slice(end + 1, Q_POWER.lastIndex));
    end = Q_POWER.lastIndex;
  }
  let dim: Dim = '';
  const unitStart = spacesEnd(body, end);
  Q_UNIT.lastIndex = unitStart;
  if (Q_UNIT.test(body)) {
    const scale = decodeSuffix(body.slice(unitStart, Q_UNIT.lastIndex));
    // A prefix alone after a space (`47 k`) is a finding: the general way says which.
    if (!scale || (unitStart > end && scale.prefixOnly)) return NaN;
    exponent += scale.exponent;
    dim = scale.dim;
    end = Q_UNIT.lastIndex;
  }
  // The same decimal as the lexer's `${mantissa}e${exponent}`, so the same double; without the exponent when it is 0.
  const value = exponent === 0 ? Number(mantissa) : Number(`${mantissa}e${exponent}`);
  if (!Number.isFinite(value) || (value === 0 && /[1-9]/.test(mantissa))) return NaN;
  quickEnd = end;
  quickDim = dim;
  return value;
}

/** parseValue of a trimmed body of the quick shape; undefined when the general parser must read it. */
function quickValue(body: string, offset: number): ParsedValue | undefined {
  const value = quickNumber(body, 0);
  if (Number.isNaN(value)) return undefined;
  const dim = quickDim;
  const span: Span = { start: offset, end: offset + quickEnd };
  if (quickEnd === body.length) return { findings: noFindings, expr: { kind: 'number', value, dim, span } };
  const pmStart = spacesEnd(body, quickEnd);
  Q_PLUS_MINUS.lastIndex = pmStart;
  if (!Q_PLUS_MINUS.test(body)) return undefined;
  const amount = quickNumber(body, spacesEnd(body, Q_PLUS_MINUS.lastIndex));
  // Nothing after the tolerance; it needs a unit, and a relative one below −100 % is refused: findings the
  // general way words.
  if (Number.isNaN(amount) || quickEnd !== body.length || quickDim === '' || (quickDim === '%' && amount > 1)) return undefined;
  return {
    findings: noFindings,
    tolerance: { kind: quickDim === '%' ? 'relative' : 'absolute', plus: amount, minus: amount },
    toleranceSpan: { start: offset + pmStart, end: offset + quickEnd },
    toleranceDim: quickDim,
    expr: { kind: 'number', value, dim, span },
  };
}

/** Parses one value; `offset` is the document offset of text[0], and every span is a document offset. */
export function parseValue(text: string, offset: number): ParsedValue {
  return parse(text, offset, true);
}

/** parseValue without the quick shape: the general lexer and parser alone, which the quick shape must agree with. */
export function parseValueGeneral(text: string, offset: number): ParsedValue {
  return parse(text, offset, false);
}

function parse(text: string, offset: number, quickly: boolean): ParsedValue {
  let start = 0;
  let end = text.length;
  while (start < end && isSpaceCode(text.charCodeAt(start))) start++;
  while (end > start && isSpaceCode(text.charCodeAt(end - 1))) end--;
  if (start === end) {
    return { findings: [error(Code.valueSyntax, 'empty value: write a number, a name, or `?`', { start: offset, end: offset + text.length })] };
  }
  const body = start === 0 && end === text.length ? text : text.slice(start, end);
  const lead = body.charCodeAt(0);
  if (quickly && ((lead >= 48 && lead <= 57) || lead === 46)) {
    const quick = quickValue(body, offset + start);
    if (quick) return quick;
  }
  const kind = wordKind(body);
  if (kind === 'identifier') return { word: body, expr: { kind: 'ident', name: body, span: { start: offset + start, end: offset + end } }, findings: noFindings };
  if (kind === 'hyphenated') return { word: body, findings: noFindings };
  const whole: Span = { start: offset + start, end: offset + end };

  const lexed = lex(body, offset + start);
  if (lexed.findings.length > 0) return { findings: lexed.findings };
  const split = splitTolerance(lexed.tokens);
  const result: ParsedValue = { findings: [...split.findings] };
  if (split.tolerance) result.tolerance = split.tolerance;
  if (split.toleranceSpan) result.toleranceSpan = split.toleranceSpan;
  if (split.toleranceDim) result.toleranceDim = split.toleranceDim;

  const tokens = split.body;
  if (tokens.length === 0) {
    const where = split.toleranceSpan ?? whole;
    result.findings.unshift(error(Code.valueSyntax, 'a tolerance needs a value before it, e.g. `47k ±1%`', where));
    return result;
  }
  if (tokens.length === 1 && tokens[0].t === 'q') {
    result.unknown = tokens[0].span;
    return result;
  }
  const bodySpan: Span = { start: tokens[0].span.start, end: tokens[tokens.length - 1].span.end };
  const parsed = parseExpression(tokens, bodySpan);
  if (parsed.expr) result.expr = parsed.expr;
  result.findings.unshift(...parsed.findings);
  return result;
}
