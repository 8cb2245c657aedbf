// The waveform panel beside the editor. It follows the block under the cursor; the drawing itself is the
// webview script's (media/panel.ts, bundled to out/media/panel.js) from the analysis posted to it.
import { randomBytes } from 'node:crypto';
import * as vscode from 'vscode';
import type { BlockAnalysis } from '../core/types';
import type { AnalysisStore } from './analysisStore';
import { commandIds } from './commandIds';
import { isTimingDocument } from './documents';
import type { Logger } from './logger';

export interface WaveformDeps {
  store: AnalysisStore;
  logger: Logger;
  extensionUri: vscode.Uri;
}

export function registerWaveform({ store, logger, extensionUri }: WaveformDeps): vscode.Disposable {
  let panel: vscode.WebviewPanel | undefined;

  const post = (block: BlockAnalysis | undefined): void => {
    void panel?.webview.postMessage({ type: 'block', name: block?.name, circuit: block?.circuit, values: block?.values ?? {}, spread: block?.spread ?? {} });
    if (panel && block) panel.title = `Waveform: ${block.name}`;
  };

  const show = async (uri?: vscode.Uri, name?: string): Promise<boolean> => {
    const doc = uri ? await vscode.workspace.openTextDocument(uri) : vscode.window.activeTextEditor?.document;
    if (!doc || !isTimingDocument(doc)) return false;
    const analysis = store.analysisOf(doc);
    const editor = vscode.window.activeTextEditor;
    const block =
      analysis.blocks.find((b) => b.name === name) ??
      (editor?.document === doc ? store.blockAt(doc, editor.selection.active) : undefined) ??
      analysis.blocks[0];
    if (!panel) {
      panel = vscode.window.createWebviewPanel('tickmark.waveform', 'Waveform', { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true }, {
        enableScripts: true,
        localResourceRoots: [vscode.Uri.joinPath(extensionUri, 'media'), vscode.Uri.joinPath(extensionUri, 'out', 'media')],
      });
      panel.webview.html = panelHtml(panel.webview, extensionUri);
      panel.onDidDispose(() => (panel = undefined));
      logger.info('waveform panel opened');
    } else {
      panel.reveal(undefined, true);
    }
    post(block);
    return true;
  };

  const follow = (editor: vscode.TextEditor): void => {
    if (!panel || !isTimingDocument(editor.document)) return;
    const block = store.blockAt(editor.document, editor.selection.active);
    if (block) post(block);
  };

  return vscode.Disposable.from(
    vscode.commands.registerCommand(commandIds.showWaveform, show),
    vscode.window.onDidChangeTextEditorSelection((e) => follow(e.textEditor)),
    vscode.workspace.onDidChangeTextDocument((e) => {
      const editor = vscode.window.activeTextEditor;
      if (editor && e.document === editor.document) follow(editor);
    }),
    { dispose: () => panel?.dispose() },
  );
}

function panelHtml(webview: vscode.Webview, extensionUri: vscode.Uri): string {
  const nonce = randomBytes(16).toString('base64');
  const script = webview.asWebviewUri(vscode.Uri.joinPath(extensionUri, 'out', 'media', 'panel.js'));
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src ${webview.cspSource} data:; style-src ${webview.cspSource} 'nonce-${nonce}'; script-src 'nonce-${nonce}';">
<meta name="viewport" content="width=device-width, initial-scale=1">
<style nonce="${nonce}">body { color: var(--vscode-foreground); background: var(--vscode-editor-background); font-family: var(--vscode-font-family); }</style>
</head><body><main id="tickmark-waveform" aria-live="polite"></main>
<script type="module" nonce="${nonce}" src="${script}"></script>
</body></html>`;
}
