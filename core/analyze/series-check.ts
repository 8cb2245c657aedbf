// Parts written off the block's own standard series. Only a block that names `series:` is checked, so
// notes that never chose a series stay quiet; the fix is the log-nearest value of that series.
import { Code } from '../codes';
import { formatQuantity } from '../format';
import { approxEqual } from '../num';
import { nearestInSeries, parseSeriesName } from '../series';
import type { Finding } from '../types';
import type { Plan } from './plan';

/** Reads the values the plan parsed; nothing is parsed again. */
export function seriesFindings(plan: Plan, uri: string): Finding[] {
  const seriesEntry = plan.entries.get('series');
  const series = seriesEntry ? parseSeriesName(seriesEntry.valueText) : undefined;
  if (!series || series === 'none') return [];
  const findings: Finding[] = [];
  for (const { key, spec, expr } of plan.slots.values()) {
    if (spec.dim !== 'Ω' && spec.dim !== 'F') continue;
    // Only a part written as one number: an expression or a name is a design choice, not a part value.
    if (expr?.kind !== 'number' || !(expr.value > 0) || !Number.isFinite(expr.value)) continue;
    const nearest = nearestInSeries(expr.value, series);
    // 1e-9 relative: `4n7` parses to 4.7e-9 give or take binary noise, and is an E24 value.
    if (approxEqual(expr.value, nearest, 1e-9)) continue;
    const written = formatQuantity(expr.value, spec.dim);
    const text = formatQuantity(nearest, spec.dim);
    findings.push({
      severity: 'info',
      code: Code.seriesSnap,
      message: `\`${key}\` = ${written} is not an ${series} value; the nearest ${series} part is ${text}`,
      span: expr.span,
      fixes: [{ title: `Snap ${key} to ${text} (${series})`, edits: [{ uri, span: expr.span, newText: text }] }],
    });
  }
  return findings;
}
