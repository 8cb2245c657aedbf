// Turns a scanned block into an evaluation plan: each parameter compiled once, replayed many times
// (nominal, tolerance corners, Monte Carlo samples, solver steps) without parsing again.
import type { BlockEntry, BlockReference, Dim, Finding, RawBlock, ResolvedIdentifier, Span, Tolerance } from '../types';
import type { CircuitModel, IntegerSet, Interval, QuantityParam } from '../circuits/model';
import { compileValue, dimOf, parseIntegerSet, parseRange, parseUnknown, parseValue, type BlockRef, type ValueNode } from '../value';
import { Code } from '../codes';
import type { DataModelName, IdentifierLookup, IdentifierSource } from './context';
import { didYouMean, isMetaEntry, metaKeys } from './keys';
import { describeDim, toleranceMismatch } from './dims';
import { modelKeys } from './model-keys';
import { evaluationOrder } from './order';
import { noReferences, type BlockOutput, type ReferenceSource, type UpstreamInput } from './references';
import { registerValue } from './registers';

export interface Slot {
  key: string;
  spec: QuantityParam;
  entry: BlockEntry;
  evaluate: (env: Readonly<Record<string, number>>) => number;
  /** Identifier as written → block key it names. */
  blockRefs: Array<[string, string]>;
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

export interface Plan {
  model: CircuitModel;
  /** The block's name as written, for cautions that depend on use. */
  name?: string;
  entries: Map<string, BlockEntry>;
  slots: Map<string, Slot>;
  /** Order in which quantity keys get their values: given slots and defaults interleaved. */
  order: string[];
  externalLookups: Map<string, IdentifierLookup & { ok: true }>;
  choices: Record<string, string>;
  lists: Record<string, IntegerSet>;
  ranges: Record<string, Interval>;
  unknowns: Unknown[];
  findings: Finding[];
  identifiers: ResolvedIdentifier[];
  /** Other blocks' results used, in the order written. */
  references: BlockReference[];
  /** Toleranced inputs upstream of the references, each once. */
  upstreamInputs: UpstreamInput[];
  /** The keys in `order`, each resolved to its slot or its default's spec: what evaluateParams replays. */
  steps: readonly Step[];
  /** Some slot reads another key of the block or another block's result (through the evaluation's environment). */
  readsEnv: boolean;
}

/** One key of the evaluation order: its given value (slot) or, without one, its spec for the default. */
export interface Step {
  key: string;
  slot?: Slot;
  spec?: QuantityParam;
}

function identifiersOf(node: ValueNode, out: Array<{ name: string; span: Span; ref?: BlockRef }> = []): Array<{ name: string; span: Span; ref?: BlockRef }> {
  switch (node.kind) {
    case 'ident':
      out.push({ name: node.name, span: node.span, ref: node.ref });
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
  const plan: Plan = {
    model,
    name: raw.name,
    entries: entries ?? new Map(raw.entries.map((e) => [e.key, e])),
    slots: new Map(),
    order: [],
    externalLookups: new Map(),
    choices: {},
    lists: {},
    ranges: {},
    unknowns: [],
    findings: [],
    identifiers: [],
    references: [],
    upstreamInputs: [],
    steps: [],
    readsEnv: false,
  };
  const quantityKeys = keys.quantities;

  for (let i = 0; i < raw.entries.length; i++) {
    const entry = raw.entries[i];
    if (isMetaEntry(entry.key, entry.valueText)) continue;
    const spec = keys.params.get(entry.key);
    if (!spec) {
      const hint = entry.key === 'from' ? ' (a note\'s firmware file is named with `firmware:`)' : didYouMean(entry.key, [...model.params.map((p) => p.key), ...metaKeys]);
      plan.findings.push({
        severity: 'warning',
        code: Code.keyUnknown,
        message: `\`${entry.key}\` is not a key of ${model.id}${hint}`,
        span: entry.keySpan,
      });
      continue;
    }
    if (spec.kind === 'choice') {
      const word = entry.valueText.trim().toLowerCase();
      if (spec.options.includes(word)) plan.choices[spec.key] = word;
      else
        plan.findings.push(
          error(Code.valueOption, `\`${entry.key}\` takes ${spec.options.map((o) => `\`${o}\``).join(' or ')}, not \`${entry.valueText}\`${didYouMean(word, spec.options)}`, entry.valueSpan),
        );
      continue;
    }
    if (spec.kind === 'list') {
      const parsed = parseIntegerSet(entry.valueText, entry.valueSpan.start);
      plan.findings.push(...parsed.findings);
      if (parsed.set) plan.lists[spec.key] = parsed.set;
      continue;
    }
    if (spec.kind === 'range') {
      const parsed = parseRange(entry.valueText, entry.valueSpan.start, spec.dim, spec.key);
      plan.findings.push(...parsed.findings);
      if (parsed.min !== undefined && parsed.max !== undefined) plan.ranges[spec.key] = { min: parsed.min, max: parsed.max };
      continue;
    }
    const unknown = parseUnknown(entry.valueText, entry.valueSpan.start);
    if (unknown) {
      plan.findings.push(...unknown.findings);
      if (!unknown.findings.some((f) => f.severity === 'error')) plan.unknowns.push({ key: spec.key, spec, entry, span: unknown.span, allowed: unknown.allowed });
      continue;
    }
    const register = registerValue(spec, entry, quantityKeys, source, dataModel);
    if (register && 'finding' in register) { plan.findings.push(register.finding); continue; }
    if (register) {
      for (const id of register.identifiers) if (!plan.identifiers.some((known) => known.name === id.name)) plan.identifiers.push(id);
      plan.slots.set(spec.key, { key: spec.key, spec, entry, evaluate: () => register.value, blockRefs: [] });
      continue;
    }
    const parsed = parseValue(entry.valueText, entry.valueSpan.start);
    // A value the parser refuses (`1e400` out of range) is still the key's problem: the message names it.
    plan.findings.push(...parsed.findings.map((f) => (f.severity === 'error' && !f.message.includes(`\`${entry.key}\``) ? { ...f, message: `\`${entry.key}\`: ${f.message}` } : f)));
    if (parsed.unknown) {
      plan.unknowns.push({ key: spec.key, spec, entry, span: parsed.unknown });
      continue;
    }
    if (!parsed.expr || parsed.findings.some((f) => f.severity === 'error')) continue;
    const toleranceProblem = toleranceMismatch(parsed.tolerance, parsed.toleranceDim, spec.dim, entry.key);
    if (toleranceProblem) {
      plan.findings.push(error(Code.valueTolerance, toleranceProblem, parsed.toleranceSpan ?? entry.valueSpan));
      continue;
    }
    const slot = compileSlot(plan, spec, entry, parsed.expr, parsed.tolerance, quantityKeys, source, dataModel, references);
    if (slot) plan.slots.set(spec.key, slot);
  }
  for (let i = 0; i < model.params.length; i++) {
    const spec = model.params[i];
    if (spec.kind === 'choice' && !(spec.key in plan.choices)) plan.choices[spec.key] = spec.default;
  }
  const ordered = evaluationOrder(plan, raw);
  plan.findings.push(...ordered.findings);
  const specs = keys.quantities;
  plan.order = ordered.order;
  plan.steps = ordered.order.map((key): Step => ({ key, slot: plan.slots.get(key), spec: specs.get(key) }));
  for (const slot of plan.slots.values()) if (slot.blockRefs.length || slot.upstream) plan.readsEnv = true;
  // Complete once built: the evaluation reads the plan and never writes to it (core/analyze/evaluate.ts).
  return Object.freeze(plan);
}

