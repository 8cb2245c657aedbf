// Timing blocks in C/C++ comments: a comment line starting `@timing`, then the comment lines of
// `key: value` right after it (a run of `//` lines, or the lines of one `/* */`), up to the first other line.
import type { BlockEntry, Finding, RawBlock, Span } from '../types';
import { keptList } from '../empty';
import { Code } from '../codes';
import { BLANK_CLASS, lineEndAt, nextLineAt, skipBlanks, trimEnd } from './lines';
import { COLON_PATTERN, EntryCollector, KEY_PATTERN, readEntryLine, scannedEntry } from './entry';
import { ignoredHeaderText, readHeaderName, startsWithWord, type HeaderName } from './header';
import { CommentCursor, type CComment } from './c-comments';

/** A comment line's lead (blanks, stars, blanks), its key, and the colon with blanks around it (blanks as lines.ts). */
const COMMENT_LEAD = new RegExp(`${BLANK_CLASS}*\\**${BLANK_CLASS}*`, 'y');
const COMMENT_KEY = new RegExp(KEY_PATTERN, 'y');
const COMMENT_COLON = new RegExp(COLON_PATTERN, 'y');

/** Blanks then stars, the last of them the star of the star-slash, when a closing line holds nothing else. */
const CLOSING_LINE = new RegExp(`${BLANK_CLASS}*\\**`, 'y');

// Fields are declared and set in the constructor, not initialised in the class body: one block per header, and a
// class-body initialiser is a function call of its own on each.
class BlockBuilder {
  declare readonly collector: EntryCollector;
  declare readonly headerSpan: Span;
  declare readonly name: HeaderName;
  declare lastEnd: number;
  /** End of the last `//` comment the block took a line from. */
  declare lastCommentEnd: number;
  /** Whether the block ended at a blank comment line (so `key: value` lines just after it were left out). */
  declare endedAtBlank: boolean;

  constructor(headerSpan: Span, name: HeaderName, text: string) {
    this.collector = new EntryCollector();
    this.headerSpan = headerSpan;
    this.name = name;
    this.lastEnd = headerSpan.end;
    this.lastCommentEnd = -1;
    this.endedAtBlank = false;
    const ignored = ignoredHeaderText(text, name);
    if (ignored) this.collector.findings.push(ignored);
  }

  /** Takes the comment text text[from, to) as the next line; false when the line ends the block. */
  take(text: string, from: number, to: number): boolean {
    const reading = readEntryLine(text, from, to);
    this.endedAtBlank = reading.kind === 'blank';
    if (reading.kind !== 'entry') return false;
    this.collector.add(reading.entry);
    this.lastEnd = reading.entry.valueEnd;
    return true;
  }

  /**
   * Takes the block comment line starting at `pos` when it is `key: value` whole and the comment goes on after it,
   * in a text without `\r`: one native regex reads the lead (blanks, stars, blanks), the key and the colon, as
   * skipBlanks, skipStars and readEntryLine would. Returns where the next line starts, or -1 for the general way.
   */
  takeCommentLine(text: string, pos: number, closeAt: number): number {
    // Three sticky tests rather than one match with groups: no match array or group strings per line.
    COMMENT_LEAD.lastIndex = pos;
    COMMENT_LEAD.test(text);
    const keyStart = COMMENT_LEAD.lastIndex;
    COMMENT_KEY.lastIndex = keyStart;
    if (!COMMENT_KEY.test(text)) return -1;
    const keyEnd = COMMENT_KEY.lastIndex;
    COMMENT_COLON.lastIndex = keyEnd;
    if (!COMMENT_COLON.test(text)) return -1;
    const valueStart = COMMENT_COLON.lastIndex;
    const lineEnd = text.indexOf('\n', valueStart);
    if (lineEnd < 0 || lineEnd >= closeAt) return -1;
    const end = trimEnd(text, valueStart, lineEnd);
    if (end === valueStart) return -1;
    this.endedAtBlank = false;
    this.collector.add(scannedEntry(text, keyStart, keyEnd, valueStart, end));
    this.lastEnd = end;
    return lineEnd + 1;
  }

  build(): RawBlock {
    const { entries, findings } = this.collector;
    const { name, nameSpan } = this.name;
    return new ScannedBlock(name, nameSpan ? nameSpan.start : -1, this.headerSpan.start, this.headerSpan.end, this.lastEnd, keptList(entries), findings);
  }
}

