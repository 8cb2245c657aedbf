// Helpers for tests in the editor host: the extension under test and its fixture files.
import * as path from 'node:path';
import * as vscode from 'vscode';

export const extensionId = 'tickmark.tickmark';

export async function activeExtension(): Promise<vscode.Extension<unknown>> {
  const extension = vscode.extensions.getExtension(extensionId);
  if (!extension) throw new Error(`${extensionId} is not loaded in this host`);
  await extension.activate();
  // Activation only starts the language server; its features register once it has answered.
  await (extension.exports as { ready?: Promise<void> } | undefined)?.ready;
  return extension;
}

export async function fixtureUri(relative: string): Promise<vscode.Uri> {
  const extension = await activeExtension();
  return vscode.Uri.file(path.join(extension.extensionPath, 'test', 'editor', 'fixtures', relative));
}

/** Polls until `probe` returns a value or the time is up; the editor answers some queries only after a moment. */
export async function eventually<T>(probe: () => Promise<T | undefined> | T | undefined, what: string, ms = 10_000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await probe();
    if (value !== undefined) return value;
    if (Date.now() > until) throw new Error(`timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

/** A file of the demo workspace (the folder the host opens). */
export async function demoUri(relative: string): Promise<vscode.Uri> {
  const extension = await activeExtension();
  return vscode.Uri.file(path.join(extension.extensionPath, 'demo', relative));
}

export async function showDemo(relative: string): Promise<vscode.TextEditor> {
  const doc = await vscode.workspace.openTextDocument(await demoUri(relative));
  return vscode.window.showTextDocument(doc, { preview: false });
}

/** Drops unsaved test edits so the demo files on disk are never changed. */
export async function revert(uri: vscode.Uri): Promise<void> {
  const doc = await vscode.workspace.openTextDocument(uri);
  if (!doc.isDirty) return;
  await vscode.window.showTextDocument(doc, { preview: false });
  await vscode.commands.executeCommand('workbench.action.files.revert');
}

export async function lensTitles(uri: vscode.Uri): Promise<string[]> {
  // The lens query needs a loaded model ("Illegal argument" otherwise).
  await vscode.workspace.openTextDocument(uri);
  const lenses = (await vscode.commands.executeCommand<vscode.CodeLens[]>('vscode.executeCodeLensProvider', uri)) ?? [];
  return lenses.map((lens) => lens.command?.title ?? '');
}

/** Replaces the first occurrence of `from` in the document with `to` (unsaved). */
export async function replaceText(uri: vscode.Uri, from: string, to: string): Promise<void> {
  const doc = await vscode.workspace.openTextDocument(uri);
  const at = doc.getText().indexOf(from);
  if (at < 0) throw new Error(`${from} not found in ${uri.fsPath}`);
  const edit = new vscode.WorkspaceEdit();
  edit.replace(uri, new vscode.Range(doc.positionAt(at), doc.positionAt(at + from.length)), to);
  if (!(await vscode.workspace.applyEdit(edit))) throw new Error('edit was refused');
}

export function tickmarkDiagnostics(uri: vscode.Uri, code?: string): vscode.Diagnostic[] {
  return vscode.languages.getDiagnostics(uri).filter((d) => d.source === 'tickmark' && (code === undefined || d.code === code));
}
