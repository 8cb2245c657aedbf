// `--json`: the shape README.md ("Command line") promises, SI base units, 1-based lines.
import type { BlockAnalysis, Finding } from '../types';
import { displayPath } from './files';
import { locate } from './locate';
import type { CheckedFile } from './run';
import { emptyList } from '../empty';

interface JsonDiagnostic {
  severity: Finding['severity'];
  code: string;
  line: number;
  column: number;
  endLine: number;
  endColumn: number;
  message: string;
  file?: string;
}

function diagnostic(finding: Finding, file: CheckedFile, shownPath: (uri: string) => string): JsonDiagnostic {
  const where = locate(finding, file);
  const out: JsonDiagnostic = { severity: finding.severity, code: finding.code, line: where.line, column: where.column, endLine: where.endLine, endColumn: where.endColumn, message: finding.message };
  // A finding in a header names that file, relative to the working folder as `path` is.
  if (where.file !== file.file) out.file = shownPath(where.file);
  return out;
}

/** `first-edge` was called `startup`: the old key stays beside it in JSON for one more version (README, Migration). */
function withStartup<T>(record: Record<string, T>): Record<string, T> {
  return 'first-edge' in record ? { ...record, startup: record['first-edge'] } : record;
}

/** `displayPath` for one report: it names the same few files thousands of times, each made relative once. */
function pathShower(cwd: string): (uri: string) => string {
  const shown = new Map<string, string>();
  return (uri) => {
    let path = shown.get(uri);
    if (path === undefined) shown.set(uri, (path = displayPath(uri, cwd)));
    return path;
  };
}

/** What an empty list writes: shared by every block without references or diagnostics. */
const none: readonly never[] = emptyList;

function block(analysis: BlockAnalysis, file: CheckedFile, shownPath: (uri: string) => string) {
  const out: Record<string, unknown> = {
    name: analysis.name,
    line: analysis.line,
    circuit: analysis.circuit ?? null,
    params: Object.assign({}, analysis.params, analysis.choices),
    values: withStartup(analysis.values),
  };
  if (analysis.spread) out.spread = withStartup(analysis.spread);
  if (analysis.solved) out.solved = analysis.solved;
  // `uri` is where the constant is defined as the analysis read it; `file` is that path as `path` shows a file.
  const identifiers = analysis.identifiers;
  if (identifiers.length) {
    const shown = new Array(identifiers.length);
    for (let i = 0; i < identifiers.length; i++) {
      const id = identifiers[i];
      shown[i] = { name: id.name, value: id.value, uri: id.uri, line: id.line, file: shownPath(id.uri) };
    }
    out.identifiers = shown;
  }
  // `file` and `line` locate the referenced block; `value` is the number it supplied.
  const references = analysis.references;
  out.references = references?.length ? referencesShown(references, shownPath) : none;
  const findings = analysis.findings;
  out.diagnostics = findings.length ? diagnosticsOf(findings, file, shownPath) : none;
  return out;
}

// Apart from `block`, so a block with neither makes no closures.
function referencesShown(references: NonNullable<BlockAnalysis['references']>, shownPath: (uri: string) => string) {
  return references.map((r) => ({ name: r.name, result: r.result, file: shownPath(r.uri), line: r.line, value: r.value }));
}

function diagnosticsOf(findings: readonly Finding[], file: CheckedFile, shownPath: (uri: string) => string): JsonDiagnostic[] {
  return findings.map((f) => diagnostic(f, file, shownPath));
}

/** Characters handed on at a time by writeJsonReport. */
const PIECE = 1 << 16;

/**
 * The one-line report (a file or a pipe), handed to `out` in pieces of about 64K characters, exactly the text
 * `jsonReport` makes without an indent: a 2,000-block report is never one megabyte string, and each block's objects
 * are gone once written, so a cold check keeps less (DEVELOPERS.md). With an indent the report is written whole.
 */
export function writeJsonReport(checked: CheckedFile[], cwd: string, out: (text: string) => void, indent?: number): void {
  if (indent) return out(jsonReport(checked, cwd, indent));
  const shownPath = pathShower(cwd);
  let text = '{"version":1,"files":[';
  for (let f = 0; f < checked.length; f++) {
    const file = checked[f];
    text += `${f ? ',' : ''}{"path":${JSON.stringify(file.display)},"blocks":[`;
    const blocks = file.analysis.blocks;
    for (let i = 0; i < blocks.length; i++) {
      text += (i ? ',' : '') + JSON.stringify(block(blocks[i], file, shownPath));
      if (text.length >= PIECE) {
        out(text);
        text = '';
      }
    }
    text += `],"diagnostics":${JSON.stringify(diagnosticsOf(file.analysis.findings, file, shownPath))}}`;
  }
  out(text + ']}\n');
}

/** `indent`: spaces per level for a reader at a terminal; none gives one line. */
export function jsonReport(checked: CheckedFile[], cwd: string, indent?: number): string {
  const shownPath = pathShower(cwd);
  const files = checked.map((file) => ({
    path: file.display,
    blocks: file.analysis.blocks.map((b) => block(b, file, shownPath)),
    diagnostics: diagnosticsOf(file.analysis.findings, file, shownPath),
  }));
  // `version` is the shape's version: it changes only when a field changes meaning or goes away.
  return JSON.stringify({ version: 1, files }, null, indent) + '\n';
}
