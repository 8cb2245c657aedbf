// Where a finding stands: in the checked file, or in a header it came from.
import type { Finding } from '../types';
import { lineStarts } from '../scan/lines';
import { readText } from './files';
import { position } from './position';
import type { CheckedFile } from './run';

export interface Located {
  file: string;
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
}

const headerStarts = new Map<string, number[]>();

export function locate(finding: Finding, checked: CheckedFile): Located {
  let file = checked.file;
  let starts = checked.starts;
  if (finding.uri && finding.uri !== checked.file) {
    file = finding.uri;
    let cached = headerStarts.get(file);
    if (!cached) headerStarts.set(file, (cached = lineStarts(readText(file, Number.MAX_SAFE_INTEGER) ?? '')));
    starts = cached;
  }
  const start = position(starts, finding.span.start);
  const end = position(starts, Math.max(finding.span.start, finding.span.end));
  return { file, line: start.line, column: start.column, endLine: end.line, endColumn: end.column };
}
