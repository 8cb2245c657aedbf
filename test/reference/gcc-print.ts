// The C compilers firmware is built with, as references: each expression is compiled, never run, and its value,
// signedness, size and floating-ness are read back out of the object file the compiler wrote. Nothing the compiler
// builds is executed, so the checks work for any target on any host.
//
//   lp64  → gcc for x86-64 (Debian 12; on another host, its cross compiler x86_64-linux-gnu-gcc)
//   ilp32 → arm-none-eabi-gcc -mcpu=cortex-m4 -mthumb (Debian 12, package gcc-arm-none-eabi)
//   ip16  → avr-gcc -mmcu=avr5 (Debian 12, packages gcc-avr and avr-libc; avr5 is the generic core family)
//
// Use:
//   const got = compileConstants('ip16', { prelude: '#include <stdint.h>\n#define F_CPU 16000000UL', expressions: ['F_CPU / 64'] });
//   got[0]  // { ok: true, value: 250000n, signed: false, size: 4, floating: undefined }
// An expression the compiler refuses (a syntax error, an overflow in a constant expression, an out-of-range
// shift: what gcc -pedantic reports) comes back as { ok: false, diagnostic } with the compiler's message.
import { execFileSync, spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { readElfSymbols, type ElfSymbol } from './elf-symbols';

export type Target = 'lp64' | 'ilp32' | 'ip16';

interface Compiler { command: string; flags: string[]; label: string; asmImmediate: string }

/** The compiler and flags used for each data model. `asmImmediate` prints an asm "i" operand without punctuation. */
export const REFERENCE_COMPILERS: Record<Target, Compiler> = {
  lp64: { command: process.arch === 'x64' ? 'gcc' : 'x86_64-linux-gnu-gcc', flags: [], label: 'gcc 12.2 (x86-64)', asmImmediate: '%P' },
  ilp32: { command: 'arm-none-eabi-gcc', flags: ['-mcpu=cortex-m4', '-mthumb'], label: 'arm-none-eabi-gcc 12.2 -mcpu=cortex-m4', asmImmediate: '%c' },
  ip16: { command: 'avr-gcc', flags: ['-mmcu=avr5'], label: 'avr-gcc 5.4 -mmcu=avr5', asmImmediate: '%' },
};

const available = new Map<Target, boolean>();
/** Whether the target's compiler is installed (checked once per target). */
export function compilerAvailable(target: Target): boolean {
  let known = available.get(target);
  if (known === undefined) {
    try { execFileSync(REFERENCE_COMPILERS[target].command, ['--version'], { stdio: 'pipe' }); known = true; } catch { known = false; }
    available.set(target, known);
  }
  return known;
}

/** The compiler's reading of one expression. */
export type CompiledConstant =
  | {
    ok: true;
    /** Integers exactly (bigint, of the expression's own type); floating values as a JS number (a `double`
     * rounded from `long double` on x86-64; avr-gcc 5.4's `double` is 32-bit, so its values are binary32). */
    value: bigint | number;
    signed: boolean;
    /** sizeof(expression) on the target, in bytes. */
    size: number;
    /** The floating type of the expression, or undefined for an integer expression. */
    floating?: 'float' | 'double' | 'long double';
  }
  | { ok: false; diagnostic: string };

export interface CompileOptions {
  /** C text before the expressions: includes, macros, enums, typedefs, const objects. */
  prelude?: string;
  expressions: string[];
  /** Extra compiler flags (`-DNAME=1`, `-I dir`), after the target's own. */
  flags?: string[];
  /** Folder the source is written to, so `#include "x.h"` in the prelude finds the headers there; a fresh
   * temporary folder (removed afterwards) when not given. */
  dir?: string;
}

// -pedantic makes gcc report what C11 does not allow in a constant expression (an overflow, a shift out of range);
// those reports, not the exit status, decide whether an expression is refused, so gcc extensions that are only
// pedantic warnings (0b binary constants) still compile.
const BASE_FLAGS = ['-std=c11', '-pedantic', '-fno-diagnostics-show-caret', '-c'];

/** The diagnostics gcc gives an operation that is undefined or not constant (gcc 12 and avr-gcc 5.4 wording). */
const REFUSAL = /overflow|shift count|shift of negative|requires \d+ bits to represent|not a constant expression|not constant|division by zero/;
/** -Woverflow also reports a well-defined implicit conversion that wraps (C11 6.3.1.3): not a refusal. */
const WRAPPING_CONVERSION = /changes value|implicitly truncated/;
const refuses = (said: string): boolean => said.split('\n').some((line) => / (?:error|warning): /.test(line) && REFUSAL.test(line) && !WRAPPING_CONVERSION.test(line));

/**
 * Compiles `expressions` (after `#include <stdint.h>` and `prelude`) with the target's reference compiler and reads
 * each one's value, signedness, size and floating type from the object file. Compile only; nothing is run. Throws
 * when the compiler is missing or the prelude itself does not compile.
 */
export function compileConstants(target: Target, options: CompileOptions): CompiledConstant[] {
  const dir = options.dir ?? fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-ref-'));
  const results = new Array<CompiledConstant | undefined>(options.expressions.length);
  try {
    let pending = options.expressions.map((_, i) => i);
    while (pending.length) {
      const run = compile(target, options, dir, pending, 'initializer');
      if (run.values) {
        for (const i of pending) {
          const said = run.diagnostics.get(i);
          results[i] = said && refuses(said) ? { ok: false, diagnostic: said } : (run.values.get(i) as CompiledConstant);
        }
        break;
      }
      const refused = [...run.diagnostics].filter(([, said]) => / error: /.test(said));
      if (!refused.length) {
        if (!compile(target, options, dir, [], 'initializer').values) throw new Error(`the prelude does not compile with ${REFERENCE_COMPILERS[target].label}:\n${run.stderr}`);
        // The message names no expression's line: one at a time tells them apart.
        for (const i of pending) results[i] = pending.length === 1 ? { ok: false, diagnostic: run.stderr.trim() } : compileConstants(target, { ...options, expressions: [options.expressions[i]] })[0];
        break;
      }
      for (const [i, said] of refused) results[i] = fallback(target, options, dir, i, said);
      pending = pending.filter((i) => !run.diagnostics.has(i) || !/ error: /.test(run.diagnostics.get(i) as string));
    }
  } finally {
    if (!options.dir) fs.rmSync(dir, { recursive: true, force: true });
    else for (const f of ['tickmark-ref.c', 'tickmark-ref.o']) fs.rmSync(path.join(dir, f), { force: true });
  }
  return results as CompiledConstant[];
}

/**
 * avr-gcc 5.4 takes a `const` object only in a constant expression's strict sense, so `TICK_HZ * 2` is "not
 * constant" in a static initializer (gcc 8 and later fold it). Such an expression is read a second way: inside a
 * function at -O2, where the optimiser folds it, as an asm "i" operand that sets an absolute symbol.
 */
function fallback(target: Target, options: CompileOptions, dir: string, i: number, diagnostic: string): CompiledConstant {
  if (!/initializer element is not constant$/m.test(diagnostic) || refuses(diagnostic.replace(/initializer element is not constant$/gm, ''))) return { ok: false, diagnostic };
  const run = compile(target, options, dir, [i], 'asm');
  return run.values && !run.diagnostics.has(i) ? (run.values.get(i) as CompiledConstant) : { ok: false, diagnostic };
}

/**
 * gcc's messages grouped per expression: a warning or error with the notes that follow it belongs to every
 * expression whose source line it mentions (its own line, or an "in expansion of macro" note at that line).
 */
function diagnosticsByExpression(stderr: string, lineOf: Map<number, number>): Map<number, string> {
  const exprAt = new Map([...lineOf].map(([i, line]) => [line, i]));
  const records: string[][] = [];
  for (const text of stderr.split('\n')) {
    if (/ (error|warning|fatal error): /.test(text)) records.push([text]);
    else if (records.length && / note: /.test(text)) records[records.length - 1].push(text);
  }
  const said = new Map<number, string[]>();
  for (const record of records) {
    for (const text of record) {
      const i = exprAt.get(Number(/tickmark-ref\.c:(\d+):/.exec(text)?.[1]));
      if (i === undefined) continue;
      said.set(i, [...(said.get(i) ?? []), ...record]);
    }
  }
  return new Map([...said].map(([i, lines]) => [i, [...new Set(lines)].join('\n')]));
}

interface Run { values?: Map<number, CompiledConstant>; diagnostics: Map<number, string>; stderr: string }

const FLOATING = ['', 'float', 'double', 'long double'] as const;

function compile(target: Target, options: CompileOptions, dir: string, indices: number[], form: 'initializer' | 'asm'): Run {
  const compiler = REFERENCE_COMPILERS[target];
  const head = `#include <stdint.h>\n${options.prelude ?? ''}\n`;
  let line = head.split('\n').length;
  const lineOf = new Map<number, number>();
  const body = indices.map((i) => { lineOf.set(i, line++); return form === 'asm' ? asmForm(i, options.expressions[i], compiler.asmImmediate) : initializerForm(i, options.expressions[i]); });
  const source = path.join(dir, 'tickmark-ref.c');
  const object = path.join(dir, 'tickmark-ref.o');
  fs.writeFileSync(source, head + body.join('\n') + '\n');
  fs.rmSync(object, { force: true });
  const args = [...compiler.flags, ...BASE_FLAGS, ...(form === 'asm' ? ['-O2'] : []), ...(options.flags ?? []), source, '-o', object];
  const run = spawnSync(compiler.command, args, { encoding: 'utf8', cwd: dir });
  if (run.error) throw new Error(`${compiler.command} could not be started: ${run.error.message}`);
  const diagnostics = diagnosticsByExpression(run.stderr, lineOf);
  if (run.status !== 0) return { diagnostics, stderr: run.stderr };
  const symbols = readElfSymbols(fs.readFileSync(object));
  const values = new Map<number, CompiledConstant>();
  for (const i of indices) {
    const read = (name: string): ElfSymbol => {
      const found = symbols.get(`tm_${name}_${i}`);
      if (!found) throw new Error(`tm_${name}_${i} is missing from the object ${compiler.command} wrote`);
      return found;
    };
    const signed = read('s').value !== 0n;
    const size = Number(read('z').value);
    const floating = FLOATING[Number(read('k').value)] || undefined;
    const bits = form === 'asm' ? (read('hi').value << 32n) | read('lo').value : read('v').value;
    const doubleBytes = Number(read('f').value);
    let value: bigint | number;
    if (floating) {
      const raw = form === 'asm' ? Buffer.from(new BigUint64Array([bits]).buffer) : read('d').bytes;
      value = doubleBytes === 4 ? raw.readFloatLE(0) : raw.readDoubleLE(0);
    } else value = signed ? BigInt.asIntN(size * 8, bits) : BigInt.asUintN(size * 8, bits);
    values.set(i, { ok: true, value, signed, size, floating });
  }
  return { values, diagnostics, stderr: run.stderr };
}

// Every constant the reader needs, on one source line per expression (so a diagnostic's line names it):
// v an integer's value as unsigned long long, d a floating value as a double, s signedness, z sizeof,
// k which floating type (0 for an integer), f sizeof(double) on the target (4 on avr-gcc 5.4).
const KIND = (e: string): string => `_Generic(${e} + 0, float: 1, double: 2, long double: 3, default: 0)`;
const SIGNED = (e: string): string => `((__typeof__(${e}))-1 < (__typeof__(${e}))0)`;
const AS_INTEGER = (e: string): string => `(unsigned long long)_Generic(${e} + 0, float: 0, double: 0, long double: 0, default: ${e})`;
const AS_DOUBLE = (e: string): string => `(double)_Generic(${e} + 0, float: ${e}, double: ${e}, long double: ${e}, default: 0)`;

function initializerForm(i: number, expr: string): string {
  const e = `(${expr})`;
  return `const unsigned long long tm_v_${i} = ${AS_INTEGER(e)}; const double tm_d_${i} = ${AS_DOUBLE(e)}; const int tm_s_${i} = ${SIGNED(e)}; const unsigned tm_z_${i} = sizeof ${e}; const int tm_k_${i} = ${KIND(e)}; const int tm_f_${i} = sizeof(double);`;
}

function asmForm(i: number, expr: string, immediate: string): string {
  const e = `(${expr})`;
  const set = (name: string, value: string): string => `__asm__ volatile (".global tm_${name}_${i}\\n.set tm_${name}_${i}, ${immediate}0" :: "i"((uint32_t)(${value})));`;
  const floating = `(${KIND(e)} != 0)`;
  // A union of 32-bit words: avr-gcc folds this punning at -O2, not one through an unsigned long long.
  return `void tm_fold_${i}(void) { union { double d; uint32_t w[2]; } tm_b = { .w = { 0, 0 } }; tm_b.d = ${AS_DOUBLE(e)}; ${set('lo', `${floating} ? tm_b.w[0] : ${AS_INTEGER(e)}`)} ${set('hi', `${floating} ? tm_b.w[1] : ${AS_INTEGER(e)} >> 32`)} ${set('s', SIGNED(e))} ${set('z', `sizeof ${e}`)} ${set('k', KIND(e))} ${set('f', 'sizeof(double)')} }`;
}
