// Reference check for undefined behaviour: gcc's UndefinedBehaviorSanitizer (Debian gcc 12.2, libubsan) decides
// which operations are undefined, and the evaluator must report exactly those (Code.cUndefined, or cDivZero
// for a zero divisor) and compute the others to gcc's value. Each operation runs at run time on volatile
// operands, so gcc cannot fold it away; `-fno-sanitize-recover=all` stops the program at the first report.
// `ub` is what ISO C11 says by hand for each data model (clause in `rule`): gcc must agree with it too, so a
// sanitizer that silently checks nothing fails the test instead of passing it.
import { skipUnlessCi } from '../helpers/reference';
import { strict as assert } from 'assert';
import { execFileSync, spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { buildConstantTable, type DataModel } from '../../core/c';
import { Code } from '../../core/codes';

type Model = 'ilp32' | 'lp64';
/** `l op r`, `op r` (unary, or a cast when op is a parenthesised type). Operands are themselves defined. */
interface Case { l?: string; op: string; r: string; ub: Model[]; rule: string }

const BOTH: Model[] = ['ilp32', 'lp64'];
const NONE: Model[] = [];

const CASES: Case[] = [
  { l: '2147483647', op: '+', r: '1', ub: BOTH, rule: 'C11 6.5p5 int overflow' },
  { l: '-2147483647', op: '-', r: '2', ub: BOTH, rule: 'C11 6.5p5' },
  { l: '-2147483647', op: '-', r: '1', ub: NONE, rule: 'C11 6.5.6 INT_MIN itself is representable' },
  { l: '46341', op: '*', r: '46341', ub: BOTH, rule: 'C11 6.5p5: 2147488281 > INT_MAX' },
  { l: '46340', op: '*', r: '46340', ub: NONE, rule: 'C11 6.5.5: 2147395600 fits' },
  { l: '(unsigned short)65535', op: '*', r: '(unsigned short)65535', ub: BOTH, rule: 'C11 6.3.1.1p2: both promote to int, then 6.5p5' },
  { l: '(short)-32768', op: '*', r: '(short)-1', ub: NONE, rule: 'C11 6.3.1.1p2: 32768 fits the promoted int' },
  { l: '65535u', op: '*', r: '65535u', ub: NONE, rule: 'C11 6.2.5p9 unsigned arithmetic wraps' },
  { l: '0u', op: '-', r: '1', ub: NONE, rule: 'C11 6.2.5p9' },
  { l: '2147483647L', op: '+', r: '1', ub: ['ilp32'], rule: 'C11 6.5p5: long is 32-bit under ilp32, 64-bit under lp64' },
  { l: '9223372036854775807LL', op: '+', r: '1', ub: BOTH, rule: 'C11 6.5p5 long long overflow' },
  { l: '-2147483647 - 1', op: '/', r: '-1', ub: BOTH, rule: 'C11 6.5.5p6 INT_MIN / -1 is not representable' },
  { l: '-2147483647 - 1', op: '%', r: '-1', ub: BOTH, rule: 'C11 6.5.5p6 a % b is undefined when a / b is' },
  { l: '-2147483647 - 1', op: '/', r: '2', ub: NONE, rule: 'C11 6.5.5p6' },
  { l: '7', op: '/', r: '0', ub: BOTH, rule: 'C11 6.5.5p5 division by zero' },
  { op: '-', r: '-2147483647 - 1', ub: BOTH, rule: 'C11 6.5p5 negating INT_MIN' },
  { op: '-', r: '-2147483647', ub: NONE, rule: 'C11 6.5.3.3p3' },
  { op: '-', r: '(unsigned char)128', ub: NONE, rule: 'C11 6.3.1.1p2 promoted to int first' },
  { op: '~', r: '2147483647', ub: NONE, rule: 'C11 6.5.3.3p4 ~ cannot overflow' },
  { l: '1', op: '<<', r: '30', ub: NONE, rule: 'C11 6.5.7p4' },
  { l: '1', op: '<<', r: '31', ub: BOTH, rule: 'C11 6.5.7p4: 2^31 is not representable in int' },
  { l: '2', op: '<<', r: '30', ub: BOTH, rule: 'C11 6.5.7p4' },
  { l: '0', op: '<<', r: '31', ub: NONE, rule: 'C11 6.5.7p4: 0 × 2^31 is representable' },
  { l: '-1', op: '<<', r: '1', ub: BOTH, rule: 'C11 6.5.7p4: E1 negative' },
  { l: '1u', op: '<<', r: '31', ub: NONE, rule: 'C11 6.5.7p4 unsigned: reduced modulo 2^N' },
  { l: '1L', op: '<<', r: '31', ub: ['ilp32'], rule: 'C11 6.5.7p4 at the width of long' },
  { l: '1LL', op: '<<', r: '62', ub: NONE, rule: 'C11 6.5.7p4' },
  { l: '1LL', op: '<<', r: '63', ub: BOTH, rule: 'C11 6.5.7p4' },
  { l: '(unsigned char)255', op: '<<', r: '24', ub: BOTH, rule: 'C11 6.3.1.1p2: a byte shifted to bit 24 is a signed int (common practice casts it to uint32_t first)' },
  { l: '(unsigned char)127', op: '<<', r: '24', ub: NONE, rule: 'C11 6.5.7p4' },
  { l: '1', op: '<<', r: '32', ub: BOTH, rule: 'C11 6.5.7p3 count not below the width' },
  { l: '1u', op: '<<', r: '-1', ub: BOTH, rule: 'C11 6.5.7p3 negative count' },
  { l: '-16', op: '>>', r: '2', ub: NONE, rule: 'C11 6.5.7p5 implementation-defined, not undefined; gcc shifts arithmetically' },
  { op: '(signed char)', r: '200', ub: NONE, rule: 'C11 6.3.1.3p3 implementation-defined; gcc wraps' },
  { op: '(short)', r: '40000', ub: NONE, rule: 'C11 6.3.1.3p3' },
  { op: '(unsigned char)', r: '300.0', ub: BOTH, rule: 'C11 6.3.1.4p1 floating value out of range' },
  { op: '(int)', r: '3e9', ub: BOTH, rule: 'C11 6.3.1.4p1' },
  { op: '(unsigned)', r: '-0.5', ub: NONE, rule: 'C11 6.3.1.4p1: the integral part, 0, is representable' },
  { op: '(unsigned)', r: '-1.5', ub: BOTH, rule: 'C11 6.3.1.4p1: the integral part, -1, is not' },
];

const isCast = (c: Case): boolean => c.op.startsWith('(');
const expressionOf = (c: Case): string => (c.l !== undefined ? `(${c.l}) ${c.op} (${c.r})` : isCast(c) ? `${c.op}(${c.r})` : `${c.op}(${c.r})`);

function cProgram(): string {
  const arms = CASES.map((c, i) => {
    const right = `volatile __typeof__(${c.r}) r = (${c.r});`;
    const left = c.l !== undefined ? `volatile __typeof__(${c.l}) l = (${c.l});` : '';
    const use = c.l !== undefined ? `l ${c.op} r` : `${c.op} r`;
    return `    case ${i}: { ${left} ${right} __typeof__(${use}) v = ${use}; SHOW(v); break; }`;
  });
  return `#include <stdio.h>
#include <stdlib.h>
#define SHOW(v) do { if ((__typeof__(v))-1 < (__typeof__(v))0) printf("%lld\\n", (long long)(v)); else printf("%llu\\n", (unsigned long long)(v)); } while (0)
int main(int argc, char **argv) {
  switch (atoi(argv[1])) {
${arms.join('\n')}
  }
  return 0;
}
`;
}

interface Verdict { ub: boolean; value?: string; report?: string }

const SANITIZE = ['-fsanitize=signed-integer-overflow,shift,integer-divide-by-zero,float-cast-overflow', '-fno-sanitize-recover=all'];

function gccVerdicts(flags: string[]): Verdict[] {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-ubsan-'));
  try {
    fs.writeFileSync(path.join(dir, 'ub.c'), cProgram());
    const exe = path.join(dir, 'ub');
    execFileSync('gcc', ['-std=c11', '-O0', '-w', ...flags, ...SANITIZE, path.join(dir, 'ub.c'), '-o', exe], { stdio: 'pipe' });
    return CASES.map((_, i) => {
      const run = spawnSync(exe, [String(i)], { encoding: 'utf8', env: { ...process.env, UBSAN_OPTIONS: 'print_stacktrace=0' } });
      const report = /runtime error: (.*)/.exec(run.stderr)?.[1];
      if (report) return { ub: true, report };
      assert.equal(run.status, 0, `case ${i} ended with ${run.status ?? run.signal} and no sanitizer report: ${run.stderr}`);
      return { ub: false, value: run.stdout.trim() };
    });
  } finally { fs.rmSync(dir, { recursive: true, force: true }); }
}

for (const [model, flags] of [['ilp32', ['-m32']], ['lp64', []]] as Array<[Model, string[]]>) {
  describe(`Undefined behaviour against gcc's UBSan (Debian gcc 12.2) as reference, ${model}`, function () {
    let verdicts: Verdict[] | undefined;
    before(function () {
      try { verdicts = gccVerdicts(flags); } catch (e) {
        skipUnlessCi(this, `gcc ${[...flags, ...SANITIZE].join(' ')} is not usable here; reference check skipped: ${String((e as { stderr?: Buffer }).stderr ?? e)}`);
      }
    });
    const table = buildConstantTable('/firmware/ub.c', '', { dataModel: model as DataModel, includeDirs: [], workspaceRoots: ['/firmware'], read: () => undefined });

    CASES.forEach((c, i) => {
      const expr = expressionOf(c);
      it(`${expr}  [${c.rule}]`, function () {
        if (!verdicts) this.skip();
        const gcc = (verdicts as Verdict[])[i];
        assert.equal(gcc.ub, c.ub.includes(model), `gcc's sanitizer disagrees with the standard as read by hand: ${gcc.report ?? gcc.value}`);
        const got = table.evaluate(expr);
        if (gcc.ub) {
          assert.ok(!got.ok, `gcc reports "${gcc.report}", the evaluator gives ${got.ok ? got.value.value : ''}`);
          assert.equal(got.code, c.op === '/' && c.r === '0' ? Code.cDivZero : Code.cUndefined, got.message);
          assert.ok(got.span && got.span.start >= 0 && got.span.end <= expr.length && got.span.start < got.span.end, 'the finding is positioned in the expression');
          if (got.code === Code.cUndefined && !isCast(c)) assert.match(got.message, new RegExp(`under ${model}`), 'the message names the data model');
        } else {
          assert.ok(got.ok, `gcc computes ${gcc.value} without a report; the evaluator says: ${got.ok ? '' : got.message}`);
          assert.equal(BigInt(got.value.value).toString(), gcc.value);
        }
      });
    });
  });
}
