// parseValue: the text after `key:` to a tree, a tolerance, `?`, or a word, with document spans.
import type { Span } from '../types';
import { Code } from '../codes';
import type { ParsedValue } from './ast';
import { error, isSpace, lex } from './lexer';
import { parseExpression } from './parser';
import { splitTolerance } from './tolerance';

function trimmed(text: string): { start: number; end: number } {
  let start = 0;
  let end = text.length;
  while (start < end && isSpace(text[start])) start++;
  while (end > start && isSpace(text[end - 1])) end--;
  return { start, end };
}

const isWordStart = (c: string): boolean => (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || c === '_';
const isWordChar = (c: string): boolean => isWordStart(c) || (c >= '0' && c <= '9');

/** `yes`, `up-down`, `E24`: letters, digits and `_` in runs joined by single hyphens. */
function wordKind(word: string): 'identifier' | 'hyphenated' | undefined {
  if (word === '' || !isWordStart(word[0])) return undefined;
  let hyphens = 0;
  for (let i = 0; i < word.length; i++) {
    const c = word[i];
    if (c === '-') {
      if (!isWordChar(word[i + 1] ?? '') || word[i - 1] === '-') return undefined;
      hyphens++;
    } else if (!isWordChar(c)) return undefined;
  }
  // R47 is a number in the letter-and-digit code, not a word.
  if (hyphens === 0 && /^R[0-9]+$/.test(word)) return undefined;
  return hyphens === 0 ? 'identifier' : 'hyphenated';
}

/** Parses one value; `offset` is the document offset of text[0], and every span is a document offset. */
export function parseValue(text: string, offset: number): ParsedValue {
  const { start, end } = trimmed(text);
  const whole: Span = { start: offset + start, end: offset + end };
  if (start === end) {
    return { findings: [error(Code.valueSyntax, 'empty value: write a number, a name, or `?`', { start: offset, end: offset + text.length })] };
  }
  const body = text.slice(start, end);
  const kind = wordKind(body);
  if (kind === 'identifier') return { word: body, expr: { kind: 'ident', name: body, span: whole }, findings: [] };
  if (kind === 'hyphenated') return { word: body, findings: [] };

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
