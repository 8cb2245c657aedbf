// C tokenizer: one pass, offsets into the original text, never throws.
// Comments count as white space (ISO C11 5.1.1.2 phase 3), so a newline inside /* */ does not end a directive.
import { LineCounter, lineOf, lineStarts } from '../scan/lines';

export type TokenKind = 'ident' | 'number' | 'char' | 'string' | 'punct' | 'newline' | 'other';

export interface Token {
  kind: TokenKind;
  text: string;
  /** 0-based offsets into the source text, half-open. */
  start: number;
  end: number;
  /** Set when the token is malformed (unterminated literal or comment, stray character). */
  error?: string;
}

// Longest first, so `<<=` wins over `<<` and `<`.
const PUNCTUATORS = [
  '...', '<<=', '>>=',
  '->', '++', '--', '<<', '>>', '<=', '>=', '==', '!=', '&&', '||', '*=', '/=', '%=', '+=', '-=', '&=', '^=', '|=', '##',
  '[', ']', '(', ')', '{', '}', '.', '&', '*', '+', '-', '~', '!', '/', '%', '<', '>', '^', '|', '?', ':', ';', '=', ',', '#',
];

// Punctuators grouped by the code of their first character (all ASCII): the tokenizer runs over whole
// firmware files on every keystroke.
const PUNCTUATORS_BY_FIRST: Array<string[] | undefined> = [];
for (const p of PUNCTUATORS) (PUNCTUATORS_BY_FIRST[p.charCodeAt(0)] ??= []).push(p);

function punctuatorAt(text: string, i: number, c: number): string | undefined {
  const list = c < 128 ? PUNCTUATORS_BY_FIRST[c] : undefined;
  if (!list) return undefined;
  for (let k = 0; k < list.length; k++) if (text.startsWith(list[k], i)) return list[k];
  return undefined;
}

function isIdentStartCode(ch: number): boolean {
  return (ch >= 97 && ch <= 122) || (ch >= 65 && ch <= 90) || ch === 95 || ch === 36;
}
function isIdentPartCode(ch: number): boolean {
  return isIdentStartCode(ch) || (ch >= 48 && ch <= 57);
}
const isIdentStart = (c: string): boolean => c !== undefined && c.length > 0 && isIdentStartCode(c.charCodeAt(0));
const isIdentPart = (c: string): boolean => c !== undefined && c.length > 0 && isIdentPartCode(c.charCodeAt(0));
const isDigit = (c: string): boolean => c >= '0' && c <= '9';

/** Length of a backslash-newline splice at `i` (0 when there is none). */
function spliceLength(text: string, i: number): number {
  if (text[i] !== '\\') return 0;
  if (text[i + 1] === '\n') return 2;
  if (text[i + 1] === '\r' && text[i + 2] === '\n') return 3;
  return 0;
}

export function tokenize(text: string): Token[] {
  return tokenizeRange(text, 0, text.length, []);
}

/**
 * Tokens of text[from, to) with offsets into the whole text, appended to `tokens`. `from` must be where a
 * lexer over the whole text stands between tokens (a line start), `to` a newline or the end of the text.
 */
export function tokenizeRange<T extends Token>(text: string, from: number, to: number, tokens: T[]): T[] {
  return lexRange(text, from, to, tokens as Token[]) as T[];
}

