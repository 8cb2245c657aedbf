// The Tickmark commands, except the waveform panel (waveform.ts).
import * as vscode from 'vscode';
import { Code } from '../core/codes';
import type { AnalysisStore } from './analysisStore';
import { applyBlockFixes } from './blockFixes';
import { commandIds } from './commandIds';
import { circuitNames } from './engine';
import { placedFindings } from './findings';
import type { Logger } from './logger';

const scannedFiles = '**/*.{md,markdown,c,h,cc,cpp,hpp,hh}';
const skippedFolders = '**/{node_modules,.git,out,.cache}/**';

export function registerCommands({ store, logger }: { store: AnalysisStore; logger: Logger }): vscode.Disposable {
  return vscode.Disposable.from(
    vscode.commands.registerCommand(commandIds.checkWorkspace, () => checkWorkspace(store, logger)),
    vscode.commands.registerCommand(commandIds.insertBlock, insertBlock),
    vscode.commands.registerCommand(commandIds.solveBlock, () => applyBlockFixes(store, [Code.solved], 'solve')),
    vscode.commands.registerCommand(commandIds.snapToSeries, () => applyBlockFixes(store, [Code.seriesSnap], 'snap to the series')),
  );
}

export interface WorkspaceSummary {
  files: number;
  blocks: number;
  errors: number;
  warnings: number;
}

/** Opens every note and source file once, so diagnostics cover files nobody has opened yet. */
async function checkWorkspace(store: AnalysisStore, logger: Logger): Promise<WorkspaceSummary> {
  const uris = await vscode.workspace.findFiles(scannedFiles, skippedFolders);
  const summary: WorkspaceSummary = { files: 0, blocks: 0, errors: 0, warnings: 0 };
  for (const uri of uris) {
    try {
      const doc = await vscode.workspace.openTextDocument(uri);
      const analysis = store.analysisOf(doc);
      summary.files++;
      summary.blocks += analysis.blocks.length;
      for (const { finding } of placedFindings(analysis)) {
        if (finding.severity === 'error') summary.errors++;
        else if (finding.severity === 'warning') summary.warnings++;
      }
    } catch (cause) {
      logger.error(`could not check ${uri.toString()}`, cause);
    }
  }
  const message = `Tickmark: ${summary.blocks} blocks in ${summary.files} files, ${summary.errors} errors, ${summary.warnings} warnings.`;
  logger.info(message);
  void vscode.window.showInformationMessage(message);
  return summary;
}

async function insertBlock(): Promise<void> {
  const editor = vscode.window.activeTextEditor;
  if (!editor) return;
  const names = circuitNames();
  const circuit = names.length > 0 ? `\${1|${names.join(',')}|}` : '${1:circuit}';
  const body = `circuit: ${circuit}\n$0`;
  const snippet =
    editor.document.languageId === 'markdown'
      ? `\`\`\`timing \${2:name}\n${body}\n\`\`\`\n`
      : `/* @timing \${2:name}\n${body.split('\n').map((line) => ` * ${line}`).join('\n')}\n */\n`;
  await editor.insertSnippet(new vscode.SnippetString(snippet));
}
