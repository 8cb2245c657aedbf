// Security: document text reaches every output escaped, cannot reach mathjs's parser or object internals,
// header lookup stays in the workspace and under the size limit, and analysis writes nothing to disk.
import { strict as assert } from 'assert';
// The module object itself, so wrapped functions are the ones the core calls (a namespace import is read-only).
// eslint-disable-next-line @typescript-eslint/no-require-imports
import fs = require('node:fs');
import * as os from 'node:os';
import * as path from 'node:path';
import { analyzeDocument, defaultAnalyzeOptions } from '../../core/analyze';
import { hoverMarkdown } from '../../core/present/hover';
import { waveformFor } from '../../core/present/waveform';
import { renderWaveformSvg } from '../../core/wave/svg';
import { main } from '../../core/cli/main';
import { readText, realPath } from '../../core/cli/files';
import { checkFiles, cliOptions } from '../../core/cli/run';
import { analyzeText, errors, noteBlock } from '../helpers/analyze';

const script = '<script>alert(1)</script><img/src=x/onerror=alert(2)>';
// One block with a hostile name that computes (for the waveform), one with hostile keys and values.
const hostileNote = [
  '```timing ' + script, 'circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1 V', 'r: 10k', 'c: 10n', 'expect: 5 kHz', '```', '',
  '```timing values', 'circuit: schmitt-rc', 'bogus<b>: x', 'supply: <iframe src=javascript:alert(3)>', 'vt+: 2 V', 'vt-: 1 V', 'r: 10k', 'c: 10n', 'mode: <script>x</script>', '```', '',
].join('\n');

function runCli(args: string[], cwd: string): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(args, { out: (t) => (out += t), err: (t) => (err += t), cwd, color: false });
  return { code, out, err };
}

function tempWorkspace(files: Record<string, string>): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-sec-'));
  for (const [name, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    fs.writeFileSync(path.join(dir, name), text);
  }
  return dir;
}

