// The tree of one parsed value. Spans are document offsets.
import type { Dim, Finding, Span, Tolerance } from '../types';

export type ValueNode =
  /** value in SI: 47k → 47000, 100n → 1e-7, 16 MHz → 1.6e7 (Hz), 50 % → 0.5 (%), 115200 baud (baud). */
  | { kind: 'number'; value: number; dim: Dim; span: Span }
  /** A C identifier or one of the block's own keys (`supply`, `r`, `SYS_CLOCK_HZ`). */
  /** `ref` is set for a block reference (`@xtal.frequency`); its `name` is then `ref.key`. */
  | { kind: 'ident'; name: string; span: Span; ref?: BlockRef }
  /** `opSpan` is the operator's own span, for findings that point at it. */
  | { kind: 'unary'; op: '-' | '+'; arg: ValueNode; span: Span; opSpan: Span }
  | { kind: 'binary'; op: '+' | '-' | '*' | '/'; left: ValueNode; right: ValueNode; span: Span; opSpan: Span };

export interface ParsedValue {
  /** Absent when the value is `?`, a word that is not a name, or on error. */
  expr?: ValueNode;
  /** The value was `?`: the one value to solve for. */
  unknown?: Span;
  /** The whole value as one word for choice keys (`yes`, `up-down`, `E24`); `expr` is also set when it is a name. */
  word?: string;
  /** `±5%`, `+80% -20%`, `±0.1 V` (absolute amounts in SI). */
  tolerance?: Tolerance;
  toleranceSpan?: Span;
  /** Dimension an absolute tolerance was written in (`±0.1 V` → 'V'), to check against the value's. */
  toleranceDim?: Dim;
  findings: Finding[];
}

/** `@name.result` or `@name` (the block's frequency), as written in a value. */
export interface BlockRef {
  /** The referenced block's name as written. */
  block: string;
  /** The result named after the dot; undefined for `@name` alone. */
  result?: string;
  blockSpan: Span;
  resultSpan?: Span;
  /** `@block.result` with the result spelled out (`frequency` when left out): the name the value reads. */
  key: string;
}
