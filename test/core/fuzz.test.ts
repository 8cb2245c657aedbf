// Property tests (fast-check): the scanners, the value parser and the C evaluator never throw and every
// finding they return has a span inside the text, on arbitrary strings and on mutations of the demo's blocks.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as path from 'node:path';
import fc from 'fast-check';
import { scanC, scanMarkdown } from '../../core/scan';
import { parseValue } from '../../core/value';
import { buildConstantTable } from '../../core/c';
import type { Finding } from '../../core/types';
import { analyzeText } from '../helpers/analyze';

const demo = path.resolve(__dirname, '..', '..', 'demo');
const demoNotes = fs.readdirSync(path.join(demo, 'notes')).map((f) => fs.readFileSync(path.join(demo, 'notes', f), 'utf8'));
const demoFirmware = fs.readdirSync(path.join(demo, 'firmware', 'src')).map((f) => fs.readFileSync(path.join(demo, 'firmware', 'src', f), 'utf8'));
const demoHeader = fs.readFileSync(path.join(demo, 'firmware', 'include', 'board.h'), 'utf8');

/** The `key: value` lines of every demo block, the material the mutations start from. */
const demoLines = [...demoNotes, ...demoFirmware].flatMap((text) => [...text.matchAll(/^[ \t/*]*([a-z][\w+.-]*): (.+)$/gim)].map((m) => [m[1], m[2]] as const));

function assertSpans(findings: readonly Finding[], length: number, what: string): void {
  for (const f of findings) {
    if (f.uri) continue;
    assert.ok(Number.isInteger(f.span.start) && Number.isInteger(f.span.end), `${what}: span not whole: ${JSON.stringify(f.span)}`);
    assert.ok(f.span.start >= 0 && f.span.start <= f.span.end && f.span.end <= length, `${what}: span ${JSON.stringify(f.span)} outside 0..${length} (${f.message})`);
    assert.ok(f.message.length > 0, `${what}: empty message`);
  }
}

// Pieces of the block grammar, recombined: keys, numbers, prefixes, units, tolerances, operators, parens.
const grammarPiece = fc.constantFrom(
  'circuit', 'timer', 'schmitt-rc', '555-astable', 'ring', 'supply', 'vt+', 'vt-', 'r', 'c', 'expect', 'target', 'from', ':', ': ',
  '47k', '4k7', '2R2', 'R47', '1M5', '0.1', '1e400', '-3', '0', '?', ' ', 'u', 'µ', 'n', 'p', 'k', 'M', 'G', 'Ω', 'ohm', 'F', 'V', 'Hz', 's', '%', 'baud',
  '±5%', '+-1%', '+80% -20%', '±0.1 V', '(', ')', '((', '))', '*', '/', '+', '-', ',', '..', 'supply', 'SYS_CLOCK_HZ', '__proto__', 'constructor', '\n', '\t', '\u0000', '`', '```', '```timing', '/*', '*/', '//', '@timing',
);
const grammarText = fc.array(grammarPiece, { maxLength: 40 }).map((parts) => parts.join(''));

/** A demo block line with its key or value replaced, cut, or wrapped. */
const mutatedLine = fc
  .tuple(fc.constantFrom(...demoLines), fc.nat({ max: 5 }), grammarText, fc.nat({ max: 40 }))
  .map(([[key, value], how, piece, cut]) => {
    switch (how) {
      case 0: return `${piece}: ${value}`;
      case 1: return `${key}: ${piece}`;
      case 2: return `${key}: ${value.slice(0, cut)}${piece}${value.slice(cut)}`;
      case 3: return `${key}: ${'('.repeat(cut)}${value}`;
      case 4: return `${key}: ${value}${')'.repeat(cut)}`;
      default: return `${key}:${value.slice(cut)}`;
    }
  });

const mutatedNote = fc
  .tuple(fc.constantFrom(...demoNotes), fc.array(fc.tuple(fc.nat(), mutatedLine), { minLength: 1, maxLength: 6 }))
  .map(([note, edits]) => {
    const lines = note.split('\n');
    for (const [at, line] of edits) lines.splice(at % (lines.length + 1), 1, line);
    return lines.join('\n');
  });

const mutatedFirmware = fc
  .tuple(fc.constantFrom(...demoFirmware), fc.array(fc.tuple(fc.nat(), mutatedLine, fc.constantFrom(' * ', '// ', '#define X ', '')), { minLength: 1, maxLength: 6 }))
  .map(([source, edits]) => {
    const lines = source.split('\n');
    for (const [at, line, lead] of edits) lines.splice(at % (lines.length + 1), 1, lead + line);
    return lines.join('\n');
  });

const anyText = fc.oneof(fc.string({ maxLength: 300 }), fc.string({ unit: 'binary', maxLength: 300 }), grammarText);

describe('fuzz: scanners', () => {
  it('scanMarkdown never throws and keeps spans inside the text', () => {
    fc.assert(fc.property(fc.oneof(anyText, mutatedNote), (text) => {
      for (const block of scanMarkdown(text)) {
        assertSpans(block.findings, text.length, 'markdown');
        assert.ok(block.span.start >= 0 && block.span.end <= text.length);
        for (const e of block.entries) assert.equal(text.slice(e.valueSpan.start, e.valueSpan.end), e.valueText);
      }
    }), { numRuns: 300 });
  });

  it('scanC never throws and keeps spans inside the text', () => {
    fc.assert(fc.property(fc.oneof(anyText, mutatedFirmware), (text) => {
      for (const block of scanC(text)) {
        assertSpans(block.findings, text.length, 'c');
        for (const e of block.entries) assert.equal(text.slice(e.valueSpan.start, e.valueSpan.end), e.valueText);
      }
    }), { numRuns: 300 });
  });
});

describe('fuzz: value parser', () => {
  it('parseValue never throws; findings lie inside the value at its offset', () => {
    fc.assert(fc.property(fc.oneof(anyText, mutatedLine.map((l) => l.slice(l.indexOf(':') + 1))), fc.nat({ max: 1000 }), (text, offset) => {
      const parsed = parseValue(text, offset);
      for (const f of parsed.findings) {
        assert.ok(f.span.start >= offset && f.span.start <= f.span.end && f.span.end <= offset + text.length, `${JSON.stringify(f.span)} outside ${offset}..${offset + text.length} for ${JSON.stringify(text)}`);
      }
      // A parse gives an expression, a `?`, a word (for choice keys), or says why not.
      assert.ok(parsed.expr !== undefined || parsed.unknown !== undefined || parsed.word !== undefined || parsed.findings.length > 0, `silent failure on ${JSON.stringify(text)}`);
    }), { numRuns: 500 });
  });
});

describe('fuzz: C evaluator', () => {
  const options = { dataModel: 'ilp32' as const, includeDirs: [], workspaceRoots: ['/virtual'], read: () => undefined };

  it('buildConstantTable and evaluate never throw; failures say why, spans stay in the expression', () => {
    const cExpr = fc.array(fc.constantFrom('1', '0x7f', '077', '0b101', "'a'", '1u', '2ul', '3ll', '1.5', 'X', 'Y', '(', ')', '+', '-', '*', '/', '%', '<<', '>>', '^', '~', '!', '&&', '||', '?', ':', '==', '<', '(uint8_t)', '(int64_t)', 'sizeof', ' '), { maxLength: 30 }).map((p) => p.join(''));
    fc.assert(fc.property(fc.oneof(anyText, mutatedFirmware), fc.oneof(cExpr, anyText), (source, expr) => {
      const table = buildConstantTable('/virtual/a.c', `#define X (Y + 1)\n#define Y 7\n${source}`, options);
      for (const f of table.findings) assert.ok(f.span.start >= 0 && f.span.start <= f.span.end, JSON.stringify(f));
      const result = table.evaluate(expr);
      if (!result.ok) {
        assert.ok(result.message.length > 0);
        if (result.span) assert.ok(result.span.start >= 0 && result.span.end <= expr.length, `${JSON.stringify(result.span)} outside ${JSON.stringify(expr)}`);
      } else assert.ok(typeof result.value.value === 'number' || typeof result.value.value === 'bigint');
    }), { numRuns: 300 });
  });

  it('evaluates a known expression alike before and after fuzzed text around it', () => {
    // C11 6.5.7: 1 << 4 is 16; 6.5.5: -7 / 2 truncates toward zero to -3.
    const table = buildConstantTable('/virtual/a.c', '#define A (1 << 4)\n#define B (-7 / 2)\n', options);
    assert.equal(Number((table.lookup('A') as { value: { value: number } }).value.value), 16);
    assert.equal(Number((table.lookup('B') as { value: { value: number } }).value.value), -3);
  });
});

describe('fuzz: whole documents', () => {
  it('analyzeDocument on mutated demo notes and firmware: no throw, spans inside, no NaN or infinity in results', () => {
    fc.assert(fc.property(fc.oneof(mutatedNote.map((t) => ['notes/a.md', t] as const), mutatedFirmware.map((t) => ['src/a.c', t] as const)), ([name, text]) => {
      const analysis = analyzeText(name, text, { 'include/board.h': demoHeader });
      assertSpans(analysis.findings, text.length, name);
      for (const block of analysis.blocks) {
        assertSpans(block.findings, text.length, block.name);
        for (const group of [block.params, block.values]) for (const [k, v] of Object.entries(group)) assert.ok(Number.isFinite(v), `${block.name}.${k} = ${v}`);
        for (const [k, r] of Object.entries(block.spread ?? {})) for (const v of [r.min, r.max, r.p1, r.p99]) if (v !== undefined) assert.ok(Number.isFinite(v), `${block.name} spread ${k} = ${v}`);
      }
    }), { numRuns: 150 });
  });
});
