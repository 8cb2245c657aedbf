// Where a cursor stands inside a timing block, for completion: typing a key at the start of a line, or a
// value after `key:`. Works on the text alone, so a line still being typed (`mode:` with no value yet,
// which ends a C block for the scanner) still counts as the block's.
import type { RawBlock, Span, TextDocumentLike } from '../types';
import { hostOf, scanDocument } from '../scan';
import { findComments } from '../scan/c-comments';
import { lineAt, lineOf, lineStarts } from '../scan/lines';

export type CursorPlace =
  | { kind: 'key'; block: RawBlock; host: 'markdown' | 'c'; replace: Span }
  /** `replace` covers the value typed so far; `needsSpace` when the cursor sits right after the colon. */
  | { kind: 'value'; block: RawBlock; host: 'markdown' | 'c'; key: string; replace: Span; needsSpace: boolean };

// A comment line's lead-in: `//`, `///`, `//!`, `/*`, `/**`, or the `*` of a block comment's inner line.
const commentLeadIn = /^[ \t]*(?:\/\/+!?|\/\*+!?|\*+(?!\/))?[ \t]*/;
const keyChars = /^[A-Za-z][A-Za-z0-9+\-_.]*$/;

export function cursorPlace(doc: TextDocumentLike, offset: number): CursorPlace | undefined {
  const host = hostOf(doc);
  if (!host) return undefined;
  const text = doc.text;
  const starts = lineStarts(text);
  const line = lineAt(text, starts[lineOf(starts, offset)]);
  if (offset > line.end) return undefined;
  const blocks = scanDocument(doc);
  const block = host === 'markdown' ? markdownBlockAt(blocks, offset, line.start) : cBlockAt(text, blocks, offset, starts);
  if (!block || (block.headerSpan.start >= line.start && block.headerSpan.start <= line.end)) return undefined;

  const before = text.slice(line.start, offset);
  const lead = host === 'c' ? (commentLeadIn.exec(before)?.[0].length ?? 0) : (/^[ \t]*/.exec(before)?.[0].length ?? 0);
  const typed = before.slice(lead);
  const at = line.start + lead;
  const colon = typed.indexOf(':');
  if (colon < 0) {
    if (typed !== '' && !keyChars.test(typed)) return undefined;
    return { kind: 'key', block, host, replace: { start: at, end: offset } };
  }
  const key = typed.slice(0, colon).trim().toLowerCase();
  if (!keyChars.test(key)) return undefined;
  const afterColon = typed.slice(colon + 1);
  const valueLead = /^[ \t]*/.exec(afterColon)?.[0].length ?? 0;
  const valueStart = at + colon + 1 + valueLead;
  return { kind: 'value', block, host, key, replace: { start: valueStart, end: offset }, needsSpace: valueLead === 0 };
}

/** A fence spans its lines up to the closing fence (or the end of the file when unterminated). */
function markdownBlockAt(blocks: RawBlock[], offset: number, lineStart: number): RawBlock | undefined {
  return blocks.find((b) => b.span.start <= lineStart && (offset <= b.span.end || isLastOpen(b, blocks)));
}

function isLastOpen(block: RawBlock, blocks: RawBlock[]): boolean {
  return block === blocks[blocks.length - 1] && block.findings.some((f) => f.code === 'block-unterminated');
}

/** The nearest block above, when the cursor is in a comment that carries it on without a code line between. */
function cBlockAt(text: string, blocks: RawBlock[], offset: number, starts: number[]): RawBlock | undefined {
  const block = [...blocks].reverse().find((b) => b.headerSpan.start <= offset);
  if (!block) return undefined;
  const comments = findComments(text);
  const here = comments.find((c) => c.start <= offset && offset <= (c.kind === 'block' ? c.closeAt : c.end));
  if (!here) return undefined;
  if (here.kind === 'block') return here.start <= block.headerSpan.start ? block : undefined;
  // A run of `//` lines, one per line, from the header's line to the cursor's.
  const lineComments = new Map(comments.filter((c) => c.kind === 'line').map((c) => [lineOf(starts, c.start), c]));
  const headerLine = lineOf(starts, block.headerSpan.start);
  for (let l = lineOf(starts, offset); l > headerLine; l--) {
    const comment = lineComments.get(l);
    if (!comment || text.slice(starts[l], comment.start).trim() !== '') return undefined;
  }
  return lineComments.get(headerLine) ? block : undefined;
}
