// Joint search of a PLL's `?` dividers and multiplier for up to three output targets, for the smallest worst
// relative error. Not a walk over prediv × mult × postdiv × postdiv2: for each prediv (admitted by the pfd range)
// and each post-divider of the first output, the mult that puts that output on target is known (target · postdiv
// / pfd); mult is walked outward from it only while the first output's own error stays below the best worst error
// found so far, which after the first candidates is a step or two. For each vco tried, every other output's best
// post-divider is the allowed value nearest vco / target, found directly. Complete: the optimum's first-output
// error is at most its worst error, so its mult lies inside the walked window.
import type { IntegerSet, Interval, RegisterSearchFailure } from './model';
import { nearestMembers, normaliseSet, setSize, setText } from './integer-set';

/** Keys of the three outputs' post-dividers and the results they give. */
export const pllOutputs = [
  { divider: 'postdiv', result: 'frequency' },
  { divider: 'postdiv2', result: 'frequency2' },
  { divider: 'postdiv3', result: 'frequency3' },
] as const;

/** Values a bare `?` may take: 6-bit prediv, 9-bit mult, 4-bit post-dividers (common register widths). */
export const pllDefaultSets: Readonly<Record<string, IntegerSet>> = {
  prediv: { kind: 'range', min: 1, max: 64 },
  mult: { kind: 'range', min: 1, max: 512 },
  postdiv: { kind: 'range', min: 1, max: 16 },
  postdiv2: { kind: 'range', min: 1, max: 16 },
  postdiv3: { kind: 'range', min: 1, max: 16 },
};

export interface PllQuery {
  ref: number;
  /** Each key's allowed values: a one-member set for a key that is given; a given mult may be fractional. */
  sets: { prediv: IntegerSet; mult: IntegerSet | number };
  /** Post-divider of each targeted output: its allowed values (one member when given). */
  outputs: Array<{ divider: string; target: number; set: IntegerSet }>;
  pfdRange?: Interval;
  vcoRange?: Interval;
}

export interface PllFound {
  values: Record<string, number>;
  /** Signed relative error of the worst output (0 when exact). */
  error: number;
}

/** Relative errors below this are floating-point noise: the set is exact. */
const exactTolerance = 1e-12;
/** A bound on the candidates tried (a `? 1..100000000` must not hang the editor). */
const maxCandidates = 1 << 21;

/** A sorted set read by index, without materialising a range. */
interface Sorted {
  length: number;
  at(i: number): number;
  /** First index whose value is ≥ x (length when none). */
  lowerBound(x: number): number;
}

function sorted(set: IntegerSet | number): Sorted {
  if (typeof set === 'number') return sorted({ kind: 'list', values: [set] });
  if (set.kind === 'range') {
    const length = Math.max(0, set.max - set.min + 1);
    return { length, at: (i) => set.min + i, lowerBound: (x) => Math.min(length, Math.max(0, Math.ceil(x - set.min))) };
  }
  const values = set.values;
  return {
    length: values.length,
    at: (i) => values[i],
    lowerBound(x) {
      let lo = 0;
      let hi = values.length;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (values[mid] < x) lo = mid + 1;
        else hi = mid;
      }
      return lo;
    },
  };
}

const inside = (x: number, r: Interval | undefined) => !r || (x >= r.min * (1 - 1e-12) && x <= r.max * (1 + 1e-12));

