// Bad or hostile input: a finding with a code and position, never an exception or a hang.
import { strict as assert } from 'assert';
import { buildConstantTable } from '../../core/c';
import { Code } from '../../core/codes';
import { valueOf, workspace } from './c-helpers';

const one = (text: string) => workspace({ '/ws/main.c': text }).table('/ws/main.c');
const codeOf = (r: { ok: boolean; code?: string }): string | undefined => (r.ok ? undefined : r.code);

describe('C constant findings', () => {
  it('division and remainder by zero name the operator (C11 6.5.5p5: undefined)', () => {
    const t = one('#define ZERO 0\n#define BAD (100 / ZERO)\n');
    const r = t.lookup('BAD');
    assert.ok(!r.ok && r.code === Code.cDivZero && /'\/'/.test(r.message));
    assert.equal(codeOf(t.evaluate('5 % (3 - 3)')), Code.cDivZero);
    // The untaken arm is not evaluated (C11 6.5.15p4), nor the right of a false && (6.5.13p4).
    assert.equal(valueOf(t, 'ZERO'), 0n);
    const ok = t.evaluate('ZERO ? 1 / ZERO : 7');
    assert.ok(ok.ok && ok.value.value === 7n);
  });

  it('names every step of a cycle through constants', () => {
    const t = one('static const int A = B + 1;\nstatic const int B = A * 2;\n');
    const r = t.lookup('A');
    assert.equal(codeOf(r), Code.cCycle);
    assert.ok(!r.ok && /A → B → A/.test(r.message));
    const m = one('#define P Q\n#define Q P\n').lookup('P');
    assert.equal(codeOf(m), Code.cCycle);
  });

  it('an unknown name is cUnknown naming it, with its position in the expression', () => {
    const t = one('#define N 1\n');
    const r = t.evaluate('N + MISSING_CLOCK');
    assert.ok(!r.ok && r.code === Code.cUnknown && /MISSING_CLOCK/.test(r.message));
    assert.deepEqual(!r.ok && r.span, { start: 4, end: 17 });
  });

  it('stringizing is reported as unsupported; a wrong argument count is a syntax finding', () => {
    const t = one('#define STR(x) #x\n#define SQ(x) ((x) * (x))\n');
    assert.equal(codeOf(t.evaluate('STR(1)')), Code.cSyntax);
    assert.equal(codeOf(t.evaluate('SQ(1, 2)')), Code.cSyntax);
    assert.equal(codeOf(t.evaluate('SQ(')), Code.cSyntax);
  });

  it('stops an exponential macro expansion with cExpansionLimit', () => {
    const lines = ['#define X0 1'];
    for (let i = 1; i <= 40; i++) lines.push(`#define X${i} (X${i - 1} + X${i - 1})`);
    const r = one(lines.join('\n')).lookup('X40');
    assert.equal(codeOf(r), Code.cExpansionLimit);
  });

  it('stops deep macro nesting and deep parentheses with a finding', () => {
    const lines = ['#define D0 1'];
    for (let i = 1; i <= 1000; i++) lines.push(`#define D${i} (D${i - 1} + 1)`);
    assert.equal(codeOf(one(lines.join('\n')).lookup('D1000')), Code.cExpansionLimit);
    const t = one('');
    assert.equal(codeOf(t.evaluate('('.repeat(5000) + '1' + ')'.repeat(5000))), Code.cSyntax);
    assert.equal(codeOf(t.evaluate('-'.repeat(5000) + '1')), Code.cSyntax);
  });

  it('resolves a long run of implicit enum values without exhausting the stack (C11 6.7.2.2p3)', () => {
    const names = Array.from({ length: 5000 }, (_, i) => `REG_${i}`);
    const t = one(`enum regs { ${names.join(', ')} };\n`);
    assert.equal(valueOf(t, 'REG_4999'), 4999n);
  });

  it('out-of-range float to integer is undefined (C11 6.3.1.4p1) and a finding, not a wrapped number', () => {
    const t = one('');
    assert.equal(codeOf(t.evaluate('(uint8_t)300.0')), Code.cUndefined);
    assert.equal(codeOf(t.evaluate('(unsigned)-1.5')), Code.cUndefined);
  });

  it('a file larger than maxFileBytes or a header larger than maxHeaderBytes is a warning and is not read', () => {
    const big = '#define A 1\n'.repeat(10);
    const files: Record<string, string> = { '/ws/big.h': big, '/ws/main.c': '#include "big.h"\n#define B 2\n' };
    const options = { dataModel: 'ilp32' as const, includeDirs: [], workspaceRoots: ['/ws'], read: (u: string) => files[u], maxFileBytes: 60, maxHeaderBytes: 60 };
    const t = buildConstantTable('/ws/main.c', files['/ws/main.c'], options);
    assert.equal(t.findings[0]?.code, Code.fileTooLarge);
    assert.equal(t.findings[0]?.severity, 'warning');
    assert.equal(files['/ws/main.c'].slice(t.findings[0].span.start, t.findings[0].span.end), '"big.h"', 'at its #include');
    assert.equal(valueOf(t, 'B'), 2n);
    assert.equal(String(valueOf(t, 'A')).startsWith(Code.cUnknown), true);
    const whole = buildConstantTable('/ws/big.h', big, options);
    assert.equal(whole.findings[0]?.code, Code.fileTooLarge);
    // The header limit is its own: a 120-byte header reads under a 60-byte file limit.
    const headerRoom = buildConstantTable('/ws/main.c', files['/ws/main.c'], { ...options, maxHeaderBytes: 1000 });
    assert.equal(valueOf(headerRoom, 'A'), 1n);
  });

  it('counts a header against its limit in UTF-8 bytes, as on disk', () => {
    // U+00B5 MICRO SIGN is two bytes in UTF-8 (RFC 3629): a 40-character comment of them is 80 bytes.
    const header = `/* ${'µ'.repeat(40)} */\n#define A 1\n`;
    const files: Record<string, string> = { '/ws/units.h': header, '/ws/main.c': '#include "units.h"\n' };
    const options = { dataModel: 'ilp32' as const, includeDirs: [], workspaceRoots: ['/ws'], read: (u: string) => files[u], maxFileBytes: 1000 };
    assert.ok(header.length < 70, 'fewer characters than the limit');
    const refused = buildConstantTable('/ws/main.c', files['/ws/main.c'], { ...options, maxHeaderBytes: 70 });
    assert.equal(refused.findings[0]?.code, Code.fileTooLarge);
    const read = buildConstantTable('/ws/main.c', files['/ws/main.c'], { ...options, maxHeaderBytes: 120 });
    assert.equal(valueOf(read, 'A'), 1n);
  });

  it('a malformed #define is positioned at its directive', () => {
    const text = '#define 42 x\n#define OK 2\n';
    const t = one(text);
    assert.equal(t.findings.length, 1);
    assert.equal(t.findings[0].code, Code.cSyntax);
    assert.equal(t.findings[0].span.start, 0);
    assert.equal(valueOf(t, 'OK'), 2n);
  });
});
