// The one entry point the CLI and the editor share: a document's text in, every block's analysis out.
import type { DocumentAnalysis, TextDocumentLike } from '../types';
import type { AnalyzeOptions } from './context';
import { AnalysisCache, type CacheStats } from './cache';
import { ConstantTableCache } from './tables';
import { analyzeWorkspace } from './workspace';

export { tooLargeAnalysis } from './document';

export { analyzeBlock } from './block';
export * from './context';
export { AnalysisCache, type CacheStats } from './cache';
export { ConstantTableCache } from './tables';
export { analyzeWorkspace, WorkspaceAnalyzer } from './workspace';
export { FirmwareCache } from './firmware';
export { defaultFirmwareSettings, firmwareOptions, parseFirmwareSettings, type FirmwareSettings } from './settings';

/** One document's analyser, kept while the document is open: an edit re-analyses only the blocks it touched. */
export class Analyzer {
  private readonly cache = new AnalysisCache();
  /** Firmware constant tables, kept while only comments (timing blocks) of the document change. */
  readonly tables = new ConstantTableCache();
  analyze(doc: TextDocumentLike, options: AnalyzeOptions): DocumentAnalysis {
    return analyzeDocument(doc, { ...options, tables: this.tables }, this.cache);
  }
  /** Blocks in the last pass, and how many of them were analysed afresh. */
  get stats(): CacheStats {
    return { ...this.cache.stats };
  }
}

/** One document by itself: its blocks may reference each other (`@name.result`), not blocks elsewhere. */
export function analyzeDocument(doc: TextDocumentLike, options: AnalyzeOptions, cache?: AnalysisCache): DocumentAnalysis {
  return analyzeWorkspace([doc], options, () => cache)[0];
}

export { isTooLarge } from '../size';
