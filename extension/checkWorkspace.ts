// Tickmark: Check All Timing Blocks in Workspace — the server reads every note and C-family file of the
// workspace folders (open buffers as they are), publishes their problems, and this writes one summary to the
// Output channel.
import * as vscode from 'vscode';
import type { ServerRequests } from './client';
import type { Logger } from './logger';
import type { WorkspaceSummary } from '../server/protocol';

export type { WorkspaceSummary };

export interface CheckDeps {
  requests: ServerRequests;
  logger: Logger;
}

export async function checkWorkspace({ requests, logger }: CheckDeps): Promise<WorkspaceSummary> {
  const summary = await vscode.window.withProgress(
    { location: vscode.ProgressLocation.Notification, title: 'Tickmark: checking timing blocks', cancellable: true },
    (_progress, token) => requests.checkWorkspace(token),
  );
  const limit = vscode.workspace.getConfiguration('tickmark').get<number>('files.maxSizeKB', 1024);
  if (summary.skipped.length > 0) {
    logger.info(`skipped ${summary.skipped.length} file(s) larger than tickmark.files.maxSizeKB (${limit} KB): ${summary.skipped.join(', ')}`);
  }
  logger.info(`workspace check: ${summary.blocks} timing blocks in ${summary.files} files, ${summary.errors} errors, ${summary.warnings} warnings`);
  vscode.window.setStatusBarMessage(`Tickmark: ${summary.blocks} blocks, ${summary.errors} errors, ${summary.warnings} warnings`, 10_000);
  return summary;
}
