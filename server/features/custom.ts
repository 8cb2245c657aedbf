// The server's own requests (server/protocol.ts): a block's analysis for the waveform panel, the preferred fix
// of a kind in the block under the cursor, the workspace check, and cache figures for tests and the bench.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { collectFiles, enabledGlobs, languageOf } from '../../core/cli/files';
import type { Feature, ServerContext } from '../context';
import { corePathOf, folderOf } from '../files';
import { placedFindings, type PlacedFinding } from '../findings';
import {
  blockFixRequest, blockRequest, cacheStatsRequest, checkWorkspaceRequest,
  type BlockAnswer, type BlockFixAnswer, type BlockFixParams, type BlockParams, type CacheStatsAnswer, type WorkspaceSummary,
} from '../protocol';
import { cancelled } from '../requests';
import { workspaceEdit } from './actions';

export const custom: Feature = {
  name: 'tickmark requests',
  register(ctx) {
    const { connection } = ctx;
    connection.onRequest(blockRequest, (params: BlockParams, token): BlockAnswer | ReturnType<typeof cancelled> => {
      if (token.isCancellationRequested) return cancelled();
      const entry = ctx.store.current(params.uri);
      if (!entry) return { names: [] };
      const blocks = entry.analysis.blocks;
      const offset = params.position ? entry.doc.offsetAt(params.position) : undefined;
      const block =
        (params.name !== undefined ? blocks.find((b) => b.name === params.name) : undefined) ??
        (offset !== undefined ? blocks.find((b) => offset >= b.block.span.start && offset <= b.block.span.end) : undefined);
      return { block, names: blocks.map((b) => b.name) };
    });

    connection.onRequest(blockFixRequest, (params: BlockFixParams, token): BlockFixAnswer | ReturnType<typeof cancelled> => {
      if (token.isCancellationRequested) return cancelled();
      const doc = ctx.documents.get(params.uri);
      if (!doc) return {};
      const offset = doc.offsetAt(params.position);
      const found = ctx.store.blockAt(params.uri, offset);
      if (!found) return {};
      const { block, entry } = found;
      const candidates = block.findings.filter((f) => params.codes.includes(f.code) && (f.fixes?.length ?? 0) > 0);
      // The finding under the cursor, else one on the cursor's line, else the block's first.
      const own = (f: (typeof candidates)[number]) => f.uri === undefined || f.uri === entry.analysis.uri;
      const chosen =
        candidates.find((f) => own(f) && offset >= f.span.start && offset <= f.span.end) ??
        candidates.find((f) => own(f) && entry.doc.positionAt(f.span.start).line === params.position.line) ??
        candidates[0];
      // The first fix is the one the core prefers.
      const fix = chosen?.fixes?.[0];
      return { blockName: block.name, edit: fix ? workspaceEdit(ctx, fix) : undefined };
    });

    connection.onRequest(cacheStatsRequest, (params: { uri: string }): CacheStatsAnswer => ctx.store.cacheStats(params.uri) ?? null);

    const fromDisk = new Set<string>();
    connection.onRequest(checkWorkspaceRequest, async (_params: unknown, token): Promise<WorkspaceSummary> => {
      // The check runs with the settings as they are now (a setting changed a moment ago counts).
      await ctx.refreshSettings();
      return checkWorkspace(ctx, fromDisk, () => token.isCancellationRequested, await filesExclude(ctx));
    });
    // A file the check reported and an editor then closed keeps its problems from disk.
    ctx.documents.onDidClose((e) => {
      if (fromDisk.has(e.document.uri)) recheckFromDisk(ctx, e.document.uri);
    });
  },
};

function publishFromDisk(ctx: ServerContext, uri: string, file: string, text: string): { blocks: number; placed: PlacedFinding[] } {
  const analysis = ctx.store.analyseText(file, text, languageOf(file));
  const placed = placedFindings(analysis);
  const mapper = TextDocument.create(uri, languageOf(file), 0, text);
  ctx.connection.sendDiagnostics({ uri, diagnostics: ctx.store.diagnosticsOf(mapper, file, placed, undefined) });
  return { blocks: analysis.blocks.length, placed };
}

function recheckFromDisk(ctx: ServerContext, uri: string): void {
  const file = corePathOf(uri);
  try {
    publishFromDisk(ctx, uri, file, fs.readFileSync(file, 'utf8'));
  } catch {
    ctx.connection.sendDiagnostics({ uri, diagnostics: [] });
  }
}

/** Each workspace folder's `files.exclude` (the client's setting, per folder); none when the client has no answer. */
async function filesExclude(ctx: ServerContext): Promise<Array<{ folder: string; globs: string[] }>> {
  const roots = ctx.roots();
  try {
    const settings: unknown[] = await ctx.connection.workspace.getConfiguration(roots.map((root) => ({ section: 'files.exclude', scopeUri: pathToFileURL(root).href })));
    return roots.map((folder, i) => ({ folder, globs: enabledGlobs(settings[i]) }));
  } catch {
    return [];
  }
}

function checkWorkspace(ctx: ServerContext, fromDisk: Set<string>, stop: () => boolean, excludeIn: Array<{ folder: string; globs: string[] }> = []): WorkspaceSummary {
  const summary: WorkspaceSummary = { files: 0, blocks: 0, errors: 0, warnings: 0, skipped: [] };
  const roots = ctx.roots();
  const relative = (file: string) => path.relative(folderOf(file, roots) ?? '', file).split(path.sep).join('/');
  // The same files a `tickmark check` of the folders reads (types, .gitignore), less the editor's files.exclude.
  for (const file of collectFiles(roots, roots[0] ?? process.cwd(), { excludeIn }).files) {
    if (stop()) break;
    const uri = ctx.reader.uriOf(file);
    const open = ctx.documents.get(uri);
    // Each file under its own folder's size limit (a multi-root workspace may set it per folder).
    const limit = ctx.settings(file).maxSizeKB * 1024;
    let found: { blocks: number; placed: PlacedFinding[] };
    if (open && ctx.store.openUris().includes(uri)) {
      // An open editor shows its live analysis, and its one file-too-large notice.
      if (Buffer.byteLength(open.getText(), 'utf8') > limit) {
        summary.skipped.push(relative(file));
        ctx.store.current(uri);
        continue;
      }
      const entry = ctx.store.current(uri);
      found = { blocks: entry?.analysis.blocks.length ?? 0, placed: entry?.placed ?? [] };
    } else {
      let size = 0;
      try {
        size = fs.statSync(file).size;
      } catch {
        continue;
      }
      if (size > limit) {
        summary.skipped.push(relative(file));
        continue;
      }
      let text: string;
      try {
        text = fs.readFileSync(file, 'utf8');
      } catch {
        continue;
      }
      found = publishFromDisk(ctx, uri, file, text);
      fromDisk.add(uri);
    }
    summary.files++;
    summary.blocks += found.blocks;
    for (const { finding } of found.placed) {
      if (finding.severity === 'error') summary.errors++;
      else if (finding.severity === 'warning') summary.warnings++;
    }
  }
  return summary;
}
