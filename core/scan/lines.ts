// Line bookkeeping shared by the scanners and by anything that turns offsets into line/column.
// A line ends at "\r\n", "\n" or a lone "\r", as CommonMark 0.31.2 §2.1 and VS Code both count them.

/** Offsets at which each line starts; always begins with 0. */
export function lineStarts(text: string): number[] {
  const starts = [0];
  // Most files have no carriage return at all: then the native search finds each line feed.
  if (text.indexOf('\r') < 0) {
    for (let i = text.indexOf('\n'); i >= 0; i = text.indexOf('\n', i + 1)) starts.push(i + 1);
    return starts;
  }
  for (let i = 0; i < text.length; i++) {
    const ch = text.charCodeAt(i);
    if (ch === 10) {
      starts.push(i + 1);
    } else if (ch === 13) {
      if (text.charCodeAt(i + 1) === 10) i++;
      starts.push(i + 1);
    }
  }
  return starts;
}

/** 0-based line holding `offset` (binary search over `lineStarts`). */
export function lineOf(starts: number[], offset: number): number {
  let low = 0;
  let high = starts.length - 1;
  while (low < high) {
    const mid = (low + high + 1) >> 1;
    if (starts[mid] <= offset) low = mid;
    else high = mid - 1;
  }
  return low;
}

/**
 * 0-based lines of offsets asked in increasing order, counted forward from the last one asked: a document's
 * block headers need their lines without a table of every line. An earlier offset counts again from the start.
 */
export class LineCounter {
  private offset = 0;
  private line = 0;
  private readonly carriageReturns: boolean;

  constructor(private readonly text: string) {
    this.carriageReturns = text.indexOf('\r') >= 0;
  }

  lineOf(offset: number): number {
    if (offset < this.offset) {
      this.offset = 0;
      this.line = 0;
    }
    const text = this.text;
    const to = Math.min(offset, text.length);
    let line = this.line;
    // A line starts after each \n before the offset, and after each \r not followed by \n.
    for (let i = text.indexOf('\n', this.offset); i >= 0 && i < to; i = text.indexOf('\n', i + 1)) line++;
    if (this.carriageReturns) {
      for (let i = text.indexOf('\r', this.offset); i >= 0 && i < to; i = text.indexOf('\r', i + 1)) {
        if (text.charCodeAt(i + 1) !== 10) line++;
      }
    }
    this.offset = to;
    this.line = line;
    return line;
  }
}

/** One physical line: `start` to `end` excludes the line break; `next` is where the following line starts. */
export interface LineRange {
  start: number;
  end: number;
  next: number;
}

/** The line starting at `start`; `next` equals text.length past the last line. */
export function lineAt(text: string, start: number): LineRange {
  let i = start;
  while (i < text.length) {
    const ch = text.charCodeAt(i);
    if (ch === 10) return { start, end: i, next: i + 1 };
    if (ch === 13) return { start, end: i, next: text.charCodeAt(i + 1) === 10 ? i + 2 : i + 1 };
    i++;
  }
  return { start, end: i, next: i };
}

/**
 * End of the line holding `start` (the offset of its line break, or text.length). `carriageReturns` says whether
 * the text holds any `\r`: without one the native search for `\n` finds the end.
 */
export function lineEndAt(text: string, start: number, carriageReturns: boolean): number {
  if (!carriageReturns) {
    const lineFeed = text.indexOf('\n', start);
    return lineFeed < 0 ? text.length : lineFeed;
  }
  let i = start;
  while (i < text.length) {
    const ch = text.charCodeAt(i);
    if (ch === 10 || ch === 13) return i;
    i++;
  }
  return i;
}

/** Where the line after the one ending at `end` (from lineEndAt) starts. */
export function nextLineAt(text: string, end: number): number {
  if (end >= text.length) return text.length;
  return text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? end + 2 : end + 1;
}

/** isBlank's characters as a regular-expression class, for the scanners' quick paths. */
export const BLANK_CLASS = '[ \\t\\f\\v\\u00a0\\ufeff]';

/** Blank for trimming: space, tab, form feed, vertical tab, no-break space, BOM. */
export function isBlank(ch: number): boolean {
  return ch === 32 || ch === 9 || ch === 12 || ch === 11 || ch === 0xa0 || ch === 0xfeff;
}

export function skipBlanks(text: string, from: number, to: number): number {
  while (from < to && isBlank(text.charCodeAt(from))) from++;
  return from;
}

export function trimEnd(text: string, from: number, to: number): number {
  while (to > from && isBlank(text.charCodeAt(to - 1))) to--;
  return to;
}
