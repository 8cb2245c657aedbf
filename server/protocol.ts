// The server's own requests beyond the Language Server Protocol, for the VS Code extension (waveform panel,
// commands) and any client that wants them. Plain names and shapes only: the extension imports this file.
import type { CacheStats } from '../core/analyze/cache';
import type { BlockAnalysis } from '../core/types';

/** The client command a code lens carries: open the waveform panel on the block (arguments: uri, block name). */
export const showWaveformCommand = 'tickmark.showWaveform';

/** `tickmark/block`: the analysis of one block of an open document, by name or by position. */
export const blockRequest = 'tickmark/block';
export interface BlockParams {
  uri: string;
  name?: string;
  position?: { line: number; character: number };
}
export interface BlockAnswer {
  /** The block, undefined when the document has none there. */
  block?: BlockAnalysis;
  /** Names of every block in the document, in order. */
  names: string[];
}

/** `tickmark/blockFix`: the preferred fix of a finding of the given codes in the block at a position. */
export const blockFixRequest = 'tickmark/blockFix';
export interface BlockFixParams {
  uri: string;
  position: { line: number; character: number };
  codes: string[];
}
export interface BlockFixAnswer {
  /** Undefined when the cursor is in no block (`blockName` too) or the block has no such fix. */
  edit?: import('vscode-languageserver').WorkspaceEdit;
  blockName?: string;
}

/** `tickmark/checkWorkspace`: every note and C-family file of the workspace folders, diagnostics published. */
export const checkWorkspaceRequest = 'tickmark/checkWorkspace';
export interface WorkspaceSummary {
  files: number;
  blocks: number;
  errors: number;
  warnings: number;
  /** Files above tickmark.files.maxSizeKB, not read (relative to their workspace folder). */
  skipped: string[];
}

/**
 * `tickmark/cacheStats`: blocks in the document's last analysis and how many were evaluated afresh, how long that
 * analysis took in the server (ms), and how often its firmware constant tables were built or kept.
 */
export const cacheStatsRequest = 'tickmark/cacheStats';
export type CacheStatsAnswer = (CacheStats & { analysisMs?: number; tables?: { built: number; reused: number } }) | null;
