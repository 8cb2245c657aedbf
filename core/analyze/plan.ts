// Turns a scanned block into an evaluation plan: each parameter compiled once, replayed many times
// (nominal, tolerance corners, Monte Carlo samples, solver steps) without parsing again.
import type { BlockEntry, Dim, Finding, RawBlock, ResolvedIdentifier, Span, Tolerance } from '../types';
import type { CircuitModel, IntegerSet, QuantityParam } from '../circuits/model';
import { compileValue, dimOf, parseIntegerSet, parseValue, type ValueNode } from '../value';
import { Code } from '../codes';
import type { DataModelName, IdentifierLookup, IdentifierSource } from './context';
import { didYouMean, isMetaEntry, metaKeys } from './keys';

export interface Slot {
  key: string;
  spec: QuantityParam;
  entry: BlockEntry;
  evaluate: (env: Readonly<Record<string, number>>) => number;
  /** Identifier as written → block key it names. */
  blockRefs: Array<[string, string]>;
  tolerance?: Tolerance;
  /** The value is exactly one firmware identifier (the target of a "set the constant" fix). */
  soleIdentifier?: string;
}

export interface Unknown {
  key: string;
  spec: QuantityParam;
  entry: BlockEntry;
  span: Span;
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
  unknowns: Unknown[];
  findings: Finding[];
  identifiers: ResolvedIdentifier[];
  /** Steps of evaluateParams, resolved on its first call. */
  replay?: Replay;
}

function identifiersOf(node: ValueNode, out: Array<{ name: string; span: Span }> = []): Array<{ name: string; span: Span }> {
  switch (node.kind) {
    case 'ident':
      out.push({ name: node.name, span: node.span });
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

interface ModelKeys {
  /** Every parameter by key (the first, should a table repeat one). */
  params: Map<string, CircuitModel['params'][number]>;
  quantities: Map<string, QuantityParam>;
  quantityList: QuantityParam[];
}

const keysByModel = new WeakMap<CircuitModel, ModelKeys>();

/** A model's parameter table by key, built once per model: plans are built per block and per edit. */
function modelKeys(model: CircuitModel): ModelKeys {
  let keys = keysByModel.get(model);
  if (!keys) {
    const params = new Map<string, CircuitModel['params'][number]>();
    for (const p of model.params) if (!params.has(p.key)) params.set(p.key, p);
    const quantityList = model.params.filter((p): p is QuantityParam => p.kind === 'quantity');
    keys = { params, quantities: new Map(quantityList.map((p) => [p.key, p])), quantityList };
    keysByModel.set(model, keys);
  }
  return keys;
}

/**
 * Builds the plan; every problem becomes a finding and the plan stays usable for what did resolve. `entries` is
 * the block's entries by key when the caller has them already.
 */
export function buildPlan(raw: RawBlock, model: CircuitModel, source: IdentifierSource, dataModel: DataModelName, entries?: Map<string, BlockEntry>): Plan {
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
    unknowns: [],
    findings: [],
    identifiers: [],
  };
  const quantityKeys = keys.quantities;

  for (const entry of raw.entries) {
    if (isMetaEntry(entry.key, entry.valueText)) continue;
    const spec = keys.params.get(entry.key);
    if (!spec) {
      const hint = entry.key === 'from' ? ' (a firmware file for `from:` ends in .h, .c, .hpp …)' : didYouMean(entry.key, [...model.params.map((p) => p.key), ...metaKeys]);
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
          error(Code.valueSyntax, `\`${entry.key}\` takes ${spec.options.map((o) => `\`${o}\``).join(' or ')}, not \`${entry.valueText}\`${didYouMean(word, spec.options)}`, entry.valueSpan),
        );
      continue;
    }
    if (spec.kind === 'list') {
      const parsed = parseIntegerSet(entry.valueText, entry.valueSpan.start);
      plan.findings.push(...parsed.findings);
      if (parsed.set) plan.lists[spec.key] = parsed.set;
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
    const toleranceProblem = toleranceMismatch(parsed.tolerance, parsed.toleranceDim, spec.dim, entry.key, describeDim(spec.dim));
    if (toleranceProblem) {
      plan.findings.push(error(Code.valueTolerance, toleranceProblem, parsed.toleranceSpan ?? entry.valueSpan));
      continue;
    }
    const slot = compileSlot(plan, spec, entry, parsed.expr, parsed.tolerance, quantityKeys, source, dataModel);
    if (slot) plan.slots.set(spec.key, slot);
  }
  for (const spec of model.params) {
    if (spec.kind === 'choice' && !(spec.key in plan.choices)) plan.choices[spec.key] = spec.default;
  }
  plan.order = evaluationOrder(plan, raw);
  return plan;
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
): Slot | undefined {
  const blockRefs: Array<[string, string]> = [];
  let failed = false;
  const idents = identifiersOf(expr);
  for (const ident of idents) {
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
  const soleIdentifier = expr.kind === 'ident' && blockRefs.length === 0 ? expr.name : undefined;
  // Firmware constants are fixed for the plan: compiled in as numbers, so only block references read the
  // environment, and a name one slot reads from firmware and another as a block key cannot collide.
  const refNames = new Set(blockRefs.map(([name]) => name));
  const constant = (name: string) => (refNames.has(name) ? undefined : plan.externalLookups.get(name)?.value);
  return { key: spec.key, spec, entry, evaluate: compileValue(expr, constant), blockRefs, tolerance, soleIdentifier };
}

/** An absolute tolerance must be in its value's unit: `r: 10k ±1 V` cannot mean ±1 Ω. */
export function toleranceMismatch(tolerance: Tolerance | undefined, toleranceDim: Dim | undefined, valueDim: Dim, key: string, valueWords: string): string | undefined {
  if (tolerance?.kind !== 'absolute' || !toleranceDim || toleranceDim === valueDim) return undefined;
  return `the tolerance of \`${key}\` is ${describeDim(toleranceDim)}, but \`${key}\` is ${valueWords}: give it in the same unit or as a percentage`;
}

const dimWords: Record<string, string> = {
  'Ω': 'a resistance (Ω)',
  F: 'a capacitance (F)',
  V: 'a voltage (V)',
  Hz: 'a frequency (Hz)',
  s: 'a time (s)',
  A: 'a current (A)',
  '': 'a plain number',
  '%': 'a percentage',
  baud: 'a baud rate',
  other: 'a compound unit',
};

export function describeDim(dim: string): string {
  return dimWords[dim] ?? dim;
}

/**
 * The order in which quantity keys get values: a given key once the keys it names have theirs, a default once
 * its inputs exist. Found once by a fixed-point pass, then replayed for every evaluation.
 */
function evaluationOrder(plan: Plan, raw: RawBlock): string[] {
  const order: string[] = [];
  const done = new Set<string>();
  const unknownKeys = new Set(plan.unknowns.map((u) => u.key));
  const quantitySpecs = modelKeys(plan.model).quantityList;
  const probe: Record<string, number> = {};
  for (const k of unknownKeys) probe[k] = 1;
  let progress = true;
  while (progress) {
    progress = false;
    for (const spec of quantitySpecs) {
      if (done.has(spec.key)) continue;
      const slot = plan.slots.get(spec.key);
      if (unknownKeys.has(spec.key)) {
        done.add(spec.key);
        order.push(spec.key);
        progress = true;
      } else if (slot) {
        if (slot.blockRefs.every(([, key]) => done.has(key))) {
          done.add(spec.key);
          order.push(spec.key);
          probe[spec.key] = 1;
          progress = true;
        }
      } else if (!plan.entries.has(spec.key) && spec.default !== undefined) {
        const value = typeof spec.default === 'number' ? spec.default : spec.default(probeValues(plan, order, probe));
        if (Number.isFinite(value)) {
          done.add(spec.key);
          order.push(spec.key);
          probe[spec.key] = value;
          progress = true;
        }
      }
    }
  }
  for (const spec of quantitySpecs) {
    if (done.has(spec.key)) continue;
    const slot = plan.slots.get(spec.key);
    if (slot) {
      const names = slot.blockRefs.map(([, key]) => key).filter((k) => !done.has(k));
      plan.findings.push(
        error(Code.identifierCycle, `\`${spec.key}\` depends on ${names.map((n) => `\`${n}\``).join(', ')}, which ${names.length > 1 ? 'have' : 'has'} no value (a cycle, or a missing key)`, slot.entry.valueSpan),
      );
    } else if (!plan.entries.has(spec.key) && !spec.optional && spec.default === undefined) {
      // A key with a default is only missing when its inputs are, and those are reported themselves.
      plan.findings.push(error(Code.keyRequired, `${plan.model.id} needs \`${spec.key}\` (${spec.label})`, raw.headerSpan));
    }
  }
  return order;
}

