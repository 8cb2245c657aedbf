// parseValue: the text after `key:` to a tree, a tolerance, `?`, or a word, with document spans.
import type { Dim, Span } from '../types';
import { Code } from '../codes';
import type { ParsedValue } from './ast';
import { error, lex } from './lexer';
import { parseExpression } from './parser';
import { splitTolerance } from './tolerance';
import { decodeSuffix } from './units';

/** The characters `isSpace` takes, by code: space, tab, no-break space, narrow no-break space, CR, LF. */
const isSpaceCode = (c: number): boolean => c === 32 || c === 9 || c === 0xa0 || c === 0x202f || c === 13 || c === 10;

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
 * The shape most values have, read by one native regex: a number, then a unit against it (`16MHz`, `47k`) or after
 * spaces (`1000 Hz`), then optionally `±`, `+-` or `+/-` and a second such number. Only letters, `µ μ Ω Ω %` and
 * `bit/s` make a unit here, so the text after each unit is a space, a `±`/`+` or the end, exactly where the lexer's
 * own run of unit characters stops. Anything else, and any unit the table does not know, goes the general way.
 */
const UNIT = '([A-Za-z_\u00b5\u03bc\u03a9\u2126%]*bit\/s|[A-Za-z_\u00b5\u03bc\u03a9\u2126%]+)';
const SPACE = '[ \t\u00a0\u202f\r\n]';
const NUMBER = String.raw`(\d+(?:\.\d+)?|\.\d+)(?:[eE]([+-]?\d+))?(?:${UNIT}|(${SPACE}+)${UNIT})?`;
const QUANTITY = new RegExp(String.raw`^${NUMBER}(?:(${SPACE}*)(±|\+-|\+\/-)(${SPACE}*)${NUMBER})?$`);

/** One number of the quick shape, with the span its token would have, or undefined to go the general way. */
interface Quick {
  value: number;
  dim: Dim;
  end: number;
}

/**
 * The number read from `m[at…at+4]` (mantissa, power, glued unit, spaces, spaced unit) starting at body index
 * `start`, as the lexer reads it: the same suffix table, the same one-step decimal conversion, the same refusals.
 */
function quickNumber(m: RegExpExecArray, at: number, start: number): Quick | undefined {
  const mantissa = m[at];
  let exponent = m[at + 1] === undefined ? 0 : Number(m[at + 1]);
  let end = start + mantissa.length + (m[at + 1] === undefined ? 0 : m[at + 1].length + 1);
  let dim: Dim = '';
  const glued = m[at + 2];
  const spaced = m[at + 4];
  if (glued !== undefined) {
    const scale = decodeSuffix(glued);
    if (!scale) return undefined;
    exponent += scale.exponent;
    dim = scale.dim;
    end += glued.length;
  } else if (spaced !== undefined) {
    // A prefix alone after a space (`47 k`) is a finding: the general way says which.
    const scale = decodeSuffix(spaced);
    if (!scale || scale.prefixOnly) return undefined;
    exponent += scale.exponent;
    dim = scale.dim;
    end += m[at + 3].length + spaced.length;
  }
  // The same decimal as the lexer's `${mantissa}e${exponent}`, so the same double; without the exponent when it is 0.
  const value = exponent === 0 ? Number(mantissa) : Number(`${mantissa}e${exponent}`);
  if (!Number.isFinite(value) || (value === 0 && /[1-9]/.test(mantissa))) return undefined;
  return { value, dim, end };
}

/** parseValue of a trimmed body of the quick shape; undefined when the general parser must read it. */
function quickValue(body: string, offset: number): ParsedValue | undefined {
  const m = QUANTITY.exec(body);
  if (!m) return undefined;
  const first = quickNumber(m, 1, 0);
  if (!first) return undefined;
  const span: Span = { start: offset, end: offset + first.end };
  if (m[7] === undefined) return { findings: [], expr: { kind: 'number', value: first.value, dim: first.dim, span } };
  const pmStart = first.end + m[6].length;
  const numberStart = pmStart + m[7].length + m[8].length;
  const second = quickNumber(m, 9, numberStart);
  // A tolerance needs a unit, and a relative one below −100 % is refused: findings the general way words.
  if (!second || second.dim === '' || (second.dim === '%' && second.value > 1)) return undefined;
  return {
    findings: [],
    tolerance: { kind: second.dim === '%' ? 'relative' : 'absolute', plus: second.value, minus: second.value },
    toleranceSpan: { start: offset + pmStart, end: offset + second.end },
    toleranceDim: second.dim,
    expr: { kind: 'number', value: first.value, dim: first.dim, span },
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
  if (kind === 'identifier') return { word: body, expr: { kind: 'ident', name: body, span: { start: offset + start, end: offset + end } }, findings: [] };
  if (kind === 'hyphenated') return { word: body, findings: [] };
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
