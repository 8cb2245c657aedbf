// The server's side of the Language Server Protocol 3.17 where no editor shows it plainly: a request cancelled
// before it ran answers RequestCancelled (-32800), a burst of edits is analysed and published at its last version,
// and a quick fix asked for with a diagnostic of an older version is not offered. A client connection
// (vscode-jsonrpc, the library VS Code's own client is built on) talks to startServer over in-memory streams.
import { strict as assert } from 'assert';
import { PassThrough } from 'node:stream';
import { CancellationTokenSource, createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { startServer } from '../../server/main';

// RC charging law (common practice): t = RC·ln(1/(1 − 0.7)) = 100 kΩ · 1 µF · 1.204 = 120.4 ms, against 100 ms ±5 %.
const note = (claim: string) => ['# delay', '', '```timing start', 'circuit: rc-delay', 'r: 100k', 'c: 1u', 'to: 0.7 * supply', 'supply: 3.3 V', `expect: ${claim}`, '```', ''].join('\n');
const uri = 'untitled:protocol-note.md';

interface Published {
  uri: string;
  version?: number;
  diagnostics: Array<{ code?: string; message: string; range: unknown; data?: unknown }>;
}

describe('language server protocol: cancellation, coalescing, stale fixes', function () {
  this.timeout(30_000);
  let client: MessageConnection;
  const published: Published[] = [];
  const publishedFor = (version: number) =>
    new Promise<Published>((resolve) => {
      const poll = () => {
        const found = published.find((p) => p.uri === uri && p.version === version);
        if (found) resolve(found);
        else setTimeout(poll, 10);
      };
      poll();
    });

  before(async () => {
    const toServer = new PassThrough();
    const toClient = new PassThrough();
    startServer(createConnection(ProposedFeatures.all, new StreamMessageReader(toServer), new StreamMessageWriter(toClient)));
    client = createMessageConnection(new StreamMessageReader(toClient), new StreamMessageWriter(toServer));
    client.onNotification('textDocument/publishDiagnostics', (p: Published) => void published.push(p));
    client.onRequest('client/registerCapability', () => null);
    client.onRequest('workspace/configuration', () => [null]);
    client.listen();
    await client.sendRequest('initialize', { processId: null, rootUri: null, capabilities: {} });
    client.sendNotification('initialized', {});
    client.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'markdown', version: 1, text: note('100 ms ±5%') } });
    await publishedFor(1);
  });
  after(() => client?.dispose());

  it('answers a request cancelled before it ran with RequestCancelled', async () => {
    const source = new CancellationTokenSource();
    const asked = client.sendRequest('textDocument/hover', { textDocument: { uri }, position: { line: 4, character: 1 } }, source.token);
    source.cancel();
    // LSP 3.17: LSPErrorCodes.RequestCancelled = -32800.
    await assert.rejects(asked, (error: { code?: number }) => error.code === -32800);
  });

  it('analyses a burst of edits at its last version and publishes that version', async () => {
    const claims = ['110 ms ±5%', '115 ms ±5%', '118 ms ±5%', '121 ms ±5%'];
    claims.forEach((claim, i) =>
      client.sendNotification('textDocument/didChange', { textDocument: { uri, version: i + 2 }, contentChanges: [{ text: note(claim) }] }));
    const last = await publishedFor(claims.length + 1);
    // 120.4 ms is inside 121 ms ±5 %: the last claim holds, so its version has no mismatch.
    assert.deepEqual(last.diagnostics.filter((d) => d.code === 'expect-mismatch'), []);
    // Every publish names a version the client sent, in order, and none is newer than the last edit.
    const versions = published.filter((p) => p.uri === uri).map((p) => p.version ?? 0);
    assert.deepEqual([...versions].sort((a, b) => a - b), versions);
    assert.ok(versions.every((v) => v >= 1 && v <= claims.length + 1), versions.join(','));
  });

  it('offers the claim fix for a current diagnostic, and nothing for one of an older version', async () => {
    const version = 10;
    client.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ text: note('100 ms ±5%') }] });
    const current = (await publishedFor(version)).diagnostics.find((d) => d.code === 'expect-mismatch');
    assert.ok(current, 'no mismatch for 100 ms ±5 %');
    const ask = (diagnostic: NonNullable<typeof current>) =>
      client.sendRequest('textDocument/codeAction', { textDocument: { uri }, range: diagnostic.range, context: { diagnostics: [diagnostic] } }) as Promise<Array<{ title: string }>>;
    assert.deepEqual((await ask(current)).map((a) => a.title), ['Update the claim to 120.4 ms']);
    client.sendNotification('textDocument/didChange', { textDocument: { uri, version: version + 1 }, contentChanges: [{ text: note('100 ms ±5%') + '\nmore prose\n' }] });
    await publishedFor(version + 1);
    // The diagnostic the client still holds was published for `version`: its fix could edit the wrong text.
    assert.deepEqual(await ask(current), []);
  });
});
