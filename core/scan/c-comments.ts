// Finds the comments of C/C++ source in one linear pass, stepping over string, character and raw string
// literals (ISO C17 §6.4.5, C++20 [lex.string]) so `"/*"` in code never opens a comment.

export interface CComment {
  kind: 'line' | 'block';
  /** Offset of the opening `/`. */
  start: number;
  /** Offset just past the comment: the line end for a line comment, past the closing star-slash of a block comment. */
  end: number;
  /** For block comments, offset of the closing star-slash (text.length when unterminated). */
  closeAt: number;
  terminated: boolean;
}

function isIdentStart(ch: number): boolean {
  return (ch >= 65 && ch <= 90) || (ch >= 97 && ch <= 122) || ch === 95 || ch === 36 || ch > 127;
}

function isIdentChar(ch: number): boolean {
  return isIdentStart(ch) || (ch >= 48 && ch <= 57);
}

function isDigit(ch: number): boolean {
  return ch >= 48 && ch <= 57;
}

function isLineBreak(ch: number): boolean {
  return ch === 10 || ch === 13;
}

/** Past a backslash and what it escapes; a backslash before CRLF splices the line (C17 §5.1.1.2). */
function skipEscape(text: string, i: number): number {
  if (text.charCodeAt(i + 1) === 13 && text.charCodeAt(i + 2) === 10) return i + 3;
  return i + 2;
}

/** End of a `//` comment: the line end, unless a backslash splices the next line on. */
function lineCommentEnd(text: string, from: number): number {
  let i = from;
  while (i < text.length) {
    const ch = text.charCodeAt(i);
    if (ch === 92 && isLineBreak(text.charCodeAt(i + 1))) {
      i = skipEscape(text, i);
      continue;
    }
    if (isLineBreak(ch)) return i;
    i++;
  }
  return i;
}

/** Past a quoted literal; an unescaped line break ends an unterminated one (compilers reject it too). */
function quotedEnd(text: string, from: number, quote: number): number {
  let i = from + 1;
  while (i < text.length) {
    const ch = text.charCodeAt(i);
    if (ch === 92) {
      i = skipEscape(text, i);
      continue;
    }
    if (ch === quote) return i + 1;
    if (isLineBreak(ch)) return i;
    i++;
  }
  return i;
}

/** Past a C++ raw string `R"delim( … )delim"` whose quote is at `quoteAt`, or -1 if not one. */
function rawStringEnd(text: string, quoteAt: number): number {
  let i = quoteAt + 1;
  // [lex.string]: the delimiter is at most 16 characters, none of space ( ) \ or control characters.
  while (i < text.length && i - quoteAt - 1 <= 16) {
    const ch = text.charCodeAt(i);
    if (ch === 40) {
      const closing = ')' + text.slice(quoteAt + 1, i) + '"';
      const found = text.indexOf(closing, i + 1);
      return found < 0 ? text.length : found + closing.length;
    }
    if (ch <= 32 || ch === 41 || ch === 92 || ch === 127) return -1;
    i++;
  }
  return -1;
}

const RAW_PREFIXES = new Set(['R', 'u8R', 'uR', 'UR', 'LR']);

/** Past a preprocessing number (C17 §6.4.8), including C++14 digit separators `1'000'000`. */
function numberEnd(text: string, from: number): number {
  let i = from + 1;
  while (i < text.length) {
    const ch = text.charCodeAt(i);
    const prev = text.charCodeAt(i - 1);
    if ((ch === 43 || ch === 45) && (prev === 101 || prev === 69 || prev === 112 || prev === 80)) i++;
    else if (ch === 39 && isIdentChar(text.charCodeAt(i + 1))) i += 2;
    else if (isIdentChar(ch) || ch === 46) i++;
    else break;
  }
  return i;
}

/** Characters a name or a preprocessing number may hold, walked back over to find where a token begins. */
function isTokenChar(ch: number): boolean {
  return isIdentChar(ch) || ch === 46 || ch === 43 || ch === 45 || ch === 39;
}

