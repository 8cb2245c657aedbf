// Building blocks shared by the circuit model files: parameter specs, checks, number text, cautions.
import { formatPercent, formatQuantity } from '../format';
import { Code } from '../codes';
export { finiteOnly } from '../num';
import type { ModelInput, ModelIssue, QuantityParam, ResultSpec } from './model';

type Defaults = Pick<QuantityParam, 'default' | 'defaultText' | 'solvable' | 'min' | 'max' | 'integer' | 'register' | 'optional' | 'template'>;

export function quantity(key: string, label: string, dim: QuantityParam['dim'], description: string, more: Defaults = {}): QuantityParam {
  return { kind: 'quantity', key, label, dim, description, ...more };
}

export const resistor = (key: string, label: string, description: string, more: Defaults = {}) =>
  quantity(key, label, 'Ω', description, { solvable: true, ...more });

export const capacitor = (key: string, label: string, description: string, more: Defaults = {}) =>
  quantity(key, label, 'F', description, { solvable: true, ...more });

export const voltage = (key: string, label: string, description: string, more: Defaults = {}) =>
  quantity(key, label, 'V', description, more);

/** Results of every relaxation oscillator, in the order of docs/blocks.md ("Circuits"). */
export const oscillatorResults: readonly ResultSpec[] = [
  { key: 'high', label: 'output high time', dim: 's' },
  { key: 'low', label: 'output low time', dim: 's' },
  { key: 'period', label: 'period', dim: 's' },
  { key: 'frequency', label: 'frequency', dim: 'Hz' },
  { key: 'duty', label: 'duty (high / period)', dim: '', percent: true },
  { key: 'first-edge', label: 'first output edge, from a discharged capacitor at power-up', dim: 's' },
];

export const oscillatorHeadline = ['frequency', 'period', 'duty'] as const;

/** One key's value, present and finite; reported under its own key. */
function finiteAt(input: ModelInput, key: string, issues: ModelIssue[]): boolean {
  const value = input.values[key];
  if (value !== undefined && Number.isFinite(value)) return true;
  issues.push({ key, message: `\`${key}\` needs a finite value` });
  return false;
}

/** A value that must be present and finite; reports it under its own key. */
export function checkFinite(input: ModelInput, keys: readonly string[], issues: ModelIssue[]): boolean {
  let ok = true;
  for (let i = 0; i < keys.length; i++) if (!finiteAt(input, keys[i], issues)) ok = false;
  return ok;
}

/** R, C, τ and the like: zero or negative values have no physical meaning here. */
export function checkPositive(input: ModelInput, keys: readonly string[], issues: ModelIssue[]): boolean {
  let ok = true;
  for (let i = 0; i < keys.length; i++) {
    const key = keys[i];
    const value = input.values[key];
    if (!finiteAt(input, key, issues)) ok = false;
    else if (value <= 0) {
      issues.push({ key, message: `\`${key}\` must be greater than zero (got ${eng(value)})` });
      ok = false;
    }
  }
  return ok;
}

/** A register or count: a whole number within [min, max] when present (absent keys are left to the caller). */
export function checkWhole(input: ModelInput, key: string, min: number, max: number, issues: ModelIssue[]): boolean {
  const value = input.values[key];
  if (value === undefined) return true;
  if (!Number.isInteger(value) || value < min || value > max) {
    issues.push({ key, code: Code.registerRange, message: `\`${key}\` must be a whole number from ${min} to ${max} (got ${eng(value)})` });
    return false;
  }
  return true;
}

export function hasErrors(issues: readonly ModelIssue[]): boolean {
  return issues.some((issue) => (issue.severity ?? 'error') === 'error');
}


/** Engineering notation for model messages and working lines: the one formatter of core/format.ts. */
export function eng(value: number, unit = ''): string {
  return formatQuantity(value, unit);
}

export function percent(fraction: number): string {
  return formatPercent(fraction);
}

/** 60 V DC: the SELV limit of IEC 60950-1 and the ES1 limit of IEC 62368-1 (from memory), common practice for "safe to touch". */
export const elvLimitVolts = 60;

export function voltageCautions(input: ModelInput, keys: readonly string[]): string[] {
  const highest = Math.max(0, ...keys.map((key) => Math.abs(input.values[key] ?? 0)).filter(Number.isFinite));
  if (highest <= elvLimitVolts) return [];
  return [
    `${eng(highest, 'V')} is above ${elvLimitVolts} V DC, the safety-extra-low-voltage limit (SELV of IEC 60950-1, ES1 of IEC 62368-1): ` +
      'hazardous voltage — follow local codes and licensed practice.',
  ];
}

const safetyWords = /watchdog|\bwdt\b|\bwdg\b|reset|\bpor\b|\bnrst\b|brown-?out|supervis|safety|interlock|e-?stop|brake/i;

/** Whether a block's name says its timing guards people or property (watchdog, reset, interlock …). */
const nameSeparators = /[-_]/g;

export function isSafetyName(name: string | undefined): boolean {
  return name !== undefined && safetyWords.test(name.replace(nameSeparators, ' '));
}

export const safetyCaution =
  'Safety-related timing (watchdog, reset, interlock): verify it independently on the built hardware, worst case over ' +
  'tolerance, temperature and supply, and follow the functional-safety standards and licensed practice that apply.';


/** A value inside a formula: negatives in parentheses so "5 V − (−2.5 V)" reads right. */
export function term(value: number, unit = ''): string {
  const text = eng(value, unit);
  return value < 0 ? `(${text.replace('-', '−')})` : text;
}
