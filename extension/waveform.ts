// The waveform panel beside the editor: opened by command or code lens, following the block under the
// cursor, redrawn (debounced) as the document changes, and restored after a window reload.
import * as vscode from 'vscode';
import type { PanelState } from '../media/messages';
import type { ServerRequests } from './client';
import { commandIds } from './commandIds';
import { isTimingDocument } from './documents';
import type { Logger } from './logger';
import { PanelEvents } from './panel/events';
import { isPanelState, panelOptions, waveformViewType, WaveformPanel, type PanelDeps } from './panel/panel';

export interface WaveformDeps {
  requests: ServerRequests;
  logger: Logger;
  extensionUri: vscode.Uri;
}

/** Typing settles before a redraw: a keystroke's analysis is cheap, repainting hundreds of points is not. */
const redrawDelayMs = 150;

export interface WaveformFeature extends vscode.Disposable {
  readonly events: PanelEvents;
}

export function registerWaveform({ requests, logger, extensionUri }: WaveformDeps): WaveformFeature {
  const events = new PanelEvents();
  const deps: PanelDeps = { requests, logger, extensionUri, events };
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

  /** `uri` may be the string a code lens carries (server/features/lens.ts). */
  const show = async (uri?: vscode.Uri | string, name?: string): Promise<boolean> => {
    const editor = vscode.window.activeTextEditor;
    const target = typeof uri === 'string' ? vscode.Uri.parse(uri) : uri;
    const doc = target instanceof vscode.Uri ? await vscode.workspace.openTextDocument(target) : editor?.document;
    if (!doc || !isTimingDocument(doc)) return false;
    // The named block, else the one under the cursor, else the document's first.
    const answer = await requests.block(doc.uri, { name: typeof name === 'string' ? name : undefined, position: editor?.document === doc ? editor.selection.active : undefined });
    const block = answer.block ?? (answer.names[0] !== undefined ? (await requests.block(doc.uri, { name: answer.names[0] })).block : undefined);
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

  let following = 0;
  const follow = async (editor: vscode.TextEditor): Promise<void> => {
    if (!current || !isTimingDocument(editor.document)) return;
    const asked = ++following;
    const { block } = await requests.block(editor.document.uri, { position: editor.selection.active });
    // A later cursor move has asked again: this answer is stale.
    if (asked !== following || !current) return;
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
    vscode.window.onDidChangeTextEditorSelection((e) => void follow(e.textEditor).catch((cause) => logger.error('panel follow failed', cause))),
    vscode.workspace.onDidChangeTextDocument((e) => {
      if (current?.target && e.document.uri.toString() === current.target.uri.toString()) redrawSoon();
    }),
    vscode.workspace.onDidChangeConfiguration((e) => e.affectsConfiguration('tickmark') && redrawSoon()),
    { dispose: () => (clearTimeout(timer), current?.dispose()) },
  );
  return { events, dispose: () => disposables.dispose() };
}
