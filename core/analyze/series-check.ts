// Parts written off the block's own standard series. Only a block that names `series:` is checked, so
// notes that never chose a series stay quiet; the fix is the log-nearest value of that series.
import type { CircuitModel } from '../circuits/model';
import { Code } from '../codes';
import { formatQuantity } from '../format';
import { approxEqual } from '../num';
import { nearestInSeries, parseSeriesName } from '../series';
import type { Finding, RawBlock } from '../types';
import { parseValue } from '../value';

export function seriesFindings(raw: RawBlock, model: CircuitModel, uri: string): Finding[] {
  const seriesEntry = raw.entries.find((e) => e.key === 'series');
  const series = seriesEntry ? parseSeriesName(seriesEntry.valueText) : undefined;
  if (!series || series === 'none') return [];
  const findings: Finding[] = [];
  for (const entry of raw.entries) {
    const spec = model.params.find((p) => p.key === entry.key);
    if (spec?.kind !== 'quantity' || (spec.dim !== 'Ω' && spec.dim !== 'F')) continue;
    // Only a part written as one number: an expression or a name is a design choice, not a part value.
    const expr = parseValue(entry.valueText, entry.valueSpan.start).expr;
    if (expr?.kind !== 'number' || !(expr.value > 0) || !Number.isFinite(expr.value)) continue;
    const nearest = nearestInSeries(expr.value, series);
    // 1e-9 relative: `4n7` parses to 4.7e-9 give or take binary noise, and is an E24 value.
    if (approxEqual(expr.value, nearest, 1e-9)) continue;
    const written = formatQuantity(expr.value, spec.dim);
    const text = formatQuantity(nearest, spec.dim);
    findings.push({
      severity: 'info',
      code: Code.seriesSnap,
      message: `\`${entry.key}\` = ${written} is not an ${series} value; the nearest ${series} part is ${text}`,
      span: expr.span,
      fixes: [{ title: `Snap ${entry.key} to ${text} (${series})`, edits: [{ uri, span: expr.span, newText: text }] }],
    });
  }
  return findings;
}
