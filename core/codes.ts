// Diagnostic codes: one constant per kind of finding, shared by diagnostics, quick fixes, SARIF rule ids.
// Add codes here; never rename one (SARIF consumers and editor quick fixes key on them).
export const Code = {
  // block shape (scanner)
  blockUnterminated: 'block-unterminated',
  blockLineMalformed: 'block-line-malformed',
  blockKeyRepeated: 'block-key-repeated',
  // values (parser)
  valueSyntax: 'value-syntax',
  valueUnit: 'value-unit',
  valueTolerance: 'value-tolerance',
  valueTooDeep: 'value-too-deep',
  // block meaning
  circuitMissing: 'circuit-missing',
  circuitUnknown: 'circuit-unknown',
  keyUnknown: 'key-unknown',
  keyRequired: 'key-required',
  keyDimension: 'key-dimension',
  identifierUnknown: 'identifier-unknown',
  identifierCycle: 'identifier-cycle',
  physics: 'physics',
  // claims and solving
  expectMismatch: 'expect-mismatch',
  expectUnknownMeasure: 'expect-unknown-measure',
  solveFailed: 'solve-failed',
  solveInexact: 'solve-inexact',
  solved: 'solved',
  /** A part value off the block's standard series; the fix sets the log-nearest series value. */
  seriesSnap: 'series-snap',
  // firmware constants
  cSyntax: 'c-syntax',
  cUnknown: 'c-unknown',
  cCycle: 'c-cycle',
  cDivZero: 'c-div-zero',
  cConditional: 'c-conditional',
  cInclude: 'c-include',
  cExpansionLimit: 'c-expansion-limit',
  /** Undefined behaviour in a constant expression: shift count out of range, float-to-integer overflow. */
  cUndefined: 'c-undefined',
  // files
  fileTooLarge: 'file-too-large',
  fileUnreadable: 'file-unreadable',
  // cautions
  caution: 'caution',
} as const;

export type CodeId = (typeof Code)[keyof typeof Code];
