// Applies the server's preferred fix of one kind to the block under the cursor (solve a `?`, snap to a series).
import * as vscode from 'vscode';
import type { ServerRequests } from './client';

export async function applyBlockFixes(requests: ServerRequests, codes: readonly string[], what: string): Promise<boolean> {
  const editor = vscode.window.activeTextEditor;
  const answer = editor ? await requests.blockFix(editor.document.uri, editor.selection.active, codes) : undefined;
  if (!editor || !answer?.blockName) {
    void vscode.window.showInformationMessage(`Place the cursor in a timing block to ${what}.`);
    return false;
  }
  if (!answer.edit) {
    void vscode.window.showInformationMessage(`Nothing to ${what} in ${answer.blockName}.`);
    return false;
  }
  return vscode.workspace.applyEdit(answer.edit);
}
