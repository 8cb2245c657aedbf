// Register search for `prescaler: ?` and/or `reload: ?`: the pair closest to a target rate.
// For one prescaler the best reload is a rounding of the ideal tick count, so the search walks only the
// smaller of the two useful windows (prescalers or reloads that can land near the target), never all pairs.
import type { IntegerSet, RegisterSearchFailure, RegisterSearchResult } from './model';
import { nearestMembers, normaliseSet, setContains, setSize, setText } from './integer-set';

export type CountMode = 'up' | 'up-down';

export interface TimerSearchQuery {
  clock: number;
  mode: CountMode;
  bits: number;
  prescalers: IntegerSet;
  /** Known register values; undefined for the ones searched. */
  prescaler?: number;
  reload?: number;
  measure: 'frequency' | 'period';
  target: number;
}

/** Beyond this many candidates the search stops at the best found (sets of 2^20 prescalers are not hardware). */
const maxCandidates = 1 << 20;

/** Below this the pair is exact; floating-point noise in clock × period is not an error. */
const exactTolerance = 1e-12;

/** Ticks of the prescaled clock in one period. Up: 0 … reload is reload + 1 ticks; up-down: 2·reload. */
export function ticksPerPeriod(mode: CountMode, reload: number): number {
  return mode === 'up' ? reload + 1 : 2 * reload;
}

function reloadRange(mode: CountMode, bits: number): { min: number; max: number } {
  return { min: mode === 'up' ? 0 : 1, max: 2 ** bits - 1 };
}

export function searchTimerRegisters(query: TimerSearchQuery): RegisterSearchResult | RegisterSearchFailure {
  const { clock, mode, bits, measure, target } = query;
  if (!(clock > 0) || !Number.isFinite(clock)) return { error: 'the search needs a positive `clock`' };
  if (!(target > 0) || !Number.isFinite(target)) return { error: `the target ${measure} must be a positive number` };
  if (!Number.isInteger(bits) || bits < 1 || bits > 53) return { error: '`bits` must be a whole number from 1 to 53' };
  const prescalers = normaliseSet(query.prescalers);
  if (setSize(prescalers) === 0) return { error: '`prescalers` allows no division ratio' };
  const range = reloadRange(mode, bits);
  if (query.prescaler !== undefined && !setContains(prescalers, query.prescaler)) {
    return { error: `prescaler ${query.prescaler} is not one of the allowed ratios (${setText(prescalers)})` };
  }
  if (query.reload !== undefined && !(Number.isInteger(query.reload) && query.reload >= range.min && query.reload <= range.max)) {
    return { error: `reload ${query.reload} is outside ${range.min}..${range.max} for a ${bits}-bit ${mode} counter` };
  }

  // Prescaled ticks the target period takes.
  const ideal = measure === 'frequency' ? clock / target : clock * target;
  const errorOf = (prescaler: number, reload: number) => {
    const ticks = prescaler * ticksPerPeriod(mode, reload);
    return measure === 'frequency' ? ideal / ticks - 1 : ticks / ideal - 1;
  };

  let best: { prescaler: number; reload: number; error: number } | undefined;
  const consider = (prescaler: number, reload: number) => {
    const error = errorOf(prescaler, reload);
    if (!Number.isFinite(error)) return;
    // Equal error: the smaller prescaler leaves the larger reload, so finer compare resolution.
    if (!best || Math.abs(error) < Math.abs(best.error) - 1e-15 || (Math.abs(error) <= Math.abs(best.error) + 1e-15 && prescaler < best.prescaler)) {
      best = { prescaler, reload, error };
    }
  };
  // The hot loop of a wide search: the two nearest reloads without building an array per prescaler.
  const withPrescaler = (prescaler: number) => {
    if (query.reload !== undefined) return consider(prescaler, query.reload);
    const x = nearestIdealReload(mode, ideal / prescaler);
    const lo = Math.min(range.max, Math.max(range.min, Math.floor(x)));
    const hi = Math.min(range.max, Math.max(range.min, Math.ceil(x)));
    consider(prescaler, lo);
    if (hi !== lo) consider(prescaler, hi);
  };
  const withReload = (reload: number) => {
    for (const prescaler of nearestMembers(prescalers, ideal / ticksPerPeriod(mode, reload))) consider(prescaler, reload);
  };
  const exact = () => best !== undefined && Math.abs(best.error) < exactTolerance;

  if (query.prescaler !== undefined) withPrescaler(query.prescaler);
  else if (query.reload !== undefined) withReload(query.reload);
  else {
    const ticksMin = ticksPerPeriod(mode, range.min);
    const ticksMax = ticksPerPeriod(mode, range.max);
    const pWindow = windowOf(prescalers, ideal / ticksMax, ideal / Math.max(1, ticksMin));
    const rLow = Math.max(range.min, Math.floor(nearestIdealReload(mode, ideal / maxOf(prescalers))));
    const rHigh = Math.min(range.max, Math.ceil(nearestIdealReload(mode, ideal / minOf(prescalers))));
    // The ends of both windows, so an unreachable target still gets the nearest corner.
    for (const p of [...nearestMembers(prescalers, ideal / ticksMax), ...nearestMembers(prescalers, ideal / Math.max(1, ticksMin))]) withPrescaler(p);
    const reloadCount = Math.max(0, rHigh - rLow + 1);
    if (pWindow.length <= reloadCount) {
      for (let i = 0; i < pWindow.length && i < maxCandidates && !exact(); i++) withPrescaler(pWindow.at(i));
    } else {
      for (let r = rHigh, n = 0; r >= rLow && n < maxCandidates && !exact(); r--, n++) withReload(r);
    }
  }
  if (!best) return { error: 'no register pair fits the allowed ranges' };
  const values: Record<string, number> = {};
  if (query.prescaler === undefined) values.prescaler = best.prescaler;
  if (query.reload === undefined) values.reload = best.reload;
  return { values, error: Math.abs(best.error) < exactTolerance ? 0 : best.error };
}

function nearestIdealReload(mode: CountMode, ticks: number): number {
  return mode === 'up' ? ticks - 1 : ticks / 2;
}

function minOf(set: IntegerSet): number {
  return set.kind === 'range' ? set.min : set.values[0];
}

function maxOf(set: IntegerSet): number {
  return set.kind === 'range' ? set.max : set.values[set.values.length - 1];
}

/** Members of a set between lo and hi, ascending, without materialising a large range. */
function windowOf(set: IntegerSet, lo: number, hi: number): { length: number; at(i: number): number } {
  if (set.kind === 'range') {
    const first = Math.max(set.min, Math.floor(lo));
    const last = Math.min(set.max, Math.ceil(hi));
    return { length: Math.max(0, last - first + 1), at: (i) => first + i };
  }
  const members = set.values.filter((v) => v >= Math.floor(lo) && v <= Math.ceil(hi));
  return { length: members.length, at: (i) => members[i] };
}
