// What the panel did, as events: the editor tests observe them, and nothing else needs the webview's state.
import * as vscode from 'vscode';
import type { HostMessage, PanelMessage } from '../../media/messages';

export type DrawnReport = Extract<PanelMessage, { type: 'drawn' }>;

export class PanelEvents implements vscode.Disposable {
  private readonly posted = new vscode.EventEmitter<HostMessage>();
  private readonly drawn = new vscode.EventEmitter<DrawnReport>();
  /** Every message the host posted to the webview. */
  readonly onDidPost = this.posted.event;
  /** The webview's report after it drew a block. */
  readonly onDidDraw = this.drawn.event;
  last?: HostMessage;

  firePosted(message: HostMessage): void {
    this.last = message;
    this.posted.fire(message);
  }

  fireDrawn(report: DrawnReport): void {
    this.drawn.fire(report);
  }

  dispose(): void {
    this.posted.dispose();
    this.drawn.dispose();
  }
}
