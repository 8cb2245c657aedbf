// Timing blocks in Markdown: fenced code blocks whose info string's first word is `timing`.
// Fence rules follow CommonMark 0.31.2 §4.5 (fenced code blocks); other fences are tracked so a
// `timing` fence shown inside a longer ```` fence is an example, not a block.
import type { RawBlock } from '../types';
import { Code } from '../codes';
import { lineAt, trimEnd } from './lines';
import { EntryCollector, readEntryLine } from './entry';
import { ignoredHeaderText, readHeaderName, startsWithWord } from './header';

interface Fence {
  char: number;
  length: number;
  /** Offset of the first fence character. */
  at: number;
}

const BACKTICK = 96;
const TILDE = 126;

function countSpaces(text: string, from: number, to: number): number {
  let i = from;
  while (i < to && text.charCodeAt(i) === 32) i++;
  return i - from;
}

function runLength(text: string, from: number, to: number, ch: number): number {
  let i = from;
  while (i < to && text.charCodeAt(i) === ch) i++;
  return i - from;
}

/** §4.5: up to three spaces of indentation, 3+ backticks or tildes; a backtick fence's info has no backtick. */
function openingFence(text: string, start: number, end: number): Fence | undefined {
  const indent = countSpaces(text, start, end);
  if (indent > 3) return undefined;
  const at = start + indent;
  const ch = text.charCodeAt(at);
  if (ch !== BACKTICK && ch !== TILDE) return undefined;
  const length = runLength(text, at, end, ch);
  if (length < 3) return undefined;
  if (ch === BACKTICK) {
    for (let i = at + length; i < end; i++) if (text.charCodeAt(i) === BACKTICK) return undefined;
  }
  return { char: ch, length, at };
}

/** §4.5: same character, at least as long, up to three spaces before, only spaces or tabs after. */
function closesFence(text: string, start: number, end: number, fence: Fence): boolean {
  const indent = countSpaces(text, start, end);
  if (indent > 3) return false;
  const at = start + indent;
  const length = runLength(text, at, end, fence.char);
  if (length < fence.length) return false;
  for (let i = at + length; i < end; i++) {
    const ch = text.charCodeAt(i);
    if (ch !== 32 && ch !== 9) return false;
  }
  return true;
}

function isCommentLine(text: string, start: number, end: number): boolean {
  let i = start;
  while (i < end && (text.charCodeAt(i) === 32 || text.charCodeAt(i) === 9)) i++;
  return text.charCodeAt(i) === 35 && i < end;
}

export function scanMarkdown(text: string): RawBlock[] {
  const blocks: RawBlock[] = [];
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  while (pos < text.length) {
    const line = lineAt(text, pos);
    pos = line.next;
    const fence = openingFence(text, line.start, line.end);
    if (!fence) continue;
    let infoAt = fence.at + fence.length;
    while (infoAt < line.end && (text.charCodeAt(infoAt) === 32 || text.charCodeAt(infoAt) === 9)) infoAt++;
    const isTiming = startsWithWord(text, infoAt, line.end, 'timing');
    const headerSpan = { start: fence.at, end: trimEnd(text, fence.at, line.end) };
    const collector = new EntryCollector();
    let closed = false;
    let lastEnd = headerSpan.end;
    while (pos < text.length) {
      const inner = lineAt(text, pos);
      pos = inner.next;
      if (closesFence(text, inner.start, inner.end, fence)) {
        closed = true;
        lastEnd = trimEnd(text, inner.start, inner.end);
        break;
      }
      if (!isTiming) continue;
      if (inner.end > inner.start) lastEnd = trimEnd(text, inner.start, inner.end);
      if (isCommentLine(text, inner.start, inner.end)) continue;
      const reading = readEntryLine(text, inner.start, inner.end);
      if (reading.kind === 'entry') collector.add(reading.entry);
      else if (reading.kind === 'malformed') collector.malformed(reading.span, reading.message);
    }
    if (!isTiming) continue;
    const findings = collector.findings;
    const header = readHeaderName(text, infoAt + 'timing'.length, line.end);
    const { name, nameSpan } = header;
    const ignored = ignoredHeaderText(text, header);
    if (ignored) findings.unshift(ignored);
    if (!closed) {
      findings.unshift({
        severity: 'warning',
        code: Code.blockUnterminated,
        message: `This timing block has no closing ${String.fromCharCode(fence.char).repeat(fence.length)} fence; it runs to the end of the file.`,
        span: headerSpan,
      });
    }
    const span = { start: fence.at, end: Math.max(lastEnd, headerSpan.end) };
    const entries = collector.entries;
    if (name === undefined) blocks.push({ host: 'markdown', headerSpan, span, entries, findings });
    else blocks.push({ host: 'markdown', name, nameSpan, headerSpan, span, entries, findings });
  }
  return blocks;
}
