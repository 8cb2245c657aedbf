// The value language of a timing block: numbers with SI prefixes and units, letter-and-digit codes,
// unit-aware arithmetic, names, tolerances and `?`.
export type { ValueNode, ParsedValue } from './ast';
export { parseValue } from './parse';
export { splitList, parseIntegerSet } from './list';
export { dimOf } from './dim';
export { compileValue, type CompiledValue } from './compile';
export { MAX_DEPTH } from './parser';
export { MAX_TOKENS } from './lexer';
export type { BlockRef } from './ast';
export { readReference, referencesIn, defaultReferenceResult } from './reference';
export { parseUnknown, parseRange, type ParsedUnknown, type ParsedRange } from './allowed';
