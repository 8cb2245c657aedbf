// Axis ticks on the 1-2-5 series (common practice for scales and oscilloscope ranges).
// Rounding to the nearest of 1, 2, 5, 10 follows Heckbert, "Nice numbers for graph labels",
// Graphics Gems (1990) (from memory).

/** A power of ten without the binary noise of Math.pow for negative exponents. */
function powerOfTen(exponent: number): number {
  return Number(`1e${exponent}`);
}

/** The 1-2-5 step nearest to span / count. */
export function niceStep(span: number, count: number): number {
  if (!(span > 0) || !Number.isFinite(span)) return 1;
  const raw = span / Math.max(1, count);
  const exponent = Math.floor(Math.log10(raw));
  const fraction = raw / powerOfTen(exponent);
  const nice = fraction < 1.5 ? 1 : fraction < 3 ? 2 : fraction < 7 ? 5 : 10;
  const step = nice * powerOfTen(exponent);
  return step > 0 && Number.isFinite(step) ? step : 1;
}

/** Tick values inside [min, max] on a 1-2-5 step giving about `count` intervals. */
export function niceTicks(min: number, max: number, count = 5): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [];
  if (min > max) [min, max] = [max, min];
  if (min === max) return [min];
  const intervals = Number.isFinite(count) ? Math.min(100, Math.max(1, Math.round(count))) : 5;
  const step = niceStep(max - min, intervals);
  if (!Number.isFinite(max - min) || step * 1000 < max - min) return [min, max];
  // Rounding to the step's own decimals removes binary noise (0.1 + 0.2) without losing a small step.
  const decimals = Math.min(100, Math.max(0, 1 - Math.floor(Math.log10(step))));
  // A small slack keeps ends that are multiples of the step despite rounding (0.3 / 0.1 = 2.9999…).
  const first = Math.ceil(min / step - 1e-9);
  const last = Math.floor(max / step + 1e-9);
  const ticks: number[] = [];
  for (let k = first; k <= last && ticks.length <= 1000; k++) {
    const value = Number((k * step).toFixed(decimals));
    ticks.push(value === 0 ? 0 : value);
  }
  return ticks;
}

/** [min, max] widened outward to whole steps, for an axis that starts and ends on a tick. */
export function niceDomain(min: number, max: number, count = 4): [number, number] {
  if (!Number.isFinite(min) || !Number.isFinite(max) || !Number.isFinite(max - min)) return [0, 1];
  // A flat trace, or one whose swing is too small for doubles to divide (subnormal values): pad it to a domain
  // that can be drawn, so no coordinate becomes NaN.
  if (!(max - min > 1e-200)) {
    const mid = (min + max) / 2;
    const pad = Math.abs(mid) * 0.1 > 1e-200 ? Math.abs(mid) * 0.1 : 1;
    return [mid - pad, mid + pad];
  }
  const step = niceStep(max - min, count);
  if (step * 1000 < max - min) return [min, max];
  return [
    Number((Math.floor(min / step + 1e-9) * step).toPrecision(12)),
    Number((Math.ceil(max / step - 1e-9) * step).toPrecision(12)),
  ];
}
