// Turns a scanned block into an evaluation plan: each parameter compiled once, replayed many times
// (nominal, tolerance corners, Monte Carlo samples, solver steps) without parsing again.
import type { BlockEntry, BlockReference, Dim, Finding, RawBlock, ResolvedIdentifier, Span, Tolerance } from '../types';
import type { CircuitModel, IntegerSet, Interval, QuantityParam } from '../circuits/model';
import { compileValue, dimOf, parseIntegerSet, parseRange, parseUnknown, parseValue, type ValueNode } from '../value';
import { Code } from '../codes';
import type { DataModelName, IdentifierLookup, IdentifierSource } from './context';
import { didYouMean, isMetaEntry, metaKeys } from './keys';
import { describeDim, toleranceMismatch } from './dims';
import { modelKeys } from './model-keys';
import { evaluationOrder } from './order';
import { noReferences, type BlockOutput, type ReferenceSource, type UpstreamInput } from './references';
import { registerValue } from './registers';
import { emptyList, emptyRecord, keptList } from '../empty';

export interface Slot {
  key: string;
  spec: QuantityParam;
  entry: BlockEntry;
  evaluate: (env: Readonly<Record<string, number>>) => number;
  /** Identifier as written → block key it names (one shared empty list when it names none). */
  blockRefs: ReadonlyArray<readonly [string, string]>;
  tolerance?: Tolerance;
  /** Other blocks' results the value reads: name in the value (`@xtal.frequency`), the block, the result. */
  upstream?: Array<[string, BlockOutput, string]>;
  /** The value is exactly one firmware identifier (the target of a "set the constant" fix). */
  soleIdentifier?: string;
  /** The value as parsed, once: later checks (a part off its series) read it here. */
  expr?: ValueNode;
}

export interface Unknown {
  key: string;
  spec: QuantityParam;
  entry: BlockEntry;
  span: Span;
  /** Values the `?` may take (`? 1..63`, `? 2, 4, 6, 8`). */
  allowed?: IntegerSet;
}

/**
 * A block's evaluation plan, complete once built: the evaluation reads it and never writes to it
 * (core/analyze/evaluate.ts). Lists a block leaves empty are one shared empty list, so nothing may add to them.
 */
export interface Plan {
  readonly model: CircuitModel;
  /** The block's name as written, for cautions that depend on use. */
  readonly name?: string;
  readonly entries: Map<string, BlockEntry>;
  readonly slots: Map<string, Slot>;
  /** Order in which quantity keys get their values: given slots and defaults interleaved. */
  readonly order: readonly string[];
  readonly externalLookups: ReadonlyMap<string, IdentifierLookup & { ok: true }>;
  readonly choices: Record<string, string>;
  readonly lists: Record<string, IntegerSet>;
  readonly ranges: Record<string, Interval>;
  readonly unknowns: readonly Unknown[];
  readonly findings: readonly Finding[];
  readonly identifiers: ResolvedIdentifier[];
  /** Other blocks' results used, in the order written. */
  readonly references: readonly BlockReference[];
  /** Toleranced inputs upstream of the references, each once. */
  readonly upstreamInputs: readonly UpstreamInput[];
  /** The keys in `order`, each resolved to its slot or its default's spec: what evaluateParams replays. */
  readonly steps: readonly Step[];
  /** Some slot reads another key of the block or another block's result (through the evaluation's environment). */
  readonly readsEnv: boolean;
  /** Keys whose given value carries a tolerance above zero, in the order written. */
  readonly ownToleranced: readonly string[];
}

/** One key of the evaluation order: its given value (slot) or, without one, its spec for the default. */
export interface Step {
  key: string;
  slot?: Slot;
  spec?: QuantityParam;
}

type IdentNode = Extract<ValueNode, { kind: 'ident' }>;

/** The identifier nodes of a value, in the order written. */
function identifiersOf(node: ValueNode, out: IdentNode[]): IdentNode[] {
  switch (node.kind) {
    case 'ident':
      out.push(node);
      break;
    case 'unary':
      identifiersOf(node.arg, out);
      break;
    case 'binary':
      identifiersOf(node.left, out);
      identifiersOf(node.right, out);
      break;
  }
  return out;
}

function error(code: string, message: string, span: Span): Finding {
  return { severity: 'error', code, message, span };
}

/** One empty list for every plan and slot that has none of a kind; a finished plan is never added to. */
const none = emptyList;

function hasError(findings: readonly Finding[]): boolean {
  for (let i = 0; i < findings.length; i++) if (findings[i].severity === 'error') return true;
  return false;
}

