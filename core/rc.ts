// The one RC segment every RC model builds on: first-order charging toward a final value.
// Standard RC charging law v(t) = vInf + (v0 − vInf)·e^(−t/τ), common practice.

/**
 * Time for a node starting at `v0` and heading exponentially toward `vInf` with time constant `tau`
 * to reach `v1`: τ·ln((vInf − v0)/(vInf − v1)).
 * Returns Infinity when `v1` is never reached (it lies at or beyond `vInf`, or behind `v0`),
 * and 0 when `v1` equals `v0`. Callers validate so that a model never reports the Infinity.
 */
export function rcSegmentTime(v0: number, v1: number, vInf: number, tau: number): number {
  if (![v0, v1, vInf, tau].every(Number.isFinite) || tau <= 0) return Infinity;
  if (v1 === v0) return 0;
  if (!rcReaches(v0, v1, vInf)) return Infinity;
  return tau * Math.log((vInf - v0) / (vInf - v1));
}

/** Whether a node at `v0` heading toward `vInf` ever passes `v1` (strictly before the asymptote). */
export function rcReaches(v0: number, v1: number, vInf: number): boolean {
  if (v1 === v0) return true;
  const rising = vInf > v0;
  if (vInf === v0) return false;
  return rising ? v1 > v0 && v1 < vInf : v1 < v0 && v1 > vInf;
}

/** Node voltage `t` seconds into a segment that starts at `v0` and heads toward `vInf`. */
export function rcVoltageAt(v0: number, vInf: number, tau: number, t: number): number {
  if (tau <= 0) return vInf;
  return vInf + (v0 - vInf) * Math.exp(-t / tau);
}
