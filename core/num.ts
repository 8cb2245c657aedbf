// Float comparison that never calls NaN equal and treats same-signed infinities as equal.

/** True when a and b agree within a relative tolerance (of the larger magnitude) or an absolute one. */
export function approxEqual(a: number, b: number, rel = 1e-9, abs = 0): boolean {
  if (Number.isNaN(a) || Number.isNaN(b)) return false;
  if (a === b) return true;
  // Unequal infinities (or an infinity against a finite number) are never close.
  if (!Number.isFinite(a) || !Number.isFinite(b)) return false;
  const diff = Math.abs(a - b);
  return diff <= abs || diff <= rel * Math.max(Math.abs(a), Math.abs(b));
}

/** (actual − target) / target; NaN when the target is zero or either value is not finite. */
export function relativeError(actual: number, target: number): number {
  if (!Number.isFinite(actual) || !Number.isFinite(target) || target === 0) return NaN;
  return (actual - target) / target;
}

/** The entries that are finite numbers; for…in rather than Object.entries, as this runs per Monte Carlo sample. */
export function finiteOnly(results: Record<string, number>): Record<string, number> {
  const out: Record<string, number> = {};
  for (const key in results) {
    const value = results[key];
    if (typeof value === 'number' && Number.isFinite(value)) out[key] = value;
  }
  return out;
}
