// Entry point: wires the features together; each registers itself and returns a Disposable.
import * as vscode from 'vscode';
import { AnalysisStore } from './analysisStore';
import { registerCodeActions } from './codeActions';
import { registerCodeLens } from './codeLens';
import { registerCommands } from './commands';
import { registerDiagnostics } from './diagnostics';
import { registerHover } from './hover';
import { createLogger } from './logger';
import { registerWaveform } from './waveform';

export function activate(context: vscode.ExtensionContext): void {
  const logger = createLogger();
  const store = new AnalysisStore(logger);
  context.subscriptions.push(
    logger,
    store,
    registerDiagnostics({ store, logger }),
    registerCodeLens({ store }),
    registerHover({ store }),
    registerCodeActions({ store }),
    registerCommands({ store, logger }),
    registerWaveform({ store, logger, extensionUri: context.extensionUri }),
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('tickmark') && store.invalidate()),
  );
  logger.info(`Tickmark ${String(context.extension.packageJSON.version)} active`);
}

export function deactivate(): void {}
