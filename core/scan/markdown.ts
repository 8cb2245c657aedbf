// Timing blocks in Markdown: fenced code blocks whose info string's first word is `timing`, wherever
// CommonMark 0.31.2 sees a fence: at the top level, in block quotes and in list items at any depth; never in
// indented code or an HTML block. The block structure is walked in ./commonmark; a key line inside a quote or
// an item has its container markers stripped, and every span still indexes the original text.
import type { RawBlock, Span } from '../types';
import { Code } from '../codes';
import { trimEnd } from './lines';
import { EntryCollector, readEntryLine } from './entry';
import { ignoredHeaderText, readHeaderName, startsWithWord } from './header';
import { walkFences, type FenceVisitor } from './commonmark';

function isCommentLine(text: string, start: number, end: number): boolean {
  let i = start;
  while (i < end && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
  return text.charCodeAt(i) === 35 && i < end;
}

class TimingBlocks implements FenceVisitor {
  readonly blocks: RawBlock[] = [];
  private collector = new EntryCollector();
  private headerSpan: Span = { start: 0, end: 0 };
  private infoAt = 0;
  private lineEnd = 0;
  private lastEnd = 0;
  private fence = '';

  constructor(private readonly text: string) {}

  open(at: number, lineEnd: number, infoAt: number, char: number, length: number): boolean {
    if (!startsWithWord(this.text, infoAt, lineEnd, 'timing')) return false;
    this.collector = new EntryCollector();
    this.headerSpan = { start: at, end: trimEnd(this.text, at, lineEnd) };
    this.infoAt = infoAt;
    this.lineEnd = lineEnd;
    this.lastEnd = this.headerSpan.end;
    this.fence = String.fromCharCode(char).repeat(length);
    return true;
  }

  line(from: number, to: number): void {
    const text = this.text;
    const end = trimEnd(text, from, to);
    if (end > from) this.lastEnd = end;
    if (isCommentLine(text, from, to)) return;
    const reading = readEntryLine(text, from, to);
    if (reading.kind === 'entry') this.collector.add(reading.entry);
    else if (reading.kind === 'malformed') this.collector.malformed(reading.span, reading.message);
  }

  close(closing: { start: number; end: number } | undefined, _next: number, atEnd: boolean): void {
    const text = this.text;
    // close() is called for every fence; only the timing fence opened last is collecting.
    if (this.fence === '') return;
    const headerSpan = this.headerSpan;
    const findings = this.collector.findings;
    const header = readHeaderName(text, this.infoAt + 'timing'.length, this.lineEnd);
    const { name, nameSpan } = header;
    const ignored = ignoredHeaderText(text, header);
    if (ignored) findings.unshift(ignored);
    if (closing) {
      this.lastEnd = trimEnd(text, closing.start, closing.end);
    } else {
      findings.unshift({
        severity: 'warning',
        code: Code.blockUnterminated,
        message: atEnd
          ? `This timing block has no closing ${this.fence} fence; it runs to the end of the file.`
          : `This timing block has no closing ${this.fence} fence; it ends where its block quote or list item ends.`,
        span: headerSpan,
      });
    }
    const span = { start: headerSpan.start, end: Math.max(this.lastEnd, headerSpan.end) };
    const entries = this.collector.entries;
    if (name === undefined) this.blocks.push({ host: 'markdown', headerSpan, span, entries, findings });
    else this.blocks.push({ host: 'markdown', name, nameSpan, headerSpan, span, entries, findings });
    this.fence = '';
  }
}

export function scanMarkdown(text: string): RawBlock[] {
  // No block without the word: most notes are skipped in one native search.
  if (text.indexOf('timing') < 0) return [];
  const visitor = new TimingBlocks(text);
  walkFences(text, visitor);
  return visitor.blocks;
}
