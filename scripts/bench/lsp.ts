// Figure 7: re-analysis through the Language Server Protocol, timed from the client's side: an edit sent as
// didChange until the publishDiagnostics for that version arrives. A C file that includes about 3.5 MB of
// generated device headers, and the 5k-line note of figure 2; each beside its cold first analysis.
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import {
  createProtocolConnection, StreamMessageReader, StreamMessageWriter, type ProtocolConnection, type PublishDiagnosticsParams,
} from 'vscode-languageserver-protocol/node';
import { cacheStatsRequest, type CacheStatsAnswer } from '../../server/protocol';
import { generateNote } from './generate';
import { median, ms, type Row } from './measure';

const root = path.resolve(__dirname, '..', '..');

/**
 * Invented device headers of about `bytes` in total, shaped like a vendor's: per peripheral instance a register
 * block typedef, base addresses, and bit position/mask pairs for every field, behind include guards.
 */
export function generateDeviceHeaders(bytes: number): { files: Record<string, string>; main: string } {
  const files: Record<string, string> = {};
  const parts: string[] = [];
  let total = 0;
  for (let part = 0; total < bytes; part++) {
    const name = `periph_${part}.h`;
    const guard = `BENCH_PERIPH_${part}_H`;
    const lines = [`/* generated peripheral header ${part} for the benchmark */`, `#ifndef ${guard}`, `#define ${guard}`, ''];
    for (let unit = 0; unit < 40; unit++) {
      const block = `UNIT${part}_${unit}`;
      lines.push(`typedef struct {`, ...Array.from({ length: 12 }, (_, r) => `  volatile unsigned int REG${r}; /* register ${r} */`), `} ${block}_Regs;`);
      lines.push(`#define ${block}_BASE (0x40000000UL + ${part * 0x10000 + unit * 0x400}UL)`, `#define ${block} ((${block}_Regs *) ${block}_BASE)`);
      for (let field = 0; field < 24; field++) {
        const f = `${block}_REG${field % 12}_F${field}`;
        lines.push(`#define ${f}_Pos (${field % 32}U)`, `#define ${f}_Msk (0x${(1 + (field % 7)).toString(16)}UL << ${f}_Pos)`, `#define ${f} ${f}_Msk`);
      }
      lines.push('');
    }
    lines.push(`#endif /* ${guard} */`, '');
    const text = lines.join('\n');
    files[name] = text;
    parts.push(name);
    total += text.length;
  }
  const main = ['/* generated device header: includes every peripheral */', '#ifndef BENCH_DEVICE_H', '#define BENCH_DEVICE_H',
    '#define BENCH_CORE_CLOCK_HZ 64000000UL', '#define BENCH_BUS_DIV 2u', ...parts.map((p) => `#include "${p}"`), '#endif', ''].join('\n');
  files['device.h'] = main;
  return { files, main: 'device.h' };
}

/** A C file of ~600 lines with a handful of timer blocks reading the device header's constants. */
function firmwareSource(): string {
  const out = ['/* generated firmware for the protocol benchmark */', '#include "device.h"', '', '#define TICK_DIV 64u', '#define TICK_TOP (BENCH_CORE_CLOCK_HZ / BENCH_BUS_DIV / TICK_DIV / 1000u - 1u)', ''];
  for (let i = 0; i < 8; i++) {
    out.push(`/* @timing tick-${i}`, ' * circuit: timer', ' * clock: BENCH_CORE_CLOCK_HZ / BENCH_BUS_DIV', ' * prescaler: TICK_DIV', ' * reload: TICK_TOP', ` * expect: 1 kHz ±1%`, ' */');
    out.push(`void task${i}(void)`, '{');
    for (let k = 0; k < 60; k++) out.push(`    counter${i} += ${k}; /* work ${k} */`);
    out.push('}', '');
  }
  return out.join('\n') + '\n';
}

interface Session {
  connection: ProtocolConnection;
  child: ChildProcess;
  published(uri: string, version: number): Promise<number>;
  stop(): Promise<void>;
}

async function startSession(workspace: string): Promise<Session> {
  const child = spawn(process.execPath, [path.join(root, 'out', 'server.js'), '--stdio'], { stdio: ['pipe', 'pipe', 'inherit'] });
  const connection = createProtocolConnection(new StreamMessageReader(child.stdout!), new StreamMessageWriter(child.stdin!));
  const waiting = new Map<string, { version: number; resolve: (at: number) => void }>();
  connection.onNotification('textDocument/publishDiagnostics', (params: PublishDiagnosticsParams) => {
    const wanted = waiting.get(params.uri);
    if (wanted && params.version === wanted.version) {
      waiting.delete(params.uri);
      wanted.resolve(performance.now());
    }
  });
  // The server asks for settings and registrations; a bench client answers them plainly.
  connection.onRequest('workspace/configuration', (params: { items: unknown[] }) => params.items.map(() => null));
  connection.onRequest('client/registerCapability', () => null);
  connection.listen();
  const folder = pathToFileURL(workspace).href;
  await connection.sendRequest('initialize', {
    processId: process.pid, rootUri: folder, workspaceFolders: [{ uri: folder, name: 'bench' }],
    capabilities: { workspace: { configuration: true } },
  });
  connection.sendNotification('initialized', {});
  return {
    connection,
    child,
    published: (uri, version) => new Promise((resolve) => waiting.set(uri, { version, resolve })),
    async stop() {
      await connection.sendRequest('shutdown');
      connection.sendNotification('exit');
      connection.dispose();
      await new Promise((resolve) => child.once('exit', resolve));
    },
  };
}

