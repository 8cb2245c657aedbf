// The waveform panel beside the editor: opened by command or code lens, following the block under the
// cursor, redrawn (debounced) as the document changes, and restored after a window reload.
import * as vscode from 'vscode';
import type { PanelState } from '../media/messages';
import type { AnalysisStore } from './analysisStore';
import { commandIds } from './commandIds';
import { isTimingDocument } from './documents';
import type { Logger } from './logger';
import { PanelEvents } from './panel/events';
import { isPanelState, panelOptions, waveformViewType, WaveformPanel, type PanelDeps } from './panel/panel';

export interface WaveformDeps {
  store: AnalysisStore;
  logger: Logger;
  extensionUri: vscode.Uri;
}

/** Typing settles before a redraw: a keystroke's analysis is cheap, repainting hundreds of points is not. */
const redrawDelayMs = 150;

export interface WaveformFeature extends vscode.Disposable {
  readonly events: PanelEvents;
}

export function registerWaveform({ store, logger, extensionUri }: WaveformDeps): WaveformFeature {
  const events = new PanelEvents();
  const deps: PanelDeps = { store, logger, extensionUri, events };
  let current: WaveformPanel | undefined;
  let timer: ReturnType<typeof setTimeout> | undefined;

  const adopt = (webviewPanel: vscode.WebviewPanel): WaveformPanel => {
    const panel = new WaveformPanel(webviewPanel, deps);
    webviewPanel.onDidDispose(() => {
      if (current === panel) current = undefined;
    });
    current = panel;
    return panel;
  };

  const show = async (uri?: vscode.Uri, name?: string): Promise<boolean> => {
    const editor = vscode.window.activeTextEditor;
    const doc = uri instanceof vscode.Uri ? await vscode.workspace.openTextDocument(uri) : editor?.document;
    if (!doc || !isTimingDocument(doc)) return false;
    const blocks = store.analysisOf(doc).blocks;
    const block =
      (typeof name === 'string' ? blocks.find((b) => b.name === name) : undefined) ??
      (editor?.document === doc ? store.blockAt(doc, editor.selection.active) : undefined) ??
      blocks[0];
    if (!block) return false;
    if (current) current.panel.reveal(undefined, true);
    else {
      const column = { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true };
      adopt(vscode.window.createWebviewPanel(waveformViewType, `Waveform: ${block.name}`, column, panelOptions(extensionUri)));
      logger.info('waveform panel opened');
    }
    current!.show({ uri: doc.uri, block: block.name });
    return true;
  };

  const follow = (editor: vscode.TextEditor): void => {
    if (!current || !isTimingDocument(editor.document)) return;
    const block = store.blockAt(editor.document, editor.selection.active);
    const target = current.target;
    if (!block || (target && target.block === block.name && target.uri.toString() === editor.document.uri.toString())) return;
    current.show({ uri: editor.document.uri, block: block.name });
  };

  const redrawSoon = (): void => {
    if (!current) return;
    clearTimeout(timer);
    timer = setTimeout(() => current?.refresh(), redrawDelayMs);
  };

  const serializer: vscode.WebviewPanelSerializer<PanelState> = {
    async deserializeWebviewPanel(webviewPanel, state) {
      current?.dispose();
      const panel = adopt(webviewPanel);
      if (isPanelState(state)) panel.show({ uri: vscode.Uri.parse(state.uri), block: state.block });
      else panel.refresh();
    },
  };

  const disposables = vscode.Disposable.from(
    events,
    vscode.commands.registerCommand(commandIds.showWaveform, show),
    vscode.window.registerWebviewPanelSerializer(waveformViewType, serializer),
    vscode.window.onDidChangeTextEditorSelection((e) => follow(e.textEditor)),
    vscode.workspace.onDidChangeTextDocument((e) => {
      if (current?.target && e.document.uri.toString() === current.target.uri.toString()) redrawSoon();
    }),
    store.onDidInvalidate(redrawSoon),
    { dispose: () => (clearTimeout(timer), current?.dispose()) },
  );
  return { events, dispose: () => disposables.dispose() };
}
