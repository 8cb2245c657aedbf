// Hover anywhere on a block: its results, spread and working.
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { timingSelector } from './documents';
import { guarded } from './guard';
import { hoverMarkdown } from './hoverContent';
import type { Logger } from './logger';
import { spanToRange } from './ranges';

export function registerHover({ store, logger }: { store: AnalysisStore; logger: Logger }): vscode.Disposable {
  return vscode.languages.registerHoverProvider(timingSelector, {
    provideHover: guarded(logger, (doc) => `hover in ${doc.uri.toString()}`, (doc: vscode.TextDocument, position: vscode.Position) => {
      const block = store.blockAt(doc, position);
      return block ? new vscode.Hover(hoverMarkdown(block, doc), spanToRange(doc, block.block.span)) : undefined;
    }, undefined),
  });
}
