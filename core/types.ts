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
export type Dim = 'Ω' | 'F' | 'V' | 'Hz' | 's' | 'A' | '' | '%' | 'baud' | 'other';

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
