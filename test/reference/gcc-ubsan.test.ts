// Reference check for undefined behaviour: the compiler decides which operations are undefined, and the evaluator
// must report exactly those (Code.cUndefined, or cDivZero for a zero divisor) and compute the others to the
// compiler's value.
// - lp64: gcc's UndefinedBehaviorSanitizer (Debian gcc 12.2, libubsan) on the 64-bit host (x86-64, or any LP64
//   Linux host: none of these cases depends on what else differs), the one target whose programs run here. Each operation runs on volatile operands, so gcc cannot fold it away;
//   `-fno-sanitize-recover=all` stops the program at the first report.
// - ilp32 and ip16: compile only, with arm-none-eabi-gcc 12.2 and avr-gcc 5.4 (gcc-print.ts). In a constant
//   expression gcc -pedantic reports an overflow, a division by zero or a shift out of range; nothing is run.
// `ub` is what ISO C11 says by hand for each data model (clause in `rule`): the compiler must agree with it too, so
// a check that silently finds nothing fails the test instead of passing it. `quiet` lists the models whose
// compiler folds an undefined operation without a word (avr-gcc 5.4 predates gcc 6's -Wshift-negative-value and
// -Wshift-overflow): there the compiler's silence is asserted, and the evaluator follows the standard.
import { skipUnlessCi } from '../helpers/reference';
import { strict as assert } from 'assert';
import { execFileSync, spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { buildConstantTable, type DataModel } from '../../core/c';
import { Code } from '../../core/codes';
import { compileConstants, compilerAvailable, REFERENCE_COMPILERS, type Target } from './gcc-print';

type Model = Target;
/** `l op r`, `op r` (unary, or a cast when op is a parenthesised type). Operands are themselves defined. */
interface Case { l?: string; op: string; r: string; ub: Model[]; quiet?: Model[]; rule: string }

const ALL: Model[] = ['ilp32', 'lp64', 'ip16'];
const INT32: Model[] = ['ilp32', 'lp64'];
const LONG32: Model[] = ['ilp32', 'ip16'];
const NONE: Model[] = [];

const CASES: Case[] = [
  { l: '2147483647', op: '+', r: '1', ub: ALL, rule: 'C11 6.5p5 int overflow (long under ip16)' },
  { l: '-2147483647', op: '-', r: '2', ub: ALL, rule: 'C11 6.5p5' },
  { l: '-2147483647', op: '-', r: '1', ub: NONE, rule: 'C11 6.5.6 INT_MIN itself is representable' },
  { l: '46341', op: '*', r: '46341', ub: ALL, rule: 'C11 6.5p5: 2147488281 > INT_MAX' },
  { l: '46340', op: '*', r: '46340', ub: NONE, rule: 'C11 6.5.5: 2147395600 fits' },
  { l: '(unsigned short)65535', op: '*', r: '(unsigned short)65535', ub: INT32, rule: 'C11 6.3.1.1p2: both promote to int, then 6.5p5; to unsigned int under ip16, which wraps' },
  { l: '(short)-32768', op: '*', r: '(short)-1', ub: ['ip16'], rule: 'C11 6.3.1.1p2: 32768 fits the promoted int, but not a 16-bit one' },
  { l: '65535u', op: '*', r: '65535u', ub: NONE, rule: 'C11 6.2.5p9 unsigned arithmetic wraps' },
  { l: '0u', op: '-', r: '1', ub: NONE, rule: 'C11 6.2.5p9' },
  { l: '2147483647L', op: '+', r: '1', ub: LONG32, rule: 'C11 6.5p5: long is 32-bit under ilp32 and ip16, 64-bit under lp64' },
  { l: '9223372036854775807LL', op: '+', r: '1', ub: ALL, rule: 'C11 6.5p5 long long overflow' },
  { l: '-2147483647 - 1', op: '/', r: '-1', ub: ALL, rule: 'C11 6.5.5p6 INT_MIN / -1 is not representable' },
  { l: '-2147483647 - 1', op: '%', r: '-1', ub: ALL, rule: 'C11 6.5.5p6 a % b is undefined when a / b is' },
  { l: '-2147483647 - 1', op: '/', r: '2', ub: NONE, rule: 'C11 6.5.5p6' },
  { l: '7', op: '/', r: '0', ub: ALL, rule: 'C11 6.5.5p5 division by zero' },
  { op: '-', r: '-2147483647 - 1', ub: ALL, rule: 'C11 6.5p5 negating INT_MIN' },
  { op: '-', r: '-2147483647', ub: NONE, rule: 'C11 6.5.3.3p3' },
  { op: '-', r: '(unsigned char)128', ub: NONE, rule: 'C11 6.3.1.1p2 promoted to int first' },
  { op: '~', r: '2147483647', ub: NONE, rule: 'C11 6.5.3.3p4 ~ cannot overflow' },
  { l: '1', op: '<<', r: '30', ub: ['ip16'], rule: 'C11 6.5.7p4; 6.5.7p3 under ip16, where int has 16 bits' },
  { l: '1', op: '<<', r: '31', ub: ALL, rule: 'C11 6.5.7p4: 2^31 is not representable in int' },
  { l: '2', op: '<<', r: '30', ub: ALL, rule: 'C11 6.5.7p4' },
  { l: '0', op: '<<', r: '31', ub: ['ip16'], rule: 'C11 6.5.7p4: 0 × 2^31 is representable; the count is not, under ip16 (6.5.7p3)' },
  { l: '-1', op: '<<', r: '1', ub: ALL, quiet: ['ip16'], rule: 'C11 6.5.7p4: E1 negative' },
  { l: '1u', op: '<<', r: '31', ub: ['ip16'], rule: 'C11 6.5.7p4 unsigned: reduced modulo 2^N; 6.5.7p3 under ip16' },
  { l: '1L', op: '<<', r: '31', ub: LONG32, quiet: ['ip16'], rule: 'C11 6.5.7p4 at the width of long' },
  { l: '1LL', op: '<<', r: '62', ub: NONE, rule: 'C11 6.5.7p4' },
  { l: '1LL', op: '<<', r: '63', ub: ALL, quiet: ['ip16'], rule: 'C11 6.5.7p4' },
  { l: '(unsigned char)255', op: '<<', r: '24', ub: ALL, rule: 'C11 6.3.1.1p2: a byte shifted to bit 24 is a signed int (common practice casts it to uint32_t first)' },
  { l: '(unsigned char)127', op: '<<', r: '24', ub: ['ip16'], rule: 'C11 6.5.7p4; 6.5.7p3 under ip16' },
  { l: '1', op: '<<', r: '32', ub: ALL, rule: 'C11 6.5.7p3 count not below the width' },
  { l: '1u', op: '<<', r: '-1', ub: ALL, rule: 'C11 6.5.7p3 negative count' },
  { l: '-16', op: '>>', r: '2', ub: NONE, rule: 'C11 6.5.7p5 implementation-defined, not undefined; gcc shifts arithmetically' },
  { op: '(signed char)', r: '200', ub: NONE, rule: 'C11 6.3.1.3p3 implementation-defined; gcc wraps' },
  { op: '(short)', r: '40000', ub: NONE, rule: 'C11 6.3.1.3p3' },
  { op: '(unsigned char)', r: '300.0', ub: ALL, rule: 'C11 6.3.1.4p1 floating value out of range' },
  { op: '(int)', r: '3e9', ub: ALL, rule: 'C11 6.3.1.4p1' },
  { op: '(unsigned)', r: '-0.5', ub: NONE, rule: 'C11 6.3.1.4p1: the integral part, 0, is representable' },
  { op: '(unsigned)', r: '-1.5', ub: ALL, rule: 'C11 6.3.1.4p1: the integral part, -1, is not' },
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

/** The compiler's verdicts without running anything: what gcc -pedantic refuses in a constant expression. */
function compiledVerdicts(model: Model): Verdict[] {
  return compileConstants(model, { expressions: CASES.map(expressionOf) }).map((c) =>
    c.ok ? { ub: false, value: c.floating ? String(c.value) : c.value.toString() } : { ub: true, report: c.diagnostic.split('\n')[0].replace(/^.*?(?:warning|error): /, '') });
}

for (const model of ['lp64', 'ilp32', 'ip16'] as Model[]) {
  const compiler = REFERENCE_COMPILERS[model];
  const how = model === 'lp64' ? `gcc's UBSan (Debian gcc 12.2, ${process.arch}, run)` : `${compiler.label}, compile only`;
  describe(`Undefined behaviour against ${how} as reference, ${model}`, function () {
    let verdicts: Verdict[] | undefined;
    before(function () {
      if (!compilerAvailable(model)) skipUnlessCi(this, `${compiler.command} is not installed; reference check skipped`);
      if (model !== 'lp64') { verdicts = compiledVerdicts(model); return; }
      try { verdicts = gccVerdicts([]); } catch (e) {
        skipUnlessCi(this, `gcc ${SANITIZE.join(' ')} is not usable here; reference check skipped: ${String((e as { stderr?: Buffer }).stderr ?? e)}`);
      }
    });
    const table = buildConstantTable('/firmware/ub.c', '', { dataModel: model as DataModel, includeDirs: [], workspaceRoots: ['/firmware'], read: () => undefined });

    CASES.forEach((c, i) => {
      const expr = expressionOf(c);
      it(`${expr}  [${c.rule}]`, function () {
        if (!verdicts) this.skip();
        const gcc = (verdicts as Verdict[])[i];
        const undefinedHere = c.ub.includes(model);
        const quiet = c.quiet?.includes(model) ?? false;
        assert.equal(gcc.ub, undefinedHere && !quiet, `${compiler.command} disagrees with the standard as read by hand: ${gcc.report ?? gcc.value}`);
        const got = table.evaluate(expr);
        if (undefinedHere) {
          assert.ok(!got.ok, `${gcc.report ? `${compiler.command} reports "${gcc.report}"` : 'undefined by the standard'}, the evaluator gives ${got.ok ? got.value.value : ''}`);
          assert.equal(got.code, c.op === '/' && c.r === '0' ? Code.cDivZero : Code.cUndefined, got.message);
          assert.ok(got.span && got.span.start >= 0 && got.span.end <= expr.length && got.span.start < got.span.end, 'the finding is positioned in the expression');
          if (got.code === Code.cUndefined && !isCast(c)) assert.match(got.message, new RegExp(`under ${model}`), 'the message names the data model');
        } else {
          assert.ok(got.ok, `${compiler.command} computes ${gcc.value} without a report; the evaluator says: ${got.ok ? '' : got.message}`);
          assert.equal(BigInt(got.value.value).toString(), gcc.value);
        }
      });
    });
  });
}