function probeValues(plan: Plan, order: string[], probe: Record<string, number>): Record<string, number> {
  const values: Record<string, number> = {};
  for (const key of order) values[key] = probe[key];
  return values;
}

/** Tolerance offsets: u in [−1, 1] per toleranced key, +1 at the top of its tolerance, −1 at the bottom. */
export type Offsets = Readonly<Record<string, number>>;

function applyTolerance(value: number, tolerance: Tolerance, u: number): number {
  const amount = u >= 0 ? u * tolerance.plus : u * tolerance.minus;
  return tolerance.kind === 'relative' ? value * (1 + amount) : value + amount;
}

interface Step {
  key: string;
  slot?: Slot;
  spec?: QuantityParam;
}

interface Replay {
  steps: Step[];
  /**
   * Block references by the names they are written with, shared by every replay: each slot writes its own
   * references before it reads them, and firmware names are compiled into the slots.
   */
  env: Record<string, number>;
}

/** The plan's keys resolved to their slot or default once: evaluateParams runs per Monte Carlo sample. */
function replayOf(plan: Plan): Replay {
  if (!plan.replay) {
    const specs = modelKeys(plan.model).quantities;
    const steps = plan.order.map((key): Step => ({ key, slot: plan.slots.get(key), spec: specs.get(key) }));
    plan.replay = { steps, env: Object.create(null) };
  }
  return plan.replay;
}

/** Evaluates every quantity key in plan order; `overrides` replace a key (solved or trial values). */
export function evaluateParams(plan: Plan, offsets?: Offsets, overrides?: Readonly<Record<string, number>>): Record<string, number> {
  const values: Record<string, number> = {};
  const replay = replayOf(plan);
  const env = replay.env;
  for (const { key, slot, spec } of replay.steps) {
    let value: number;
    if (overrides && key in overrides) value = overrides[key];
    else if (slot) {
      const refs = slot.blockRefs;
      for (let i = 0; i < refs.length; i++) env[refs[i][0]] = values[refs[i][1]];
      value = slot.evaluate(env);
      if (slot.tolerance && offsets && offsets[key]) value = applyTolerance(value, slot.tolerance, offsets[key]);
    } else {
      if (!spec || spec.default === undefined) continue;
      value = typeof spec.default === 'number' ? spec.default : spec.default(values);
    }
    values[key] = value;
  }
  return values;
}

/** Keys whose given value carries a tolerance. */
export function tolerancedKeys(plan: Plan): string[] {
  return [...plan.slots.values()].filter((s) => s.tolerance && (s.tolerance.plus > 0 || s.tolerance.minus > 0)).map((s) => s.key);
}