describe('security: escaping', () => {
  const analysis = analyzeText('notes/x.md', hostileNote);
  const block = analysis.blocks[0];
  const valuesBlock = analysis.blocks[1];

  it('keeps the name as written in the analysis (escaping is each output\'s job)', () => {
    assert.equal(block.name, script);
  });

  it('the hover carries no live HTML from the block', () => {
    // CommonMark 0.31 §6.6 raw HTML: a `<` followed by a tag name opens a tag; escaped as &lt; it cannot.
    // CommonMark 0.31 §6.1 code spans: their content is literal text, never markup — so outside them every `<`
    // must be escaped, and inside them no backtick may close the span early.
    const outsideCode = (markdown: string) => markdown.replace(/`[^`\n]*`/g, '');
    for (const b of [block, valuesBlock]) {
      const hover = hoverMarkdown(b);
      assert.doesNotMatch(outsideCode(hover), /<(script|img|iframe|b)\b/i);
    }
    assert.match(hoverMarkdown(block), /&lt;script&gt;/);
  });

  it('the SVG carries the name as text only (XML 1.0 §2.4: < and & escaped in character data)', () => {
    const wave = waveformFor(block);
    assert.ok(wave, 'waveform');
    const svg = renderWaveformSvg(wave, { title: block.name });
    assert.doesNotMatch(svg, /<(script|img|iframe)\b/i);
    // An event attribute would need white space before its name; inside an escaped value it has none.
    assert.doesNotMatch(svg, /\sonerror\s*=/i);
    assert.match(svg, /&lt;script&gt;alert\(1\)&lt;\/script&gt;/);
  });

  it('JSON and SARIF outputs parse back to the same name (RFC 8259 string escaping)', () => {
    const dir = tempWorkspace({ 'x.md': hostileNote });
    try {
      const json = JSON.parse(runCli(['check', '--json', 'x.md'], dir).out);
      assert.equal(json.files[0].blocks[0].name, script);
      const sarif = JSON.parse(runCli(['check', '--sarif', 'x.md'], dir).out);
      assert.equal(sarif.version, '2.1.0');
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('the terminal report prints no control characters from the document (ECMA-48 escape sequences)', () => {
    const dir = tempWorkspace({ 'x.md': '```timing evil\u001b]0;owned\u0007\u001b[2J\ncircuit: ring\nstages: 5\ntpd: 1 ns\nnote\u001b[31m: x\n```\n' });
    try {
      const { out } = runCli(['check', 'x.md'], dir);
      assert.doesNotMatch(out, /[\u0000-\u0008\u000b-\u001f\u007f-\u009f]/);
      assert.match(out, /evil/);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });
});

describe('security: evaluator isolation', () => {
  it('mathjs functions named in a value are unknown identifiers or syntax errors', () => {
    for (const value of ['import({ x: 1 })', 'createUnit("knot")', 'evaluate("2")', 'parse("1")', 'compile("1")', 'import', 'createUnit']) {
      const block = noteBlock(['circuit: rc-delay', `r: ${value}`, 'c: 1u', 'to: 1 V', 'toward: 5 V']);
      assert.ok(errors(block).length > 0, `${value} gave no error`);
      assert.equal(block.values.time, undefined, value);
    }
    // A unit that createUnit would have made is still unknown afterwards.
    const after = noteBlock(['circuit: rc-delay', 'r: 10 knot', 'c: 1u', 'to: 1 V', 'toward: 5 V']);
    assert.ok(errors(after).length > 0);
  });

  it('object internals as identifiers or keys are findings and pollute nothing', () => {
    const before = Object.getOwnPropertyNames(Object.prototype).sort();
    const internals = ['constructor', '__proto__', 'toString', 'valueOf', 'hasOwnProperty', 'prototype', '__defineGetter__'];
    for (const name of internals) {
      const asValue = noteBlock(['circuit: rc-delay', `r: ${name}`, 'c: 1u', 'to: 1 V', 'toward: 5 V']);
      assert.ok(errors(asValue).length > 0, `r: ${name}`);
      assert.equal(asValue.params.r, undefined, name);
      const asKey = noteBlock(['circuit: ring', 'stages: 5', 'tpd: 1 ns', `${name}: 1`]);
      // Ring oscillator f = 1/(2·N·tpd) = 100 MHz still computes beside a stray key, or the key is refused by name.
      const keyed = asKey.findings.find((f) => f.message.toLowerCase().includes(`\`${name.toLowerCase()}\``));
      assert.ok(keyed, `${name}: no finding names the key`);
      assert.ok(asKey.values.frequency === 1e8 || keyed.severity === 'error', name);
      const c = analyzeText('src/a.c', `#define ${name} 5\nenum { __proto__ = 3 };\nconst int constructor = 4;\n/* @timing t\n * circuit: timer\n * clock: 1 MHz\n * prescaler: ${name}\n * reload: 9\n */\n`);
      assert.ok(c.blocks.length === 1);
      const p = c.blocks[0].params.prescaler;
      assert.ok(p === undefined || p === 5, `${name} resolved to ${p}`);
    }
    assert.deepEqual(Object.getOwnPropertyNames(Object.prototype).sort(), before);
    assert.equal(({} as Record<string, unknown>).polluted, undefined);
    assert.equal(Object.getPrototypeOf({}), Object.prototype);
  });
});

