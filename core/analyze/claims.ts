// `expect:` and `target:` — the quantities a block claims or asks for, each tied to one result.
import type { BlockEntry, Finding, Span, Tolerance } from '../types';
import type { CircuitModel } from '../circuits/model';
import { compileValue, dimOf, parseValue, splitList } from '../value';
import { Code } from '../codes';
import { measureFor } from './measure';
import { toleranceMismatch } from './dims';

export interface Claim {
  measure: string;
  value: number;
  /** Tolerance as written, else the default relative one. */
  tolerance: Tolerance;
  toleranceGiven: boolean;
  /** The item as written (`1 kHz ±0.5%`) and where, for messages and the "update expect" fix. */
  text: string;
  span: Span;
  /** Just the value part, without its tolerance. */
  valueSpan: Span;
}

/** Parses `expect:` or `target:` items; identifiers are not allowed in claims (they state numbers). */
export function parseClaims(entry: BlockEntry, model: CircuitModel, defaultTolerance: number, findings: Finding[]): Claim[] {
  const claims: Claim[] = [];
  const items = splitList(entry.valueText, entry.valueSpan.start);
  for (let i = 0; i < items.length; i++) {
    const item = items[i];
    const trimmed = item.text.trim();
    if (!trimmed) continue;
    const lead = item.text.indexOf(trimmed);
    const offset = item.offset + lead;
    const span = { start: offset, end: offset + trimmed.length };
    const parsed = parseValue(trimmed, offset);
    if (parsed.findings.length) {
      findings.push(...parsed.findings);
      continue;
    }
    if (!parsed.expr) {
      findings.push({ severity: 'error', code: Code.valueSyntax, message: `\`${entry.key}\` needs a quantity with a unit, such as \`1 kHz\`, \`2.5 ms\` or \`50 %\``, span });
      continue;
    }
    const dim = dimOf(parsed.expr, () => undefined);
    if ('finding' in dim) {
      findings.push(dim.finding);
      continue;
    }
    const toleranceProblem = dim.dim === '' ? undefined : toleranceMismatch(parsed.tolerance, parsed.toleranceDim, dim.dim, entry.key, true);
    if (toleranceProblem) {
      findings.push({ severity: 'error', code: Code.valueTolerance, message: toleranceProblem, span: parsed.toleranceSpan ?? span });
      continue;
    }
    const measure = dim.dim === '' ? undefined : measureFor(model, dim.dim);
    if (!measure) {
      const units = [...new Set(model.results.map((r) => (r.percent ? '%' : r.key === 'baud' ? 'baud' : r.dim)).filter(Boolean))].join(', ');
      findings.push({
        severity: 'error',
        code: Code.expectUnknownMeasure,
        message: dim.dim === '' ? `\`${trimmed}\` has no unit, so it is not clear which result it speaks of (${model.id} gives ${units})` : `${model.id} has no result in ${dim.dim} (it gives ${units})`,
        span,
      });
      continue;
    }
    let value: number;
    if (parsed.expr.kind === 'number') value = parsed.expr.value;
    else {
      try {
        value = compileValue(parsed.expr)({});
      } catch {
        value = NaN;
      }
    }
    if (!Number.isFinite(value)) {
      findings.push({ severity: 'error', code: Code.valueSyntax, message: `\`${trimmed}\` does not evaluate to a number (claims cannot name constants)`, span });
      continue;
    }
    const valueEnd = parsed.toleranceSpan ? parsed.toleranceSpan.start : span.end;
    const valueText = trimmed.slice(0, valueEnd - offset).trimEnd();
    claims.push({
      measure,
      value,
      tolerance: parsed.tolerance ?? { kind: 'relative', plus: defaultTolerance, minus: defaultTolerance },
      toleranceGiven: parsed.tolerance !== undefined,
      text: trimmed,
      span,
      valueSpan: { start: offset, end: offset + valueText.length },
    });
  }
  return claims;
}

/** Whether a computed value lies inside the claim's band. */
export function meetsClaim(claim: Claim, computed: number): boolean {
  const t = claim.tolerance;
  const low = t.kind === 'relative' ? claim.value * (1 - t.minus) : claim.value - t.minus;
  const high = t.kind === 'relative' ? claim.value * (1 + t.plus) : claim.value + t.plus;
  // A hair of slack for binary rounding at the band's edge.
  const slack = 1e-12 * Math.max(Math.abs(low), Math.abs(high));
  return computed >= low - slack && computed <= high + slack;
}
