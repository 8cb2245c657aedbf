// Spread of every result from the block's tolerances: worst case over the corners and an interior grid (for
// results that are not monotonic in an input), each input's share of the width, and optional Monte Carlo.
import type { SpreadRange } from '../types';
import { computeAt } from './measure';
import type { Plan } from './plan';

/** Inputs beyond this many get corners only; 3^6 = 729 grid points is still cheap. */
const gridLimit = 6;
/** Beyond this many toleranced inputs the corners (2^n) are sampled by Monte Carlo instead. */
const cornerLimit = 12;

function* levels(count: number, steps: readonly number[]): Generator<number[]> {
  const index = new Array(count).fill(0);
  while (true) {
    yield index.map((i) => steps[i]);
    let k = 0;
    while (k < count && ++index[k] === steps.length) index[k++] = 0;
    if (k === count) return;
  }
}

function widen(ranges: Record<string, SpreadRange>, results: Record<string, number>): void {
  for (const [key, value] of Object.entries(results)) {
    const range = ranges[key];
    if (!range) ranges[key] = { min: value, max: value };
    else {
      if (value < range.min) range.min = value;
      if (value > range.max) range.max = value;
    }
  }
}

export function worstCase(plan: Plan, keys: readonly string[], overrides?: Record<string, number>): Record<string, SpreadRange> {
  const ranges: Record<string, SpreadRange> = {};
  if (keys.length === 0) return ranges;
  const steps = keys.length <= gridLimit ? [-1, 0, 1] : [-1, 1];
  // A grid with a centre step holds every one-at-a-time point: the swings are read off it, not run again.
  const swings = steps.length === 3 ? new Map<string, Swing>() : undefined;
  if (keys.length <= cornerLimit) {
    for (const point of levels(keys.length, steps)) {
      const offsets: Record<string, number> = {};
      keys.forEach((key, i) => (offsets[key] = point[i]));
      const results = computeAt(plan, offsets, overrides);
      if (results) widen(ranges, results);
      if (swings) {
        const moved = point.filter((u) => u !== 0).length === 1 ? point.findIndex((u) => u !== 0) : -1;
        if (moved >= 0) {
          const swing = swings.get(keys[moved]) ?? {};
          if (point[moved] < 0) swing.low = results ?? null;
          else swing.high = results ?? null;
          swings.set(keys[moved], swing);
        }
      }
    }
  } else {
    const random = mulberry32(1);
    for (let n = 0; n < 4096; n++) {
      const offsets: Record<string, number> = {};
      for (const key of keys) offsets[key] = random() < 0.5 ? -1 : 1;
      const results = computeAt(plan, offsets, overrides);
      if (results) widen(ranges, results);
    }
  }
  addShares(plan, keys, ranges, overrides, swings);
  return ranges;
}

/** One input's results at −1 and +1 with every other input nominal; null where they break the model. */
interface Swing {
  low?: Record<string, number> | null;
  high?: Record<string, number> | null;
}

/** Each input's one-at-a-time swing over the sum of swings: which part is worth buying tighter. */
function addShares(plan: Plan, keys: readonly string[], ranges: Record<string, SpreadRange>, overrides?: Record<string, number>, known?: Map<string, Swing>): void {
  const swings: Record<string, Record<string, number>> = {};
  for (const key of keys) {
    const seen = known?.get(key);
    const low = seen?.low !== undefined ? seen.low : computeAt(plan, { [key]: -1 }, overrides);
    const high = seen?.high !== undefined ? seen.high : computeAt(plan, { [key]: 1 }, overrides);
    if (!low || !high) continue;
    for (const result of Object.keys(ranges)) {
      if (!(result in low) || !(result in high)) continue;
      (swings[result] ??= {})[key] = Math.abs(high[result] - low[result]);
    }
  }
  for (const [result, byKey] of Object.entries(swings)) {
    const total = Object.values(byKey).reduce((a, b) => a + b, 0);
    if (total <= 0) continue;
    const shares: Record<string, number> = {};
    // Upstream inputs are shown by the reference that brings them (`@xtal.frequency`).
    for (const [key, swing] of Object.entries(byKey)) shares[plan.upstreamInputs.find((i) => i.id === key)?.label ?? key] = swing / total;
    ranges[result].shares = shares;
  }
}

/**
 * Monte Carlo with every toleranced input uniform over its band (a part's tolerance is a bound, not a sigma:
 * uniform is the cautious reading, common practice for tolerance stacks without distribution data).
 */
export function monteCarlo(plan: Plan, keys: readonly string[], samples: number, seed: number, ranges: Record<string, SpreadRange>, overrides?: Record<string, number>): void {
  const random = mulberry32(seed);
  const collected = new Map<string, { store: Float64Array; count: number }>();
  const offsets: Record<string, number> = {};
  for (let n = 0; n < samples; n++) {
    for (let i = 0; i < keys.length; i++) offsets[keys[i]] = random() * 2 - 1;
    const results = computeAt(plan, offsets, overrides);
    if (!results) continue;
    for (const key in results) {
      let column = collected.get(key);
      if (!column) collected.set(key, (column = { store: new Float64Array(samples), count: 0 }));
      column.store[column.count++] = results[key];
    }
  }
  for (const [key, { store, count }] of collected) {
    if (!ranges[key] || count === 0) continue;
    const values = store.subarray(0, count);
    ranges[key].p1 = percentile(values, 0.01);
    ranges[key].p99 = percentile(values, 0.99);
  }
}

/** Linear interpolation between the order statistics around p, found by selection instead of a full sort. */
function percentile(values: Float64Array, p: number): number {
  const position = (values.length - 1) * p;
  const low = Math.floor(position);
  const high = Math.min(low + 1, values.length - 1);
  const below = select(values, low);
  let above = below;
  // After selecting rank `low`, everything past it is at least as large: the next rank is their minimum.
  if (high > low) {
    above = values[high];
    for (let i = high + 1; i < values.length; i++) if (values[i] < above) above = values[i];
  }
  return below + (above - below) * (position - low);
}

/** The value of rank k (0-based) of finite numbers, reordering `values` in place (Hoare's quickselect). */
function select(values: Float64Array, k: number): number {
  let left = 0;
  let right = values.length - 1;
  while (right > left) {
    const pivot = median3(values[left], values[(left + right) >> 1], values[right]);
    let i = left;
    let j = right;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        const t = values[i];
        values[i++] = values[j];
        values[j--] = t;
      }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else break;
  }
  return values[k];
}

function median3(a: number, b: number, c: number): number {
  return a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
}

/** A small seeded generator so a block's Monte Carlo figures are the same on every run (mulberry32). */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
