// Which editor documents carry timing blocks, and how they are handed to the core.
import * as vscode from 'vscode';
import type { TextDocumentLike } from '../core/types';

export const timingLanguages: readonly string[] = ['markdown', 'c', 'cpp'];

export const timingSelector: vscode.DocumentSelector = timingLanguages.map((language) => ({ language }));

export function isTimingDocument(doc: vscode.TextDocument): boolean {
  return timingLanguages.includes(doc.languageId);
}

/** The core names files by absolute path (as the CLI does); other schemes keep their URI string. */
export function coreUriOf(uri: vscode.Uri): string {
  return uri.scheme === 'file' ? uri.fsPath : uri.toString();
}

/** Inverse of coreUriOf, also accepting a URI string from the core. */
export function editorUriOf(coreUri: string): vscode.Uri {
  return /^[a-z][a-z0-9+.-]+:/i.test(coreUri) && !/^[a-z]:[\\/]/i.test(coreUri) ? vscode.Uri.parse(coreUri) : vscode.Uri.file(coreUri);
}

export function toDocumentLike(doc: vscode.TextDocument): TextDocumentLike {
  return { uri: coreUriOf(doc.uri), text: doc.getText(), languageId: doc.languageId };
}

export function findOpenDocument(coreUri: string): vscode.TextDocument | undefined {
  const wanted = editorUriOf(coreUri).toString();
  return vscode.workspace.textDocuments.find((doc) => doc.uri.toString() === wanted);
}
