// One cache of the core's answer per open document, keyed by version, shared by every feature, so a
// lens, a hover and the diagnostics of one edit come from the same analysis.
import * as vscode from 'vscode';
import { Code } from '../core/codes';
import type { BlockAnalysis, DocumentAnalysis } from '../core/types';
import { coreUriOf, toDocumentLike } from './documents';
import { analyzeDocument } from './engine';
import type { Logger } from './logger';
import { analyzeOptionsFor } from './options';
import { spanContains } from './ranges';
import { readSettings } from './settings';

interface Entry {
  version: number;
  analysis: DocumentAnalysis;
}

export class AnalysisStore implements vscode.Disposable {
  private readonly entries = new Map<string, Entry>();
  private readonly changed = new vscode.EventEmitter<void>();
  /** Fires when cached answers were dropped (settings, a header edit): features re-query. */
  readonly onDidInvalidate = this.changed.event;

  constructor(private readonly logger: Logger) {}

  analysisOf(doc: vscode.TextDocument): DocumentAnalysis {
    const key = doc.uri.toString();
    const cached = this.entries.get(key);
    if (cached && cached.version === doc.version) return cached.analysis;
    const analysis = this.compute(doc);
    this.entries.set(key, { version: doc.version, analysis });
    return analysis;
  }

  blockAt(doc: vscode.TextDocument, position: vscode.Position): BlockAnalysis | undefined {
    const offset = doc.offsetAt(position);
    return this.analysisOf(doc).blocks.find((b) => spanContains(b.block.span, offset));
  }

  /** Open documents whose last analysis read `uri` (a header they include). */
  dependantsOf(uri: vscode.Uri): string[] {
    const file = coreUriOf(uri);
    return [...this.entries].filter(([, e]) => e.analysis.dependencies.includes(file)).map(([key]) => key);
  }

  forget(uri: vscode.Uri): void {
    this.entries.delete(uri.toString());
  }

  invalidate(keys?: readonly string[]): void {
    if (keys === undefined) this.entries.clear();
    else for (const key of keys) this.entries.delete(key);
    this.changed.fire();
  }

  dispose(): void {
    this.entries.clear();
    this.changed.dispose();
  }

  /** A file's text that is not open in the editor (the workspace check); not cached. */
  analyzeText(uri: vscode.Uri, text: string, languageId: string): DocumentAnalysis {
    return this.guarded(uri, () => analyzeDocument({ uri: coreUriOf(uri), text, languageId }, analyzeOptionsFor(uri, readSettings(uri))));
  }

  private compute(doc: vscode.TextDocument): DocumentAnalysis {
    return this.guarded(doc.uri, () => analyzeDocument(toDocumentLike(doc), analyzeOptionsFor(doc.uri, readSettings(doc.uri))));
  }

  private guarded(editorUri: vscode.Uri, analyze: () => DocumentAnalysis): DocumentAnalysis {
    const uri = coreUriOf(editorUri);
    try {
      return analyze();
    } catch (cause) {
      // The core promises findings, not exceptions; if one escapes, say so at the top of the file.
      this.logger.error(`analysis of ${uri} failed`, cause);
      const message = `Tickmark could not analyse this file (${cause instanceof Error ? cause.message : String(cause)}); details in the Tickmark output.`;
      return { uri, blocks: [], dependencies: [], findings: [{ severity: 'error', code: Code.fileUnreadable, message, span: { start: 0, end: 0 } }] };
    }
  }
}
