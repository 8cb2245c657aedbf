// Helpers for tests in the editor host: the extension under test and its fixture files.
import * as path from 'node:path';
import * as vscode from 'vscode';

export const extensionId = 'tickmark.tickmark';

export async function activeExtension(): Promise<vscode.Extension<unknown>> {
  const extension = vscode.extensions.getExtension(extensionId);
  if (!extension) throw new Error(`${extensionId} is not loaded in this host`);
  await extension.activate();
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
