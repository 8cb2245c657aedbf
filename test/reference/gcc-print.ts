// The C compiler as reference: compile a tiny program that includes the firmware's own header and prints the
// value of each expression, so the evaluator's reading of the same text can be compared with gcc's.
import { execFileSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';

export const gccAvailable = ((): boolean => {
  try {
    execFileSync('gcc', ['--version'], { stdio: 'pipe' });
    return true;
  } catch {
    return false;
  }
})();

/**
 * Values gcc gives `expressions` after `#include "<header>"` in `dir`, printed exactly (integers as
 * unsigned long long or long long by their signedness, floating values with 17 significant digits).
 * Throws with gcc's own message when the program does not build.
 */
export function printWithGcc(dir: string, header: string, expressions: string[], flags: string[]): string[] {
  const body = expressions.map((expr) => {
    const e = `(${expr})`;
    return `  if (_Generic(${e}, float: 1, double: 1, long double: 1, default: 0)) printf("%.17g\\n", (double)${e});
  else if ((__typeof__${e})-1 < (__typeof__${e})0) printf("%lld\\n", (long long)${e});
  else printf("%llu\\n", (unsigned long long)${e});`;
  });
  const source = path.join(dir, 'print-constants.c');
  const exe = path.join(dir, 'print-constants');
  fs.writeFileSync(source, `#include <stdio.h>\n#include "${header}"\nint main(void) {\n${body.join('\n')}\n  return 0;\n}\n`);
  try {
    execFileSync('gcc', ['-std=c11', '-Wall', '-Werror', ...flags, source, '-o', exe], { stdio: 'pipe' });
    return execFileSync(exe, { encoding: 'utf8' }).trim().split('\n');
  } finally {
    fs.rmSync(source, { force: true });
    fs.rmSync(exe, { force: true });
  }
}
