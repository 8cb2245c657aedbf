// Applies the core's fixes of one kind to the block under the cursor (solve a `?`, snap to a series).
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { toWorkspaceEdit } from './edits';
import { spanContains } from './ranges';

export async function applyBlockFixes(store: AnalysisStore, codes: readonly string[], what: string): Promise<boolean> {
  const editor = vscode.window.activeTextEditor;
  const block = editor && store.blockAt(editor.document, editor.selection.active);
  if (!editor || !block) {
    void vscode.window.showInformationMessage(`Place the cursor in a timing block to ${what}.`);
    return false;
  }
  const offset = editor.document.offsetAt(editor.selection.active);
  const line = editor.selection.active.line;
  const candidates = block.findings.filter((f) => codes.includes(f.code) && (f.fixes?.length ?? 0) > 0);
  // The finding under the cursor, else one on the cursor's line, else the block's first.
  const chosen =
    candidates.find((f) => f.uri === undefined && spanContains(f.span, offset)) ??
    candidates.find((f) => f.uri === undefined && editor.document.positionAt(f.span.start).line === line) ??
    candidates[0];
  const fixes = chosen?.fixes ?? [];
  if (fixes.length === 0) {
    void vscode.window.showInformationMessage(`Nothing to ${what} in ${block.name}.`);
    return false;
  }
  let applied = false;
  // The first fix is the one the core prefers.
  for (const fix of fixes.slice(0, 1)) {
    const edit = toWorkspaceEdit(fix);
    if (edit) applied = (await vscode.workspace.applyEdit(edit)) || applied;
  }
  return applied;
}