function lexRange(text: string, from: number, to: number, tokens: Token[]): Token[] {
  const n = to;
  let i = from;
  while (i < n) {
    const c = text[i];
    const splice = spliceLength(text, i);
    if (splice) { i += splice; continue; }
    if (c === '\n') { tokens.push({ kind: 'newline', text: '\n', start: i, end: i + 1 }); i++; continue; }
    if (c === ' ' || c === '\t' || c === '\r' || c === '\f' || c === '\v') { i++; continue; }
    if (c === '/' && text[i + 1] === '/') {
      // A line comment ends at the newline, unless a splice continues it (C11 5.1.1.2 phase 2).
      i += 2;
      while (i < n && text[i] !== '\n') i += spliceLength(text, i) || 1;
      continue;
    }
    if (c === '/' && text[i + 1] === '*') {
      const close = text.indexOf('*/', i + 2);
      if (close < 0) {
        tokens.push({ kind: 'other', text: text.slice(i, i + 2), start: i, end: text.length, error: 'unterminated comment' });
        i = text.length;
      } else i = close + 2;
      continue;
    }
    if (isIdentStart(c)) {
      let j = i + 1;
      while (j < n && isIdentPartCode(text.charCodeAt(j))) j++;
      const word = text.slice(i, j);
      if ((text[j] === "'" || text[j] === '"') && (word === 'L' || word === 'u' || word === 'U' || word === 'u8')) {
        j = quoted(text, j, text[j], tokens, i);
        i = j;
        continue;
      }
      tokens.push({ kind: 'ident', text: word, start: i, end: j });
      i = j;
      continue;
    }
    if (isDigit(c) || (c === '.' && isDigit(text[i + 1] ?? ''))) {
      // A preprocessing number (C11 6.4.8): digits, letters, dots, and e+ e- p+ p- signs.
      let j = i + 1;
      while (j < n) {
        const d = text[j];
        if ((d === '+' || d === '-') && /[eEpP]/.test(text[j - 1])) { j++; continue; }
        if (isIdentPart(d) || d === '.') { j++; continue; }
        break;
      }
      tokens.push({ kind: 'number', text: text.slice(i, j), start: i, end: j });
      i = j;
      continue;
    }
    if (c === "'" || c === '"') { i = quoted(text, i, c, tokens, i); continue; }
    const p = punctuatorAt(text, i, text.charCodeAt(i));
    if (p) { tokens.push({ kind: 'punct', text: p, start: i, end: i + p.length }); i += p.length; continue; }
    tokens.push({ kind: 'other', text: c, start: i, end: i + 1, error: `unexpected character '${c}'` });
    i++;
  }
  return tokens;
}

/** Reads a character or string literal whose quote is at `q`; the token starts at `start` (a prefix may precede). */
function quoted(text: string, q: number, quote: string, tokens: Token[], start: number): number {
  let j = q + 1;
  while (j < text.length && text[j] !== quote && text[j] !== '\n') {
    if (text[j] === '\\') j += spliceLength(text, j) || 2;
    else j++;
  }
  const kind = quote === "'" ? 'char' : 'string';
  if (text[j] === quote) {
    tokens.push({ kind, text: text.slice(start, j + 1), start, end: j + 1 });
    return j + 1;
  }
  const end = Math.min(j, text.length);
  tokens.push({ kind, text: text.slice(start, end), start, end, error: `unterminated ${kind === 'char' ? 'character' : 'string'} literal` });
  return end;
}

/**
 * 1-based line numbers from offsets, on the scanners' one line table (core/scan/lines.ts: \r\n, \n or a lone \r
 * ends a line). Questions usually come in file order, so a counter runs forward; an earlier offset falls back to a
 * binary search over line starts.
 */
export function lineIndex(text: string): (offset: number) => number {
  const counter = new LineCounter(text);
  let last = 0;
  let starts: number[] | undefined;
  return (offset) => {
    if (!starts && offset >= last) {
      last = offset;
      return counter.lineOf(offset) + 1;
    }
    starts ??= lineStarts(text);
    return lineOf(starts, offset) + 1;
  };
}

/** A token with the file it came from; `hide` is the set of macros it was produced by (C11 6.10.3.4p2). */
export interface SourceToken extends Token {
  uri: string;
  hide?: ReadonlySet<string>;
}

export function tokenizeSource(text: string, uri: string): SourceToken[] {
  return tokenizeSourceRange(text, 0, text.length, uri, []);
}

/** tokenizeRange with each token tagged with its file, appended to `out`. */
export function tokenizeSourceRange(text: string, from: number, to: number, uri: string, out: SourceToken[]): SourceToken[] {
  const first = out.length;
  // Tagged in place: a copy per token doubled the garbage of a large file.
  lexRange(text, from, to, out as Token[]);
  for (let k = first; k < out.length; k++) out[k].uri = uri;
  return out;
}

/** A copy of `t` produced by the macros in `hide`; spelled out, as an object spread per token is slow in V8. */
export function withHide(t: SourceToken, hide: ReadonlySet<string>): SourceToken {
  const copy: SourceToken = { kind: t.kind, text: t.text, start: t.start, end: t.end, uri: t.uri, hide };
  if (t.error !== undefined) copy.error = t.error;
  return copy;
}
