// Diagnostic codes, one meaning each, and the one table that describes them: diagnostics, quick fixes, SARIF
// rules and the docs all read it. Add codes here; never rename one (SARIF consumers and quick fixes key on them).
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
  valueOption: 'value-option',
  valueRange: 'value-range',
  // block meaning
  circuitMissing: 'circuit-missing',
  circuitUnknown: 'circuit-unknown',
  keyUnknown: 'key-unknown',
  keyRequired: 'key-required',
  keyDimension: 'key-dimension',
  keyRenamed: 'key-renamed',
  firmwareInC: 'firmware-in-c',
  identifierUnknown: 'identifier-unknown',
  identifierCycle: 'identifier-cycle',
  // block references (`@name.result`)
  referenceUnknown: 'reference-unknown',
  referenceAmbiguous: 'reference-ambiguous',
  referenceCycle: 'reference-cycle',
  referenceResult: 'reference-result',
  blockNameRepeated: 'block-name-repeated',
  // the circuit model
  physics: 'physics',
  registerRange: 'register-range',
  rateError: 'rate-error',
  supplyRange: 'supply-range',
  resultOverflow: 'result-overflow',
  clockRange: 'clock-range',
  clockTolerance: 'clock-tolerance',
  refreshTiming: 'refresh-timing',
  busLimit: 'bus-limit',
  sampleSettling: 'sample-settling',
  // claims and solving
  expectMismatch: 'expect-mismatch',
  expectUnknownMeasure: 'expect-unknown-measure',
  expectNotComputed: 'expect-not-computed',
  solveFailed: 'solve-failed',
  solveBlocked: 'solve-blocked',
  solveInexact: 'solve-inexact',
  solved: 'solved',
  seriesSnap: 'series-snap',
  // firmware constants
  cSyntax: 'c-syntax',
  cUnknown: 'c-unknown',
  cCycle: 'c-cycle',
  cDivZero: 'c-div-zero',
  cConditional: 'c-conditional',
  cInclude: 'c-include',
  cExpansionLimit: 'c-expansion-limit',
  cUndefined: 'c-undefined',
  /** A firmware name whose value is only known at run time: an extern variable, a function call. */
  cRuntime: 'c-runtime',
  // files
  fileTooLarge: 'file-too-large',
  fileUnreadable: 'file-unreadable',
  // cautions
  caution: 'caution',
  safetyKept: 'safety-kept',
} as const;

export type CodeId = (typeof Code)[keyof typeof Code];

export type Severity = 'error' | 'warning' | 'info';

export interface CodeInfo {
  id: CodeId;
  /** The severity a finding of this code has unless its message says otherwise. */
  severity: Severity;
  /** One sentence: what the finding means (SARIF `shortDescription`). */
  short: string;
  /** When it is reported and why it matters (SARIF `fullDescription`). */
  full: string;
  /** What to do about it (SARIF `help`). */
  help: string;
}

type Row = Omit<CodeInfo, 'id'>;