/**
 * A block of a C file as its places' offsets: the spans are made when read. The blocks of a file live as long as its
 * analysis, and each object kept that long is copied through V8's young generation on a cold start (see ScannedEntry).
 */
class ScannedBlock implements RawBlock {
  // Assigned in the constructor alone (declared, not defined): one block per header in the file.
  declare readonly name: string | undefined;
  declare readonly entries: BlockEntry[];
  declare readonly findings: Finding[];
  /** Where the name starts (-1 without a name; it ends after the name's text), the header line, the block's end. */
  declare private readonly nameStart: number;
  declare private readonly headerStart: number;
  declare private readonly headerEnd: number;
  declare private readonly end: number;

  constructor(name: string | undefined, nameStart: number, headerStart: number, headerEnd: number, end: number, entries: BlockEntry[], findings: Finding[]) {
    this.name = name;
    this.entries = entries;
    this.findings = findings;
    this.nameStart = nameStart;
    this.headerStart = headerStart;
    this.headerEnd = headerEnd;
    this.end = end;
  }

  get host(): 'c' {
    return 'c';
  }

  get nameSpan(): Span | undefined {
    return this.name === undefined ? undefined : { start: this.nameStart, end: this.nameStart + this.name.length };
  }

  get headerSpan(): Span {
    return { start: this.headerStart, end: this.headerEnd };
  }

  get span(): Span {
    return { start: this.headerStart, end: this.end };
  }

  /** The plain shape, spans included, wherever a block is sent as JSON (the language server's `tickmark/block`). */
  toJSON(): RawBlock {
    const { name, entries, findings } = this;
    if (name === undefined) return { host: 'c', headerSpan: this.headerSpan, span: this.span, entries, findings };
    return { host: 'c', name, nameSpan: this.nameSpan, headerSpan: this.headerSpan, span: this.span, entries, findings };
  }
}

/**
 * Where the next `@timing` stands, found by the native search and asked with offsets that only grow: a line without
 * one cannot hold a header, so most lines never reach `header`.
 */
class TimingCursor {
  private at: number;

  /** `general`: say yes to every range and take no quick step, so every line is read in full (tests compare with it). */
  constructor(private readonly text: string, readonly general = false) {
    this.at = text.indexOf('@timing');
  }

