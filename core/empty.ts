// The one empty list and the one empty record that results share where they hold nothing of a kind: a cold check
// makes thousands of blocks, most with no findings, references, lists or ranges. Frozen, so code that wrote to one
// would fail at once rather than change every result holding it.
export const emptyList = Object.freeze([]) as unknown as never[];
export const emptyRecord = Object.freeze({}) as Record<string, never>;

/**
 * A list built by pushing, to be kept with a result: copied at its own length. V8 gives an array that grows from
 * empty room for 17 elements, so a kept list of three would otherwise carry ~150 bytes of spare room for as long as
 * the analysis lives, copied through the young generation with it.
 */
export function keptList<T>(list: T[]): T[] {
  return list.length === 0 ? list : list.slice();
}
