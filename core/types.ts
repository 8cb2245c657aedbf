// Shared shapes of the core. Nothing here imports the editor; offsets are 0-based into a document's text.

/** A document as the core sees it: the editor glue and the CLI both wrap theirs to fit. */
export interface TextDocumentLike {
  uri: string;
  text: string;
  languageId: string;
}

export type Severity = 'error' | 'warning' | 'info';

/** Half-open range [start, end) of 0-based offsets into the document text. */
export interface Span {
  start: number;
  end: number;
}

/** A text edit the user may choose to apply (a quick fix). Never applied by the core. */
export interface TextEdit {
  /** Document the edit applies to (may be a header other than the block's own file). */
  uri: string;
  span: Span;
  newText: string;
}

export interface Fix {
  title: string;
  edits: TextEdit[];
}

export interface Finding {
  severity: Severity;
  /** Stable code from core/codes.ts, shared by diagnostics and quick fixes. */
  code: string;
  message: string;
  /** Offsets into the text of `uri` (the block's own document unless stated). */
  span: Span;
  uri?: string;
  fixes?: Fix[];
}

/** The physical dimension of a value, named by its SI unit. '' is a plain number. */
export type Dim = 'Ω' | 'F' | 'V' | 'Hz' | 's' | 'A' | '' | '%' | 'baud' | 'bit/s' | 'other';

/** A resolved value in SI base units. */
export interface Quantity {
  value: number;
  dim: Dim;
}

/** Tolerance as relative fractions (0.05 for ±5 %) or absolute amounts in the value's SI unit. */
export type Tolerance =
  | { kind: 'relative'; plus: number; minus: number }
  | { kind: 'absolute'; plus: number; minus: number };

/** One `key: value` line of a block, exactly where it stands. */
export interface BlockEntry {
  /** Lower-cased key. */
  key: string;
  keySpan: Span;
  /** Value text as written (trimmed). */
  valueText: string;
  valueSpan: Span;
}

export type BlockHost = 'markdown' | 'c';

/** A timing block as found by a scanner, before any value is parsed. */
export interface RawBlock {
  host: BlockHost;
  /** Name as written, or undefined (then named `circuit@line`). */
  name?: string;
  nameSpan?: Span;
  /** The opening line (fence or `@timing` tag). */
  headerSpan: Span;
  /** The whole block, header to last entry line. */
  span: Span;
  entries: BlockEntry[];
  /** Problems of the block's own shape: unterminated fence, a line that is not `key: value`, a repeated key. */
  findings: Finding[];
}

/** A result with its spread, when the block gives tolerances. */
export interface SpreadRange {
  min: number;
  max: number;
  /** Monte Carlo percentiles when `samples:` is given. */
  p1?: number;
  p99?: number;
  /** Each toleranced input's share of the worst-case width (fractions summing to about 1). */
  shares?: Record<string, number>;
}

export interface SolvedPart {
  /** Exact value that meets the target (R, C); absent for timer registers. */
  exact?: number;
  /** The value used from now on: the standard part, or the register value. */
  value: number;
  series?: string;
  /** Relative error of the recomputed measure against the target. */
  error?: number;
}

/** A firmware identifier a block used, with where it came from. */
export interface ResolvedIdentifier {
  name: string;
  value: number;
  /** Where it is defined: document uri and 1-based line. */
  uri: string;
  line: number;
}

/** Another block's result a block used (`clock: @sysclk.frequency`), with where that block stands. */
export interface BlockReference {
  /** The referenced block's name and result, as resolved (`sysclk`, `frequency`). */
  name: string;
  result: string;
  /** The referenced block: document uri and 1-based line of its header. */
  uri: string;
  line: number;
  /** The nominal value it supplied, SI base units. */
  value: number;
  /** The referenced block's circuit, for formatting the value. */
  circuit: string;
  /** The reference as written in this block (its `@name` and `.result`), for the editor. */
  span: Span;
  /** The key whose value holds the reference. */
  key: string;
}

/** Everything the engine says about one block: the CLI's JSON and the editor's lens, hover and diagnostics. */
/** Allowed integers: an explicit list, or an inclusive range. */
export type IntegerSet = { kind: 'list'; values: number[] } | { kind: 'range'; min: number; max: number };

/** An inclusive interval in SI units (`vco-range: 96 MHz .. 344 MHz`). */
export interface Interval {
  min: number;
  max: number;
}

/** A relative tolerance band of an input (fractions: 20 ppm is 2e-5). */
export interface Band {
  plus: number;
  minus: number;
}

export interface BlockAnalysis {
  /** Name as written, or `circuit@line`. */
  name: string;
  /** 1-based line of the block's header. */
  line: number;
  circuit?: string;
  /** The raw block as scanned (spans for the editor). */
  block: RawBlock;
  /** Every value that resolved, SI base units. */
  params: Record<string, number>;
  /** Word-valued parameters (`mode`, `diode`, `series`). */
  choices: Record<string, string>;
  /** Sets of allowed integers (`prescalers: 1, 8, 64`), as the model was given them. */
  lists: Record<string, IntegerSet>;
  /** Range keys as given (`vco-range`) and each toleranced input's relative band, as the model was given them. */
  ranges?: Record<string, Interval>;
  tolerances?: Record<string, Band>;
  /** Results that could be computed; never NaN or infinite. */
  values: Record<string, number>;
  spread?: Record<string, SpreadRange>;
  solved?: Record<string, SolvedPart>;
  identifiers: ResolvedIdentifier[];
  /** Other blocks' results this block used, in the order written. */
  references?: BlockReference[];
  /** Findings with spans into the block's document (or `uri` when elsewhere). */
  findings: Finding[];
}

export interface DocumentAnalysis {
  uri: string;
  blocks: BlockAnalysis[];
  /** Findings not tied to one block (file too large, include problems). */
  findings: Finding[];
  /** Files read to resolve constants (headers), so an editor can refresh dependants. */
  dependencies: string[];
}
