// Hostile input finishes with a diagnostic, never an exception, a hang or a non-finite number.
// (Speed is never asserted here; `npm run bench` measures it.)
import { strict as assert } from 'assert';
import { analyzeText, errors, noteBlock } from '../helpers/analyze';
import { buildConstantTable } from '../../core/c';
import { parseValue, MAX_DEPTH } from '../../core/value';
import type { DocumentAnalysis } from '../../core/types';

const cOptions = { dataModel: 'ilp32' as const, includeDirs: [], workspaceRoots: ['/virtual'], read: () => undefined };

/** Walks a JSON-like value and returns the paths of numbers that are NaN or infinite. */
function nonFinite(value: unknown, at = '$', out: string[] = []): string[] {
  if (typeof value === 'number' && !Number.isFinite(value)) out.push(at);
  else if (Array.isArray(value)) value.forEach((v, i) => nonFinite(v, `${at}[${i}]`, out));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) nonFinite(v, `${at}.${k}`, out);
  return out;
}

function assertSane(analysis: DocumentAnalysis, text: string): void {
  assert.deepEqual(nonFinite(analysis), []);
  for (const f of [...analysis.findings, ...analysis.blocks.flatMap((b) => b.findings)]) {
    if (!f.uri) assert.ok(f.span.start >= 0 && f.span.start <= f.span.end && f.span.end <= text.length, JSON.stringify(f));
  }
}

describe('hostile input', () => {
  it('a 200,000-character value line gives a finding, not a hang', () => {
    const text = ['```timing long', 'circuit: rc-delay', 'r: ' + '1+'.repeat(100_000) + '1', 'c: 1u', 'to: 1 V', 'toward: 5 V', '```'].join('\n');
    const analysis = analyzeText('notes/a.md', text);
    assertSane(analysis, text);
    assert.ok(analysis.blocks[0].findings.some((f) => f.severity === 'error' && /token|long/i.test(f.message)), JSON.stringify(analysis.blocks[0].findings.map((f) => f.message)));
  });

  it('a 200,000-character prose line and a 200,000-character C line are read through', () => {
    const note = 'x'.repeat(200_000) + '\n```timing t\ncircuit: ring\nstages: 5\ntpd: 1 ns\n```\n';
    const analysis = analyzeText('notes/a.md', note);
    // Ring oscillator: f = 1 / (2·N·tpd) (CMOS handbook relation, from memory) = 100 MHz for N = 5, 1 ns.
    assert.equal(analysis.blocks[0].values.frequency, 1e8);
    const c = '#define W ' + '1'.repeat(200_000) + '\n/* @timing t\n * circuit: timer\n * clock: W\n * prescaler: 1\n * reload: 9\n */\n';
    const ca = analyzeText('src/a.c', c);
    assertSane(ca, c);
    assert.ok(ca.blocks[0].findings.some((f) => f.severity === 'error'), 'an out-of-range constant is an error');
  });

  it('deeply nested parentheses stop at the depth bound with a finding', () => {
    const deep = '('.repeat(10_000) + '1' + ')'.repeat(10_000);
    // Under the token bound, the depth bound speaks; above it, the length bound does.
    const nested = parseValue('('.repeat(MAX_DEPTH + 10) + '1' + ')'.repeat(MAX_DEPTH + 10), 0);
    assert.ok(nested.findings.some((f) => f.message.includes(`${MAX_DEPTH} deep`)), JSON.stringify(nested.findings));
    const long = parseValue(deep, 0);
    assert.ok(long.findings.some((f) => /too long/.test(f.message)), JSON.stringify(long.findings));
    const table = buildConstantTable('/virtual/a.c', `#define D ${deep}\n`, cOptions);
    const found = table.lookup('D');
    assert.equal(found.ok, false);
    if (!found.ok) assert.match(found.message, /deep|nest|limit|token/i);
  });

  it('a macro-expansion bomb is cut off with a finding', () => {
    // Each level doubles: 2^40 tokens unbounded.
    const lines = ['#define M0 1'];
    for (let i = 1; i <= 40; i++) lines.push(`#define M${i} (M${i - 1} + M${i - 1})`);
    const text = lines.join('\n') + '\n/* @timing bomb\n * circuit: timer\n * clock: 16 MHz\n * prescaler: M40\n * reload: 9\n */\n';
    const analysis = analyzeText('src/a.c', text);
    assertSane(analysis, text);
    const block = analysis.blocks[0];
    assert.ok(block.findings.some((f) => f.severity === 'error' && /token|limit|expan/i.test(f.message)), JSON.stringify(block.findings.map((f) => f.message)));
  });

  it('a self-referencing and a mutually recursive macro are diagnostics (C11 6.10.3.4p2 stops re-expansion)', () => {
    const text = '#define A (B + 1)\n#define B (A + 1)\n#define S S\n/* @timing loop\n * circuit: timer\n * clock: A\n * prescaler: S\n * reload: 9\n */\n';
    const analysis = analyzeText('src/a.c', text);
    const block = analysis.blocks[0];
    assert.ok(block.findings.filter((f) => f.severity === 'error').length >= 2, JSON.stringify(block.findings.map((f) => f.message)));
  });

  it('a binary file with NUL bytes gives findings or nothing, never a throw', () => {
    let seed = 7;
    const bytes: string[] = [];
    for (let i = 0; i < 20_000; i++) {
      seed = (seed * 1103515245 + 12345) >>> 0;
      bytes.push(String.fromCharCode(seed >>> 24));
    }
    const binary = bytes.join('') + '\0\0/* @timing x\n * circuit: timer\0\n */';
    for (const name of ['src/blob.c', 'notes/blob.md']) assertSane(analyzeText(name, binary), binary);
  });

  it('an unterminated fence is reported at its opening line', () => {
    const text = '# note\n\n```timing open\ncircuit: ring\nstages: 5\ntpd: 1 ns\n';
    const analysis = analyzeText('notes/a.md', text);
    const all = [...analysis.findings, ...analysis.blocks.flatMap((b) => b.findings)];
    const finding = all.find((f) => /fence|close|unterminated/i.test(f.message));
    assert.ok(finding, JSON.stringify(all.map((f) => f.message)));
    assert.equal(text.slice(finding.span.start, finding.span.start + 3), '```');
  });

  it('an unterminated /* comment is reported in C', () => {
    const text = '#define T 9\n/* @timing open\n * circuit: timer\n * clock: 1 MHz\n * prescaler: 1\n * reload: T\n';
    const analysis = analyzeText('src/a.c', text);
    assertSane(analysis, text);
    const all = [...analysis.findings, ...analysis.blocks.flatMap((b) => b.findings)];
    assert.ok(all.some((f) => /unterminated|comment/i.test(f.message)), JSON.stringify(all.map((f) => f.message)));
  });

  it('a 1 MB hostile note through analyzeDocument: every block reported, nothing non-finite', () => {
    const pieces = ['```timing a\ncircuit: schmitt-rc\nsupply: 1e400\nvt+: ((((\nvt-: \0\nr: -1\nc: 0\n```\n', '```timing\ncircuit: ring\nstages: 4\ntpd: 1 ns\n```\n', '```timing b\n' + 'k: v\n'.repeat(200) + '```\n', '`'.repeat(3000) + '\n', '\u202e\ufeff\ud800 text\n'];
    let text = '';
    for (let i = 0; text.length < 1_000_000; i++) text += pieces[i % pieces.length];
    const analysis = analyzeText('notes/big.md', text, {}, { maxFileBytes: 2_000_000 });
    assertSane(analysis, text);
    assert.ok(analysis.blocks.length > 100);
  });

  it('a file above maxFileBytes is skipped with one finding', () => {
    const text = '```timing t\ncircuit: ring\nstages: 5\ntpd: 1 ns\n```\n' + 'x'.repeat(5000);
    const analysis = analyzeText('notes/a.md', text, {}, { maxFileBytes: 1024 });
    assert.equal(analysis.blocks.length, 0);
    assert.equal(analysis.findings.length, 1);
    assert.equal(analysis.findings[0].code, 'file-too-large');
  });
});

