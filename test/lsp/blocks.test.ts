// Block references through the language server's protocol: a client connection (vscode-jsonrpc, the library VS
// Code's own client is built on) talks to startServer over in-memory streams, as an editor does over stdio.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { PassThrough } from 'node:stream';
import { pathToFileURL } from 'node:url';
import { createMessageConnection, StreamMessageReader, StreamMessageWriter, type MessageConnection } from 'vscode-jsonrpc/node';
import { createConnection, ProposedFeatures } from 'vscode-languageserver/node';
import { startServer } from '../../server/main';

const note = [
  '# clocks', '',
  '```timing xtal', 'circuit: timer', 'clock: 16 MHz ±25 ppm', 'prescaler: 1', 'reload: 0', '```', '',
  '```timing bus', 'circuit: timer', 'clock: @xtal', 'prescaler: 2', 'reload: 0', '```', '',
].join('\n');
const firmware = ['/* @timing console', ' * circuit: baud', ' * clock: @bus.frequency', ' * baud: 115200', ' */', 'int main(void) { return 0; }', ''].join('\n');

describe('block references in the language server', function () {
  this.timeout(30_000);
  let dir: string;
  let client: MessageConnection;
  const diagnostics = new Map<string, Array<{ code?: string; message: string }>>();
  const uri = (name: string) => pathToFileURL(path.join(dir, name)).href;
  const position = (text: string, needle: string, plus = 1) => {
    const offset = text.indexOf(needle) + plus;
    const before = text.slice(0, offset).split('\n');
    return { line: before.length - 1, character: before[before.length - 1].length };
  };

  before(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-refs-'));
    fs.mkdirSync(path.join(dir, 'notes'));
    fs.mkdirSync(path.join(dir, 'src'));
    fs.writeFileSync(path.join(dir, 'notes', 'clocks.md'), note);
    fs.writeFileSync(path.join(dir, 'src', 'uart.c'), firmware);
    const toServer = new PassThrough();
    const toClient = new PassThrough();
    startServer(createConnection(ProposedFeatures.all, new StreamMessageReader(toServer), new StreamMessageWriter(toClient)));
    client = createMessageConnection(new StreamMessageReader(toClient), new StreamMessageWriter(toServer));
    client.onNotification('textDocument/publishDiagnostics', (p: { uri: string; diagnostics: Array<{ code?: string; message: string }> }) => void diagnostics.set(p.uri, p.diagnostics));
    client.onRequest('client/registerCapability', () => null);
    client.onRequest('workspace/configuration', () => [null]);
    client.listen();
    await client.sendRequest('initialize', { processId: null, rootUri: pathToFileURL(dir).href, capabilities: {}, workspaceFolders: [{ uri: pathToFileURL(dir).href, name: 'ws' }] });
    client.sendNotification('initialized', {});
    client.sendNotification('textDocument/didOpen', { textDocument: { uri: uri('src/uart.c'), languageId: 'c', version: 1, text: firmware } });
  });
  after(() => {
    client?.dispose();
    fs.rmSync(dir, { recursive: true, force: true });
  });

  const hover = async () => {
    const answer = (await client.sendRequest('textDocument/hover', { textDocument: { uri: uri('src/uart.c') }, position: position(firmware, 'clock: @bus') })) as { contents: { value: string } };
    return answer.contents.value.replace(/\\(.)/g, '$1');
  };

  it('resolves a reference to a note that is not open, and the hover shows its value and a link to the block', async () => {
    const text = await hover();
    // bus = 16 MHz / 2 = 8 MHz; divisor round(8e6 / (16 · 115200)) = 4; rate 8e6 / 64 = 125000 baud (UART divisor law).
    assert.match(text, /125 kBd|125000/);
    assert.match(text, /`@bus\.frequency` = 8 MHz — \[notes\/clocks\.md:10\]\(file:\/\/[^)]*clocks\.md#L10\)/);
    assert.match(text, /source that two references share/);
  });

  it('goes to the referenced block and finds its references', async () => {
    const [target] = (await client.sendRequest('textDocument/definition', { textDocument: { uri: uri('src/uart.c') }, position: position(firmware, '@bus', 2) })) as Array<{ uri: string; range: { start: { line: number } } }>;
    assert.equal(target.uri, uri('notes/clocks.md'));
    assert.equal(target.range.start.line, 9);
    const found = (await client.sendRequest('textDocument/references', { textDocument: { uri: uri('src/uart.c') }, position: position(firmware, '@bus', 2), context: { includeDeclaration: true } })) as Array<{ uri: string }>;
    assert.deepEqual(found.map((l) => l.uri).sort(), [uri('notes/clocks.md'), uri('src/uart.c')].sort());
  });

  it('completes block names after @ and result names after the dot', async () => {
    const edited = firmware.replace('@bus.frequency', '@bus.');
    client.sendNotification('textDocument/didChange', { textDocument: { uri: uri('src/uart.c'), version: 2 }, contentChanges: [{ text: edited }] });
    const results = (await client.sendRequest('textDocument/completion', { textDocument: { uri: uri('src/uart.c') }, position: position(edited, '@bus.', 5) })) as Array<{ label: string }>;
    assert.ok(['frequency', 'period', 'counts'].every((r) => results.some((i) => i.label === r)), JSON.stringify(results.map((i) => i.label)));
    const names = (await client.sendRequest('textDocument/completion', { textDocument: { uri: uri('src/uart.c') }, position: position(edited, '@bus.', 1) })) as Array<{ label: string }>;
    assert.ok(names.some((i) => i.label === 'xtal') && names.some((i) => i.label === 'bus'), JSON.stringify(names.map((i) => i.label)));
    client.sendNotification('textDocument/didChange', { textDocument: { uri: uri('src/uart.c'), version: 3 }, contentChanges: [{ text: firmware }] });
  });

  it('renames a block with its references in other files', async () => {
    const answer = (await client.sendRequest('textDocument/rename', { textDocument: { uri: uri('src/uart.c') }, position: position(firmware, '@bus', 2), newName: 'apb' })) as { changes: Record<string, Array<{ newText: string }>> };
    assert.deepEqual(Object.keys(answer.changes).sort(), [uri('notes/clocks.md'), uri('src/uart.c')].sort());
    assert.ok(Object.values(answer.changes).flat().every((e) => e.newText === 'apb'));
  });

  it('an edit upstream re-analyses the dependant in another open file', async () => {
    client.sendNotification('textDocument/didOpen', { textDocument: { uri: uri('notes/clocks.md'), languageId: 'markdown', version: 1, text: note } });
    // Prescaler 2 → 4: bus 4 MHz, divisor round(4e6 / 1843200) = 2, rate 4e6 / 32 = 125000 baud still; the bus
    // value in the hover is what moves.
    const edited = note.replace('prescaler: 2', 'prescaler: 4');
    client.sendNotification('textDocument/didChange', { textDocument: { uri: uri('notes/clocks.md'), version: 2 }, contentChanges: [{ text: edited }] });
    await new Promise((resolve) => setTimeout(resolve, 300));
    assert.match(await hover(), /`@bus\.frequency` = 4 MHz/);
  });
});
