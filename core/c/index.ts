// Firmware constants with C's rules: the one entry point the analysis and the editor use.
export type { DataModel } from './ctypes';
export { buildConstantTable, toNumber } from './table';
export type { CValue, ConstantDefinition, ConstantResolution, ConstantTable, ConstantTableOptions, ExpressionResult } from './table';
export { tokenize, type Token } from './tokens';
export { resolveInclude, type IncludeResult } from './include';
export { parseCompileDatabase, parseMacroFlag, type BuildConfig, type MacroFlag } from './config';
export { DEFAULT_MAX_HEADER_BYTES } from './table';
