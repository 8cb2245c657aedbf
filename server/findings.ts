// Core findings as protocol diagnostics. A finding located in another file (a header) is shown on its block's
// header line with related information pointing into that file, so it stays beside the claim it affects.
// Each diagnostic carries the document version and its index in `data`: a quick fix finds its finding again
// from the diagnostic the client passes back, without analysing anything.
import { DiagnosticSeverity, type Diagnostic, type Range } from 'vscode-languageserver';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { BlockAnalysis, DocumentAnalysis, Finding, Severity, Span } from '../core/types';

export interface PlacedFinding {
  finding: Finding;
  block?: BlockAnalysis;
}

/** What a published diagnostic carries back to the server. */
export interface DiagnosticData {
  /** Document version the finding was analysed for. */
  version: number;
  /** Index into that version's placed findings. */
  index: number;
}

export function placedFindings(analysis: DocumentAnalysis): PlacedFinding[] {
  const placed: PlacedFinding[] = analysis.findings.map((finding) => ({ finding }));
  for (const block of analysis.blocks) {
    for (const finding of [...block.block.findings, ...block.findings]) placed.push({ finding, block });
  }
  return dedupe(placed);
}

const severities: Record<Severity, DiagnosticSeverity> = {
  error: DiagnosticSeverity.Error,
  warning: DiagnosticSeverity.Warning,
  info: DiagnosticSeverity.Information,
};

export function spanToRange(doc: Pick<TextDocument, 'positionAt'>, span: Span): Range {
  const start = doc.positionAt(span.start);
  return { start, end: span.end <= span.start ? start : doc.positionAt(span.end) };
}

export interface DiagnosticPlace {
  /** The document's own text. */
  doc: Pick<TextDocument, 'positionAt'>;
  /** The core path of the document. */
  path: string;
  /** Positions in another file the analysis read, and that file's URI for the client. */
  elsewhere: (corePath: string) => { mapper: Pick<TextDocument, 'positionAt'>; uri: string } | undefined;
}

export function toDiagnostic(place: DiagnosticPlace, { finding, block }: PlacedFinding, data: DiagnosticData | undefined): Diagnostic {
  const other = finding.uri !== undefined && finding.uri !== place.path;
  const range = other ? spanToRange(place.doc, block?.block.headerSpan ?? { start: 0, end: 0 }) : spanToRange(place.doc, finding.span);
  const diagnostic: Diagnostic = { range, severity: severities[finding.severity], source: 'tickmark', code: finding.code, message: finding.message };
  if (other && finding.uri !== undefined) {
    const there = place.elsewhere(finding.uri);
    if (there) diagnostic.relatedInformation = [{ location: { uri: there.uri, range: spanToRange(there.mapper, finding.span) }, message: 'found here' }];
  }
  if (data) diagnostic.data = data;
  return diagnostic;
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
