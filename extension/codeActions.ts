// Quick fixes where the core is certain: a register constant that meets `expect`, a solved `?`, a stale claim.
import * as vscode from 'vscode';
import type { AnalysisStore } from './analysisStore';
import { timingSelector } from './documents';
import { toWorkspaceEdit } from './edits';
import { placedFindings, toDiagnostic } from './findings';
import { rangeToSpan, spansOverlap } from './ranges';

export function registerCodeActions({ store }: { store: AnalysisStore }): vscode.Disposable {
  const provider: vscode.CodeActionProvider = {
    provideCodeActions(doc, range) {
      const wanted = rangeToSpan(doc, range);
      const actions: vscode.CodeAction[] = [];
      for (const placed of placedFindings(store.analysisOf(doc))) {
        const diagnostic = toDiagnostic(doc, placed);
        if (!spansOverlap(rangeToSpan(doc, diagnostic.range), wanted)) continue;
        for (const fix of placed.finding.fixes ?? []) {
          const edit = toWorkspaceEdit(fix);
          if (!edit) continue;
          const action = new vscode.CodeAction(fix.title, vscode.CodeActionKind.QuickFix);
          action.edit = edit;
          action.diagnostics = [diagnostic];
          action.isPreferred = placed.finding.fixes?.length === 1;
          actions.push(action);
        }
      }
      return actions;
    },
  };
  return vscode.languages.registerCodeActionsProvider(timingSelector, provider, {
    providedCodeActionKinds: [vscode.CodeActionKind.QuickFix],
  });
}