/**
 * Steps over names, numbers and punctuation from `from` (a token boundary) until reaching `to`; returns where it
 * stopped, past `to` when a number's digit separator or a raw string starting before `to` takes it in.
 */
function skipCode(text: string, from: number, to: number): number {
  let i = from;
  while (i < to) {
    const ch = text.charCodeAt(i);
    if (isIdentStart(ch)) {
      const start = i;
      while (i < text.length && isIdentChar(text.charCodeAt(i))) i++;
      if (text.charCodeAt(i) === 34 && RAW_PREFIXES.has(text.slice(start, i))) {
        const end = rawStringEnd(text, i);
        i = end < 0 ? quotedEnd(text, i, 34) : end;
      }
    } else if (isDigit(ch) || (ch === 46 && isDigit(text.charCodeAt(i + 1)))) {
      i = numberEnd(text, i);
    } else {
      i++;
    }
  }
  return i;
}

/**
 * The comments of a text one at a time, each read into the cursor's own fields: a scan that looks at each comment
 * once keeps no record per comment. Only `/`, `"` and `'` open a comment or a literal, so the native string search
 * jumps from one to the next. Names and numbers matter only next to a quote (`R"(`, `1'000`): from the last
 * character that cannot be part of a token before the quote, the same token rules are walked forward as a full
 * character scan would.
 */
export class CommentCursor implements CComment {
  declare kind: 'line' | 'block';
  declare start: number;
  declare end: number;
  declare closeAt: number;
  declare terminated: boolean;
  private declare readonly text: string;
  private declare i: number;
  private declare slash: number;
  private declare double: number;
  private declare single: number;

  constructor(text: string) {
    this.text = text;
    this.kind = 'line';
    this.start = 0;
    this.end = 0;
    this.closeAt = 0;
    this.terminated = true;
    this.i = 0;
    this.slash = text.indexOf('/');
    this.double = text.indexOf('"');
    this.single = text.indexOf("'");
  }

  /** Moves to the next comment; false when there is none. */
  next(): boolean {
    const text = this.text;
    let i = this.i;
    let slash = this.slash;
    let double = this.double;
    let single = this.single;
    let found = false;
    for (;;) {
      if (slash >= 0 && slash < i) slash = text.indexOf('/', i);
      if (double >= 0 && double < i) double = text.indexOf('"', i);
      if (single >= 0 && single < i) single = text.indexOf("'", i);
      let at = slash;
      if (double >= 0 && (at < 0 || double < at)) at = double;
      if (single >= 0 && (at < 0 || single < at)) at = single;
      if (at < 0) break;
      const ch = text.charCodeAt(at);
      if (ch !== 47) {
        let from = at;
        while (from > i && isTokenChar(text.charCodeAt(from - 1))) from--;
        const reached = skipCode(text, from, at);
        if (reached > at) {
          i = reached;
          continue;
        }
        i = quotedEnd(text, at, ch);
        continue;
      }
      const next = text.charCodeAt(at + 1);
      if (next === 47) {
        const end = lineCommentEnd(text, at + 2);
        this.kind = 'line';
        this.start = at;
        this.end = end;
        this.closeAt = end;
        this.terminated = true;
        i = end;
        found = true;
        break;
      } else if (next === 42) {
        const close = text.indexOf('*/', at + 2);
        this.kind = 'block';
        this.start = at;
        this.closeAt = close < 0 ? text.length : close;
        this.end = close < 0 ? text.length : close + 2;
        this.terminated = close >= 0;
        i = this.end;
        found = true;
        break;
      } else {
        i = at + 1;
      }
    }
    this.i = i;
    this.slash = slash;
    this.double = double;
    this.single = single;
    return found;
  }
}

/** Every comment of the text, in order (CommentCursor's comments as records). */
export function findComments(text: string): CComment[] {
  const comments: CComment[] = [];
  const cursor = new CommentCursor(text);
  while (cursor.next()) {
    comments.push({ kind: cursor.kind, start: cursor.start, end: cursor.end, closeAt: cursor.closeAt, terminated: cursor.terminated });
  }
  return comments;
}
