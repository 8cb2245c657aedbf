// Entry point: wires the features together; each registers itself and returns a Disposable.
// Nothing here loads the core engine: extension/engine.ts requires it on the first analysis.
import { moduleLoadStart } from './activationClock';
import * as vscode from 'vscode';
import { AnalysisStore } from './analysisStore';
import { registerCodeActions } from './codeActions';
import { registerCodeLens } from './codeLens';
import { registerCommands } from './commands';
import { registerCompletion } from './completion';
import { registerDiagnostics } from './diagnostics';
import { registerHover } from './hover';
import { engineLoadState } from './engine';
import { registerInternalCommands, type ActivationMarks } from './internalCommands';
import { createLogger } from './logger';
import { timingPreviewPlugin, type MarkdownIt } from './preview';
import { registerWaveform } from './waveform';
import { registerTasks } from './tasks';
import type { PanelEvents } from './panel/events';

/** What activate() hands to VS Code and other extensions: the preview plugin, and what the panel shows. */
export interface TickmarkApi {
  extendMarkdownIt(md: MarkdownIt): MarkdownIt;
  readonly waveformPanel: PanelEvents;
}

// Every import above has run by now: the code-loading share of activation ends here.
const moduleLoadEnd = performance.now();
let marks: ActivationMarks | undefined;

export function activate(context: vscode.ExtensionContext): TickmarkApi {
  const activateStart = performance.now();
  const logger = createLogger();
  const store = new AnalysisStore(logger);
  const problems = registerDiagnostics({ store, logger });
  const waveform = registerWaveform({ store, logger, extensionUri: context.extensionUri });
  context.subscriptions.push(
    logger,
    store,
    problems,
    registerCodeLens({ store, logger }),
    registerHover({ store, logger }),
    registerCodeActions({ store }),
    registerCommands({ store, problems, logger }),
    registerCompletion({ logger }),
    waveform,
    registerInternalCommands(store, () => marks),
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('tickmark') && store.invalidate()),
  );
  context.subscriptions.push(registerTasks(context.extensionPath));
  logger.info(`Tickmark ${String(context.extension.packageJSON.version)} active`);
  marks = { moduleLoadStart, moduleLoadEnd, activateStart, activateEnd: performance.now(), engineLoadedAtActivation: engineLoadState().loaded };
  return { extendMarkdownIt: (md) => timingPreviewPlugin(md, store), waveformPanel: waveform.events };
}

export function deactivate(): void {}