describe('non-physical blocks: an error naming the key', () => {
  const cases: Array<[string, string[], string]> = [
    // Ideal comparator with rail-to-rail output: a threshold outside 0..supply is never reached (DESIGN.md physics rule).
    ['threshold above the output swing', ['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 4 V', 'vt-: 1 V', 'r: 10k', 'c: 10n'], 'vt+'],
    ['threshold below the output swing', ['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: -1 V', 'r: 10k', 'c: 10n'], 'vt-'],
    ['inverted thresholds', ['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 1 V', 'vt-: 2 V', 'r: 10k', 'c: 10n'], 'vt-'],
    ['zero resistor', ['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1 V', 'r: 0', 'c: 10n'], 'r'],
    ['negative capacitor', ['circuit: 555-astable', 'supply: 9 V', 'ra: 1k', 'rb: 10k', 'c: -10n'], 'c'],
    // An odd number of inverting stages is needed to oscillate (fact of the trade).
    ['an even ring', ['circuit: ring', 'stages: 4', 'tpd: 1 ns'], 'stages'],
    ['reload beyond bits', ['circuit: timer', 'clock: 16 MHz', 'prescaler: 1', 'reload: 70000', 'bits: 16'], 'reload'],
    // The 555's threshold comparator never trips at or above VCC (NE555 datasheet, control voltage range).
    ['control at the supply', ['circuit: 555-astable', 'supply: 9 V', 'ra: 1k', 'rb: 10k', 'c: 10n', 'control: 9 V'], 'control'],
    ['control above the supply', ['circuit: 555-monostable', 'supply: 5 V', 'r: 10k', 'c: 10n', 'control: 6 V'], 'control'],
    ['an overflowing value', ['circuit: rc-delay', 'r: 1e400', 'c: 1u', 'to: 1 V', 'toward: 5 V'], 'r'],
    ['an overflowing product', ['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1 V', 'r: 1e300', 'c: 1e300'], 'c'],
  ];
  for (const [what, lines, key] of cases) {
    it(`${what}: error names \`${key}\`, no result is non-finite`, () => {
      const block = noteBlock(lines);
      const messages = errors(block);
      assert.ok(messages.some((m) => m.includes(`\`${key}\``)), `${what}: ${JSON.stringify(messages)}`);
      assert.deepEqual(nonFinite({ values: block.values, params: block.params, spread: block.spread }), []);
      const error = block.findings.find((f) => f.severity === 'error' && f.message.includes(`\`${key}\``))!;
      assert.ok(error.span.end > error.span.start, 'the error points at text');
    });
  }
});
