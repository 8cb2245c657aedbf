// A lens above each block with its headline numbers; clicking it opens the waveform panel.
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { commandIds } from './commandIds';
import { timingSelector } from './documents';
import { formatHeadline } from './engine';
import { guarded } from './guard';
import type { Logger } from './logger';
import { spanToRange } from './ranges';
import { readSettings } from './settings';

export function registerCodeLens({ store, logger }: { store: AnalysisStore; logger: Logger }): vscode.Disposable {
  const changed = new vscode.EventEmitter<void>();
  const provider: vscode.CodeLensProvider = {
    onDidChangeCodeLenses: changed.event,
    provideCodeLenses: guarded(logger, (doc) => `code lenses for ${doc.uri.toString()}`, (doc: vscode.TextDocument) => {
      if (!readSettings(doc.uri).lensEnabled) return [];
      return store.analysisOf(doc).blocks.map((block) => {
        const headline = formatHeadline(block);
        return new vscode.CodeLens(spanToRange(doc, block.block.headerSpan), {
          title: headline,
          // A narrow editor cuts the title off; the tooltip keeps the whole headline.
          tooltip: `${headline}\nClick to open the waveform of ${block.name}.`,
          command: commandIds.showWaveform,
          arguments: [doc.uri, block.name],
        });
      });
    }, []),
  };
  return vscode.Disposable.from(
    changed,
    vscode.languages.registerCodeLensProvider(timingSelector, provider),
    store.onDidInvalidate(() => changed.fire()),
    vscode.workspace.onDidChangeConfiguration((e) => (e.affectsConfiguration('tickmark.lens') || e.affectsConfiguration('editor.codeLens')) && changed.fire()),
  );
}
