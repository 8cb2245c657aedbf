// C arithmetic types under a data model, and the conversions of ISO C11 6.3.

export type DataModel = 'ilp32' | 'lp64' | 'ip16';

export interface IntType {
  kind: 'int'; name: string; bits: number; signed: boolean;
  /** C11 6.3.1.1 conversion rank. */ rank: number;
  /** For a typedef (`uint16_t`): the keyword type it names, which arithmetic results are reported as. */
  base?: string;
}
export interface FloatType {
  kind: 'float'; name: 'float' | 'double' | 'long double'; rank: number;
  /** binary32 or binary64 (IEC 60559); a wider long double is read as binary64. */ bits: 32 | 64;
}
export type CType = IntType | FloatType;

/** A typedef name that undecided #if branches define as different types: using it is a finding, never a guess. */
export interface TypeConflict { kind: 'conflict'; message: string }

/** An evaluated value: BigInt for integer types, a JS double for floating types. */
export interface Val { v: bigint | number; t: CType }

const RANK = { bool: 0, char: 1, short: 2, int: 3, long: 4, llong: 5 };

export interface TypeSystem {
  model: DataModel;
  /** Keyword spellings (`unsigned long`, `int`) and the <stdint.h> names. */
  named: Map<string, CType>;
  int: IntType;
  uint: IntType;
  llong: IntType;
  ullong: IntType;
  double: FloatType;
  sizeT: IntType;
}

const it = (name: string, bits: number, signed: boolean, rank: number): IntType => ({ kind: 'int', name, bits, signed, rank });

/**
 * `charSigned`: plain char is signed on x86 and AVR gcc, unsigned on ARM and RISC-V (an implementation choice,
 * C11 6.2.5p15; the processors' ABIs), so by default unsigned under ilp32 only.
 */
export function typeSystem(model: DataModel, charSigned = model !== 'ilp32'): TypeSystem {
  const intBits = model === 'ip16' ? 16 : 32;
  const longBits = model === 'lp64' ? 64 : 32;
  const types: IntType[] = [
    it('_Bool', 1, false, RANK.bool),
    it('char', 8, charSigned, RANK.char), it('signed char', 8, true, RANK.char), it('unsigned char', 8, false, RANK.char),
    it('short', 16, true, RANK.short), it('unsigned short', 16, false, RANK.short),
    it('int', intBits, true, RANK.int), it('unsigned int', intBits, false, RANK.int),
    it('long', longBits, true, RANK.long), it('unsigned long', longBits, false, RANK.long),
    it('long long', 64, true, RANK.llong), it('unsigned long long', 64, false, RANK.llong),
  ];
  const named = new Map<string, CType>(types.map((t) => [t.name, t]));
  // avr-gcc (5.4 and 7.3, as Debian ships it) makes double and long double 32-bit, like float.
  const doubleBits = model === 'ip16' ? 32 : 64;
  named.set('float', { kind: 'float', name: 'float', rank: 0, bits: 32 });
  named.set('double', { kind: 'float', name: 'double', rank: 1, bits: doubleBits });
  named.set('long double', { kind: 'float', name: 'long double', rank: 2, bits: doubleBits });
  const by = (n: string): IntType => named.get(n) as IntType;
  // <stdint.h> as glibc (x86, x86-64) and avr-libc define them; the names keep their spelling for display.
  const alias = (name: string, of: string): void => { named.set(name, { ...by(of), name, base: of }); };
  alias('int8_t', 'signed char'); alias('uint8_t', 'unsigned char');
  alias('int16_t', model === 'ip16' ? 'int' : 'short'); alias('uint16_t', model === 'ip16' ? 'unsigned int' : 'unsigned short');
  alias('int32_t', model === 'ip16' ? 'long' : 'int'); alias('uint32_t', model === 'ip16' ? 'unsigned long' : 'unsigned int');
  alias('int64_t', model === 'lp64' ? 'long' : 'long long'); alias('uint64_t', model === 'lp64' ? 'unsigned long' : 'unsigned long long');
  alias('size_t', model === 'lp64' ? 'unsigned long' : 'unsigned int');
  alias('bool', '_Bool');
  return {
    model, named, int: by('int'), uint: by('unsigned int'), llong: by('long long'), ullong: by('unsigned long long'),
    double: named.get('double') as FloatType, sizeT: named.get('size_t') as IntType,
  };
}

// Range limits by width and signedness, made once: every arithmetic result is checked against them.
const limits: Array<{ min: bigint; max: bigint } | undefined> = [];
const limitsOf = (t: IntType): { min: bigint; max: bigint } => {
  const key = t.bits * 2 + (t.signed ? 1 : 0);
  return (limits[key] ??= t.signed
    ? { min: -(1n << BigInt(t.bits - 1)), max: (1n << BigInt(t.bits - 1)) - 1n }
    : { min: 0n, max: (1n << BigInt(t.bits)) - 1n });
};
export const maxOf = (t: IntType): bigint => limitsOf(t).max;
export const minOf = (t: IntType): bigint => limitsOf(t).min;
export const fits = (v: bigint, t: IntType): boolean => { const l = limitsOf(t); return v >= l.min && v <= l.max; };