  /** Whether text[from, to) holds an `@timing`; `from` never decreases between calls. */
  within(from: number, to: number): boolean {
    if (this.general) return true;
    if (this.at >= 0 && this.at < from) this.at = this.text.indexOf('@timing', from);
    return this.at >= 0 && this.at < to;
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

/**
 * After a block ended at a blank comment line, the next comment line may still read as `key: value`: the user
 * most likely meant it to belong. Said once, on that line, so a claim never drops out of a block silently.
 */
class LeftOutWatch {
  private ended: RawBlock | undefined;

  /** Whether a block ended at a blank line is waiting to see the next line. */
  get waiting(): boolean {
    return this.ended !== undefined;
  }

  blockEnded(block: RawBlock, builder: BlockBuilder): void {
    this.ended = builder.endedAtBlank ? block : undefined;
  }

  /** Looks at a comment line outside any block; forgets the ended block at the first line that is not blank. */
  line(text: string, from: number, to: number): void {
    if (!this.ended) return;
    const reading = readEntryLine(text, from, to);
    if (reading.kind === 'blank') return;
    if (reading.kind === 'entry') {
      this.ended.findings.push({
        severity: 'warning',
        code: Code.blockLineMalformed,
        message: `\`${reading.entry.key}:\` is not part of the block above: a blank comment line ended it. Remove the blank line to keep it in the block.`,
        span: { start: reading.entry.keySpan.start, end: reading.entry.valueSpan.end },
      });
    }
    this.ended = undefined;
  }

  reset(): void {
    this.ended = undefined;
  }
}

function scanBlockComment(text: string, comment: CComment, out: RawBlock[], carriageReturns: boolean, timing: TimingCursor): void {
  // The comment's blocks go straight to `out`; those from `firstFound` on are this comment's.
  const firstFound = out.length;
  let open: BlockBuilder | undefined;
  let pos = comment.start + 2;
  let first = true;
  // Made when a block in this comment ends at a blank line: only then can a later line be left out.
  let watch: LeftOutWatch | undefined;
  while (pos <= comment.closeAt) {
    if (open && !first && !carriageReturns && !timing.general) {
      const next = open.takeCommentLine(text, pos, comment.closeAt);
      if (next >= 0) {
        pos = next;
        continue;
      }
      // The closing line, nothing but blanks and stars before the star-slash: a blank line that ends the block
      // and the comment (a watch for left-out lines has nothing after it to see).
      CLOSING_LINE.lastIndex = pos;
      if (CLOSING_LINE.test(text) && CLOSING_LINE.lastIndex === comment.closeAt + 1) {
        out.push(open.build());
        open = undefined;
        break;
      }
    }
    const lineEnd = lineEndAt(text, pos, carriageReturns);
    const to = Math.min(lineEnd, comment.closeAt);
    // The first line follows `/*` (`/**`, `/*!` too); later lines may lead with `*`.
    const from = first ? skipMarks(text, pos, to, 42) : skipStars(text, skipBlanks(text, pos, to), to);
    first = false;
    const opened = timing.within(from, to) ? header(text, from, to) : undefined;
    if (opened) {
      if (open) out.push(open.build());
      open = opened;
      watch?.reset();
    } else if (open && !open.take(text, from, to)) {
      const block = open.build();
      out.push(block);
      if (open.endedAtBlank) (watch ??= new LeftOutWatch()).blockEnded(block, open);
      else watch?.reset();
      open = undefined;
    } else if (!open) watch?.line(text, from, to);
    const next = nextLineAt(text, lineEnd);
    if (next <= pos || lineEnd >= comment.closeAt) break;
    pos = next;
  }
  if (open) out.push(open.build());
  if (!comment.terminated) {
    for (let i = firstFound; i < out.length; i++) {
      out[i].findings.unshift({
        severity: 'error',
        code: Code.blockUnterminated,
        message: 'This `/*` comment is never closed with `*/`; the block ends at the end of the file.',
        span: { start: comment.start, end: comment.start + 2 },
      });
    }
  }
}

export function scanC(text: string): RawBlock[] {
  return scan(text, new TimingCursor(text));
}

/** scanC reading every comment line in full, without skipping those the `@timing` search rules out. */
export function scanCGeneral(text: string): RawBlock[] {
  return scan(text, new TimingCursor(text, true));
}

function scan(text: string, timing: TimingCursor): RawBlock[] {
  const blocks: RawBlock[] = [];
  const carriageReturns = text.indexOf('\r') >= 0;
  let run: BlockBuilder | undefined;
  const watch = new LeftOutWatch();
  let lastLineComment = -1;
  // One cursor over the comments, read in place: no record per comment of the file.
  const comment = new CommentCursor(text);
  while (comment.next()) {
    if (comment.kind === 'block') {
      if (run) blocks.push(run.build());
      run = undefined;
      watch.reset();
      // Without `@timing` inside, a block comment opens no block, and nothing before it is left waiting.
      if (timing.within(comment.start, comment.end)) scanBlockComment(text, comment, blocks, carriageReturns, timing);
      continue;
    }
    const from = skipMarks(text, comment.start + 2, comment.end, 47);
    const to = lineEndAt(text, comment.start, carriageReturns);
    // A line that cannot open a block, with no block open and none waiting, changes nothing but where the run is.
    if (!run && !watch.waiting && !timing.within(from, to)) {
      lastLineComment = comment.end;
      continue;
    }
    if (run && !onNextLineAlone(text, run.lastCommentEnd, comment.start, carriageReturns)) {
      blocks.push(run.build());
      run = undefined;
    }
    // The watch only follows a run of `//` lines, each alone on the line after the previous one.
    if (!run && lastLineComment >= 0 && !onNextLineAlone(text, lastLineComment, comment.start, carriageReturns)) watch.reset();
    const opened = timing.within(from, to) ? header(text, from, to) : undefined;
    if (opened) {
      if (run) blocks.push(run.build());
      run = opened;
      watch.reset();
    } else if (run && !run.take(text, from, to)) {
      const block = run.build();
      blocks.push(block);
      watch.blockEnded(block, run);
      run = undefined;
    } else if (!run) watch.line(text, from, to);
    if (run) run.lastCommentEnd = comment.end;
    lastLineComment = comment.end;
  }
  if (run) blocks.push(run.build());
  return blocks;
}
