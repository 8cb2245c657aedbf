// How results read: one formatter for lens, hover, CLI and preview so a value looks the same everywhere.
import type { BlockAnalysis } from '../types';
import type { CircuitModel } from '../circuits/model';
import { circuitById } from '../circuits/registry';
import { formatConstant, formatQuantity, formatResult } from '../format';
import { severityMark } from './marks';
export { formatConstant, formatResult };

/** The code lens line: headline numbers, the worst-case band of the first, or the block's first error. */
export function headline(analysis: BlockAnalysis): string {
  const error = analysis.findings.find((f) => f.severity === 'error');
  // The same mark as the hover and the preview give an error.
  if (error) return `${severityMark.error} ${error.message}`;
  const model = analysis.circuit ? circuitById(analysis.circuit) : undefined;
  if (!model) return analysis.name;
  const parts: string[] = [];
  for (const key of headlineKeys(model, analysis.values)) {
    const value = analysis.values[key];
    if (value === undefined) continue;
    const text = formatResult(model, key, value);
    parts.push(model.results.find((r) => r.key === key)?.percent ? `${text} ${key}` : text);
  }
  const first = headlineKeys(model, analysis.values).find((k) => analysis.spread?.[k]);
  const band = first ? analysis.spread![first] : undefined;
  const bandWords = first ? spreadText(model, first, band) : '';
  if (bandWords) parts.push(`${bandWords} worst case`);
  for (const [key, part] of Object.entries(analysis.solved ?? {})) {
    const spec = model.params.find((p) => p.key === key);
    const dim = spec && spec.kind === 'quantity' ? spec.dim : '';
    parts.push(`${key} = ${dim ? formatQuantity(part.value, dim) : formatConstant(part.value)}${part.series ? ` (${part.series})` : ''}`);
  }
  const warnings = analysis.findings.filter((f) => f.severity === 'warning').length;
  if (warnings) parts.push(`${warnings} warning${warnings > 1 ? 's' : ''}`);
  return parts.join(' · ') || analysis.name;
}

/**
 * The model's headline order, except that below 1 Hz the period leads: a 2 s watchdog timeout is read as a
 * time, not as 0.5 Hz.
 */
function headlineKeys(model: CircuitModel, values: Readonly<Record<string, number>>): readonly string[] {
  const keys = model.headline;
  const f = keys.indexOf('frequency');
  const t = keys.indexOf('period');
  if (f < 0 || t < 0 || f > t || !(values.frequency < 1)) return keys;
  const swapped = [...keys];
  [swapped[f], swapped[t]] = [swapped[t], swapped[f]];
  return swapped;
}

/** A result's worst-case band as it reads, or '' when both ends read the same (no spread worth showing). */
export function spreadText(model: CircuitModel, key: string, band: { min: number; max: number } | undefined): string {
  if (!band || formatResult(model, key, band.min) === formatResult(model, key, band.max)) return '';
  return bandText(model, key, band.min, band.max);
}

/** `172–209 Hz`: one unit for both ends when they share it. */
export function bandText(model: CircuitModel, key: string, min: number, max: number): string {
  const low = formatResult(model, key, min);
  const high = formatResult(model, key, max);
  // Signed values (errors) keep both units: `−13.8–+13.7 %` would read as a subtraction.
  if (/^[\u2212+-]/.test(low) || /^[\u2212+-]/.test(high)) return `${low} … ${high}`;
  const lowParts = low.split(' ');
  const highParts = high.split(' ');
  if (lowParts.length === 2 && highParts.length === 2 && lowParts[1] === highParts[1]) return `${lowParts[0]}–${high}`;
  return `${low} – ${high}`;
}
