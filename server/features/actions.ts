// Quick fixes where the core is certain (a register constant that meets `expect`, a solved `?`, a stale claim),
// matched to the diagnostics the client passes back: their `data` names the analysed version and the finding,
// so nothing is analysed or read again. A diagnostic of an older version is dropped (the client asks again).
import { CodeActionKind, type CodeAction, type Diagnostic, type TextEdit, type WorkspaceEdit } from 'vscode-languageserver';
import type { Fix } from '../../core/types';
import type { Feature, ServerContext } from '../context';
import { spanToRange, type DiagnosticData, type PlacedFinding } from '../findings';
import { cancelled } from '../requests';
import type { Analysed } from '../store';

export const actions: Feature = {
  name: 'quick fixes',
  capabilities: { codeActionProvider: { codeActionKinds: [CodeActionKind.QuickFix] } },
  register(ctx) {
    ctx.connection.onCodeAction((params, token) => {
      if (token.isCancellationRequested) return cancelled();
      const only = params.context.only;
      if (only && !only.some((kind) => kind === CodeActionKind.QuickFix || CodeActionKind.QuickFix.startsWith(kind + '.'))) return [];
      const entry = ctx.store.current(params.textDocument.uri);
      if (!entry) return [];
      const out: CodeAction[] = [];
      for (const diagnostic of params.context.diagnostics) {
        const placed = findingOf(entry, diagnostic);
        for (const fix of placed?.finding.fixes ?? []) {
          const edit = workspaceEdit(ctx, fix);
          if (!edit) continue;
          out.push({ title: fix.title, kind: CodeActionKind.QuickFix, diagnostics: [diagnostic], edit, isPreferred: placed!.finding.fixes!.length === 1 });
        }
      }
      return out;
    });
  },
};

function isData(data: unknown): data is DiagnosticData {
  const d = data as Partial<DiagnosticData> | undefined;
  return typeof d?.version === 'number' && typeof d.index === 'number';
}

/** The finding behind a diagnostic of the current analysis; a client that drops `data` is matched by place and text. */
function findingOf(entry: Analysed, diagnostic: Diagnostic): PlacedFinding | undefined {
  if (diagnostic.source !== undefined && diagnostic.source !== 'tickmark') return undefined;
  if (isData(diagnostic.data)) return diagnostic.data.version === entry.version ? entry.placed[diagnostic.data.index] : undefined;
  const start = entry.doc.offsetAt(diagnostic.range.start);
  return entry.placed.find(({ finding, block }) => {
    const at = finding.uri !== undefined && finding.uri !== entry.analysis.uri ? (block?.block.headerSpan.start ?? 0) : finding.span.start;
    return finding.code === diagnostic.code && finding.message === diagnostic.message && at === start;
  });
}

/** A core fix (offset edits, maybe in a header) as a workspace edit; undefined when a file it edits cannot be read. */
export function workspaceEdit(ctx: ServerContext, fix: Fix): WorkspaceEdit | undefined {
  const changes: Record<string, TextEdit[]> = {};
  for (const change of fix.edits) {
    const mapper = ctx.reader.mapperOf(change.uri);
    if (!mapper) return undefined;
    const uri = ctx.reader.uriOf(change.uri);
    (changes[uri] ??= []).push({ range: spanToRange(mapper, change.span), newText: change.newText });
  }
  return { changes };
}
