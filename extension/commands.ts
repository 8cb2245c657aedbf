// The Tickmark commands, except the waveform panel (waveform.ts).
import * as vscode from 'vscode';
import { Code } from '../core/codes';
import type { AnalysisStore } from './analysisStore';
import { applyBlockFixes } from './blockFixes';
import { checkWorkspace } from './checkWorkspace';
import { commandIds } from './commandIds';
import type { DiagnosticsHandle } from './diagnostics';
import { insertBlock } from './insertBlock';
import type { Logger } from './logger';

export interface CommandDeps {
  store: AnalysisStore;
  problems: DiagnosticsHandle;
  logger: Logger;
}

export function registerCommands(deps: CommandDeps): vscode.Disposable {
  const { store } = deps;
  return vscode.Disposable.from(
    vscode.commands.registerCommand(commandIds.checkWorkspace, () => checkWorkspace(deps)),
    vscode.commands.registerCommand(commandIds.insertBlock, insertBlock),
    vscode.commands.registerCommand(commandIds.solveBlock, () => applyBlockFixes(store, [Code.solved], 'solve')),
    vscode.commands.registerCommand(commandIds.snapToSeries, () => applyBlockFixes(store, [Code.seriesSnap], 'snap to its series')),
  );
}
