// One line per diagnostic code, for SARIF rule metadata and the docs.
import { Code, type CodeId } from './codes';

export const codeDescriptions: Record<CodeId, string> = {
  [Code.blockUnterminated]: 'A timing block is not closed (fence or comment runs to the end of the file).',
  [Code.blockLineMalformed]: 'A line inside a timing block is not `key: value`.',
  [Code.blockKeyRepeated]: 'A key is given twice in one block.',
  [Code.valueSyntax]: 'A value cannot be read as a number, quantity, expression or word.',
  [Code.valueUnit]: 'A value has an unknown unit or SI prefix.',
  [Code.valueTolerance]: 'A tolerance cannot be read.',
  [Code.valueTooDeep]: 'A value nests parentheses beyond the supported depth.',
  [Code.circuitMissing]: 'A block does not say which circuit it describes.',
  [Code.circuitUnknown]: 'A block names a circuit Tickmark does not model.',
  [Code.keyUnknown]: 'A key is not a parameter of the block\'s circuit.',
  [Code.keyRequired]: 'A parameter the circuit needs is missing.',
  [Code.keyDimension]: 'A value has the wrong physical dimension for its key.',
  [Code.identifierUnknown]: 'An identifier is not a key of the block nor a constant of the firmware.',
  [Code.identifierCycle]: 'Keys of a block refer to each other in a cycle.',
  [Code.physics]: 'The values break the circuit model (threshold outside the swing, negative part, even ring, register overflow, …).',
  [Code.expectMismatch]: 'The computed value lies outside the claim of `expect:`.',
  [Code.expectUnknownMeasure]: 'A claim\'s unit does not match any result of the circuit.',
  [Code.solveFailed]: 'A `?` value could not be solved.',
  [Code.solveInexact]: 'The closest solution misses the target band.',
  [Code.solved]: 'A `?` value was solved (informational).',
  [Code.cSyntax]: 'A firmware constant cannot be evaluated as a C constant expression.',
  [Code.cUnknown]: 'A firmware identifier is not defined in the file or its quoted includes.',
  [Code.cCycle]: 'Firmware macros or constants refer to each other in a cycle.',
  [Code.cDivZero]: 'A firmware constant divides by zero.',
  [Code.cConditional]: 'A firmware constant is defined differently under #if branches.',
  [Code.cInclude]: 'A quoted #include or `from:` file cannot be read or lies outside the workspace.',
  [Code.cExpansionLimit]: 'Macro expansion exceeded its bound.',
  [Code.fileTooLarge]: 'A file is above the size limit and was not read.',
  [Code.fileUnreadable]: 'A file could not be read.',
  [Code.seriesSnap]: 'A part value is off the block\'s standard series.',
  [Code.cUndefined]: 'A firmware constant expression has undefined behaviour in C (signed overflow, shift out of range, float-to-integer overflow).',
  [Code.caution]: 'A safety caution for the circuit as given.',
};

export function describeCode(code: string): string {
  return (codeDescriptions as Record<string, string>)[code] ?? code;
}
