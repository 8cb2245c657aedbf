// Problems list: re-checks a document shortly after typing stops, and the documents that include a
// header when the header changes. A result for an outdated version is dropped, never shown.
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { isTimingDocument } from './documents';
import { placedFindings, toDiagnostic } from './findings';
import { guarded } from './guard';
import type { Logger } from './logger';
import { textMapper, type OffsetMapper } from './ranges';
import type { DocumentAnalysis } from '../core/types';

export interface DiagnosticsDeps {
  store: AnalysisStore;
  logger: Logger;
  /** Quiet time after the last keystroke before re-checking (ms). */
  debounceMs?: number;
}

/** The Problems list as other features fill it: an open document, or a file the workspace check read from disk. */
export interface DiagnosticsHandle extends vscode.Disposable {
  publish(doc: vscode.TextDocument): void;
  publishFromDisk(uri: vscode.Uri, mapper: OffsetMapper, analysis: DocumentAnalysis): void;
}

export function registerDiagnostics({ store, logger, debounceMs = 250 }: DiagnosticsDeps): DiagnosticsHandle {
  const collection = vscode.languages.createDiagnosticCollection('tickmark');
  const pending = new Map<string, NodeJS.Timeout>();
  // Files the workspace check reported without opening them: closing their editor re-reads the disk
  // instead of clearing their problems.
  const fromDisk = new Set<string>();

  const publish = (doc: vscode.TextDocument): void => {
    if (doc.isClosed || !isTimingDocument(doc)) return;
    const analysis = store.analysisOf(doc);
    collection.set(doc.uri, placedFindings(analysis).map((placed) => toDiagnostic(doc, placed)));
  };

  const publishFromDisk = (uri: vscode.Uri, mapper: OffsetMapper, analysis: DocumentAnalysis): void => {
    fromDisk.add(uri.toString());
    const target = { uri, positionAt: mapper.positionAt, offsetAt: mapper.offsetAt };
    collection.set(uri, placedFindings(analysis).map((placed) => toDiagnostic(target, placed)));
  };

  const recheckFromDisk = async (doc: vscode.TextDocument): Promise<void> => {
    try {
      const text = new TextDecoder('utf-8').decode(await vscode.workspace.fs.readFile(doc.uri));
      publishFromDisk(doc.uri, textMapper(text), store.analyzeText(doc.uri, text, doc.languageId));
    } catch {
      collection.delete(doc.uri);
    }
  };

  const schedule = (doc: vscode.TextDocument): void => {
    const key = doc.uri.toString();
    clearTimeout(pending.get(key));
    const version = doc.version;
    pending.set(
      key,
      setTimeout(() => {
        pending.delete(key);
        if (doc.version !== version) return;
        try {
          publish(doc);
        } catch (cause) {
          logger.error(`diagnostics for ${key} failed`, cause);
        }
      }, debounceMs),
    );
  };

  const refreshDependants = (doc: vscode.TextDocument): void => {
    const dependants = store.dependantsOf(doc.uri);
    if (dependants.length === 0) return;
    store.invalidate(dependants);
    for (const other of vscode.workspace.textDocuments) {
      if (dependants.includes(other.uri.toString())) schedule(other);
    }
  };

  // Opening a document (and the first check) runs outside any try of the editor's: a fault is logged instead.
  const publishOpened = guarded(logger, (doc) => `diagnostics for ${doc.uri.toString()}`, publish, undefined);
  const publishAll = (): void => vscode.workspace.textDocuments.forEach((doc) => publishOpened(doc));

  // Just after activation, not inside it: activating only registers, the engine loads on this first check.
  const initial = setTimeout(publishAll, 0);
  const subscriptions = vscode.Disposable.from(
    collection,
    vscode.workspace.onDidOpenTextDocument(publishOpened),
    vscode.workspace.onDidChangeTextDocument((event) => {
      if (event.contentChanges.length === 0) return;
      if (isTimingDocument(event.document)) schedule(event.document);
      refreshDependants(event.document);
    }),
    vscode.workspace.onDidSaveTextDocument(refreshDependants),
    vscode.workspace.onDidCloseTextDocument((doc) => {
      clearTimeout(pending.get(doc.uri.toString()));
      pending.delete(doc.uri.toString());
      store.forget(doc.uri);
      if (fromDisk.has(doc.uri.toString()) && doc.uri.scheme === 'file') void recheckFromDisk(doc);
      else collection.delete(doc.uri);
    }),
    store.onDidInvalidate(() => {
      for (const doc of vscode.workspace.textDocuments) if (isTimingDocument(doc)) schedule(doc);
    }),
    { dispose: () => [initial, ...pending.values()].forEach((timer) => clearTimeout(timer)) },
  );
  return { publish, publishFromDisk, dispose: () => subscriptions.dispose() };
}
