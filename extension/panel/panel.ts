// One waveform panel: the webview, the block it shows (document and name), and the messages both ways.
import * as vscode from 'vscode';
import type { HostMessage, PanelMessage, PanelState } from '../../media/messages';
import type { ServerRequests } from '../client';
import type { Logger } from '../logger';
import { showMessage } from './content';
import type { PanelEvents } from './events';
import { exportWaveformSvg } from './export';
import { newNonce, panelHtml } from './html';

export const waveformViewType = 'tickmark.waveform';

export interface PanelDeps {
  requests: ServerRequests;
  logger: Logger;
  extensionUri: vscode.Uri;
  events: PanelEvents;
}

export interface PanelTarget {
  uri: vscode.Uri;
  block: string;
}

export function panelOptions(extensionUri: vscode.Uri): vscode.WebviewOptions & vscode.WebviewPanelOptions {
  return {
    enableScripts: true,
    enableForms: false,
    // The stylesheet and the script bundle (media/dist) both live under media/: nothing else may load.
    localResourceRoots: [vscode.Uri.joinPath(extensionUri, 'media')],
  };
}

/** A state handed back by the serializer: only a well-formed one is trusted. */
export function isPanelState(state: unknown): state is PanelState {
  const s = state as Partial<PanelState> | null | undefined;
  return typeof s?.uri === 'string' && typeof s.block === 'string';
}

export class WaveformPanel implements vscode.Disposable {
  target?: PanelTarget;
  private readonly subscriptions: vscode.Disposable[] = [];

  constructor(readonly panel: vscode.WebviewPanel, private readonly deps: PanelDeps) {
    const { webview } = panel;
    webview.options = panelOptions(deps.extensionUri);
    webview.html = panelHtml({
      cspSource: webview.cspSource,
      scriptUri: webview.asWebviewUri(vscode.Uri.joinPath(deps.extensionUri, 'media', 'dist', 'panel.js')).toString(),
      styleUri: webview.asWebviewUri(vscode.Uri.joinPath(deps.extensionUri, 'media', 'panel.css')).toString(),
      nonce: newNonce(),
    });
    this.subscriptions.push(webview.onDidReceiveMessage((message: PanelMessage) => this.receive(message)));
  }

  /** Shows a block; the webview may not be loaded yet, then its 'ready' asks for it again. */
  show(target: PanelTarget): void {
    this.target = target;
    this.refresh();
  }

  /** Asks the server for the block; an answer overtaken by a newer refresh is dropped. */
  refresh(): void {
    void this.redraw().catch((cause) => this.deps.logger.error('panel redraw failed', cause));
  }

  private generation = 0;

  private async redraw(): Promise<void> {
    const asked = ++this.generation;
    const target = this.target;
    if (!target) return this.post({ type: 'empty', reason: 'Put the cursor in a timing block to see its waveform.' });
    const doc = openDocument(target.uri);
    if (!doc) return void this.reopen(target);
    const { block: analysis } = await this.deps.requests.block(doc.uri, { name: target.block });
    if (asked !== this.generation) return;
    if (!analysis || analysis.name !== target.block) return this.post({ type: 'empty', reason: `No timing block named “${target.block}” in this file any more.` });
    this.panel.title = `Waveform: ${analysis.name}`;
    this.post(showMessage(doc.uri.toString(), analysis));
  }

  dispose(): void {
    for (const s of this.subscriptions) s.dispose();
    this.panel.dispose();
  }

  /** A closed document (or one not yet loaded after a reload) is opened once, then drawn. */
  private async reopen(target: PanelTarget): Promise<void> {
    try {
      await vscode.workspace.openTextDocument(target.uri);
    } catch {
      return this.post({ type: 'empty', reason: `Cannot open the file of “${target.block}”.` });
    }
    if (this.target === target && openDocument(target.uri)) this.refresh();
  }

  private post(message: HostMessage): void {
    this.deps.events.firePosted(message);
    void this.panel.webview.postMessage(message);
  }

  private receive(message: PanelMessage): void {
    switch (message?.type) {
      case 'ready':
        return this.refresh();
      case 'export':
        return void this.exportCurrent();
      case 'drawn':
        return this.deps.events.fireDrawn(message);
    }
  }

  private async exportCurrent(): Promise<void> {
    const doc = this.target && openDocument(this.target.uri);
    const analysis = doc && (await this.deps.requests.block(doc.uri, { name: this.target!.block })).block;
    if (!doc || !analysis || analysis.name !== this.target!.block) return;
    try {
      const saved = await exportWaveformSvg(doc, analysis);
      if (saved) this.deps.logger.info(`waveform of ${analysis.name} exported to ${saved.toString()}`);
    } catch (cause) {
      this.deps.logger.error(`waveform export of ${analysis.name} failed`, cause);
      void vscode.window.showErrorMessage(`Tickmark could not write the SVG: ${cause instanceof Error ? cause.message : String(cause)}`);
    }
  }
}

function openDocument(uri: vscode.Uri): vscode.TextDocument | undefined {
  const wanted = uri.toString();
  return vscode.workspace.textDocuments.find((doc) => doc.uri.toString() === wanted);
}
