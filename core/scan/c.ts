// Timing blocks in C/C++ comments: a comment line starting `@timing`, then the comment lines of
// `key: value` right after it (a run of `//` lines, or the lines of one `/* */`), up to the first other line.
import type { RawBlock, Span } from '../types';
import { Code } from '../codes';
import { lineEndAt, nextLineAt, skipBlanks, trimEnd } from './lines';
import { EntryCollector, readEntryLine } from './entry';
import { ignoredHeaderText, readHeaderName, startsWithWord, type HeaderName } from './header';
import { findComments, type CComment } from './c-comments';

class BlockBuilder {
  readonly collector = new EntryCollector();
  lastEnd: number;
  /** End of the last `//` comment the block took a line from. */
  lastCommentEnd = -1;

  constructor(
    readonly headerSpan: Span,
    readonly name: HeaderName,
    text: string,
  ) {
    this.lastEnd = headerSpan.end;
    const ignored = ignoredHeaderText(text, name);
    if (ignored) this.collector.findings.push(ignored);
  }

  /** Takes the comment text text[from, to) as the next line; false when the line ends the block. */
  take(text: string, from: number, to: number): boolean {
    const reading = readEntryLine(text, from, to);
    if (reading.kind !== 'entry') return false;
    this.collector.add(reading.entry);
    this.lastEnd = reading.entry.valueSpan.end;
    return true;
  }

  build(): RawBlock {
    const span = { start: this.headerSpan.start, end: this.lastEnd };
    const { entries, findings } = this.collector;
    // Two literals rather than a spread of the optional name: one block per header in the file.
    const { name, nameSpan } = this.name;
    if (name === undefined) return { host: 'c', headerSpan: this.headerSpan, span, entries, findings };
    return { host: 'c', name, nameSpan, headerSpan: this.headerSpan, span, entries, findings };
  }
}

/** A header `@timing [name]` in text[from, to), or undefined. */
function header(text: string, from: number, to: number): BlockBuilder | undefined {
  const at = skipBlanks(text, from, to);
  if (text.charCodeAt(at) !== 64 || !startsWithWord(text, at, to, '@timing')) return undefined;
  const end = trimEnd(text, at, to);
  return new BlockBuilder({ start: at, end }, readHeaderName(text, at + '@timing'.length, end), text);
}

/** Skips the extra `/` or `!` of `///` and `//!` doc comments, or `*`/`!` of `/**` and `/*!`. */
function skipMarks(text: string, from: number, to: number, mark: number): number {
  while (from < to && (text.charCodeAt(from) === mark || text.charCodeAt(from) === 33)) from++;
  return from;
}

function skipStars(text: string, from: number, to: number): number {
  while (from < to && text.charCodeAt(from) === 42) from++;
  return from;
}

/** Whether `start` is the first non-blank of the line right after the one ending at `prevEnd`. */
function onNextLineAlone(text: string, prevEnd: number, start: number, carriageReturns: boolean): boolean {
  const following = nextLineAt(text, lineEndAt(text, prevEnd, carriageReturns));
  return following <= start && skipBlanks(text, following, start) === start;
}

function scanBlockComment(text: string, comment: CComment, out: RawBlock[], carriageReturns: boolean): void {
  const found: RawBlock[] = [];
  let open: BlockBuilder | undefined;
  let pos = comment.start + 2;
  let first = true;
  while (pos <= comment.closeAt) {
    const lineEnd = lineEndAt(text, pos, carriageReturns);
    const to = Math.min(lineEnd, comment.closeAt);
    // The first line follows `/*` (`/**`, `/*!` too); later lines may lead with `*`.
    const from = first ? skipMarks(text, pos, to, 42) : skipStars(text, skipBlanks(text, pos, to), to);
    first = false;
    const opened = header(text, from, to);
    if (opened) {
      if (open) found.push(open.build());
      open = opened;
    } else if (open && !open.take(text, from, to)) {
      found.push(open.build());
      open = undefined;
    }
    const next = nextLineAt(text, lineEnd);
    if (next <= pos || lineEnd >= comment.closeAt) break;
    pos = next;
  }
  if (open) found.push(open.build());
  if (!comment.terminated) {
    for (const block of found) {
      block.findings.unshift({
        severity: 'error',
        code: Code.blockUnterminated,
        message: 'This `/*` comment is never closed with `*/`; the block ends at the end of the file.',
        span: { start: comment.start, end: comment.start + 2 },
      });
    }
  }
  out.push(...found);
}

export function scanC(text: string): RawBlock[] {
  const blocks: RawBlock[] = [];
  const carriageReturns = text.indexOf('\r') >= 0;
  let run: BlockBuilder | undefined;
  for (const comment of findComments(text)) {
    if (comment.kind === 'block') {
      if (run) blocks.push(run.build());
      run = undefined;
      scanBlockComment(text, comment, blocks, carriageReturns);
      continue;
    }
    const from = skipMarks(text, comment.start + 2, comment.end, 47);
    const to = lineEndAt(text, comment.start, carriageReturns);
    if (run && !onNextLineAlone(text, run.lastCommentEnd, comment.start, carriageReturns)) {
      blocks.push(run.build());
      run = undefined;
    }
    const opened = header(text, from, to);
    if (opened) {
      if (run) blocks.push(run.build());
      run = opened;
    } else if (run && !run.take(text, from, to)) {
      blocks.push(run.build());
      run = undefined;
    }
    if (run) run.lastCommentEnd = comment.end;
  }
  if (run) blocks.push(run.build());
  return blocks;
}