/** Integer to integer: modulo 2^N for unsigned (C11 6.3.1.3p2); gcc documents the same wrap for signed. */
export function wrap(v: bigint, t: IntType): bigint {
  if (t.bits === 1) return v !== 0n ? 1n : 0n;
  if (fits(v, t)) return v;
  return t.signed ? BigInt.asIntN(t.bits, v) : BigInt.asUintN(t.bits, v);
}

/** Converts a value to a type; floating to integer out of range is undefined (C11 6.3.1.4p1), so it returns an error text. */
export function convert(x: Val, t: CType): Val | string {
  if (t.kind === 'float') return { v: typeof x.v === 'bigint' ? integerToFloating(x.v, t) : roundFloating(x.v, t), t };
  if (typeof x.v === 'bigint') {
    const v = wrap(x.v, t);
    // Values are never changed once made, so one already of this type and in its range is the result itself.
    return v === x.v && x.t === t ? x : { v, t };
  }
  if (t.bits === 1) return { v: x.v !== 0 ? 1n : 0n, t };
  if (!Number.isFinite(x.v)) return `${x.v} cannot be converted to ${t.name}`;
  const truncated = BigInt(Math.trunc(x.v));
  if (!fits(truncated, t)) return `${x.v} is out of range of ${t.name} (undefined behaviour, C11 6.3.1.4)`;
  return { v: truncated, t };
}

/** A result of floating arithmetic rounded to the type's format: each binary32 operation is exact in binary64 and
 * then rounded once more, which gives the binary32 result for + - * / (IEC 60559 double rounding is innocuous
 * when the wider format has at least 2p + 2 bits, Figueroa 1995). */
export const roundFloating = (d: number, t: FloatType): number => (t.bits === 32 ? Math.fround(d) : d);

/** An integer converted to a floating type, rounded once to nearest, ties to even (C11 6.3.1.4p2, Annex F). */
export function integerToFloating(v: bigint, t: FloatType): number {
  const precision = t.bits === 32 ? 24 : 53;
  const magnitude = v < 0n ? -v : v;
  const excess = magnitude.toString(2).length - precision;
  if (excess <= 0) return Number(v);
  const half = 1n << BigInt(excess - 1);
  let kept = magnitude >> BigInt(excess);
  const rest = magnitude & ((half << 1n) - 1n);
  if (rest > half || (rest === half && (kept & 1n) === 1n)) kept += 1n;
  const rounded = Number(kept) * 2 ** excess;
  return roundFloating(v < 0n ? -rounded : rounded, t);
}

/** Integer promotions, C11 6.3.1.1p2. */
export function promote(t: CType, ts: TypeSystem): CType {
  if (t.kind === 'float') return t;
  if (t.rank >= RANK.int) return t.base ? (ts.named.get(t.base) ?? t) : t;
  return t.bits < ts.int.bits || (t.bits === ts.int.bits && t.signed) ? ts.int : ts.uint;
}

/** The usual arithmetic conversions, C11 6.3.1.8p1: the common type of two operands. */
export function commonType(a: CType, b: CType, ts: TypeSystem): CType {
  if (a.kind === 'float' || b.kind === 'float') {
    if (a.kind === 'float' && b.kind === 'float') return a.rank >= b.rank ? a : b;
    return a.kind === 'float' ? a : b;
  }
  const x = promote(a, ts) as IntType;
  const y = promote(b, ts) as IntType;
  if (x.signed === y.signed) return x.rank >= y.rank ? x : y;
  const u = x.signed ? y : x;
  const s = x.signed ? x : y;
  if (u.rank >= s.rank) return u;
  if (s.bits > u.bits) return s;
  return unsignedOf(s, ts);
}

export function unsignedOf(t: IntType, ts: TypeSystem): IntType {
  for (const c of ts.named.values()) if (c.kind === 'int' && !c.signed && c.rank === t.rank && c.bits === t.bits && !c.base) return c;
  return { ...t, signed: false, name: `unsigned ${t.name}` };
}

/** Canonical name of a run of type keywords (`long unsigned int` → `unsigned long`), or undefined when they do not form one. */
export function keywordTypeName(words: string[]): string | undefined {
  let sign = ''; let longs = 0; let base = ''; let short = false;
  for (const w of words) {
    if (w === 'const' || w === 'volatile') continue;
    if (w === 'signed' || w === 'unsigned') { if (sign) return undefined; sign = w; }
    else if (w === 'long') longs++;
    else if (w === 'short') short = true;
    else if (w === 'int' || w === 'char' || w === 'float' || w === 'double' || w === '_Bool') { if (base) return undefined; base = w; }
    else return undefined;
  }
  if (base === 'float' || base === '_Bool') return sign || longs || short ? undefined : base;
  if (base === 'double') return sign || short || longs > 1 ? undefined : longs ? 'long double' : 'double';
  if (base === 'char') return longs || short ? undefined : sign ? `${sign} char` : 'char';
  if (short && longs) return undefined;
  if (longs > 2) return undefined;
  const size = short ? 'short' : longs === 2 ? 'long long' : longs === 1 ? 'long' : base === 'int' || sign ? 'int' : '';
  if (!size) return undefined;
  return sign === 'unsigned' ? `unsigned ${size}` : size;
}

export const TYPE_KEYWORDS = new Set(['signed', 'unsigned', 'long', 'short', 'int', 'char', 'float', 'double', '_Bool', 'const', 'volatile']);