describe('security: files', () => {
  it('#include "../../../etc/passwd" is a diagnostic and reads nothing outside', () => {
    const reads: string[] = [];
    const dir = tempWorkspace({ 'fw/src/a.c': '#include "../../../etc/passwd"\n#define TOP 9\n/* @timing t\n * circuit: timer\n * clock: 1 MHz\n * prescaler: 1\n * reload: TOP\n */\n' });
    try {
      const file = path.join(dir, 'fw/src/a.c');
      const analysis = analyzeDocument({ uri: file, text: fs.readFileSync(file, 'utf8'), languageId: 'c' }, {
        ...defaultAnalyzeOptions, workspaceRoots: [dir], read: (p) => (reads.push(p), readText(p, 1e6)), realpath: realPath,
      });
      assert.ok(analysis.findings.some((f) => f.code === 'c-include' && f.message.includes('outside the workspace')), JSON.stringify(analysis.findings));
      assert.ok(reads.every((p) => p.startsWith(dir)), JSON.stringify(reads));
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('a symbolic link out of the workspace is not followed', () => {
    const outside = tempWorkspace({ 'secret.h': '#define SECRET 42u\n' });
    const dir = tempWorkspace({ 'src/a.c': '#include "link.h"\n/* @timing t\n * circuit: timer\n * clock: 1 MHz\n * prescaler: 1\n * reload: SECRET\n */\n' });
    try {
      fs.symlinkSync(path.join(outside, 'secret.h'), path.join(dir, 'src/link.h'));
      const reads: string[] = [];
      const file = path.join(dir, 'src/a.c');
      const analysis = analyzeDocument({ uri: file, text: fs.readFileSync(file, 'utf8'), languageId: 'c' }, {
        ...defaultAnalyzeOptions, workspaceRoots: [dir], read: (p) => (reads.push(p), readText(p, 1e6)), realpath: realPath,
      });
      assert.equal(analysis.blocks[0].params.reload, undefined, 'SECRET must not resolve');
      assert.deepEqual(reads.filter((p) => p.includes('link.h')), []);
      // The CLI refuses it too.
      const json = JSON.parse(runCli(['check', '--json', 'src/a.c'], dir).out);
      assert.equal(json.files[0].blocks[0].params.reload, undefined);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
      fs.rmSync(outside, { recursive: true, force: true });
    }
  });

  it('no file above the size limit is read, neither a header nor the checked file itself', () => {
    const big = '#define BIG 1u\n' + '/* padding */\n'.repeat(200);
    const dir = tempWorkspace({ 'src/a.c': '#include "big.h"\n/* @timing t\n * circuit: timer\n * clock: 1 MHz\n * prescaler: 1\n * reload: BIG\n */\n', 'src/big.h': big, 'src/huge.c': big });
    const original = fs.readFileSync;
    const read: string[] = [];
    (fs as { readFileSync: unknown }).readFileSync = function (this: unknown, ...args: Parameters<typeof fs.readFileSync>) {
      read.push(String(args[0]));
      return original.apply(this, args);
    };
    try {
      const limit = 1024;
      const reads: string[] = [];
      const file = path.join(dir, 'src/a.c');
      const analysis = analyzeDocument({ uri: file, text: original(file, 'utf8'), languageId: 'c' }, {
        ...defaultAnalyzeOptions, maxFileBytes: limit, workspaceRoots: [dir], read: (p) => { const t = readText(p, limit); if (t !== undefined) reads.push(p); return t; }, realpath: realPath,
      });
      assert.deepEqual(reads, []);
      assert.equal(analysis.blocks[0].params.reload, undefined);
      read.length = 0;
      // The CLI's own read of a checked file above the setting: one notice, no read.
      const checked = checkFiles([path.join(dir, 'src/huge.c')], cliOptions({ maxFileBytes: limit }), (f) => f);
      assert.deepEqual(checked.map((c) => c.analysis.findings.map((f) => f.code)), [['file-too-large']]);
      assert.deepEqual(read.filter((p) => p.endsWith('huge.c')), [], 'the checked file above the limit was read');
    } finally {
      (fs as { readFileSync: unknown }).readFileSync = original;
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('nothing writes to disk during analysis or a CLI check', () => {
    const dir = tempWorkspace({ 'notes/x.md': hostileNote, 'src/a.c': '#include "b.h"\n/* @timing t\n * circuit: timer\n * clock: 1 MHz\n * prescaler: 1\n * reload: T\n */\n', 'src/b.h': '#define T 9\n' });
    const writers = ['writeFileSync', 'writeFile', 'appendFileSync', 'appendFile', 'writeSync', 'write', 'mkdirSync', 'mkdir', 'createWriteStream', 'renameSync', 'unlinkSync', 'rmSync', 'copyFileSync', 'symlinkSync', 'truncateSync'] as const;
    const calls: string[] = [];
    const saved = new Map<string, unknown>();
    const target = fs as unknown as Record<string, (...a: unknown[]) => unknown>;
    for (const name of writers) {
      saved.set(name, target[name]);
      target[name] = (...args: unknown[]) => { calls.push(`${name}(${String(args[0])})`); throw new Error(`write during analysis: ${name}`); };
    }
    const openSync = fs.openSync;
    target.openSync = (...args: unknown[]) => {
      if (args[1] !== undefined && args[1] !== 'r' && args[1] !== fs.constants.O_RDONLY) calls.push(`openSync(${String(args[0])}, ${String(args[1])})`);
      return (openSync as (...a: unknown[]) => unknown)(...args);
    };
    try {
      for (const name of ['notes/x.md', 'src/a.c']) {
        const file = path.join(dir, name);
        analyzeDocument({ uri: file, text: fs.readFileSync(file, 'utf8'), languageId: name.endsWith('.md') ? 'markdown' : 'c' }, { ...defaultAnalyzeOptions, workspaceRoots: [dir], read: (p) => readText(p, 1e6), realpath: realPath });
      }
      runCli(['check', '--json', '.'], dir);
      runCli(['check', '--sarif', '.'], dir);
      runCli(['check', '.'], dir);
    } finally {
      for (const [name, fn] of saved) target[name] = fn as (...a: unknown[]) => unknown;
      target.openSync = openSync as unknown as (...a: unknown[]) => unknown;
      fs.rmSync(dir, { recursive: true, force: true });
    }
    assert.deepEqual(calls, []);
  });
});
