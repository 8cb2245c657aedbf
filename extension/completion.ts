// Completion inside timing blocks (Markdown fences and C @timing comments); the entries are the core's.
import * as vscode from 'vscode';
import { timingSelector, toDocumentLike } from './documents';
import { blockCompletions, type CompletionEntry } from './engine';
import { guarded } from './guard';
import type { Logger } from './logger';
import { spanToRange } from './ranges';

const kinds: Record<CompletionEntry['kind'], vscode.CompletionItemKind> = {
  circuit: vscode.CompletionItemKind.Class,
  key: vscode.CompletionItemKind.Property,
  meta: vscode.CompletionItemKind.Keyword,
  word: vscode.CompletionItemKind.EnumMember,
};

export function registerCompletion({ logger }: { logger: Logger }): vscode.Disposable {
  const provider: vscode.CompletionItemProvider = {
    provideCompletionItems: guarded(logger, (doc) => `completion in ${doc.uri.toString()}`, (doc: vscode.TextDocument, position: vscode.Position) => {
      const entries = blockCompletions(toDocumentLike(doc), doc.offsetAt(position));
      return entries.map((entry, index) => toItem(doc, entry, index));
    }, []),
  };
  return vscode.languages.registerCompletionItemProvider(timingSelector, provider, ':');
}

function toItem(doc: vscode.TextDocument, entry: CompletionEntry, index: number): vscode.CompletionItem {
  const item = new vscode.CompletionItem({ label: entry.label, description: entry.detail }, kinds[entry.kind]);
  item.detail = entry.detail;
  item.documentation = new vscode.MarkdownString(entry.documentation);
  item.insertText = entry.insertText;
  item.filterText = entry.filterText;
  item.range = spanToRange(doc, entry.replace);
  // The core lists entries in the parameter table's order; keep it over the editor's alphabetical one.
  item.sortText = String(index).padStart(3, '0');
  if (entry.offersWords) item.command = { title: 'Suggest values', command: 'editor.action.triggerSuggest' };
  return item;
}
