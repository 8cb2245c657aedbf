// Hover anywhere on a block: its results, spread, working, assumptions and cautions (core/present).
import { hoverMarkdown } from '../../core/present/hover';
import { corePathOf, folderOf } from '../files';
import type { Feature } from '../context';
import { spanToRange } from '../findings';
import { cancelled } from '../requests';

export const hover: Feature = {
  name: 'hover',
  capabilities: { hoverProvider: true },
  register(ctx) {
    ctx.connection.onHover((params, token) => {
      if (token.isCancellationRequested) return cancelled();
      const doc = ctx.documents.get(params.textDocument.uri);
      if (!doc) return null;
      const found = ctx.store.blockAt(doc.uri, doc.offsetAt(params.position));
      if (!found) return null;
      const folder = folderOf(corePathOf(doc.uri), ctx.roots());
      // The core escapes all document text; the Markdown holds no HTML and no command links.
      return {
        contents: { kind: 'markdown', value: hoverMarkdown(found.block, { relativeTo: folder, linkTo: (file, line) => `${ctx.reader.uriOf(file)}#L${line}` }) },
        range: spanToRange(found.entry.doc, found.block.block.span),
      };
    });
  },
};
