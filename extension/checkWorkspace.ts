// Tickmark: Check All Timing Blocks in Workspace — reads every note and C-family file from disk (open
// buffers as they are), fills the Problems list, and writes one summary to the Output channel.
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import type { DiagnosticsHandle } from './diagnostics';
import { findOpenDocument, coreUriOf } from './documents';
import { placedFindings } from './findings';
import type { Logger } from './logger';
import { textMapper } from './ranges';
import { readSettings } from './settings';

export const scannedFiles = '**/*.{md,markdown,c,h,cc,cpp,hpp,hh}';
const skippedFolders = '**/{node_modules,.git,out,.cache}/**';

export interface WorkspaceSummary {
  files: number;
  blocks: number;
  errors: number;
  warnings: number;
  /** Files above tickmark.files.maxSizeKB, not read. */
  skipped: string[];
}

export interface CheckDeps {
  store: AnalysisStore;
  problems: DiagnosticsHandle;
  logger: Logger;
}

export async function checkWorkspace({ store, problems, logger }: CheckDeps): Promise<WorkspaceSummary> {
  const summary: WorkspaceSummary = { files: 0, blocks: 0, errors: 0, warnings: 0, skipped: [] };
  await vscode.window.withProgress(
    { location: vscode.ProgressLocation.Notification, title: 'Tickmark: checking timing blocks', cancellable: true },
    async (progress, token) => {
      const uris = await vscode.workspace.findFiles(scannedFiles, skippedFolders, undefined, token);
      for (const [index, uri] of uris.entries()) {
        if (token.isCancellationRequested) break;
        progress.report({ message: vscode.workspace.asRelativePath(uri), increment: 100 / uris.length });
        try {
          await checkOne(uri, summary, store, problems);
        } catch (cause) {
          logger.error(`could not check ${uri.toString()}`, cause);
        }
        // Let the extension host breathe between files of a large workspace.
        if (index % 20 === 19) await new Promise((resolve) => setTimeout(resolve, 0));
      }
    },
  );
  const limit = readSettings().maxSizeKB;
  if (summary.skipped.length > 0) {
    logger.info(`skipped ${summary.skipped.length} file(s) larger than tickmark.files.maxSizeKB (${limit} KB): ${summary.skipped.join(', ')}`);
  }
  logger.info(`workspace check: ${summary.blocks} timing blocks in ${summary.files} files, ${summary.errors} errors, ${summary.warnings} warnings`);
  vscode.window.setStatusBarMessage(`Tickmark: ${summary.blocks} blocks, ${summary.errors} errors, ${summary.warnings} warnings`, 10_000);
  return summary;
}

async function checkOne(uri: vscode.Uri, summary: WorkspaceSummary, store: AnalysisStore, problems: DiagnosticsHandle): Promise<void> {
  const open = findOpenDocument(coreUriOf(uri));
  let analysis;
  if (open) {
    // Counted as skipped like a file on disk; its open editor shows the one file-too-large notice.
    if (Buffer.byteLength(open.getText(), 'utf8') > readSettings(uri).maxSizeKB * 1024) summary.skipped.push(vscode.workspace.asRelativePath(uri));
    analysis = store.analysisOf(open);
    problems.publish(open);
    if (summary.skipped.includes(vscode.workspace.asRelativePath(uri))) return;
  } else {
    const { size } = await vscode.workspace.fs.stat(uri);
    if (size > readSettings(uri).maxSizeKB * 1024) {
      summary.skipped.push(vscode.workspace.asRelativePath(uri));
      return;
    }
    const text = new TextDecoder('utf-8').decode(await vscode.workspace.fs.readFile(uri));
    analysis = store.analyzeText(uri, text, languageOf(uri));
    problems.publishFromDisk(uri, textMapper(text), analysis);
  }
  summary.files++;
  summary.blocks += analysis.blocks.length;
  for (const { finding } of placedFindings(analysis)) {
    if (finding.severity === 'error') summary.errors++;
    else if (finding.severity === 'warning') summary.warnings++;
  }
}

function languageOf(uri: vscode.Uri): string {
  const lower = uri.path.toLowerCase();
  if (lower.endsWith('.md') || lower.endsWith('.markdown')) return 'markdown';
  return lower.endsWith('.c') || lower.endsWith('.h') ? 'c' : 'cpp';
}
