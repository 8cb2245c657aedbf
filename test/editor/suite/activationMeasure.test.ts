// A tests entry of its own for scripts/editor-activation.mjs (bench figure 6): in a fresh extension host
// it opens one note, so the host activates the extension, and prints the extension's activation record
// beside the host's own marks for it.
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { ActivationRecord } from '../../../extension/internalCommands';
import { extensionId } from './host';

export const recordPrefix = 'TICKMARK_ACTIVATION ';

/** The extension host's own timing of our activation, from its performance marks (whole milliseconds). */
export interface HostActivationMarks {
  /** willLoadExtensionCode → didLoadExtensionCode: the host's require() of out/extension.js. */
  loadCodeMs: number;
  /** willActivateExtension → didActivateExtension: activate() called and its result settled. */
  activateMs: number;
}

interface MarkSource {
  getMarks(): Array<{ name: string; startTime: number }>;
}

/**
 * VS Code 1.100 (src/vs/base/common/performance.ts, read from the host's own source map) keeps the extension
 * host's marks on globalThis.MonacoPerformanceMarks, stamped with Date.now(); absent outside a real host.
 */
export function hostActivationMarks(id = extensionId): HostActivationMarks | undefined {
  const source = (globalThis as { MonacoPerformanceMarks?: MarkSource }).MonacoPerformanceMarks;
  if (!source) return undefined;
  const at = new Map(source.getMarks().map((m) => [m.name, m.startTime] as const));
  const span = (from: string, to: string) => {
    const start = at.get(`code/extHost/${from}/${id}`);
    const end = at.get(`code/extHost/${to}/${id}`);
    return start === undefined || end === undefined ? undefined : end - start;
  };
  const loadCodeMs = span('willLoadExtensionCode', 'didLoadExtensionCode');
  const activateMs = span('willActivateExtension', 'didActivateExtension');
  return loadCodeMs === undefined || activateMs === undefined ? undefined : { loadCodeMs, activateMs };
}

export async function run(): Promise<void> {
  const extension = vscode.extensions.getExtension(extensionId);
  if (!extension) throw new Error(`${extensionId} is not loaded in this host`);
  // VS Code API: onLanguage:markdown activation fires when a Markdown document opens.
  await vscode.workspace.openTextDocument(vscode.Uri.file(path.join(extension.extensionPath, 'test', 'editor', 'fixtures', 'notes', 'clock.md')));
  await extension.activate();
  const record = await vscode.commands.executeCommand<ActivationRecord>('tickmark.internal.activationTime');
  if (!record) throw new Error('the extension recorded no activation');
  console.log(recordPrefix + JSON.stringify({ ...record, host: hostActivationMarks() }));
}