/**
 * What a plan gathers while its entries are read. Lists start as the shared empty one and are made on the first
 * item: most blocks have no unknowns, references or findings (a cold run builds one plan per block).
 */
class PlanBuilder {
  declare findings: Finding[];
  declare identifiers: ResolvedIdentifier[];
  declare externalLookups: Map<string, IdentifierLookup & { ok: true }> | undefined;
  declare references: BlockReference[];
  declare upstreamInputs: UpstreamInput[];
  declare unknowns: Unknown[];
  declare ownToleranced: string[];
  declare readsEnv: boolean;

  constructor() {
    this.findings = none;
    this.identifiers = [];
    this.externalLookups = undefined;
    this.references = none;
    this.upstreamInputs = none;
    this.unknowns = none;
    this.ownToleranced = none;
    this.readsEnv = false;
  }

  finding(finding: Finding): void {
    if (this.findings === none) this.findings = [];
    this.findings.push(finding);
  }

  addFindings(findings: readonly Finding[]): void {
    for (let i = 0; i < findings.length; i++) this.finding(findings[i]);
  }

  unknown(unknown: Unknown): void {
    if (this.unknowns === none) this.unknowns = [];
    this.unknowns.push(unknown);
  }

  reference(reference: BlockReference): void {
    if (this.references === none) this.references = [];
    this.references.push(reference);
  }

  upstreamInput(input: UpstreamInput): void {
    const inputs = this.upstreamInputs;
    for (let i = 0; i < inputs.length; i++) if (inputs[i].id === input.id) return;
    if (this.upstreamInputs === none) this.upstreamInputs = [];
    this.upstreamInputs.push(input);
  }

  toleranced(key: string): void {
    if (this.ownToleranced === none) this.ownToleranced = [];
    this.ownToleranced.push(key);
  }
}

/** The lists and ranges of a block that gives none: shared records, read by models and the editor, never written. */
const noLists: Record<string, IntegerSet> = emptyRecord;
const noRanges: Record<string, Interval> = emptyRecord;

const noLookups: ReadonlyMap<string, IdentifierLookup & { ok: true }> = new Map();

/**
 * Builds the plan; every problem becomes a finding and the plan stays usable for what did resolve. `entries` is
 * the block's entries by key when the caller has them already.
 */
