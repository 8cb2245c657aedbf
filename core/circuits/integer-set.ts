// Allowed register values (`prescalers: 1, 8, 64, 256, 1024` or `1..65536`).
import type { IntegerSet } from './model';

/** Without a `prescalers:` list any whole division ratio of a 16-bit prescaler is allowed. */
export const anyPrescaler: IntegerSet = { kind: 'range', min: 1, max: 65536 };

export function setContains(set: IntegerSet, value: number): boolean {
  if (!Number.isInteger(value)) return false;
  return set.kind === 'range' ? value >= set.min && value <= set.max : set.values.includes(value);
}

export function setText(set: IntegerSet): string {
  if (set.kind === 'range') return `${set.min}..${set.max}`;
  return set.values.length > 12 ? `${set.values.slice(0, 12).join(', ')}, …` : set.values.join(', ');
}

/** Ascending, whole, positive, without repeats: the form the search needs. */
export function normaliseSet(set: IntegerSet): IntegerSet {
  if (set.kind === 'range') {
    const min = Math.max(1, Math.ceil(set.min));
    const max = Math.floor(set.max);
    // A range already in that form (the default prescalers, every check of every timer block) is its own result.
    return min === set.min && max === set.max ? set : { kind: 'range', min, max };
  }
  const values = [...new Set(set.values.filter((v) => Number.isInteger(v) && v >= 1))].sort((a, b) => a - b);
  return { kind: 'list', values };
}

export function setSize(set: IntegerSet): number {
  return set.kind === 'range' ? Math.max(0, set.max - set.min + 1) : set.values.length;
}

/** Members nearest to `x` from below and above (one or two values; none for an empty set). */
export function nearestMembers(set: IntegerSet, x: number): number[] {
  if (set.kind === 'range') {
    if (set.max < set.min) return [];
    const lo = Math.min(set.max, Math.max(set.min, Math.floor(x)));
    const hi = Math.min(set.max, Math.max(set.min, Math.ceil(x)));
    return lo === hi ? [lo] : [lo, hi];
  }
  const values = set.values;
  if (values.length === 0) return [];
  let low = 0;
  let high = values.length - 1;
  while (low < high) {
    const mid = (low + high) >> 1;
    if (values[mid] < x) low = mid + 1;
    else high = mid;
  }
  return low > 0 ? [values[low - 1], values[low]] : [values[low]];
}
