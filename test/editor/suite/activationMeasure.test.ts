// A tests entry of its own for scripts/editor-activation.mjs (bench figure 6): in a fresh extension host
// it opens one note, so the host activates the extension, and prints the extension's activation record.
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { ActivationRecord } from '../../../extension/internalCommands';
import { extensionId } from './host';

export const recordPrefix = 'TICKMARK_ACTIVATION ';

export async function run(): Promise<void> {
  const extension = vscode.extensions.getExtension(extensionId);
  if (!extension) throw new Error(`${extensionId} is not loaded in this host`);
  // VS Code API: onLanguage:markdown activation fires when a Markdown document opens.
  await vscode.workspace.openTextDocument(vscode.Uri.file(path.join(extension.extensionPath, 'test', 'editor', 'fixtures', 'notes', 'clock.md')));
  await extension.activate();
  const record = await vscode.commands.executeCommand<ActivationRecord>('tickmark.internal.activationTime');
  if (!record) throw new Error('the extension recorded no activation');
  console.log(recordPrefix + JSON.stringify(record));
}
