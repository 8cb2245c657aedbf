// Engineering notation for display: exponent a multiple of 3 with an SI prefix, trimmed significant figures;
// and a circuit's results as they read everywhere (lens, hover, CLI, preview, panel, finding messages).
import type { CircuitModel } from './circuits/model';

/** U+2212: a real minus sign for display; the value parser reads it back. */
export const MINUS = '\u2212';
export const NOT_A_NUMBER = '—';

// BIPM SI Brochure, 9th ed., table 7; femto … tera covers electronics timing.
const prefixByExponent: Readonly<Record<number, string>> = {
  [-15]: 'f', [-12]: 'p', [-9]: 'n', [-6]: 'µ', [-3]: 'm', 0: '', 3: 'k', 6: 'M', 9: 'G', 12: 'T',
};

function withSign(negative: boolean, text: string): string {
  return negative ? MINUS + text : text;
}

/** Rounds to `sig` significant figures and prints without binary noise or needless zeros. */
function plainDigits(magnitude: number, sig: number): string {
  const rounded = Number(magnitude.toPrecision(sig));
  const text = String(rounded);
  // String() switches to exponent form below 1e-6 and from 1e21; keep it readable there.
  return text.includes('e') ? rounded.toExponential(Math.max(0, sig - 1)).replace(/\.?0*e\+?/, 'e') : text;
}

function clampSig(sig: number): number {
  return Math.min(15, Math.max(1, Math.round(sig)));
}

/** A plain number rounded to `sig` significant figures: 0.0052834 → "0.005283", −3 → "−3". */
export function formatNumber(x: number, sig = 4): string {
  if (!Number.isFinite(x)) return NOT_A_NUMBER;
  if (x === 0) return '0';
  return withSign(x < 0, plainDigits(Math.abs(x), clampSig(sig)));
}

/**
 * Engineering notation with an SI prefix: (189.3, 'Hz') → "189.3 Hz", (0.005283, 's') → "5.283 ms",
 * (47000, 'Ω') → "47 kΩ". Without a unit the prefix sits against the number, as values are written ("47k").
 */
export function formatQuantity(x: number, unit: string, sig = 4): string {
  if (unit === '%') return formatPercent(x, sig);
  // A compound dimension has no symbol of ours; show the number alone.
  if (unit === 'other') unit = '';
  if (!Number.isFinite(x)) return NOT_A_NUMBER;
  const s = clampSig(sig);
  const separator = unit === '' ? '' : ' ';
  if (x === 0) return `0${separator}${unit}`;
  // Round first: 999.96 at 4 figures is 1 k, not 1000.
  const rounded = Number(Math.abs(x).toPrecision(s));
  const exponent = Number(rounded.toExponential(s - 1).split('e')[1]);
  const engineering = Math.floor(exponent / 3) * 3;
  const prefix = prefixByExponent[engineering];
  if (prefix === undefined) {
    return withSign(x < 0, `${rounded.toExponential(s - 1).replace(/\.?0*e\+?/, 'e')}${separator}${unit}`);
  }
  const [digits, power] = rounded.toExponential(s - 1).split('e');
  const mantissa = Number(`${digits}e${Number(power) - engineering}`);
  return withSign(x < 0, `${plainDigits(mantissa, s)}${unit === '' ? prefix : ` ${prefix}${unit}`}`);
}

/** A fraction as percent: 0.468 → "46.8 %". */
export function formatPercent(fraction: number, sig = 4): string {
  if (!Number.isFinite(fraction)) return NOT_A_NUMBER;
  return `${formatNumber(fraction * 100, sig)} %`;
}

/** A baud rate as the trade reads it, a whole number in one spelling of the unit: 9615.4 → "9615.4 baud". */
export function formatBaud(rate: number): string {
  if (!Number.isFinite(rate)) return NOT_A_NUMBER;
  return `${Math.round(rate * 10) / 10} baud`;
}

/** A difference as a signed percent: −0.023 → "−2.3 %", 0.05 → "+5 %", 0 → "0 %". */
export function formatSignedPercent(fraction: number, sig = 3): string {
  if (!Number.isFinite(fraction)) return NOT_A_NUMBER;
  const text = formatPercent(fraction, sig);
  return fraction > 0 && text !== '0 %' ? `+${text}` : text;
}

export function formatResult(model: CircuitModel, key: string, value: number): string {
  const spec = model.results.find((r) => r.key === key);
  // An error is a signed deviation; a duty is a plain share.
  if (spec?.percent) return key === 'error' ? formatSignedPercent(value) : formatPercent(value);
  // Baud rates are read as whole numbers in the trade (9600, 115200), not with prefixes.
  if (key === 'baud') return formatBaud(value);
  // Below 1 Hz a prefix misleads: "500 mHz" is read as MHz at a glance. Long times stay in seconds, not ks.
  if (spec?.dim === 'Hz' && Math.abs(value) < 1 && value !== 0) return `${formatNumber(value, 4)} Hz`;
  if (spec?.dim === 's' && Math.abs(value) >= 1000) return `${formatNumber(value, 4)} s`;
  // Counts and register values are whole numbers a firmware engineer compares digit by digit.
  if (!spec?.dim && Number.isInteger(value) && Math.abs(value) < 1e15) return String(value);
  return formatQuantity(value, spec?.dim ?? '');
}

/** A firmware constant as the compiler sees it: whole numbers in full, others in engineering form. */
export function formatConstant(value: number): string {
  return Number.isInteger(value) && Math.abs(value) < 1e15 ? String(value) : formatQuantity(value, '');
}
