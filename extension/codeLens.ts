// A lens above each block with its headline numbers; clicking it opens the waveform panel.
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { commandIds } from './commandIds';
import { timingSelector } from './documents';
import { formatHeadline } from './engine';
import { spanToRange } from './ranges';
import { readSettings } from './settings';

export function registerCodeLens({ store }: { store: AnalysisStore }): vscode.Disposable {
  const changed = new vscode.EventEmitter<void>();
  const provider: vscode.CodeLensProvider = {
    onDidChangeCodeLenses: changed.event,
    provideCodeLenses(doc) {
      if (!readSettings(doc.uri).lensEnabled) return [];
      return store.analysisOf(doc).blocks.map(
        (block) =>
          new vscode.CodeLens(spanToRange(doc, block.block.headerSpan), {
            title: formatHeadline(block),
            tooltip: `Open the waveform of ${block.name}`,
            command: commandIds.showWaveform,
            arguments: [doc.uri, block.name],
          }),
      );
    },
  };
  return vscode.Disposable.from(
    changed,
    vscode.languages.registerCodeLensProvider(timingSelector, provider),
    store.onDidInvalidate(() => changed.fire()),
    vscode.workspace.onDidChangeConfiguration((e) => (e.affectsConfiguration('tickmark.lens') || e.affectsConfiguration('editor.codeLens')) && changed.fire()),
  );
}