/** Cold analysis, then `runs` one-character edits at offsets `at(i)`, each timed to its publish. */
async function timeEdits(session: Session, uri: string, languageId: string, text: string, edits: Record<string, (i: number, text: string) => number>, runs: number) {
  const { connection } = session;
  let version = 1;
  const start = performance.now();
  const opened = session.published(uri, version);
  connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId, version, text } });
  const cold = (await opened) - start;
  const results: Record<string, { median: number; server: number }> = {};
  const inServer: number[] = [];
  let tables: { built: number; reused: number } | undefined;
  for (const [label, offsetOf] of Object.entries(edits)) {
    const times: number[] = [];
    for (let i = 0; i < runs + 1; i++) {
      const offset = offsetOf(i, text);
      const old = text[offset];
      const next = /[0-8]/.test(old) ? String(Number(old) + 1) : old === '9' ? '1' : old === 'a' ? 'b' : 'a';
      text = text.slice(0, offset) + next + text.slice(offset + 1);
      const position = positionAt(text, offset);
      version++;
      const before = performance.now();
      const done = session.published(uri, version);
      connection.sendNotification('textDocument/didChange', {
        textDocument: { uri, version },
        contentChanges: [{ range: { start: position, end: { line: position.line, character: position.character + 1 } }, text: next }],
      });
      const at = await done;
      // The first edit of each kind warms the path; it is not counted.
      if (i > 0) {
        times.push(at - before);
        const stats = await connection.sendRequest<CacheStatsAnswer>(cacheStatsRequest, { uri });
        inServer.push(stats?.analysisMs ?? NaN);
        if (stats?.tables) tables = stats.tables;
      }
    }
    results[label] = { median: median(times), server: median(inServer) };
    inServer.length = 0;
  }
  return { cold, results, tables };
}

function positionAt(text: string, offset: number): { line: number; character: number } {
  let line = 0;
  let start = 0;
  for (let i = text.indexOf('\n'); i >= 0 && i < offset; i = text.indexOf('\n', i + 1)) {
    line++;
    start = i + 1;
  }
  return { line, character: offset - start };
}

export async function protocolEdits(): Promise<Row[]> {
  if (!fs.existsSync(path.join(root, 'out', 'server.js'))) {
    execFileSync(process.execPath, [path.join(root, 'scripts', 'build.mjs')], { cwd: root, stdio: 'pipe' });
  }
  const workspace = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-bench-lsp-'));
  try {
    const headers = generateDeviceHeaders(3.5e6);
    for (const [name, text] of Object.entries(headers.files)) fs.writeFileSync(path.join(workspace, name), text);
    const headerBytes = Object.values(headers.files).reduce((sum, t) => sum + Buffer.byteLength(t), 0);
    const cText = firmwareSource();
    const cFile = path.join(workspace, 'firmware.c');
    fs.writeFileSync(cFile, cText);
    const noteText = generateNote(5_000, 100);
    const noteFile = path.join(workspace, 'note.md');
    fs.writeFileSync(noteFile, noteText);
    const session = await startSession(workspace);
    try {
      const runs = 15;
      const c = await timeEdits(session, pathToFileURL(cFile).href, 'c', cText, {
        // A digit inside a function body, far from any block.
        outside: (i, text) => text.indexOf(`counter${i % 8} += 3`) + `counter${i % 8} += `.length,
        // The first digit of a claim: `expect: 1 kHz` in one of the blocks.
        inside: (i, text) => text.indexOf(' * expect: ', text.indexOf(`@timing tick-${i % 8}\n`)) + ' * expect: '.length,
      }, runs);
      const note = await timeEdits(session, pathToFileURL(noteFile).href, 'markdown', noteText, {
        outside: (i, text) => text.indexOf('Paragraph line 3', text.indexOf(`stage-${(i * 37) % 100}\n`)) + 'Paragraph line '.length,
        inside: (i, text) => text.indexOf('r: ', text.indexOf(`stage-${(i * 37) % 100}\n`)) + 3,
      }, runs);
      const size = `${(headerBytes / 1e6).toFixed(2)} MB of headers`;
      const row = (figure: string, r: { median: number; server: number }, target: number) =>
        ({ figure, value: ms(r.median), target: `< ${target} ms`, met: r.median < target, note: `median of ${runs}; analysis in the server ${ms(r.server)}, the rest is the protocol round trip` });
      return [
        { figure: `7a LSP: C file including ${size}, cold analysis`, value: ms(c.cold), target: '—', met: true, note: 'didOpen to its publishDiagnostics' },
        row('7b   edit in code outside any block, to the publish', c.results.outside, 50),
        row('7c   edit inside a block, to the publish', c.results.inside, 50),
        { figure: '7d LSP: 5k-line note, 100 blocks, cold analysis', value: ms(note.cold), target: '—', met: true, note: `didOpen to its publishDiagnostics; C constant tables built ${c.tables?.built ?? '?'}×, kept ${c.tables?.reused ?? '?'}× over the C edits` },
        row('7e   edit outside any block, to the publish', note.results.outside, 16),
        row('7f   edit inside a block, to the publish', note.results.inside, 16),
      ];
    } finally {
      await session.stop();
    }
  } finally {
    fs.rmSync(workspace, { recursive: true, force: true });
  }
}

if (require.main === module) {
  void protocolEdits().then((rows) => rows.forEach((r) => console.log(`${r.figure}  ${r.value}  target ${r.target}  ${r.met ? 'met' : 'OVER'}  ${r.note ?? ''}`)));
}
