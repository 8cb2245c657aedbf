// One cache of the core's answer per open document, keyed by version, shared by every feature, so a
// lens, a hover and the diagnostics of one edit come from the same analysis. Each open document keeps
// its own core Analyzer, so an edit re-evaluates only the blocks it touched; closing drops both.
import * as vscode from 'vscode';
import { Code } from '../core/codes';
import type { BlockAnalysis, DocumentAnalysis } from '../core/types';
import { coreUriOf, toDocumentLike } from './documents';
import { analyzeDocument, createAnalyzer, tooLargeAnalysis, type Analyzer, type AnalyzeOptions, type CacheStats } from './engine';
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
  private readonly analyzers = new Map<string, Analyzer>();
  private readonly changed = new vscode.EventEmitter<void>();
  /** Fires when cached answers were dropped (settings, a header edit): features re-query. */
  readonly onDidInvalidate = this.changed.event;

  constructor(private readonly logger: Logger) {}

  analysisOf(doc: vscode.TextDocument): DocumentAnalysis {
    const key = doc.uri.toString();
    const cached = this.entries.get(key);
    if (cached && cached.version === doc.version) return cached.analysis;
    const analysis = this.compute(doc, key);
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

  /** Blocks in the document's last analysis pass and how many were evaluated afresh; none once it closed. */
  cacheStatsOf(uri: vscode.Uri): CacheStats | undefined {
    return this.analyzers.get(uri.toString())?.stats;
  }

  forget(uri: vscode.Uri): void {
    this.entries.delete(uri.toString());
    this.analyzers.delete(uri.toString());
  }

  /**
   * Drops the answers by version; the analyzers stay, since they re-check every firmware value a block
   * read and drop themselves when the settings differ.
   */
  invalidate(keys?: readonly string[]): void {
    if (keys === undefined) this.entries.clear();
    else for (const key of keys) this.entries.delete(key);
    this.changed.fire();
  }

  dispose(): void {
    this.entries.clear();
    this.analyzers.clear();
    this.changed.dispose();
  }

  /** A file's text that is not open in the editor (the workspace check); not cached. */
  analyzeText(uri: vscode.Uri, text: string, languageId: string): DocumentAnalysis {
    const options = analyzeOptionsFor(uri, readSettings(uri));
    return this.guarded(uri, () => tooLargeOrNot(coreUriOf(uri), text, options) ?? analyzeDocument({ uri: coreUriOf(uri), text, languageId }, options));
  }

  private compute(doc: vscode.TextDocument, key: string): DocumentAnalysis {
    const options = analyzeOptionsFor(doc.uri, readSettings(doc.uri));
    return this.guarded(doc.uri, () => {
      const like = toDocumentLike(doc);
      const tooLarge = tooLargeOrNot(like.uri, like.text, options);
      if (tooLarge) return tooLarge;
      let analyzer = this.analyzers.get(key);
      if (!analyzer) this.analyzers.set(key, (analyzer = createAnalyzer()));
      return analyzer.analyze(like, options);
    });
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

/** The size setting counts bytes on disk (UTF-8), as the CLI's stat does, not UTF-16 characters. */
function tooLargeOrNot(uri: string, text: string, options: AnalyzeOptions): DocumentAnalysis | undefined {
  return Buffer.byteLength(text, 'utf8') > options.maxFileBytes ? tooLargeAnalysis(uri, options) : undefined;
}
