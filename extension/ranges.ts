// The one adapter from core offsets (0-based UTF-16 code units, half-open) to editor ranges and back.
import * as vscode from 'vscode';
import { lineOf, lineStarts } from '../core/scan/lines';
import type { Span } from '../core/types';

/** Anything that maps offsets to positions: an open document, or text read from disk. */
export interface OffsetMapper {
  positionAt(offset: number): vscode.Position;
  offsetAt(position: vscode.Position): number;
}

export function spanToRange(doc: OffsetMapper, span: Span): vscode.Range {
  const start = doc.positionAt(span.start);
  return new vscode.Range(start, span.end <= span.start ? start : doc.positionAt(span.end));
}

export function rangeToSpan(doc: OffsetMapper, range: vscode.Range): Span {
  return { start: doc.offsetAt(range.start), end: doc.offsetAt(range.end) };
}

export function spanContains(span: Span, offset: number): boolean {
  return offset >= span.start && offset <= span.end;
}

export function spansOverlap(a: Span, b: Span): boolean {
  return a.start <= b.end && b.start <= a.end;
}

/** Offsets of a file that is not open, with the editor's line rules (\n, \r\n and lone \r end a line). */
export function textMapper(text: string): OffsetMapper {
  const starts = lineStarts(text);
  return {
    positionAt(offset) {
      const clamped = Math.max(0, Math.min(offset, text.length));
      const line = lineOf(starts, clamped);
      return new vscode.Position(line, clamped - starts[line]);
    },
    offsetAt(position) {
      const line = Math.max(0, Math.min(position.line, starts.length - 1));
      return Math.min(starts[line] + position.character, text.length);
    },
  };
}
