// Entry point: wires the features together; each registers itself and returns a Disposable.
import * as vscode from 'vscode';
import { AnalysisStore } from './analysisStore';
import { registerCodeActions } from './codeActions';
import { registerCodeLens } from './codeLens';
import { registerCommands } from './commands';
import { registerCompletion } from './completion';
import { registerDiagnostics } from './diagnostics';
import { registerHover } from './hover';
import { createLogger } from './logger';
import { timingPreviewPlugin, type MarkdownIt } from './preview';
import { registerWaveform } from './waveform';
import type { PanelEvents } from './panel/events';

/** What activate() hands to VS Code and other extensions: the preview plugin, and what the panel shows. */
export interface TickmarkApi {
  extendMarkdownIt(md: MarkdownIt): MarkdownIt;
  readonly waveformPanel: PanelEvents;
}

export function activate(context: vscode.ExtensionContext): TickmarkApi {
  const logger = createLogger();
  const store = new AnalysisStore(logger);
  const problems = registerDiagnostics({ store, logger });
  const waveform = registerWaveform({ store, logger, extensionUri: context.extensionUri });
  context.subscriptions.push(
    logger,
    store,
    problems,
    registerCodeLens({ store }),
    registerHover({ store }),
    registerCodeActions({ store }),
    registerCommands({ store, problems, logger }),
    registerCompletion(),
    waveform,
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('tickmark') && store.invalidate()),
  );
  logger.info(`Tickmark ${String(context.extension.packageJSON.version)} active`);
  return { extendMarkdownIt: (md) => timingPreviewPlugin(md, store), waveformPanel: waveform.events };
}

export function deactivate(): void {}
