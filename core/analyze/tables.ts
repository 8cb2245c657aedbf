// Constant tables kept across edits of one C document (the editor's and the language server's Analyzer). A table
// depends on the document's code and on the headers it read; comments do not count (C replaces each by one
// space before preprocessing, C11 5.1.1.2 phase 3). So an edit inside a comment — every edit of a timing block
// in a C file — keeps the table: its places in the document are moved to the new text, and each header is
// checked to read exactly as when the table was built. Anything else builds the table afresh.
import type { ConstantDefinition, ConstantResolution, ConstantTable } from '../c';
import { findComments } from '../scan/c-comments';
import { LineCounter } from '../scan/lines';
import type { Span } from '../types';

/** The document's text with each comment as one space, and where the comments stood. */
interface Stripped {
  code: string;
  /** Comment starts and ends in the text, in order. */
  comments: Array<{ start: number; end: number }>;
  text: string;
}

function strip(text: string): Stripped | undefined {
  const found = findComments(text);
  // An unterminated comment ends the file: the preprocessor reports it, and the table is built each time.
  if (found.some((c) => !c.terminated)) return undefined;
  const parts: string[] = [];
  let at = 0;
  for (const c of found) {
    parts.push(text.slice(at, c.start), ' ');
    at = c.end;
  }
  parts.push(text.slice(at));
  return { code: parts.join(''), comments: found.map((c) => ({ start: c.start, end: c.end })), text };
}

/** Offset in the text → offset in its stripped code (an offset inside a comment maps to the comment's space). */
function toCode(s: Stripped, offset: number): number {
  let removed = 0;
  for (const c of s.comments) {
    if (c.start >= offset) break;
    if (offset < c.end) return c.start - removed;
    removed += c.end - c.start - 1;
  }
  return offset - removed;
}

/** Offset in the stripped code → offset in the text. */
function fromCode(s: Stripped, code: number): number {
  let removed = 0;
  for (const c of s.comments) {
    const codeStart = c.start - removed;
    if (codeStart >= code) break;
    if (code === codeStart) return c.start;
    removed += c.end - c.start - 1;
  }
  return code + removed;
}

interface Kept {
  key: string;
  built: Stripped;
  table: ConstantTable;
  /** Every file the build read, with the text it got. */
  reads: Map<string, string | undefined>;
}

export class ConstantTableCache {
  private readonly kept = new Map<string, Kept>();
  /** Tables built and tables reused since the cache was made (bench and tests). */
  readonly counts = { built: 0, reused: 0 };

  /**
   * The table of `filePath` at `text`: the kept one moved to the new text when only comments changed and every
   * file it read reads the same, else `build(read)` with a reader that records what it read.
   */
  table(filePath: string, text: string, key: string, read: (file: string) => string | undefined, build: (read: (file: string) => string | undefined) => ConstantTable): ConstantTable {
    const slot = `${filePath}\u0000${key}`;
    const now = strip(text);
    const kept = this.kept.get(slot);
    if (now && kept && kept.key === key && kept.built.code === now.code && readsHold(kept.reads, filePath, read)) {
      this.counts.reused++;
      return moved(kept.table, filePath, kept.built, now);
    }
    const reads = new Map<string, string | undefined>();
    const table = build((file) => {
      const got = read(file);
      if (file !== filePath) reads.set(file, got);
      return got;
    });
    this.counts.built++;
    if (now) this.kept.set(slot, { key, built: now, table, reads });
    else this.kept.delete(slot);
    return table;
  }
}

function readsHold(reads: Map<string, string | undefined>, filePath: string, read: (file: string) => string | undefined): boolean {
  for (const [file, text] of reads) if (file !== filePath && read(file) !== text) return false;
  return true;
}

/** The kept table as seen from the new text: places in the document itself move with the code around them. */
function moved(table: ConstantTable, filePath: string, before: Stripped, after: Stripped): ConstantTable {
  if (before.text === after.text) return table;
  let lines: LineCounter | undefined;
  const span = (s: Span): Span => ({ start: fromCode(after, toCode(before, s.start)), end: fromCode(after, toCode(before, s.end)) });
  const definition = (d: ConstantDefinition | undefined): ConstantDefinition | undefined => {
    if (!d || d.uri !== filePath) return d;
    const nameSpan = span(d.nameSpan);
    return {
      name: d.name,
      uri: d.uri,
      line: (lines ??= new LineCounter(after.text)).lineOf(nameSpan.start) + 1,
      span: span(d.span),
      nameSpan,
      literal: d.literal ? { ...d.literal, span: span(d.literal.span) } : undefined,
    };
  };
  const resolution = (r: ConstantResolution): ConstantResolution => {
    // Named fields, not a spread: a resolved lookup makes its value when read (core/c/table.ts, Resolved).
    if (r.ok) return { ok: true, value: r.value, definition: definition(r.definition)! };
    const out = { ...r };
    if (r.definition) out.definition = definition(r.definition);
    if (r.at && r.at.uri === filePath) out.at = { ...r.at, span: span(r.at.span) };
    return out;
  };
  return {
    lookup: (name) => resolution(table.lookup(name)),
    evaluate: (expression) => table.evaluate(expression),
    dependencies: table.dependencies,
    findings: table.findings.map((f) => (f.uri === filePath ? { ...f, span: span(f.span) } : f)),
  };
}
