// Solving for one `?` part (R, C, any continuous key) or searching timer registers, then snapping a part to a
// standard series of IEC 60063.
import type { QuantityParam } from '../circuits/model';
import { nearestInSeries, parseSeriesName, type SeriesName } from '../series';
import { computeAt } from './measure';
import { formatQuantity, formatResult } from '../format';
import type { Plan } from './plan';

export type SolveOutcome =
  | { ok: true; exact: number }
  | { ok: false; message: string };

const typicalMagnitude: Record<string, number> = { 'Ω': 10e3, F: 100e-9, V: 1, Hz: 1e6, s: 1e-6 };

/**
 * Finds x with measure(x) = target by Newton steps in log–log space: timing results are close to power laws in
 * each part (period ∝ R·C), so this converges in a few steps; a bracketing fallback covers the rest.
 */
export function solveContinuous(plan: Plan, spec: QuantityParam, measure: string, target: number, fixed: Record<string, number> = {}): SolveOutcome {
  const at = (x: number): number | undefined => computeAt(plan, undefined, { ...fixed, [spec.key]: x })?.[measure];
  let x0 = typicalMagnitude[spec.dim] ?? 1;
  let m0 = at(x0);
  for (let tries = 0; m0 === undefined && tries < 24; tries++) {
    x0 *= tries % 2 ? 1e-3 ** tries : 1e3 ** tries;
    m0 = at(x0);
  }
  if (m0 === undefined || m0 <= 0) return { ok: false, message: `no value of \`${spec.key}\` gives a valid circuit to start from` };
  let x1 = x0 * 1.5;
  let m1 = at(x1);
  if (m1 === undefined || m1 <= 0) return { ok: false, message: `\`${spec.key}\` has no valid neighbourhood to solve in` };
  for (let step = 0; step < 80; step++) {
    if (Math.abs(m1 / target - 1) < 1e-12) return { ok: true, exact: x1 };
    const slope = Math.log(m1 / m0) / Math.log(x1 / x0);
    if (!Number.isFinite(slope)) break;
    if (Math.abs(slope) < 1e-12) return { ok: false, message: `${measure} does not depend on \`${spec.key}\`; put \`?\` on a part that sets it` };
    let next = x1 * Math.pow(target / m1, 1 / slope);
    // Keep each step within three decades so a poor slope cannot throw the iterate out of the model's range.
    next = Math.min(Math.max(next, x1 * 1e-3), x1 * 1e3);
    let mNext = at(next);
    for (let halvings = 0; mNext === undefined && halvings < 30; halvings++) {
      next = Math.sqrt(next * x1);
      mNext = at(next);
    }
    if (mNext === undefined || mNext <= 0) break;
    x0 = x1;
    m0 = m1;
    x1 = next;
    m1 = mNext;
  }
  if (Math.abs(m1 / target - 1) < 1e-9) return { ok: true, exact: x1 };
  const reached = m1 !== undefined ? `; the nearest it came is ${formatResult(plan.model, measure, m1)} at ${formatQuantity(x1, spec.dim)}` : '';
  return { ok: false, message: `no value of \`${spec.key}\` gives ${measure} ${formatResult(plan.model, measure, target)}${reached}` };
}

/** The standard part for a solved resistor or capacitor; other quantities keep the exact value. */
export function snapToSeries(spec: QuantityParam, exact: number, seriesText: string): { value: number; series?: SeriesName } {
  if (spec.dim !== 'Ω' && spec.dim !== 'F') return { value: spec.integer ? Math.round(exact) : exact };
  const series = parseSeriesName(seriesText);
  if (!series || series === 'none') return { value: exact };
  return { value: nearestInSeries(exact, series), series };
}
