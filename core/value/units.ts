// SI prefixes and the units a value may carry. Scale is kept as a power of ten so that
// decimal text converts to the nearest double in one step (Number("100e-9"), not 100 * 1e-9).
import type { Dim } from '../types';

/** Powers of ten of the SI prefixes (BIPM SI Brochure, 9th ed., table 7), femto to tera. */
export const prefixExponent: Readonly<Record<string, number>> = {
  f: -15, p: -12, n: -9, u: -6, m: -3, k: 3, M: 6, G: 9, T: 12,
  '\u00b5': -6, // micro sign
  '\u03bc': -6, // Greek small mu
  // Upper-case K for kilo is not SI but is common practice on schematics and BOMs (4K7, 47K).
  K: 3,
};

export interface UnitInfo {
  dim: Dim;
  /** Power of ten the unit itself contributes: % is 10^-2, ppm 10^-6. */
  exponent: number;
  /** Whether an SI prefix may precede it (kΩ yes, k% no). */
  prefixable: boolean;
}

const ohm: UnitInfo = { dim: 'Ω', exponent: 0, prefixable: true };

export const units: Readonly<Record<string, UnitInfo>> = {
  '\u03a9': ohm, // Greek capital omega
  '\u2126': ohm, // ohm sign
  ohm,
  ohms: ohm,
  // 47R, 0R: the letter R for ohms is common practice (IEC 60062 uses it as the decimal marker).
  R: { dim: 'Ω', exponent: 0, prefixable: false },
  F: { dim: 'F', exponent: 0, prefixable: true },
  V: { dim: 'V', exponent: 0, prefixable: true },
  A: { dim: 'A', exponent: 0, prefixable: true },
  Hz: { dim: 'Hz', exponent: 0, prefixable: true },
  s: { dim: 's', exponent: 0, prefixable: true },
  baud: { dim: 'baud', exponent: 0, prefixable: true },
  Bd: { dim: 'baud', exponent: 0, prefixable: true },
  // A bus bitrate (CAN): its own measure, as baud is, so a bitrate claim cannot be read as a frequency.
  'bit/s': { dim: 'bit/s', exponent: 0, prefixable: true },
  '%': { dim: '%', exponent: -2, prefixable: false },
  // Parts per million: the trade's unit for crystal tolerance; a fraction like percent.
  ppm: { dim: '%', exponent: -6, prefixable: false },
};

export interface Scale {
  dim: Dim;
  exponent: number;
  /** True when the suffix is a prefix alone (47k), with no unit. */
  prefixOnly: boolean;
}

/** Reads `k`, `kΩ`, `MHz`, `%`, `ohm` …; undefined when the text is not a prefix and/or unit. */
export function decodeSuffix(suffix: string): Scale | undefined {
  const unit = units[suffix];
  if (unit) return { dim: unit.dim, exponent: unit.exponent, prefixOnly: false };
  const prefix = prefixExponent[suffix[0] ?? ''];
  if (prefix === undefined) return undefined;
  const rest = suffix.slice(1);
  if (rest === '') return { dim: '', exponent: prefix, prefixOnly: true };
  const prefixed = units[rest];
  if (!prefixed || !prefixed.prefixable) return undefined;
  return { dim: prefixed.dim, exponent: prefix + prefixed.exponent, prefixOnly: false };
}

/** IEC 60062 letter-and-digit code letters: the letter is the decimal marker and the multiplier. */
export const letterCode: Readonly<Record<string, { exponent: number; dim: Dim }>> = {
  R: { exponent: 0, dim: 'Ω' },
  K: { exponent: 3, dim: '' }, k: { exponent: 3, dim: '' },
  M: { exponent: 6, dim: '' }, G: { exponent: 9, dim: '' }, T: { exponent: 12, dim: '' },
  p: { exponent: -12, dim: '' }, n: { exponent: -9, dim: '' },
  u: { exponent: -6, dim: '' }, '\u00b5': { exponent: -6, dim: '' }, '\u03bc': { exponent: -6, dim: '' },
  m: { exponent: -3, dim: '' },
  // 3V3 for 3.3 V is common practice on schematics, after the same pattern.
  V: { exponent: 0, dim: 'V' },
};

/** Canonical suffixes offered in "did you mean" hints (no K, no duplicate µ or Ω forms). */
export const suggestableSuffixes: readonly string[] = (() => {
  const out: string[] = ['k', 'M', 'G', 'T', 'm', 'u', 'µ', 'n', 'p', 'f'];
  const unitNames = ['Ω', 'ohm', 'F', 'V', 'A', 'Hz', 's', 'baud', 'Bd', 'bit/s'];
  out.push(...unitNames, '%', 'ppm', 'R');
  for (const p of ['f', 'p', 'n', 'u', 'µ', 'm', 'k', 'M', 'G', 'T']) {
    for (const u of unitNames) out.push(p + u);
  }
  return out;
})();

/** Up to two known suffixes one case change or one stray character away from `suffix`. */
export function suggestSuffix(suffix: string): string[] {
  if (suffix.length > 12) return [];
  const found: string[] = [];
  const lower = suffix.toLowerCase();
  for (const s of suggestableSuffixes) {
    if (s !== suffix && s.toLowerCase() === lower && !found.includes(s)) found.push(s);
  }
  for (let i = 0; i < suffix.length && found.length === 0; i++) {
    const shorter = suffix.slice(0, i) + suffix.slice(i + 1);
    if (shorter !== '' && suggestableSuffixes.includes(shorter) && !found.includes(shorter)) found.push(shorter);
  }
  return found.slice(0, 2);
}
