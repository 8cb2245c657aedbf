// Keys a block may carry besides its circuit's parameters, and the helpers to suggest a near miss.

import { blockKey, blockKeys } from '../block-keys';
import { cExtensions } from '../scan';

/** Block keys that steer the analysis rather than describe the circuit (core/block-keys.ts is their table). */
export const metaKeys: readonly string[] = blockKeys.map((spec) => spec.key);

export function isMetaKey(key: string): boolean {
  return blockKey(key) !== undefined;
}

// The C-family types of core/scan, and `.inc`, which firmware includes but Tickmark does not scan.
const firmwareExtensions = [...cExtensions, 'inc'].map((ext) => `.${ext}`);

/**
 * A note names its firmware file with `firmware:`. The older spelling `from:` is still read as one when its value
 * ends in a C-family extension; otherwise `from` is the circuit's own parameter (rc-delay's start voltage).
 */
export function isFirmwarePath(value: string): boolean {
  const lower = value.trim().toLowerCase();
  return firmwareExtensions.some((ext) => lower.endsWith(ext));
}

/** Whether an entry steers the analysis (meta) rather than giving a circuit parameter. */
export function isMetaEntry(key: string, value: string): boolean {
  if (key === 'from') return isFirmwarePath(value);
  return isMetaKey(key);
}

/** The entry that names a block's firmware file: `firmware:`, or the older `from:` with a C-family path. */
export function firmwareEntry<E extends { key: string; valueText: string }>(entries: readonly E[]): E | undefined {
  let from: E | undefined;
  for (let i = 0; i < entries.length; i++) {
    const e = entries[i];
    if (e.key === 'firmware') return e;
    if (e.key === 'from' && !from && isFirmwarePath(e.valueText)) from = e;
  }
  return from;
}

/** Levenshtein distance, bounded: returns limit + 1 once it is certain to exceed limit. */
export function editDistance(a: string, b: string, limit = 3): number {
  if (Math.abs(a.length - b.length) > limit) return limit + 1;
  let previous = Array.from({ length: b.length + 1 }, (_, i) => i);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    let rowMin = i;
    for (let j = 1; j <= b.length; j++) {
      const cost = a[i - 1] === b[j - 1] ? 0 : 1;
      current[j] = Math.min(previous[j] + 1, current[j - 1] + 1, previous[j - 1] + cost);
      rowMin = Math.min(rowMin, current[j]);
    }
    if (rowMin > limit) return limit + 1;
    previous = current;
  }
  return previous[b.length];
}

/** The closest candidate within two edits, for "did you mean" hints. */
export function closest(word: string, candidates: readonly string[]): string | undefined {
  let best: string | undefined;
  let bestDistance = 3;
  for (const candidate of candidates) {
    const distance = editDistance(word.toLowerCase(), candidate.toLowerCase(), 2);
    if (distance < bestDistance) {
      best = candidate;
      bestDistance = distance;
    }
  }
  return best;
}

export function didYouMean(word: string, candidates: readonly string[]): string {
  const near = closest(word, candidates);
  return near ? ` — did you mean \`${near}\`?` : '';
}
