// A lens above each block with its headline numbers. Its command opens the waveform panel in a client that
// has one (the VS Code extension); other clients show the title.
import { headline } from '../../core/present/values';
import type { Feature } from '../context';
import { spanToRange } from '../findings';
import { cancelled } from '../requests';
import { corePathOf } from '../files';
import { showWaveformCommand } from '../protocol';

export const lens: Feature = {
  name: 'code lens',
  capabilities: { codeLensProvider: { resolveProvider: false } },
  register(ctx) {
    ctx.connection.onCodeLens((params, token) => {
      if (token.isCancellationRequested) return cancelled();
      if (!ctx.settings(corePathOf(params.textDocument.uri)).lensEnabled) return [];
      const entry = ctx.store.current(params.textDocument.uri);
      if (!entry) return [];
      return entry.analysis.blocks.map((block) => {
        const title = headline(block);
        return {
          range: spanToRange(entry.doc, block.block.headerSpan),
          // A narrow editor cuts the title off; the tooltip keeps the whole headline.
          command: { title, tooltip: `${title}\nClick to open the waveform of ${block.name}.`, command: showWaveformCommand, arguments: [entry.uri, block.name] },
        };
      });
    });
  },
};
