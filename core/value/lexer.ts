// One pass over a value's text: numbers with their prefix and unit, names, operators, `±`, `?`.
// Character loops only, so time is linear in the text and nothing backtracks.
import type { Dim, Finding, Span } from '../types';
import { Code } from '../codes';
import { decodeSuffix, letterCode, suggestSuffix } from './units';
import type { BlockRef } from './ast';
import { readReference } from './reference';

export type Token =
  | { t: 'num'; value: number; dim: Dim; span: Span; text: string }
  | { t: 'id'; name: string; span: Span; ref?: BlockRef }
  | { t: 'op'; op: '+' | '-' | '*' | '/' | '(' | ')'; span: Span }
  | { t: 'pm'; span: Span }
  | { t: 'q'; span: Span };

/** More parts than any honest value has; a bound keeps later tree walks shallow. */
export const MAX_TOKENS = 512;

export interface LexResult {
  tokens: Token[];
  findings: Finding[];
}

const isDigit = (c: string): boolean => c >= '0' && c <= '9';
const isLetter = (c: string): boolean => (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c === '_';
const isIdentChar = (c: string): boolean => isLetter(c) || isDigit(c);
const isUnitChar = (c: string): boolean => isIdentChar(c) || '\u00b5\u03bc\u03a9\u2126%'.includes(c);
/** Spaces between the parts of a value: space, tab, no-break space, narrow no-break space, CR, LF. */
export const isSpaceCode = (c: number): boolean => c === 32 || c === 9 || c === 0xa0 || c === 0x202f || c === 13 || c === 10;
export const isSpace = (c: string): boolean => isSpaceCode(c.charCodeAt(0));
/** The same spaces as a regular-expression class, for the quick paths that read values by regex. */
export const SPACE_CLASS = '[ \\t\\u00a0\\u202f\\r\\n]';

/** Text quoted in a message, shortened so a pasted megabyte does not end up in the Problems list. */
export function shown(text: string): string {
  return text.length > 24 ? `${text.slice(0, 24)}…` : text;
}

export function error(code: string, message: string, span: Span): Finding {
  return { severity: 'error', code, message, span };
}

/** Runs of digits are read without regexes; `at` is a local index. */
function digitsEnd(text: string, at: number): number {
  while (at < text.length && isDigit(text[at])) at++;
  return at;
}

function runEnd(text: string, at: number, pred: (c: string) => boolean): number {
  while (at < text.length && pred(text[at])) at++;
  return at;
}

/** A unit suffix: a run of unit characters, where `bit` may go on as `bit/s` (the one unit with a slash). */
function unitEnd(text: string, at: number): number {
  const end = runEnd(text, at, isUnitChar);
  if (end - at >= 3 && text.startsWith('bit', end - 3) && text[end] === '/' && text[end + 1] === 's' && (end + 2 >= text.length || !isUnitChar(text[end + 2]))) return end + 2;
  return end;
}

/** `4k7`, `2R2`, `3V3`, `4n7`, optionally followed by a unit: the letter is the decimal point. */
function letterDigitCode(whole: string, suffix: string): { mantissa: string; exponent: number; dim: Dim } | undefined {
  const code = letterCode[suffix[0]];
  if (!code || whole === '') return undefined;
  const fractionEnd = digitsEnd(suffix, 1);
  if (fractionEnd === 1) return undefined;
  const rest = suffix.slice(fractionEnd);
  let dim = code.dim;
  if (rest !== '') {
    const unit = decodeSuffix(rest);
    if (!unit || unit.exponent !== 0 || unit.dim === '%' || (dim !== '' && unit.dim !== dim)) return undefined;
    dim = unit.dim;
  }
  return { mantissa: `${whole}.${suffix.slice(1, fractionEnd)}`, exponent: code.exponent, dim };
}

export function lex(text: string, offset: number): LexResult {
  const tokens: Token[] = [];
  const findings: Finding[] = [];
  const span = (start: number, end: number): Span => ({ start: offset + start, end: offset + end });
  let i = 0;

  /** Reads a unit standing after spaces (`47 kΩ`, `5 %`); returns the new end or `end` unchanged. */
  const spacedUnit = (written: string, end: number): { end: number; dim?: Dim; exponent?: number } => {
    const wordStart = runEnd(text, end, isSpace);
    const wordEnd = unitEnd(text, wordStart);
    if (wordStart === end || wordEnd === wordStart) return { end };
    const word = shown(text.slice(wordStart, wordEnd));
    const numberText = shown(written);
    const scale = decodeSuffix(text.slice(wordStart, wordEnd));
    if (scale && !scale.prefixOnly) return { end: wordEnd, dim: scale.dim, exponent: scale.exponent };
    if (scale?.prefixOnly) {
      findings.push(error(Code.valueUnit,
        `\`${numberText} ${word}\`: write the prefix against the number (\`${numberText}${word}\`) or add a unit (\`${numberText} ${word}Ω\`)`,
        span(wordStart, wordEnd)));
    } else {
      const hints = suggestSuffix(word);
      if (hints.length > 0) {
        findings.push(error(Code.valueUnit,
          `\`${numberText} ${word}\`: unknown unit \`${word}\` — did you mean ${hints.map((h) => `\`${numberText} ${h}\``).join(' or ')}?`,
          span(wordStart, wordEnd)));
      }
    }
    return { end };
  };

  const pushNumber = (start: number, mantissa: string, exponent: number, dim: Dim, end: number, bare: boolean): void => {
    const after = bare ? spacedUnit(text.slice(start, end), end) : { end };
    const finalDim = after.dim ?? dim;
    const finalExponent = exponent + (after.exponent ?? 0);
    const value = Number(`${mantissa}e${finalExponent}`);
    const written = text.slice(start, after.end);
    // Beyond the range of a double the number would silently become Infinity or 0.
    if (!Number.isFinite(value) || (value === 0 && /[1-9]/.test(mantissa))) {
      findings.push(error(Code.valueSyntax, `\`${shown(written)}\`: number out of range`, span(start, after.end)));
    } else {
      tokens.push({ t: 'num', value, dim: finalDim, span: span(start, after.end), text: written });
    }
    i = after.end;
  };

  const lexNumber = (start: number): void => {
    const wholeEnd = digitsEnd(text, start);
    let end = wholeEnd;
    if (text[end] === '.' && isDigit(text[end + 1] ?? '')) end = digitsEnd(text, end + 1);
    let power = 0;
    let mantissaEnd = end;
    if (text[end] === 'e' || text[end] === 'E') {
      const signAt = text[end + 1] === '+' || text[end + 1] === '-' ? end + 2 : end + 1;
      if (isDigit(text[signAt] ?? '')) {
        const powerEnd = digitsEnd(text, signAt);
        power = Number(text.slice(end + 1, powerEnd));
        end = powerEnd;
      }
    }
    const mantissa = text.slice(start, mantissaEnd);
    const suffixEnd = unitEnd(text, end);
    const suffix = text.slice(end, suffixEnd);
    if (suffix === '') return pushNumber(start, mantissa, power, '', end, true);
    const code = end === wholeEnd ? letterDigitCode(text.slice(start, wholeEnd), suffix) : undefined;
    if (code) return pushNumber(start, code.mantissa, code.exponent, code.dim, suffixEnd, false);
    const scale = decodeSuffix(suffix);
    if (scale) return pushNumber(start, mantissa, power + scale.exponent, scale.dim, suffixEnd, false);
    const numberText = shown(text.slice(start, end));
    const hints = suggestSuffix(suffix);
    const advice = hints.length > 0
      ? `did you mean ${hints.map((h) => `\`${numberText}${h}\``).join(' or ')}?`
      : 'expected an SI prefix (p n µ m k M G) and/or a unit (Ω F V A Hz s %)';
    findings.push(error(Code.valueUnit, `\`${numberText}${shown(suffix)}\`: unknown suffix \`${shown(suffix)}\` — ${advice}`, span(end, suffixEnd)));
    i = suffixEnd;
  };

  while (i < text.length && findings.length === 0) {
    if (tokens.length >= MAX_TOKENS) {
      findings.push(error(Code.valueTooDeep, `value is too long: more than ${MAX_TOKENS} parts`, span(i, text.length)));
      break;
    }
    const c = text[i];
    if (isSpace(c)) { i++; continue; }
    if (isDigit(c) || (c === '.' && isDigit(text[i + 1] ?? ''))) { lexNumber(i); continue; }
    if (isLetter(c)) {
      const end = runEnd(text, i, isIdentChar);
      const name = text.slice(i, end);
      // R47 is the letter-and-digit code for 0.47 Ω, not a name.
      if (name.length > 1 && name[0] === 'R' && /^[0-9]+$/.test(name.slice(1))) {
        pushNumber(i, `0.${name.slice(1)}`, 0, 'Ω', end, false);
      } else {
        tokens.push({ t: 'id', name, span: span(i, end) });
        i = end;
      }
      continue;
    }
    if (c === '@') {
      const read = readReference(text, i, offset);
      if ('problem' in read) findings.push(error(Code.valueSyntax, read.problem, span(i, read.end)));
      else tokens.push({ t: 'id', name: read.ref.key, span: span(i, read.end), ref: read.ref });
      i = read.end;
      continue;
    }
    if (c === '±') { tokens.push({ t: 'pm', span: span(i, i + 1) }); i++; continue; }
    if (c === '+' && text[i + 1] === '-') { tokens.push({ t: 'pm', span: span(i, i + 2) }); i += 2; continue; }
    if (c === '+' && text[i + 1] === '/' && text[i + 2] === '-') { tokens.push({ t: 'pm', span: span(i, i + 3) }); i += 3; continue; }
    if (c === '?') { tokens.push({ t: 'q', span: span(i, i + 1) }); i++; continue; }
    const op = c === '\u2212' ? '-' : c === '×' || c === '·' || c === '⋅' ? '*' : c;
    if (op === '+' || op === '-' || op === '*' || op === '/' || op === '(' || op === ')') {
      tokens.push({ t: 'op', op, span: span(i, i + 1) });
      i++;
      continue;
    }
    findings.push(error(Code.valueSyntax, `unexpected character \`${c}\` — a value is a number with a unit, a name, or arithmetic with + − * / ( )`, span(i, i + 1)));
  }
  return { tokens, findings };
}
