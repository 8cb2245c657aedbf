// The hover's Markdown comes from the core (the CLI and preview share it); here it only becomes an
// editor MarkdownString with identifier locations shown relative to the workspace folder.
import * as vscode from 'vscode';
import type { BlockAnalysis } from '../core/types';
import { blockHoverMarkdown } from './engine';

export function hoverMarkdown(block: BlockAnalysis, doc: vscode.TextDocument): vscode.MarkdownString {
  const folder = vscode.workspace.getWorkspaceFolder(doc.uri);
  const relativeTo = folder?.uri.scheme === 'file' ? folder.uri.fsPath : undefined;
  // The core escapes all document text; no HTML and no command links are enabled.
  return new vscode.MarkdownString(blockHoverMarkdown(block, { relativeTo }), true);
}