export function buildPlan(
  raw: RawBlock,
  model: CircuitModel,
  source: IdentifierSource,
  dataModel: DataModelName,
  entries?: Map<string, BlockEntry>,
  references: ReferenceSource = noReferences,
): Plan {
  const keys = modelKeys(model);
  const built = new PlanBuilder();
  const slots = new Map<string, Slot>();
  let choices: Record<string, string> = {};
  let chosen = false;
  let lists: Record<string, IntegerSet> | undefined;
  let ranges: Record<string, Interval> | undefined;
  const quantityKeys = keys.quantities;

  for (let i = 0; i < raw.entries.length; i++) {
    const entry = raw.entries[i];
    if (isMetaEntry(entry.key, entry.valueText)) continue;
    const spec = keys.params.get(entry.key);
    if (!spec) {
      const hint = entry.key === 'from' ? ' (a note\'s firmware file is named with `firmware:`)' : didYouMean(entry.key, [...model.params.map((p) => p.key), ...metaKeys]);
      built.finding({
        severity: 'warning',
        code: Code.keyUnknown,
        message: `\`${entry.key}\` is not a key of ${model.id}${hint}`,
        span: entry.keySpan,
      });
      continue;
    }
    if (spec.kind === 'choice') {
      const word = entry.valueText.trim().toLowerCase();
      if (spec.options.includes(word)) {
        choices[spec.key] = word;
        chosen = true;
      }
      else
        built.finding(
          error(Code.valueOption, `\`${entry.key}\` takes ${spec.options.map((o) => `\`${o}\``).join(' or ')}, not \`${entry.valueText}\`${didYouMean(word, spec.options)}`, entry.valueSpan),
        );
      continue;
    }
    if (spec.kind === 'list') {
      const parsed = parseIntegerSet(entry.valueText, entry.valueSpan.start);
      built.addFindings(parsed.findings);
      if (parsed.set) (lists ??= {})[spec.key] = parsed.set;
      continue;
    }
    if (spec.kind === 'range') {
      const parsed = parseRange(entry.valueText, entry.valueSpan.start, spec.dim, spec.key);
      built.addFindings(parsed.findings);
      if (parsed.min !== undefined && parsed.max !== undefined) (ranges ??= {})[spec.key] = { min: parsed.min, max: parsed.max };
      continue;
    }
    const unknown = parseUnknown(entry.valueText, entry.valueSpan.start);
    if (unknown) {
      built.addFindings(unknown.findings);
      if (!hasError(unknown.findings)) built.unknown({ key: spec.key, spec, entry, span: unknown.span, allowed: unknown.allowed });
      continue;
    }
    const register = registerValue(spec, entry, quantityKeys, source, dataModel);
    if (register && 'finding' in register) { built.finding(register.finding); continue; }
    if (register) {
      const identifiers = built.identifiers;
      for (let r = 0; r < register.identifiers.length; r++) {
        const id = register.identifiers[r];
        let known = false;
        for (let k = 0; k < identifiers.length && !known; k++) known = identifiers[k].name === id.name;
        if (!known) identifiers.push(id);
      }
      const value = register.value;
      slots.set(spec.key, { key: spec.key, spec, entry, evaluate: () => value, blockRefs: none, tolerance: undefined, upstream: undefined, soleIdentifier: undefined, expr: undefined });
      continue;
    }
    const parsed = parseValue(entry.valueText, entry.valueSpan.start);
    const parseFindings = parsed.findings;
    // A value the parser refuses (`1e400` out of range) is still the key's problem: the message names it.
    for (let f = 0; f < parseFindings.length; f++) {
      const finding = parseFindings[f];
      built.finding(finding.severity === 'error' && !finding.message.includes(`\`${entry.key}\``) ? { ...finding, message: `\`${entry.key}\`: ${finding.message}` } : finding);
    }
    if (parsed.unknown) {
      built.unknown({ key: spec.key, spec, entry, span: parsed.unknown, allowed: undefined });
      continue;
    }
    if (!parsed.expr || hasError(parseFindings)) continue;
    const toleranceProblem = toleranceMismatch(parsed.tolerance, parsed.toleranceDim, spec.dim, entry.key);
    if (toleranceProblem) {
      built.finding(error(Code.valueTolerance, toleranceProblem, parsed.toleranceSpan ?? entry.valueSpan));
      continue;
    }
    const slot = compileSlot(built, spec, entry, parsed.expr, parsed.tolerance, quantityKeys, source, dataModel, references);
    if (!slot) continue;
    slots.set(spec.key, slot);
    const t = slot.tolerance;
    if (t && (t.plus > 0 || t.minus > 0)) built.toleranced(spec.key);
  }
  // A block that chooses nothing shares its model's defaults (one object kept per block fewer, see core/empty.ts).
  if (!chosen) choices = keys.defaultChoices as Record<string, string>;
  else {
    for (let i = 0; i < model.params.length; i++) {
      const spec = model.params[i];
      if (spec.kind === 'choice' && !(spec.key in choices)) choices[spec.key] = spec.default;
    }
  }
  const blockEntries = entries ?? new Map(raw.entries.map((e) => [e.key, e]));
  const ordered = evaluationOrder({ model, entries: blockEntries, slots, unknowns: built.unknowns }, raw);
  built.addFindings(ordered.findings);
  const specs = keys.quantities;
  const order = ordered.order;
  const steps: Step[] = new Array(order.length);
  for (let i = 0; i < order.length; i++) {
    const key = order[i];
    steps[i] = { key, slot: slots.get(key), spec: specs.get(key) };
  }
  return {
    model,
    name: raw.name,
    entries: blockEntries,
    slots,
    order,
    externalLookups: built.externalLookups ?? noLookups,
    choices,
    lists: lists ?? noLists,
    ranges: ranges ?? noRanges,
    unknowns: built.unknowns,
    findings: built.findings,
    identifiers: keptList(built.identifiers),
    references: built.references,
    upstreamInputs: built.upstreamInputs,
    steps,
    readsEnv: built.readsEnv,
    ownToleranced: built.ownToleranced,
  };
}

/*
 * The resolver dimOf and compileValue call back while one slot compiles, as plain functions over the slot being
 * compiled rather than closures made per slot. Both are called only during compileSlot, which nothing re-enters.
 */
let compilingKey = '';
let compilingKeys: ReadonlyMap<string, QuantityParam> = new Map();
let compilingDims: Map<string, Dim> | undefined;
let compilingRefs: ReadonlyArray<readonly [string, string]> = none;
let compilingLookups: ReadonlyMap<string, IdentifierLookup & { ok: true }> | undefined;

