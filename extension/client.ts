// The seam between the editor features and the language server. Diagnostics, lens, hover, quick fixes,
// completion and go-to-definition come from the server (server/, out/server.js), the same implementation every
// other editor uses, and the analysis runs in the server's process, never on the extension host's thread.
// The client library is required just after activation (extension/clientCore.ts, bundled as out/client.js).
import type * as vscode from 'vscode';
import type { BlockAnswer, CacheStatsAnswer, WorkspaceSummary } from '../server/protocol';
import type * as Core from './clientCore';

/** What the other features ask the server, with VS Code's types on this side. */
export interface ServerRequests {
  /** A block of an open document by name, else the block at a position. */
  block(uri: vscode.Uri, which: { name?: string; position?: vscode.Position }): Promise<BlockAnswer>;
  /** The preferred fix of one of `codes` in the block at `position`, as an edit VS Code applies. */
  blockFix(uri: vscode.Uri, position: vscode.Position, codes: readonly string[]): Promise<{ edit?: vscode.WorkspaceEdit; blockName?: string }>;
  checkWorkspace(token?: vscode.CancellationToken): Promise<WorkspaceSummary>;
  cacheStats(uri: vscode.Uri): Promise<CacheStatsAnswer>;
}

export interface TickmarkClient extends ServerRequests, vscode.Disposable {
  /** Settles when the server has answered `initialize` and the features are registered. */
  readonly ready: Promise<void>;
}

/** How long the client library took to load on the host's thread, once it has (ms). */
export let clientLoadMs: number | undefined;

/** Starts the client on the next turn of the host's event loop; requests wait for it. */
export function startClient(context: vscode.ExtensionContext, output: vscode.LogOutputChannel): TickmarkClient {
  let stopped = false;
  const started = new Promise<TickmarkClient>((resolve, reject) => {
    setImmediate(() => {
      if (stopped) return reject(new Error('the extension was deactivated before its language client started'));
      try {
        const start = performance.now();
        // A plain require so esbuild can point it at out/client.js (scripts/build.mjs); the test bundle resolves the source.
        const core = require('./clientCore') as typeof Core;
        clientLoadMs = performance.now() - start;
        resolve(core.startClient(context, output));
      } catch (cause) {
        reject(cause);
      }
    });
  });
  const ready = started.then((client) => client.ready).catch((cause: unknown) => {
    output.error(`the Tickmark language client did not start: ${cause instanceof Error ? cause.message : String(cause)}`);
  });
  return {
    ready,
    block: async (...args) => (await started).block(...args),
    blockFix: async (...args) => (await started).blockFix(...args),
    checkWorkspace: async (...args) => (await started).checkWorkspace(...args),
    cacheStats: async (...args) => (await started).cacheStats(...args),
    dispose: () => {
      stopped = true;
      void started.then((client) => client.dispose(), () => undefined);
    },
  };
}
