// One `key: value` line of a block, read from a slice of the text so every span stays exact.
import type { BlockEntry, Finding, Span } from '../types';
import { Code } from '../codes';
import { skipBlanks, trimEnd } from './lines';

export type LineReading =
  | { kind: 'blank' }
  | { kind: 'entry'; entry: BlockEntry }
  | { kind: 'malformed'; span: Span; message: string };

/** Keys are the trade's short names: a letter, then letters, digits, `+ - _ .` (`vt+`, `data-model`). */
function isKeyChar(ch: number, first: boolean): boolean {
  const letter = (ch >= 65 && ch <= 90) || (ch >= 97 && ch <= 122);
  if (first) return letter;
  return letter || (ch >= 48 && ch <= 57) || ch === 43 || ch === 45 || ch === 95 || ch === 46;
}

/** Reads text[from, to) as `key: value`. */
export function readEntryLine(text: string, from: number, to: number): LineReading {
  const start = skipBlanks(text, from, to);
  const end = trimEnd(text, start, to);
  if (start === end) return { kind: 'blank' };
  // Searched within the line only: a line without `:` must not send the search on through the file.
  let colon = start;
  while (colon < end && text.charCodeAt(colon) !== 58) colon++;
  const span = { start, end };
  if (colon >= end) {
    return { kind: 'malformed', span, message: 'Expected `key: value`; this line has no `:`.' };
  }
  const keyEnd = trimEnd(text, start, colon);
  if (keyEnd === start) {
    return { kind: 'malformed', span, message: 'Expected `key: value`; the key before `:` is missing.' };
  }
  for (let i = start; i < keyEnd; i++) {
    if (!isKeyChar(text.charCodeAt(i), i === start)) {
      const key = text.slice(start, keyEnd);
      return {
        kind: 'malformed',
        span: { start, end: keyEnd },
        message: `\`${key}\` is not a key: keys start with a letter and hold letters, digits and \`+ - _ .\`.`,
      };
    }
  }
  const valueStart = skipBlanks(text, colon + 1, end);
  if (valueStart === end) {
    return {
      kind: 'malformed',
      span,
      message: `\`${text.slice(start, keyEnd)}\` has no value after \`:\`.`,
    };
  }
  return {
    kind: 'entry',
    entry: {
      key: text.slice(start, keyEnd).toLowerCase(),
      keySpan: { start, end: keyEnd },
      valueText: text.slice(valueStart, end),
      valueSpan: { start: valueStart, end },
    },
  };
}

/** Collects entries, keeping the first of a repeated key and flagging the later one. */
export class EntryCollector {
  readonly entries: BlockEntry[] = [];
  readonly findings: Finding[] = [];
  private readonly seen = new Map<string, BlockEntry>();

  add(entry: BlockEntry): void {
    const first = this.seen.get(entry.key);
    if (first) {
      this.findings.push({
        severity: 'warning',
        code: Code.blockKeyRepeated,
        message: `\`${entry.key}\` is given twice; the first value (\`${first.valueText}\`) is used.`,
        span: entry.keySpan,
      });
      return;
    }
    this.seen.set(entry.key, entry);
    this.entries.push(entry);
  }

  malformed(span: Span, message: string): void {
    this.findings.push({ severity: 'error', code: Code.blockLineMalformed, message, span });
  }
}
