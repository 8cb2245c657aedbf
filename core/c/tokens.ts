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

// ASCII character classes in one table, so the lexer's loop asks one question per character rather than calling out.
const IDENT_START = 1;
const IDENT_PART = 2;
const SPACE = 4;
const CLASS = new Uint8Array(128);
for (let c = 0; c < 128; c++) {
  const letter = (c >= 97 && c <= 122) || (c >= 65 && c <= 90) || c === 95 || c === 36;
  const digit = c >= 48 && c <= 57;
  CLASS[c] = (letter ? IDENT_START | IDENT_PART : 0) | (digit ? IDENT_PART : 0) | (c === 32 || c === 9 || c === 13 || c === 12 || c === 11 ? SPACE : 0);
}
const isDigitCode = (c: number): boolean => c >= 48 && c <= 57;

/** Length of a backslash-newline splice at `i` (0 when there is none). */
function spliceLength(text: string, i: number): number {
  if (text.charCodeAt(i) !== 92) return 0;
  const next = text.charCodeAt(i + 1);
  if (next === 10) return 2;
  if (next === 13 && text.charCodeAt(i + 2) === 10) return 3;
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
  return lexRange(text, from, to, tokens as Token[], undefined) as T[];
}

/** A malformed token; `uri` set after the error, as every token of a source range has one. */
function faulty(kind: TokenKind, text: string, start: number, end: number, error: string, uri: string | undefined): Token {
  const t: Token = { kind, text, start, end, error };
  if (uri !== undefined) (t as SourceToken).uri = uri;
  return t;
}

/** `uri`: the file each token is tagged with, given to it as it is made (a token of tokenize() has none). */
function lexRange(text: string, from: number, to: number, tokens: Token[], uri: string | undefined): Token[] {
  const n = to;
  let i = from;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === 92) {
      const splice = spliceLength(text, i);
      if (splice) { i += splice; continue; }
    }
    if (c === 10) {
      tokens.push(uri === undefined ? { kind: 'newline', text: '\n', start: i, end: i + 1 } : { kind: 'newline', text: '\n', start: i, end: i + 1, uri } as SourceToken);
      i++;
      continue;
    }
    if (c < 128 && (CLASS[c] & SPACE) !== 0) { i++; continue; }
    if (c === 47) {
      const next = text.charCodeAt(i + 1);
      if (next === 47) {
        // A line comment ends at the newline, unless a splice continues it (C11 5.1.1.2 phase 2).
        i += 2;
        while (i < n && text.charCodeAt(i) !== 10) i += spliceLength(text, i) || 1;
        continue;
      }
      if (next === 42) {
        const close = text.indexOf('*/', i + 2);
        if (close < 0) {
          tokens.push(faulty('other', text.slice(i, i + 2), i, text.length, 'unterminated comment', uri));
          i = text.length;
        } else i = close + 2;
        continue;
      }
    }
    if (c < 128 && (CLASS[c] & IDENT_START) !== 0) {
      let j = i + 1;
      while (j < n) {
        const d = text.charCodeAt(j);
        if (d >= 128 || (CLASS[d] & IDENT_PART) === 0) break;
        j++;
      }
      const q = text.charCodeAt(j);
      if ((q === 39 || q === 34) && (j - i === 1 ? c === 76 || c === 117 || c === 85 : j - i === 2 && c === 117 && text.charCodeAt(i + 1) === 56)) {
        // L'x', u"…", U'x', u8"…": the prefix is part of the literal.
        i = quoted(text, j, q, tokens, i, uri);
        continue;
      }
      const word = text.slice(i, j);
      tokens.push(uri === undefined ? { kind: 'ident', text: word, start: i, end: j } : { kind: 'ident', text: word, start: i, end: j, uri } as SourceToken);
      i = j;
      continue;
    }
    if ((c >= 48 && c <= 57) || (c === 46 && isDigitCode(text.charCodeAt(i + 1)))) {
      // A preprocessing number (C11 6.4.8): digits, letters, dots, and e+ e- p+ p- signs.
      let j = i + 1;
      while (j < n) {
        const d = text.charCodeAt(j);
        if (d === 43 || d === 45) {
          const before = text.charCodeAt(j - 1);
          if (before === 101 || before === 69 || before === 112 || before === 80) { j++; continue; }
          break;
        }
        if (d === 46 || (d < 128 && (CLASS[d] & IDENT_PART) !== 0)) { j++; continue; }
        break;
      }
      const spelled = text.slice(i, j);
      tokens.push(uri === undefined ? { kind: 'number', text: spelled, start: i, end: j } : { kind: 'number', text: spelled, start: i, end: j, uri } as SourceToken);
      i = j;
      continue;
    }
    if (c === 39 || c === 34) { i = quoted(text, i, c, tokens, i, uri); continue; }
    const p = punctuatorAt(text, i, c);
    if (p) {
      tokens.push(uri === undefined ? { kind: 'punct', text: p, start: i, end: i + p.length } : { kind: 'punct', text: p, start: i, end: i + p.length, uri } as SourceToken);
      i += p.length;
      continue;
    }
    tokens.push(faulty('other', text[i], i, i + 1, `unexpected character '${text[i]}'`, uri));
    i++;
  }
  return tokens;
}

