// Entry point: starts the language server client and wires the editor-only features (panel, preview,
// commands); each registers itself and returns a Disposable. Diagnostics, lens, hover, quick fixes and
// completion come from the server (server/, out/server.js) through extension/client.ts. Nothing here loads
// the core engine: the preview and the panel require it on first use (extension/engine.ts).
import { moduleLoadStart } from './activationClock';
import * as vscode from 'vscode';
import { AnalysisStore } from './analysisStore';
import { startClient } from './client';
import { registerCommands } from './commands';
import { engineLoadState } from './engine';
import { registerInternalCommands, type ActivationMarks } from './internalCommands';
import { createLogger } from './logger';
import { timingPreviewPlugin, type MarkdownIt } from './preview';
import { registerWaveform } from './waveform';
import { registerTasks } from './tasks';
import type { PanelEvents } from './panel/events';

/** What activate() hands to VS Code and other extensions: the preview plugin, what the panel shows, and readiness. */
export interface TickmarkApi {
  extendMarkdownIt(md: MarkdownIt): MarkdownIt;
  readonly waveformPanel: PanelEvents;
  /** Settles once the language server answers and its features are registered. */
  readonly ready: Promise<void>;
}

// Every import above has run by now: the code-loading share of activation ends here.
const moduleLoadEnd = performance.now();
let marks: ActivationMarks | undefined;

export function activate(context: vscode.ExtensionContext): TickmarkApi {
  const activateStart = performance.now();
  const logger = createLogger();
  const client = startClient(context, logger.channel);
  // The preview renders synchronously inside markdown-it: it keeps an in-process analysis of the notes it shows.
  const previewStore = new AnalysisStore(logger);
  const waveform = registerWaveform({ requests: client, logger, extensionUri: context.extensionUri });
  context.subscriptions.push(
    logger,
    client,
    previewStore,
    registerCommands({ requests: client, logger }),
    waveform,
    registerInternalCommands(client, () => marks),
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('tickmark') && previewStore.invalidate()),
  );
  context.subscriptions.push(registerTasks(context.extensionPath));
  logger.info(`Tickmark ${String(context.extension.packageJSON.version)} active`);
  const done: ActivationMarks = { moduleLoadStart, moduleLoadEnd, activateStart, activateEnd: performance.now(), engineLoadedAtActivation: engineLoadState().loaded };
  marks = done;
  void client.ready.then(() => (done.serverReady = performance.now()));
  return { extendMarkdownIt: (md) => timingPreviewPlugin(md, previewStore), waveformPanel: waveform.events, ready: client.ready };
}

export function deactivate(): void {}