const rows: Record<CodeId, Row> = {
  'block-unterminated': {
    severity: 'error',
    short: 'A timing block is not closed.',
    full: 'A fenced `timing` block has no closing fence, or a `/* @timing` comment runs to the end of the file; the block is not analysed.',
    help: 'Close the fence (a line of three backticks) or the comment (`*/`).',
  },
  'block-line-malformed': {
    severity: 'error',
    short: 'A line inside a timing block is not `key: value`.',
    full: 'Every line of a block is one `key: value` pair; a line without a colon or without a key cannot be read and is left out.',
    help: 'Write the line as `key: value`, or move prose out of the block.',
  },
  'block-key-repeated': {
    severity: 'error',
    short: 'A key is given twice in one block.',
    full: 'A block gives each key once; the second value is not used, so which one was meant is unclear.',
    help: 'Remove one of the two lines.',
  },
  'value-syntax': {
    severity: 'error',
    short: 'A value cannot be read.',
    full: 'A value is not a number, a quantity with a unit, an expression with + − * / ( ), a name or `?`: an unexpected character, an unmatched parenthesis, an empty value, a claim without a unit.',
    help: 'Write a number with an optional SI prefix and unit (`47k`, `100 nF`, `16 MHz`) or arithmetic of such values.',
  },
  'value-unit': {
    severity: 'error',
    short: 'A value has an unknown unit or prefix, or one that reads differently from C.',
    full: 'A unit or SI prefix is not known, or a firmware-style suffix (`2u`) reads as an SI prefix (2 µ) rather than as C\'s unsigned 2.',
    help: 'Use a known unit (Ω F V Hz s % baud bit/s) and prefix (p n u µ m k M G); write a plain number where C\'s suffix was meant.',
  },
  'value-tolerance': {
    severity: 'error',
    short: 'A tolerance cannot be read or does not fit its value.',
    full: 'A tolerance after a value (`±5%`, `+80% -20%`, `±0.1 V`, `±20 ppm`) cannot be read, or its unit does not match the value\'s.',
    help: 'Write the tolerance in percent, ppm, or in the value\'s own unit.',
  },
  'value-too-deep': {
    severity: 'error',
    short: 'A value is too long or too deeply nested.',
    full: 'A value has more parts, or nests parentheses or signs deeper, than the parser accepts; it is refused rather than evaluated.',
    help: 'Split the expression or simplify it.',
  },
  'value-option': {
    severity: 'error',
    short: 'A word-valued key has a word it does not take.',
    full: 'Keys such as `mode:`, `diode:`, `data-model:` and `safety:` take one of a fixed set of words; the value given is none of them, so the default is used.',
    help: 'Use one of the words the message lists.',
  },
  'value-range': {
    severity: 'error',
    short: 'A setting of the block is outside its range.',
    full: 'A key that steers the analysis (`samples:`, `seed:`) takes a whole number within fixed bounds; the value given is outside them and is not used.',
    help: 'Give a whole number within the bounds the message states.',
  },
  'circuit-missing': {
    severity: 'error',
    short: 'A block does not say which circuit it describes.',
    full: 'Every timing block needs `circuit:`; without it nothing can be computed.',
    help: 'Add `circuit:` with one of the circuits the message lists.',
  },
  'circuit-unknown': {
    severity: 'error',
    short: 'A block names a circuit Tickmark does not model.',
    full: 'The value of `circuit:` is not one of the modelled circuits; the block is not analysed.',
    help: 'Use one of the circuits listed in the message (a near miss is suggested).',
  },
  'key-unknown': {
    severity: 'warning',
    short: 'A key is not a parameter of the block\'s circuit.',
    full: 'The key is neither a parameter of the circuit nor a key that steers the analysis; its value is ignored.',
    help: 'Check the spelling (a near miss is suggested) or the circuit.',
  },
  'key-required': {
    severity: 'error',
    short: 'A parameter the circuit needs is missing.',
    full: 'The circuit cannot be computed without this key and it has no default.',
    help: 'Add the key with its value.',
  },
  'key-dimension': {
    severity: 'error',
    short: 'A value has the wrong physical dimension for its key.',
    full: 'The value\'s unit says one dimension (a time, say) where the key takes another (a capacitance).',
    help: 'Give the value in the key\'s unit.',
  },
  'key-renamed': {
    severity: 'info',
    short: 'A key has a newer name.',
    full: 'A note\'s firmware file was once named with `from:`; it is still read, but `from:` now means only rc-delay\'s start voltage.',
    help: 'Rename the key to `firmware:`.',
  },
  'firmware-in-c': {
    severity: 'warning',
    short: 'A block in a C file names a firmware file.',
    full: 'A block inside C or C++ reads the constants of its own file and the headers it includes; a `firmware:` key there is ignored.',
    help: 'Remove the key, or include the header in the C file.',
  },
  'identifier-unknown': {
    severity: 'error',
    short: 'A name is neither a key of the block nor read from any firmware.',
    full: 'A value names an identifier that is not one of the block\'s own keys, and there is no firmware to read it from: a note\'s block without `firmware:`, or a claim in `expect:` (claims take numbers only). Where firmware is read (C files, `firmware:`), a name it does not define is `c-unknown` instead.',
    help: 'Name a key of the block, or add `firmware: path/to/file.h` so the name resolves from the firmware.',
  },
  'identifier-cycle': {
    severity: 'error',
    short: 'Keys of a block refer to each other in a cycle.',
    full: 'A key\'s value names another key whose value in turn depends on it, directly or through others, or on a key without a value.',
    help: 'Give one of the keys in the cycle a plain value.',
  },
  'reference-unknown': {
    severity: 'error',
    short: 'A `@name` reference names no block.',
    full: 'A value reads another block\'s result with `@name` or `@name.result`, but no block of that name is in the same file or anywhere in the workspace (the editor\'s folders, the files the CLI reads); the block gets no results that depend on it.',
    help: 'Correct the name (the message lists the nearest block names), or name the block you mean.',
  },
  'reference-ambiguous': {
    severity: 'error',
    short: 'A `@name` reference matches more than one block.',
    full: 'A name resolves in the same file first, then across the workspace; two or more blocks share the name where it was looked up, so the reference cannot choose.',
    help: 'Give each block its own name.',
  },
  'reference-cycle': {
    severity: 'error',
    short: 'Blocks read each other\'s results in a cycle.',
    full: 'A block\'s value reads a result that, through other blocks, depends on the block itself; no block in the cycle can be computed. Reported at each reference in the cycle.',
    help: 'Break the cycle: give one of the blocks a value of its own.',
  },
  'reference-result': {
    severity: 'error',
    short: 'A referenced block has no such result, or could not compute it.',
    full: 'The block a reference names exists, but it has no result of that name (a bare `@name` means its frequency), its own errors left it without results, or the chain of references is deeper than Tickmark follows.',
    help: 'Name one of the results the message lists, or fix the referenced block first.',
  },
  'block-name-repeated': {
    severity: 'warning',
    short: 'Two blocks in one file share a name.',
    full: 'Blocks are told apart by file and name: references, the waveform panel and the CLI\'s `wave --block` need one block per name in a file.',
    help: 'Rename one of the blocks.',
  },
  'physics': {
    severity: 'error',
    short: 'The values break the circuit model.',
    full: 'Inputs outside what the model describes: a threshold outside the output swing, `vt-` at or above `vt+`, a zero or negative part, an even ring, a control level above the supply. The block gets no results rather than wrong ones.',
    help: 'Correct the value the message names.',
  },
  'register-range': {
    severity: 'error',
    short: 'A register value is outside what the hardware can hold.',
    full: 'An integer key (prescaler, reload, compare, oversampling, stages, bits …) is not a whole number, is outside the range its register holds, or is not one of the allowed ratios; or a compare value lies beyond the period (a warning: the output stays active).',
    help: 'Pick a value within the range the message states, or change `bits:` / `prescalers:`.',
  },
  'clock-range': {
    severity: 'error',
    short: 'A PLL\'s comparison or VCO frequency is outside its range.',
    full: 'pfd = ref / prediv or vco = pfd · mult lies outside `pfd-range` or `vco-range`, so the PLL would not lock (an error); or the reference\'s tolerance carries it beyond the range (a warning).',
    help: 'Choose prediv or mult that keep the frequency inside the range with margin, or let `?` search them.',
  },
  'clock-tolerance': {
    severity: 'warning',
    short: 'A clock is less accurate than the bus timing tolerates.',
    full: 'The tolerance given with a CAN controller\'s clock exceeds the largest oscillator tolerance its bit timing survives by the two conditions of ISO 11898-1; nodes may lose synchronisation.',
    help: 'Use a more accurate clock (a crystal rather than an RC oscillator), or a larger sjw and phase segments.',
  },
  'refresh-timing': {
    severity: 'error',
    short: 'A watchdog refresh comes too late or too early.',
    full: 'The firmware\'s refresh interval reaches the shortest timeout over the clock\'s tolerance, or comes before a window watchdog\'s window opens at its latest; either way the watchdog resets a healthy system.',
    help: 'Refresh more often, lengthen the timeout (prescaler, reload), or move the window; verify on the hardware.',
  },
  'bus-limit': {
    severity: 'warning',
    short: 'An I²C line is beyond its mode\'s limits.',
    full: 'The rise time exceeds the mode\'s limit, the bus capacitance its maximum, or the pull-up is too small for a device to pull the line down to vol (I²C-bus specification); the bus may not run at that mode\'s speed.',
    help: 'Choose a pull-up within the bounds the hover gives (`pullup: ?` picks one), shorten the bus, or use a slower mode.',
  },
  'sample-settling': {
    severity: 'warning',
    short: 'An ADC input does not settle within its sampling time.',
    full: 'The sampling capacitor needs longer than the sampling time to settle to ½ LSB through the source and switch resistance; conversions read low or depend on the previous channel.',
    help: 'Lengthen the sampling time, lower the source resistance (a buffer or a smaller divider), or add a capacitor at the pin.',
  },
  'rate-error': {
    severity: 'warning',
    short: 'A UART rate misses the wanted baud rate beyond what a link tolerates.',
    full: 'The rate a baud-rate divisor gives differs from `baud:` by more than ±2 %, about what an 8-N-1 link tolerates between both ends (common practice).',
    help: 'Choose a divisor or clock that lands closer, or a fractional divisor.',
  },
  'supply-range': {
    severity: 'warning',
    short: 'A supply is outside the part\'s operating range.',
    full: 'The supply is beyond what the modelled part is rated for (a bipolar 555 above its absolute maximum); the numbers assume a part that would not survive or run there.',
    help: 'Check the supply against the part\'s datasheet, or choose a part rated for it.',
  },
  'result-overflow': {
    severity: 'error',
    short: 'A result is beyond what can be computed.',
    full: 'The inputs pass every physics check but a result would overflow or underflow a double (1e-300 F, 1e300 Ω); the block gets an error rather than a missing number.',
    help: 'Check the magnitudes and prefixes of the values.',
  },
  'expect-mismatch': {
    severity: 'warning',
    short: 'The computed value lies outside the claim of `expect:`.',
    full: 'The block computes a value outside the claim\'s tolerance (1 % unless the claim or the setting says otherwise); the message states the computed value and the difference from the claim.',
    help: 'Fix the part or register that is wrong (a quick fix sets a register constant that meets the claim), or update a stale claim.',
  },
  'expect-unknown-measure': {
    severity: 'error',
    short: 'A claim\'s unit matches no result of the circuit.',
    full: 'A claim in `expect:` has no unit, or a unit that none of the circuit\'s results has, so it is not clear which result it speaks of.',
    help: 'Claim a result the circuit computes, in its unit (the message lists them).',
  },
  'expect-not-computed': {
    severity: 'info',
    short: 'A claim speaks of a result this block does not compute.',
    full: 'The claimed result exists for the circuit but needs an optional key the block leaves out (a timer\'s duty needs `compare:`), so the claim is not checked.',
    help: 'Add the key the message suggests, or drop the claim.',
  },
  'solve-failed': {
    severity: 'error',
    short: 'A `?` value could not be solved.',
    full: 'A value marked `?` has no `target:`, cannot be solved for, is one `?` too many, or no value meets the target.',
    help: 'Follow the message: add `target:`, move `?` to a part, or relax the target.',
  },
  'solve-blocked': {
    severity: 'info',
    short: 'A `?` value waits for the block\'s errors to be fixed.',
    full: 'The block has errors, so its `?` is not solved yet; it is solved once they are fixed.',
    help: 'Fix the errors of the block.',
  },
  'solve-inexact': {
    severity: 'warning',
    short: 'The closest solution misses the target band.',
    full: 'A `?` was solved or searched, but the nearest standard part or register pair misses the target by more than the claim\'s tolerance.',
    help: 'Relax the target, widen the series or the allowed registers, or change another part.',
  },
  'solved': {
    severity: 'info',
    short: 'A `?` value was solved.',
    full: 'A value marked `?` was solved for `target:`; the message gives the value, and a quick fix fills it in.',
    help: 'Apply the quick fix to write the solved value into the block.',
  },
  'series-snap': {
    severity: 'info',
    short: 'A part value is off the block\'s standard series.',
    full: 'A resistor or capacitor value is not a value of the IEC 60063 series the block names (`series:`, default E24).',
    help: 'Apply the quick fix to set the log-nearest series value.',
  },
  'c-syntax': {
    severity: 'error',
    short: 'A firmware constant cannot be evaluated as a C constant expression.',
    full: 'The definition behind a name is not a C constant expression Tickmark evaluates with C\'s rules.',
    help: 'Check the definition the message points to.',
  },
  'c-unknown': {
    severity: 'error',
    short: 'A firmware name is not defined in the firmware read.',
    full: 'A name a block uses is not defined in the C file, the headers it includes, or the note\'s `firmware:` file and its includes.',
    help: 'Define the name, include its header, or pass it with `-D`.',
  },
  'c-cycle': {
    severity: 'error',
    short: 'Firmware macros or constants refer to each other in a cycle.',
    full: 'A macro or constant depends on itself, directly or through others.',
    help: 'Break the cycle in the firmware.',
  },
  'c-div-zero': {
    severity: 'error',
    short: 'A firmware constant divides by zero.',
    full: 'Evaluated with C\'s rules, an integer division or remainder in the constant has a zero divisor.',
    help: 'Check the constants that make the divisor zero.',
  },
  'c-conditional': {
    severity: 'error',
    short: 'A firmware constant depends on an undecided `#if`.',
    full: 'The name is defined differently under `#if` branches that Tickmark cannot decide from the file alone.',
    help: 'Settle the condition with `-D`/`-U` or compile_commands.json.',
  },
  'c-include': {
    severity: 'error',
    short: 'A firmware file cannot be read.',
    full: 'A quoted `#include` or a note\'s `firmware:` file cannot be found or read, lies outside the workspace, includes itself, or is computed; its constants are not known.',
    help: 'Fix the path, or add the folder to the include folders.',
  },
  'c-expansion-limit': {
    severity: 'error',
    short: 'Macro expansion or includes exceeded their bound.',
    full: 'Expanding a macro, or following nested includes, went beyond the bound that keeps the analysis finite.',
    help: 'Simplify the macro or the include chain.',
  },
  'c-undefined': {
    severity: 'error',
    short: 'A firmware constant expression has undefined behaviour in C.',
    full: 'Signed overflow, a shift count out of range or a float-to-integer overflow: C gives it no value, so neither does Tickmark.',
    help: 'Use unsigned arithmetic or a wider type, as the compiler would need.',
  },
  'c-runtime': {
    severity: 'error',
    short: 'A firmware name is only known at run time, not a constant.',
    full: 'An `extern` variable or a function call in a macro has no value until the firmware runs; the finding names the macro, its line and what it reads.',
    help: 'Give the block the constant the variable is set from, or the value itself.',
  },
  'file-too-large': {
    severity: 'warning',
    short: 'A file is above the size limit and was not read.',
    full: 'Files larger than the size setting (`tickmark.files.maxSizeKB`, CLI `--max-size-kb`) are not scanned; a warning so a check that skipped one does not pass silently.',
    help: 'Raise the limit, or exclude the file.',
  },
  'file-unreadable': {
    severity: 'error',
    short: 'A file could not be read.',
    full: 'The file exists in the editor or on the command line but its text could not be read.',
    help: 'Check the path and its permissions.',
  },
  'caution': {
    severity: 'info',
    short: 'A caution for the circuit as given.',
    full: 'A hazard beside the arithmetic: a voltage above the safety-extra-low-voltage limit, safety-related timing (watchdog, reset, interlock), a part run outside its recommended range.',
    help: 'Verify independently on the built hardware and follow local codes and licensed practice.',
  },
  'safety-kept': {
    severity: 'info',
    short: '`safety: no` does not remove the safety caution from a block named like a guard.',
    full: 'A block named for watchdog, reset or interlock timing always carries the safety-timing caution; one word in the block does not silence it.',
    help: 'Remove `safety: no`, or rename the block if it guards nothing.',
  },
};

/** Every code with its description, in the order of `Code`. */
export const codeTable: readonly CodeInfo[] = Object.values(Code).map((id) => ({ id, ...rows[id] }));

const byId = new Map<string, CodeInfo>(codeTable.map((info) => [info.id, info]));

/** The row of a code; undefined for a code this version does not know. */
export function codeInfo(code: string): CodeInfo | undefined {
  return byId.get(code);
}