/** Reads a character or string literal whose quote (code `quote`) is at `q`; the token starts at `start` (a prefix may precede). */
function quoted(text: string, q: number, quote: number, tokens: Token[], start: number, uri: string | undefined): number {
  let j = q + 1;
  while (j < text.length) {
    const d = text.charCodeAt(j);
    if (d === quote || d === 10) break;
    if (d === 92) j += spliceLength(text, j) || 2;
    else j++;
  }
  const kind = quote === 39 ? 'char' : 'string';
  if (text.charCodeAt(j) === quote) {
    const spelled = text.slice(start, j + 1);
    tokens.push(uri === undefined ? { kind, text: spelled, start, end: j + 1 } : { kind, text: spelled, start, end: j + 1, uri } as SourceToken);
    return j + 1;
  }
  const end = Math.min(j, text.length);
  tokens.push(faulty(kind, text.slice(start, end), start, end, `unterminated ${kind === 'char' ? 'character' : 'string'} literal`, uri));
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
  // Tagged as each token is made: a copy per token doubled the garbage of a large file, a later tag changed its shape.
  lexRange(text, from, to, out as Token[], uri);
  return out;
}

/** A copy of `t` produced by the macros in `hide`; spelled out, as an object spread per token is slow in V8. */
export function withHide(t: SourceToken, hide: ReadonlySet<string>): SourceToken {
  const copy: SourceToken = { kind: t.kind, text: t.text, start: t.start, end: t.end, uri: t.uri, hide };
  if (t.error !== undefined) copy.error = t.error;
  return copy;
}

// One C token of a line free of comments, literals and splices, as lexRange reads it: an identifier, a preprocessing
// number (C11 6.4.8) or a punctuator, longest first (the order of PUNCTUATORS). Native, where lexRange walks
// each character in JavaScript: a firmware's macro bodies are read while the code is still cold.
const PLAIN_TOKEN = /[A-Za-z_$][\w$]*|\.?[0-9](?:[eEpP][+-]|[\w$.])*|\.\.\.|<<=|>>=|->|\+\+|--|<<|>>|<=|>=|==|!=|&&|\|\||[*/%+\-&^|]=|##|[[\](){}.&*+\-~!/%<>^|?:;=,#]/y;

/**
 * The tokens of text[from, to), which holds no comment, character or string literal, backslash or newline, as
 * tokenizeSourceRange gives them; undefined when the range holds anything else (a character C has no token for),
 * which tokenizeSourceRange then reads.
 */
export function tokenizePlainRange(text: string, from: number, to: number, uri: string): SourceToken[] | undefined {
  // Most bodies are one token: its array is made to measure (a first push would reserve room for 17).
  let first: SourceToken | undefined;
  let out: SourceToken[] | undefined;
  for (let i = from; ;) {
    while (i < to && (CLASS[text.charCodeAt(i)] & SPACE) !== 0) i++;
    if (i >= to) return out ?? (first ? [first] : []);
    PLAIN_TOKEN.lastIndex = i;
    if (!PLAIN_TOKEN.test(text)) return undefined;
    const end = PLAIN_TOKEN.lastIndex;
    if (end > to) return undefined;
    const c = text.charCodeAt(i);
    const kind: TokenKind = (CLASS[c] & IDENT_START) !== 0 ? 'ident' : isDigitCode(c) || (c === 46 && end - i > 1 && isDigitCode(text.charCodeAt(i + 1))) ? 'number' : 'punct';
    const token: SourceToken = { kind, text: text.slice(i, end), start: i, end, uri };
    if (out) out.push(token);
    else if (first) out = [first, token];
    else first = token;
    i = end;
  }
}