export function searchPll(query: PllQuery): PllFound | RegisterSearchFailure {
  const { ref, pfdRange, vcoRange } = query;
  const predivs = normaliseSet(query.sets.prediv);
  const given = query.sets.mult;
  const multSet = typeof given === 'number' ? given : normaliseSet(given);
  const mults = sorted(multSet);
  const outputs = query.outputs.map((o) => ({ ...o, set: normaliseSet(o.set) }));
  if (outputs.length === 0) return { error: 'a PLL search needs a target' };
  if (setSize(predivs) === 0 || mults.length === 0 || outputs.some((o) => setSize(o.set) === 0)) return { error: 'a `?` allows no value' };

  let best: { prediv: number; mult: number; posts: number[]; worst: number; signed: number } | undefined;
  const posts = new Array<number>(outputs.length);
  let tried = 0;

  /** Exact sets tie at zero; ties go to the smaller prediv (higher pfd), then the smaller mult (lower vco). */
  const beats = (worst: number, prediv: number, mult: number): boolean => {
    if (!best) return true;
    const a = worst < exactTolerance ? 0 : worst;
    const b = best.worst < exactTolerance ? 0 : best.worst;
    if (a !== b) return a < b;
    return prediv !== best.prediv ? prediv < best.prediv : mult < best.mult;
  };

  const consider = (prediv: number, mult: number, vco: number): void => {
    tried++;
    if (!inside(vco, vcoRange)) return;
    let worst = 0;
    let signed = 0;
    for (let i = 0; i < outputs.length; i++) {
      const { set, target } = outputs[i];
      let chosen = NaN;
      let chosenError = Infinity;
      for (const post of nearestMembers(set, vco / target)) {
        const error = vco / post / target - 1;
        if (Math.abs(error) < Math.abs(chosenError)) {
          chosen = post;
          chosenError = error;
        }
      }
      posts[i] = chosen;
      if (Math.abs(chosenError) > worst) {
        worst = Math.abs(chosenError);
        signed = chosenError;
      }
      // Cannot beat the best found: the other outputs need not be looked at.
      if (best && worst > Math.max(best.worst, exactTolerance)) return;
    }
    if (beats(worst, prediv, mult)) best = { prediv, mult, posts: [...posts], worst, signed };
  };

  const first = outputs[0];
  const firstPosts = sorted(first.set);
  // With a vco range, only post-dividers that can put the first output on target from inside it, and the nearest
  // one beyond each end (the best a vco inside the range can do when none can).
  const postFrom = vcoRange ? Math.max(0, firstPosts.lowerBound((vcoRange.min * (1 - 1e-9)) / first.target) - 1) : 0;
  const postTo = vcoRange ? Math.min(firstPosts.length, firstPosts.lowerBound((vcoRange.max * (1 + 1e-9)) / first.target + 1) + 1) : firstPosts.length;
  // Mults inside the vco range for one pfd, as an index window.
  const multWindow = (pfd: number) =>
    vcoRange ? [mults.lowerBound((vcoRange.min * (1 - 1e-12)) / pfd), mults.lowerBound((vcoRange.max * (1 + 1e-12)) / pfd + 1e-9)] : [0, mults.length];
  const bound = () => (best ? Math.max(best.worst, exactTolerance) : Infinity);

  for (let p = 0; p < setSize(predivs) && tried < maxCandidates; p++) {
    const prediv = predivs.kind === 'range' ? predivs.min + p : predivs.values[p];
    const pfd = ref / prediv;
    if (!inside(pfd, pfdRange)) continue;
    const [lo, hi] = multWindow(pfd);
    if (lo >= hi) continue;
    for (let q = postFrom; q < postTo && tried < maxCandidates; q++) {
      const ideal = (first.target * firstPosts.at(q)) / pfd;
      const firstError = (mult: number) => Math.abs((pfd * mult) / firstPosts.at(q) / first.target - 1);
      const start = Math.min(hi, Math.max(lo, mults.lowerBound(ideal)));
      // Upward from the first mult at or above the ideal, downward from the one below it; the nearest on each side
      // is always tried, the rest only while the first output alone stays within the best worst error.
      for (let i = start; i < hi && tried < maxCandidates; i++) {
        const mult = mults.at(i);
        if (i > start && firstError(mult) > bound()) break;
        consider(prediv, mult, pfd * mult);
      }
      for (let i = start - 1; i >= lo && tried < maxCandidates; i--) {
        const mult = mults.at(i);
        if (i < start - 1 && firstError(mult) > bound()) break;
        consider(prediv, mult, pfd * mult);
      }
    }
  }

  if (!best) {
    const limits = [pfdRange && `pfd within ${rangeText(pfdRange)}`, vcoRange && `vco within ${rangeText(vcoRange)}`].filter(Boolean).join(' and ');
    const multText = typeof multSet === 'number' ? String(multSet) : setText(multSet);
    return { error: `no prediv (${setText(predivs)}) and mult (${multText}) keep ${limits || 'the PLL valid'}` };
  }
  const found = best;
  const values: Record<string, number> = { prediv: found.prediv, mult: found.mult };
  outputs.forEach((o, i) => (values[o.divider] = found.posts[i]));
  return { values, error: found.worst < exactTolerance ? 0 : found.signed };
}

function rangeText(range: Interval): string {
  const mhz = (x: number) => `${Number((x / 1e6).toPrecision(6))} MHz`;
  return `${mhz(range.min)} .. ${mhz(range.max)}`;
}
