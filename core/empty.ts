// The one empty list and the one empty record that results share where they hold nothing of a kind: a cold check
// makes thousands of blocks, most with no findings, references, lists or ranges. Frozen, so code that wrote to one
// would fail at once rather than change every result holding it.
export const emptyList = Object.freeze([]) as unknown as never[];
export const emptyRecord = Object.freeze({}) as Record<string, never>;
