// The Tickmark commands, except the waveform panel (waveform.ts).
import * as vscode from 'vscode';
import { Code } from '../core/codes';
import { applyBlockFixes } from './blockFixes';
import { checkWorkspace } from './checkWorkspace';
import type { ServerRequests } from './client';
import { commandIds } from './commandIds';
import { insertBlock } from './insertBlock';
import type { Logger } from './logger';

export interface CommandDeps {
  requests: ServerRequests;
  logger: Logger;
}

export function registerCommands(deps: CommandDeps): vscode.Disposable {
  const { requests } = deps;
  return vscode.Disposable.from(
    vscode.commands.registerCommand(commandIds.checkWorkspace, () => checkWorkspace(deps)),
    vscode.commands.registerCommand(commandIds.insertBlock, insertBlock),
    vscode.commands.registerCommand(commandIds.solveBlock, () => applyBlockFixes(requests, [Code.solved], 'solve')),
    vscode.commands.registerCommand(commandIds.snapToSeries, () => applyBlockFixes(requests, [Code.seriesSnap], 'snap to its series')),
  );
}
