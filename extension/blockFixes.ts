// Applies the core's fixes of one kind to the block under the cursor (solve a `?`, snap to a series).
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { toWorkspaceEdit } from './edits';

export async function applyBlockFixes(store: AnalysisStore, codes: readonly string[], what: string): Promise<boolean> {
  const editor = vscode.window.activeTextEditor;
  const block = editor && store.blockAt(editor.document, editor.selection.active);
  if (!editor || !block) {
    void vscode.window.showInformationMessage(`Place the cursor in a timing block to ${what}.`);
    return false;
  }
  const fixes = block.findings.filter((f) => codes.includes(f.code)).flatMap((f) => f.fixes ?? []);
  if (fixes.length === 0) {
    void vscode.window.showInformationMessage(`Nothing to ${what} in ${block.name}.`);
    return false;
  }
  let applied = false;
  // One fix per finding: the first is the one the core prefers.
  for (const fix of fixes.slice(0, 1)) {
    const edit = toWorkspaceEdit(fix);
    if (edit) applied = (await vscode.workspace.applyEdit(edit)) || applied;
  }
  return applied;
}
