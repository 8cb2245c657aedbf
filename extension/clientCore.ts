// The language client (vscode-languageclient) that starts the server (server/, bundled as out/server.js). esbuild
// bundles this module as out/client.js apart from out/extension.js; extension/client.ts loads it just after
// activation, so activating parses none of the client library. Only the client's wiring belongs here.
import * as vscode from 'vscode';
import { LanguageClient, RevealOutputChannelOn, TransportKind, type LanguageClientOptions, type ServerOptions } from 'vscode-languageclient/node';
import {
  blockFixRequest, blockRequest, cacheStatsRequest, checkWorkspaceRequest,
  type BlockAnswer, type BlockFixAnswer, type CacheStatsAnswer, type WorkspaceSummary,
} from '../server/protocol';
import type { TickmarkClient } from './client';
import { timingLanguages } from './documents';

export function startClient(context: vscode.ExtensionContext, output: vscode.LogOutputChannel): TickmarkClient {
  const module = vscode.Uri.joinPath(context.extensionUri, 'out', 'server.js').fsPath;
  const serverOptions: ServerOptions = {
    run: { module, transport: TransportKind.ipc },
    debug: { module, transport: TransportKind.ipc, options: { execArgv: ['--nolazy', '--enable-source-maps'] } },
  };
  const clientOptions: LanguageClientOptions = {
    // Any scheme: untitled notes are analysed too (their firmware: and #include paths cannot resolve).
    documentSelector: timingLanguages.map((language) => ({ language })),
    initializationOptions: {
      // The settings as they are now, so the first analysis needs no round trip; later ones are pulled.
      tickmark: JSON.parse(JSON.stringify(vscode.workspace.getConfiguration('tickmark'))) as unknown,
      retriggerCommand: 'editor.action.triggerSuggest',
    },
    outputChannel: output,
    // A fault is logged to the Tickmark output, not shown as a notification per request.
    revealOutputChannelOn: RevealOutputChannelOn.Never,
  };
  const client = new LanguageClient('tickmark', 'Tickmark', serverOptions, clientOptions);
  const ready = client.start().catch((cause: unknown) => {
    output.error(`the Tickmark language server did not start: ${cause instanceof Error ? cause.message : String(cause)}`);
  });
  const c2p = client.code2ProtocolConverter;
  const p2c = client.protocol2CodeConverter;
  const position = (p: vscode.Position) => ({ line: p.line, character: p.character });
  return {
    ready,
    async block(uri, which) {
      await ready;
      const answer = await client.sendRequest<BlockAnswer>(blockRequest, { uri: c2p.asUri(uri), name: which.name, position: which.position && position(which.position) });
      return answer ?? { names: [] };
    },
    async blockFix(uri, at, codes) {
      await ready;
      const answer = await client.sendRequest<BlockFixAnswer>(blockFixRequest, { uri: c2p.asUri(uri), position: position(at), codes: [...codes] });
      return { blockName: answer?.blockName, edit: answer?.edit ? await p2c.asWorkspaceEdit(answer.edit) : undefined };
    },
    async checkWorkspace(token) {
      await ready;
      return client.sendRequest<WorkspaceSummary>(checkWorkspaceRequest, {}, token);
    },
    async cacheStats(uri) {
      await ready;
      return client.sendRequest<CacheStatsAnswer>(cacheStatsRequest, { uri: c2p.asUri(uri) });
    },
    dispose: () => void client.stop().catch(() => undefined),
  };
}
