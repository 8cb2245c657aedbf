// The shape every circuit model file exports. One model per file; the registry lists them.
import type { Dim } from '../types';
import type { CodeId } from '../codes';

/** A numeric parameter of a circuit, in SI units. */
export interface QuantityParam {
  kind: 'quantity';
  key: string;
  /** Short label for hovers and completion, in the trade's words ("upper threshold VT+"). */
  label: string;
  dim: Dim;
  /** Default when the key is absent: a constant, or derived from the other resolved values. Absent = required. */
  default?: number | ((values: Readonly<Record<string, number>>) => number);
  /** Human text of the default for docs and completion ("supply", "2/3 supply"). */
  defaultText?: string;
  /** Hard limits; outside them the model is not computed (an error naming the key). */
  min?: number;
  max?: number;
  /** Whether `?` may be solved for this key (R, C, and timer registers). */
  solvable?: boolean;
  /** Integer-valued (registers, stages, oversampling): read as a C constant expression, see isRegisterKey. */
  integer?: boolean;
  /** A register value that may be fractional (a baud divisor, a PLL multiplier): read as C as well. */
  register?: boolean;
  /** May be left out without a default: the model then runs without it (timer `compare`, baud `divisor`). */
  optional?: boolean;
  /** Written in a new block's template although optional (can-bit's prop-seg and phase-seg1, the alternative to tseg1). */
  template?: boolean;
  description: string;
}

/**
 * The one rule for which keys are registers (docs/blocks.md, "Values and units"): plain-number keys marked `integer` or
 * `register` take C constant expressions in the block's data model; keys with a unit keep the value language.
 */
export function isRegisterKey(spec: QuantityParam): boolean {
  return spec.dim === '' && (spec.integer === true || spec.register === true);
}

/** A word-valued parameter (`mode: up-down`, `diode: yes`). */
export interface ChoiceParam {
  kind: 'choice';
  key: string;
  label: string;
  options: readonly string[];
  default: string;
  description: string;
}

/** A set of allowed integers (`prescalers: 1, 8, 64` or `1..65536`). */
export interface ListParam {
  kind: 'list';
  key: string;
  label: string;
  defaultText?: string;
  description: string;
}

/** Limits written as a range with units (`vco-range: 96 MHz .. 344 MHz`); optional, no default. */
export interface RangeParam {
  kind: 'range';
  key: string;
  label: string;
  dim: Dim;
  description: string;
}

export type ParamSpec = QuantityParam | ChoiceParam | ListParam | RangeParam;

export type { IntegerSet, Interval, Band } from '../types';
import type { Interval, Band } from '../types';
import type { IntegerSet } from '../types';

/** Resolved inputs of a model. */
export interface ModelInput {
  values: Readonly<Record<string, number>>;
  choices: Readonly<Record<string, string>>;
  lists: Readonly<Record<string, IntegerSet>>;
  /** Range keys that were given (`pfd-range`, `vco-range`). */
  ranges?: Readonly<Record<string, Interval>>;
  /**
   * Relative tolerance of each toleranced input, present (possibly empty) at the block's nominal evaluation only;
   * absent at spread corners and search trials, which move the inputs themselves. A model checks limits that
   * concern the whole band (a watchdog's shortest timeout, a PLL's vco range) only when it is present, so a
   * spread corner is never dropped for leaving a band the nominal check already judged.
   */
  tolerances?: Readonly<Record<string, Band>>;
  /** The block's name when it has one: cautions depend on use (a timer named `watchdog`). */
  name?: string;
}

export interface ResultSpec {
  key: string;
  label: string;
  dim: Dim;
  /** Fractions shown as percent (duty, error). */
  percent?: boolean;
  /** Computed only when an optional key is given (a timer's duty needs `compare`, a PLL's frequency2 `postdiv2`). */
  optional?: boolean;
}

/** A physics problem with the inputs, naming the offending key. */
export interface ModelIssue {
  key: string;
  message: string;
  severity?: 'error' | 'warning' | 'info';
  /** The finding's code when it is not a plain physics problem (`register-range`, `rate-error`, `supply-range`). */
  code?: CodeId;
}

/** One line of the hover's working: the formula, the numbers substituted, and its published source. */
export interface WorkingLine {
  formula: string;
  substituted: string;
  source: string;
}

/** A trace for the waveform panel and SVG, sampled densely enough to draw. */
export interface Trace {
  name: string;
  dim: Dim;
  points: Array<[number, number]>;
}

export interface Waveform {
  traces: Trace[];
  /** Horizontal reference lines (thresholds, control voltage) on the first trace's axis. */
  levels: Array<{ label: string; value: number }>;
  /** Time span drawn, seconds. */
  duration: number;
}

/** Register search (`prescaler: ?`, `reload: ?`, `mult: ? 8..512`). */
export interface RegisterSearch {
  /** Keys searched, from the block's `?`s. */
  unknowns: string[];
  /** The result the target constrains and its value ("frequency", 1000); '' and NaN for a search without target. */
  measure: string;
  target: number;
  /** Every target (`target:`, `target2:`, `target3:`), the first being `measure`/`target` above. */
  targets?: Array<{ measure: string; target: number }>;
  /** Values a `?` was given to choose from (`? 1..63`). */
  allowed?: Readonly<Record<string, IntegerSet>>;
  /** The block's standard series for parts (`series:` or the setting's default). */
  series?: string;
}

export interface RegisterSearchResult {
  values: Record<string, number>;
  /** Relative error of the achieved measure against the target (0 when exact); the worst one over several targets. */
  error: number;
  /** Parts snapped onto a series: the exact value before snapping and the series' name. */
  exact?: Record<string, number>;
  series?: string;
  /** One sentence on how the answer was chosen, for a search without target (`largest E24 value in …`). */
  note?: string;
}

/** A search that found nothing says why; `error` is then a message, not a relative error. */
export interface RegisterSearchFailure {
  error: string;
}

export function isSearchFailure(result: RegisterSearchResult | RegisterSearchFailure): result is RegisterSearchFailure {
  return typeof result.error === 'string';
}

export interface CircuitModel {
  id: string;
  title: string;
  /** One sentence for the README and completion. */
  summary: string;
  /** In words, for the hover; one starting `<choice key> <option>: ` is shown only when that option is chosen. */
  assumptions: readonly string[];
  params: readonly ParamSpec[];
  results: readonly ResultSpec[];
  /** Result keys shown on the code lens, in order. */
  headline: readonly string[];
  /** Physics checks on resolved inputs (after defaults), without computing. An error here means compute() is not called. */
  validate(input: ModelInput): ModelIssue[];
  /**
   * Results in SI units. The engine calls it once per evaluation and checks afterwards that every result not
   * marked `optional` is a finite number (an overflow is a `result-overflow` error, not a missing number).
   */
  compute(input: ModelInput): Record<string, number>;
  working(input: ModelInput, results: Readonly<Record<string, number>>): WorkingLine[];
  waveform?(input: ModelInput, cycles: number): Waveform;
  /** Its timing always guards something (a watchdog): the engine adds the safety-timing caution whatever the name. */
  safetyRelated?: boolean;
  /** Cautions in words for the hover (hazardous voltage, out-of-range use); the safety-timing caution is the engine's. */
  cautions?(input: ModelInput): string[];
  /** For timers: search the `?` registers for a target. */
  search?(input: ModelInput, search: RegisterSearch): RegisterSearchResult | RegisterSearchFailure;
  /** The search also runs without `target:` (an I²C pull-up chosen within its bounds). */
  searchWithoutTarget?: boolean;
}
