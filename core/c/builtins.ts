// What the compiler brings itself: its predefined macros (sizes and limits of the data model) and the
// freestanding headers <stdint.h>, <limits.h>, <stdbool.h>, <stddef.h>, <inttypes.h>, written as gcc's and
// avr-libc's own headers write them, so each limit keeps the value and the type the compiler gives it.
import { maxOf, type IntType, type TypeSystem } from './ctypes';

/** The freestanding headers served from here, never searched for on disk (a toolchain's own need its builtins). */
export const BUILTIN_HEADERS = new Set(['stdint.h', 'limits.h', 'stdbool.h', 'stddef.h', 'inttypes.h']);

export const BUILTIN_URI_PREFIX = '<built-in>/';

const int = (ts: TypeSystem, name: string): IntType => ts.named.get(name) as IntType;

/** A literal of `t`'s maximum with the suffix that gives it that type. */
function maxLiteral(t: IntType): string {
  const suffix = (t.signed ? '' : 'U') + (t.rank === 4 ? 'L' : t.rank === 5 ? 'LL' : '');
  return `${maxOf(t)}${suffix}`;
}

const suffixOf = (t: IntType, ts: TypeSystem): string => {
  const base = int(ts, t.base ?? t.name);
  // Types narrower than int promote: their constant macros are plain int constants (C11 7.20.4p3).
  if (base.rank < 3) return '';
  return (base.signed ? '' : 'U') + (base.rank === 4 ? 'L' : base.rank === 5 ? 'LL' : '');
};

/** gcc's predefined size and limit macros for the data model (`gcc -dM -E` lists them). */
export function compilerPredefines(ts: TypeSystem): string {
  const lines = [
    '#define __CHAR_BIT__ 8',
    `#define __SIZEOF_SHORT__ 2`,
    `#define __SIZEOF_INT__ ${ts.int.bits / 8}`,
    `#define __SIZEOF_LONG__ ${int(ts, 'long').bits / 8}`,
    '#define __SIZEOF_LONG_LONG__ 8',
    `#define __SIZEOF_POINTER__ ${ts.model === 'lp64' ? 8 : ts.model === 'ip16' ? 2 : 4}`,
    `#define __SIZEOF_FLOAT__ 4`,
    `#define __SIZEOF_DOUBLE__ ${ts.model === 'ip16' ? 4 : 8}`,
    '#define __SCHAR_MAX__ 0x7f',
    '#define __SHRT_MAX__ 0x7fff',
    `#define __INT_MAX__ ${ts.int.bits === 16 ? '0x7fff' : '0x7fffffff'}`,
    `#define __LONG_MAX__ ${int(ts, 'long').bits === 64 ? '0x7fffffffffffffffL' : '0x7fffffffL'}`,
    '#define __LONG_LONG_MAX__ 0x7fffffffffffffffLL',
  ];
  if (!int(ts, 'char').signed) lines.push('#define __CHAR_UNSIGNED__ 1');
  return lines.join('\n') + '\n';
}