function dimOfName(name: string): Dim {
  const fromBlock = compilingDims?.get(name);
  if (fromBlock !== undefined) return fromBlock;
  const key = name.toLowerCase();
  if (key !== compilingKey) {
    const spec = compilingKeys.get(key);
    if (spec) return spec.dim;
  }
  return '';
}

// Firmware constants are fixed for the plan: compiled in as numbers, so only block references read the
// environment, and a name one slot reads from firmware and another as a block key cannot collide.
function firmwareConstant(name: string): number | undefined {
  const refs = compilingRefs;
  for (let i = 0; i < refs.length; i++) if (refs[i][0] === name) return undefined;
  return compilingLookups?.get(name)?.value;
}

function compileSlot(
  plan: PlanBuilder,
  spec: QuantityParam,
  entry: BlockEntry,
  expr: ValueNode,
  tolerance: Tolerance | undefined,
  quantityKeys: Map<string, QuantityParam>,
  source: IdentifierSource,
  dataModel: DataModelName,
  references: ReferenceSource,
): Slot | undefined {
  let blockRefs: Array<[string, string]> | undefined;
  let upstream: Array<[string, BlockOutput, string]> | undefined;
  let upstreamDims: Map<string, Dim> | undefined;
  let failed = false;
  // A value that is one name (`clock: SYS_CLOCK_HZ`, the common firmware shape) needs no list of its names.
  const idents = expr.kind === 'ident' ? undefined : identifiersOf(expr, []);
  const count = idents ? idents.length : 1;
  for (let i = 0; i < count; i++) {
    const ident = idents ? idents[i] : (expr as IdentNode);
    if (ident.ref) {
      const found = references.resolve(ident.ref);
      if (!found.ok) {
        plan.finding(error(found.code, found.message, ident.span));
        failed = true;
        continue;
      }
      (upstreamDims ??= new Map()).set(ident.name, found.dim);
      upstream ??= [];
      let listed = false;
      for (let u = 0; u < upstream.length && !listed; u++) listed = upstream[u][0] === ident.name;
      if (!listed) upstream.push([ident.name, found.output, found.result]);
      const { output } = found;
      plan.reference({ name: output.name, result: found.result, uri: output.uri, line: output.line, value: output.values[found.result], circuit: output.circuit, span: ident.span, key: spec.key });
      for (let u = 0; u < output.inputs.length; u++) plan.upstreamInput(output.inputs[u]);
      continue;
    }
    const asKey = ident.name.toLowerCase();
    if (asKey !== spec.key && quantityKeys.has(asKey)) {
      (blockRefs ??= []).push([ident.name, asKey]);
      continue;
    }
    if (plan.externalLookups?.has(ident.name)) continue;
    const found = source.lookup(ident.name, dataModel);
    if (!found.ok) {
      plan.finding(error(found.code || Code.identifierUnknown, found.message, ident.span));
      failed = true;
      continue;
    }
    (plan.externalLookups ??= new Map()).set(ident.name, found);
    plan.identifiers.push(found.identifier);
  }
  if (failed) return undefined;
  compilingKey = spec.key;
  compilingKeys = quantityKeys;
  compilingDims = upstreamDims;
  compilingRefs = blockRefs ?? none;
  compilingLookups = plan.externalLookups;
  const dim = dimOf(expr, dimOfName);
  compilingDims = undefined;
  if ('finding' in dim) {
    compilingRefs = none;
    compilingLookups = undefined;
    plan.finding(dim.finding);
    return undefined;
  }
  if (dim.dim !== '' && dim.dim !== spec.dim && !(spec.dim === '' && dim.dim === '%')) {
    compilingRefs = none;
    compilingLookups = undefined;
    plan.finding(
      error(Code.keyDimension, `\`${entry.key}\` is ${describeDim(spec.dim)}, but \`${entry.valueText}\` is ${describeDim(dim.dim)}`, entry.valueSpan),
    );
    return undefined;
  }
  const soleIdentifier = expr.kind === 'ident' && !expr.ref && !blockRefs ? expr.name : undefined;
  const evaluate = compileValue(expr, firmwareConstant);
  // Nothing of this block stays referenced from the module once its slot is made.
  compilingRefs = none;
  compilingLookups = undefined;
  if (blockRefs || upstream) plan.readsEnv = true;
  return { key: spec.key, spec, entry, evaluate, blockRefs: blockRefs ?? none, tolerance, upstream, soleIdentifier, expr };
}
