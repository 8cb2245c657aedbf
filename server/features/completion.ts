// Completion inside timing blocks (Markdown fences and C @timing comments): the core's entries for keys,
// circuits and words, then whatever other features contribute at the place (server/context.ts).
import { CompletionItemKind, type CompletionItem } from 'vscode-languageserver';
import { blockCompletions, type CompletionEntry } from '../../core/present/completion';
import { corePathOf } from '../files';
import type { At, Feature, ServerContext } from '../context';
import { spanToRange } from '../findings';

const kinds: Record<CompletionEntry['kind'], CompletionItemKind> = {
  circuit: CompletionItemKind.Class,
  key: CompletionItemKind.Property,
  meta: CompletionItemKind.Keyword,
  word: CompletionItemKind.EnumMember,
};

function coreEntries(ctx: ServerContext, at: At): CompletionItem[] {
  const entries = blockCompletions({ uri: corePathOf(at.uri), text: at.doc.getText(), languageId: at.doc.languageId }, at.offset);
  return entries.map((entry, index) => {
    const item: CompletionItem = {
      label: entry.label,
      labelDetails: { description: entry.detail },
      kind: kinds[entry.kind],
      detail: entry.detail,
      documentation: { kind: 'markdown', value: entry.documentation },
      filterText: entry.filterText,
      textEdit: { range: spanToRange(at.doc, entry.replace), newText: entry.insertText },
      // The core lists entries in the parameter table's order; keep it over the editor's alphabetical one.
      sortText: String(index).padStart(3, '0'),
    };
    if (entry.offersWords && ctx.client.retriggerCommand) item.command = { title: 'Suggest values', command: ctx.client.retriggerCommand };
    return item;
  });
}

export const completion: Feature = {
  name: 'completion',
  capabilities: { completionProvider: { triggerCharacters: [':', '@', '.'] } },
  contribute(into) {
    into.completion.push(coreEntries);
  },
};
