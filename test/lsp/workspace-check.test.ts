// The workspace check through the language server's protocol (vscode-jsonrpc, the library VS Code's client is
// built on): it reads the files `tickmark check` of the same folder reads — the same file types, .gitignore —
// less what the client's `files.exclude` of that folder leaves out, asked for per folder as VS Code answers it.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { PassThrough } from 'node:stream';
import { pathToFileURL } from 'node:url';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { startServer } from '../../server/main';
import { collectFiles } from '../../core/cli/files';

// 16 MHz / 64 / 256 = 976.6 Hz against a 1 kHz claim (timer law): one warning per file.
const stale = ['```timing tick', 'circuit: timer', 'clock: 16 MHz', 'prescaler: 64', 'reload: 255', 'expect: 1 kHz', '```', ''].join('\n');
const staleC = ['// @timing tick', '// circuit: timer', '// clock: 16 MHz', '// prescaler: 64', '// reload: 255', '// expect: 1 kHz', ''].join('\n');

describe('workspace check in the language server', function () {
  this.timeout(30_000);
  let dir: string;
  let client: MessageConnection;
  const published = new Set<string>();

  before(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-wscheck-'));
    const files: Record<string, string> = {
      '.gitignore': 'generated/\n',
      'notes/a.md': stale,
      'src/b.cxx': staleC,
      'vendor/sdk/c.h': staleC,
      'generated/d.md': stale,
      'notes/old/e.md': stale,
    };
    for (const [name, text] of Object.entries(files)) {
      fs.mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
      fs.writeFileSync(path.join(dir, name), text);
    }
    const toServer = new PassThrough();
    const toClient = new PassThrough();
    startServer(createConnection(ProposedFeatures.all, new StreamMessageReader(toServer), new StreamMessageWriter(toClient)));
    client = createMessageConnection(new StreamMessageReader(toClient), new StreamMessageWriter(toServer));
    client.onNotification('textDocument/publishDiagnostics', (p: { uri: string; diagnostics: unknown[] }) => {
      if (p.diagnostics.length) published.add(path.relative(dir, new URL(p.uri).pathname).split(path.sep).join('/'));
    });
    client.onRequest('client/registerCapability', () => null);
    // VS Code answers files.exclude with its glob map; `false` and `when` entries are not exclusions.
    client.onRequest('workspace/configuration', (params: { items: Array<{ section?: string }> }) =>
      params.items.map((item) => (item.section === 'files.exclude' ? { '**/.git': true, 'vendor/**': true, 'notes/old': true, 'src/**': false, '**/*.js': { when: '$(basename).ts' } } : null)),
    );
    client.listen();
    await client.sendRequest('initialize', { processId: null, rootUri: pathToFileURL(dir).href, capabilities: { workspace: { configuration: true } }, workspaceFolders: [{ uri: pathToFileURL(dir).href, name: 'ws' }] });
    client.sendNotification('initialized', {});
  });
  after(() => {
    client?.dispose();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('reads the CLI\'s file types and .gitignore, less files.exclude', async () => {
    const summary = (await client.sendRequest('tickmark/checkWorkspace', {})) as { files: number; warnings: number };
    // `tickmark check .` of the folder: every type (.cxx too), generated/ left out by .gitignore.
    const cli = collectFiles(['.'], dir).files.map((f) => path.relative(dir, f).split(path.sep).join('/'));
    assert.deepEqual(cli, ['notes/a.md', 'notes/old/e.md', 'src/b.cxx', 'vendor/sdk/c.h']);
    assert.equal(summary.files, 2);
    assert.equal(summary.warnings, 2);
    assert.deepEqual([...published].sort(), ['notes/a.md', 'src/b.cxx']);
  });
});
