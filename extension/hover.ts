// Hover anywhere on a block: its results, spread and working.
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { timingSelector } from './documents';
import { hoverMarkdown } from './hoverContent';
import { spanToRange } from './ranges';

export function registerHover({ store }: { store: AnalysisStore }): vscode.Disposable {
  return vscode.languages.registerHoverProvider(timingSelector, {
    provideHover(doc, position) {
      const block = store.blockAt(doc, position);
      return block ? new vscode.Hover(hoverMarkdown(block, doc), spanToRange(doc, block.block.span)) : undefined;
    },
  });
}
