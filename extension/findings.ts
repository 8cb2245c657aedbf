// Turns core findings into editor diagnostics. A finding located in another file (a header) is shown on
// its block's header line, pointing at the other file, so it stays beside the claim it affects.
import * as fs from 'node:fs';
import * as vscode from 'vscode';
import type { BlockAnalysis, DocumentAnalysis, Finding, Severity } from '../core/types';
import { coreUriOf, editorUriOf, findOpenDocument } from './documents';
import { spanToRange, textMapper, type OffsetMapper } from './ranges';

export interface PlacedFinding {
  finding: Finding;
  block?: BlockAnalysis;
}

export function placedFindings(analysis: DocumentAnalysis): PlacedFinding[] {
  const placed: PlacedFinding[] = analysis.findings.map((finding) => ({ finding }));
  for (const block of analysis.blocks) {
    for (const finding of [...block.block.findings, ...block.findings]) placed.push({ finding, block });
  }
  return dedupe(placed);
}

const severities: Record<Severity, vscode.DiagnosticSeverity> = {
  error: vscode.DiagnosticSeverity.Error,
  warning: vscode.DiagnosticSeverity.Warning,
  info: vscode.DiagnosticSeverity.Information,
};

/** An open document, or a file read from disk with its offsets (the workspace check). */
export type DiagnosticTarget = OffsetMapper & { readonly uri: vscode.Uri };

export function toDiagnostic(doc: DiagnosticTarget, { finding, block }: PlacedFinding): vscode.Diagnostic {
  const elsewhere = finding.uri !== undefined && finding.uri !== coreUriOf(doc.uri);
  const range = elsewhere ? spanToRange(doc, block?.block.headerSpan ?? { start: 0, end: 0 }) : spanToRange(doc, finding.span);
  const diagnostic = new vscode.Diagnostic(range, finding.message, severities[finding.severity]);
  diagnostic.source = 'tickmark';
  diagnostic.code = finding.code;
  if (elsewhere && finding.uri !== undefined) {
    const mapper = mapperFor(finding.uri);
    if (mapper) {
      const location = new vscode.Location(editorUriOf(finding.uri), spanToRange(mapper, finding.span));
      diagnostic.relatedInformation = [new vscode.DiagnosticRelatedInformation(location, 'found here')];
    }
  }
  return diagnostic;
}

/** Offsets of a file the block reached: the open buffer, else the text on disk. */
export function mapperFor(coreUri: string): OffsetMapper | undefined {
  const open = findOpenDocument(coreUri);
  if (open) return open;
  const uri = editorUriOf(coreUri);
  if (uri.scheme !== 'file') return undefined;
  try {
    return textMapper(fs.readFileSync(uri.fsPath, 'utf8'));
  } catch {
    return undefined;
  }
}

// A header problem reached by two blocks is one problem.
function dedupe(placed: PlacedFinding[]): PlacedFinding[] {
  const seen = new Set<string>();
  return placed.filter(({ finding }) => {
    const key = `${finding.uri ?? ''}|${finding.span.start}|${finding.span.end}|${finding.code}|${finding.message}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}