function compileSlot(
  plan: Plan,
  spec: QuantityParam,
  entry: BlockEntry,
  expr: ValueNode,
  tolerance: Tolerance | undefined,
  quantityKeys: Map<string, QuantityParam>,
  source: IdentifierSource,
  dataModel: DataModelName,
  references: ReferenceSource,
): Slot | undefined {
  const blockRefs: Array<[string, string]> = [];
  const upstream: Array<[string, BlockOutput, string]> = [];
  let upstreamDims: Map<string, Dim> | undefined;
  let failed = false;
  const idents = identifiersOf(expr);
  for (let i = 0; i < idents.length; i++) {
    const ident = idents[i];
    if (ident.ref) {
      const found = references.resolve(ident.ref);
      if (!found.ok) {
        plan.findings.push(error(found.code, found.message, ident.span));
        failed = true;
        continue;
      }
      (upstreamDims ??= new Map()).set(ident.name, found.dim);
      if (!upstream.some(([name]) => name === ident.name)) upstream.push([ident.name, found.output, found.result]);
      const { output } = found;
      plan.references.push({ name: output.name, result: found.result, uri: output.uri, line: output.line, value: output.values[found.result], circuit: output.circuit, span: ident.span, key: spec.key });
      for (const input of output.inputs) if (!plan.upstreamInputs.some((i) => i.id === input.id)) plan.upstreamInputs.push(input);
      continue;
    }
    const asKey = ident.name.toLowerCase();
    if (quantityKeys.has(asKey) && asKey !== spec.key) {
      blockRefs.push([ident.name, asKey]);
      continue;
    }
    if (plan.externalLookups.has(ident.name)) continue;
    const found = source.lookup(ident.name, dataModel);
    if (!found.ok) {
      plan.findings.push(error(found.code || Code.identifierUnknown, found.message, ident.span));
      failed = true;
      continue;
    }
    plan.externalLookups.set(ident.name, found);
    plan.identifiers.push(found.identifier);
  }
  if (failed) return undefined;
  const dim = dimOf(expr, (name) => {
    const fromBlock = upstreamDims?.get(name);
    if (fromBlock !== undefined) return fromBlock;
    const key = name.toLowerCase();
    if (quantityKeys.has(key) && key !== spec.key) return quantityKeys.get(key)!.dim;
    return '';
  });
  if ('finding' in dim) {
    plan.findings.push(dim.finding);
    return undefined;
  }
  if (dim.dim !== '' && dim.dim !== spec.dim && !(spec.dim === '' && dim.dim === '%')) {
    plan.findings.push(
      error(Code.keyDimension, `\`${entry.key}\` is ${describeDim(spec.dim)}, but \`${entry.valueText}\` is ${describeDim(dim.dim)}`, entry.valueSpan),
    );
    return undefined;
  }
  const soleIdentifier = expr.kind === 'ident' && !expr.ref && blockRefs.length === 0 ? expr.name : undefined;
  // Firmware constants are fixed for the plan: compiled in as numbers, so only block references read the
  // environment, and a name one slot reads from firmware and another as a block key cannot collide.
  const refNames = blockRefs.length ? new Set(blockRefs.map(([name]) => name)) : undefined;
  const constant = (name: string) => (refNames?.has(name) ? undefined : plan.externalLookups.get(name)?.value);
  const slot: Slot = { key: spec.key, spec, entry, evaluate: compileValue(expr, constant), blockRefs, tolerance, soleIdentifier, expr };
  if (upstream.length) slot.upstream = upstream;
  return slot;
}