function stdint(ts: TypeSystem): string {
  const out: string[] = [];
  const names = (n: number) => [`int${n}_t`, `uint${n}_t`];
  for (const bits of [8, 16, 32, 64]) {
    const [s, u] = names(bits).map((n) => int(ts, n));
    const sBase = int(ts, s.base ?? s.name);
    out.push(`#define INT${bits}_MAX ${sBase.rank < 3 ? maxOf(s) : maxLiteral(sBase)}`);
    out.push(`#define INT${bits}_MIN (-INT${bits}_MAX - 1)`);
    // uint8_t and (beyond 16-bit int) uint16_t promote to int: their maxima are int constants, as gcc writes them.
    const uBase = int(ts, u.base ?? u.name);
    out.push(`#define UINT${bits}_MAX ${uBase.rank < 3 ? maxOf(u) : maxLiteral(uBase)}`);
    out.push(`#define INT${bits}_C(c) c${suffixOf(s, ts) ? ' ## ' + suffixOf(s, ts) : ''}`);
    out.push(`#define UINT${bits}_C(c) c${suffixOf(u, ts) ? ' ## ' + suffixOf(u, ts) : ''}`);
    for (const kind of ['LEAST', 'FAST']) {
      out.push(`#define INT_${kind}${bits}_MAX INT${bits}_MAX`, `#define INT_${kind}${bits}_MIN INT${bits}_MIN`, `#define UINT_${kind}${bits}_MAX UINT${bits}_MAX`);
    }
  }
  out.push('#define INTMAX_MAX INT64_MAX', '#define INTMAX_MIN INT64_MIN', '#define UINTMAX_MAX UINT64_MAX');
  out.push('#define INTMAX_C(c) INT64_C(c)', '#define UINTMAX_C(c) UINT64_C(c)');
  const ptrBits = ts.model === 'lp64' ? 64 : ts.model === 'ip16' ? 16 : 32;
  out.push(`#define INTPTR_MAX INT${ptrBits}_MAX`, `#define INTPTR_MIN INT${ptrBits}_MIN`, `#define UINTPTR_MAX UINT${ptrBits}_MAX`);
  out.push(`#define PTRDIFF_MAX INT${ptrBits}_MAX`, `#define PTRDIFF_MIN INT${ptrBits}_MIN`, `#define SIZE_MAX ${maxLiteral(int(ts, ts.sizeT.base ?? 'unsigned int'))}`);
  return out.join('\n') + '\n';
}

function limits(ts: TypeSystem): string {
  const charSigned = int(ts, 'char').signed;
  const shortIsInt = ts.int.bits === 16;
  return [
    '#define CHAR_BIT __CHAR_BIT__',
    '#define SCHAR_MAX __SCHAR_MAX__',
    '#define SCHAR_MIN (-SCHAR_MAX - 1)',
    '#define UCHAR_MAX (SCHAR_MAX * 2 + 1)',
    charSigned ? '#define CHAR_MIN SCHAR_MIN' : '#define CHAR_MIN 0',
    charSigned ? '#define CHAR_MAX SCHAR_MAX' : '#define CHAR_MAX UCHAR_MAX',
    '#define SHRT_MAX __SHRT_MAX__',
    '#define SHRT_MIN (-SHRT_MAX - 1)',
    // gcc's <limits.h>: unsigned short widens to unsigned int where short is as wide as int.
    shortIsInt ? '#define USHRT_MAX (SHRT_MAX * 2U + 1U)' : '#define USHRT_MAX (SHRT_MAX * 2 + 1)',
    '#define INT_MAX __INT_MAX__',
    '#define INT_MIN (-INT_MAX - 1)',
    '#define UINT_MAX (INT_MAX * 2U + 1U)',
    '#define LONG_MAX __LONG_MAX__',
    '#define LONG_MIN (-LONG_MAX - 1L)',
    '#define ULONG_MAX (LONG_MAX * 2UL + 1UL)',
    '#define LLONG_MAX __LONG_LONG_MAX__',
    '#define LLONG_MIN (-LLONG_MAX - 1LL)',
    '#define ULLONG_MAX (LLONG_MAX * 2ULL + 1ULL)',
  ].join('\n') + '\n';
}

/** The text of a built-in header for the data model, or undefined when `name` is not one. */
export function builtinHeader(name: string, ts: TypeSystem): string | undefined {
  switch (name) {
    case 'stdint.h': return stdint(ts);
    case 'inttypes.h': return '#include <stdint.h>\n';
    case 'limits.h': return limits(ts);
    case 'stdbool.h': return '#define bool _Bool\n#define true 1\n#define false 0\n#define __bool_true_false_are_defined 1\n';
    case 'stddef.h': return '#define NULL ((void *)0)\n';
    default: return undefined;
  }
}
