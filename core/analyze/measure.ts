// Running a plan through its model, and choosing which result a claimed or targeted unit speaks of.
import type { Dim } from '../types';
import type { Band, CircuitModel, ModelInput, ModelIssue, QuantityParam } from '../circuits/model';
import type { Plan } from './plan';
import { finiteOnly } from '../num';
import { Code } from '../codes';
export { finiteOnly };

/** The record itself when every value is a finite number (the usual case, nothing copied), else finiteOnly's copy. */
export function finiteRecord(results: Record<string, number>): Record<string, number> {
  for (const key in results) {
    const value = results[key];
    if (typeof value !== 'number' || !Number.isFinite(value)) return finiteOnly(results);
  }
  return results;
}
import { evaluateParams, tolerancedKeys } from './evaluate';
import type { Offsets } from './context';
import { emptyRecord } from '../empty';

/** The model's input; `nominal` adds each toleranced input's relative band (spread corners move the inputs instead). */
export function modelInput(plan: Plan, values: Readonly<Record<string, number>>, nominal = false, overrides?: Readonly<Record<string, number>>): ModelInput {
  if (!nominal) return { values, choices: plan.choices, lists: plan.lists, ranges: plan.ranges, name: plan.name };
  return { values, choices: plan.choices, lists: plan.lists, ranges: plan.ranges, name: plan.name, tolerances: inputTolerances(plan, values, overrides) };
}

/** The bands of a block without a toleranced input: one shared record, read by models and the editor, never written. */
const noBands: Record<string, Band> = emptyRecord;

/** Beyond this many toleranced inputs (2^n corners) the bands come from each key's own tolerance only. */
const bandCornerLimit = 6;

/**
 * Relative band of every input that a tolerance moves: its own (`±20 ppm`, an absolute `±0.1 V` over its value)
 * or one carried in through a reference (`clock: @xtal.frequency`), found over the corners of every toleranced
 * input of the block, own and upstream, so a key computed from others gets theirs too.
 */
export function inputTolerances(plan: Plan, values: Readonly<Record<string, number>>, overrides?: Readonly<Record<string, number>>): Record<string, Band> {
  const keys = tolerancedKeys(plan);
  if (keys.length === 0) return noBands;
  const bands: Record<string, Band> = {};
  if (keys.length > bandCornerLimit) {
    for (const slot of plan.slots.values()) {
      const t = slot.tolerance;
      if (!t || !(t.plus > 0 || t.minus > 0)) continue;
      const scale = t.kind === 'relative' ? 1 : Math.abs(values[slot.key]);
      if (scale > 0 && Number.isFinite(scale)) bands[slot.key] = { plus: t.plus / scale, minus: t.minus / scale };
    }
    return bands;
  }
  const low: Record<string, number> = {};
  const high: Record<string, number> = {};
  for (let corner = 0; corner < 1 << keys.length; corner++) {
    const offsets: Record<string, number> = {};
    keys.forEach((key, i) => (offsets[key] = corner & (1 << i) ? 1 : -1));
    const at = evaluateParams(plan, offsets, overrides);
    for (const [key, value] of Object.entries(at)) {
      if (!Number.isFinite(value)) continue;
      if (!(key in low) || value < low[key]) low[key] = value;
      if (!(key in high) || value > high[key]) high[key] = value;
    }
  }
  for (const [key, nominal] of Object.entries(values)) {
    if (!(nominal > 0) || !(key in low)) continue;
    const plus = high[key] / nominal - 1;
    const minus = 1 - low[key] / nominal;
    if (plus > 1e-15 || minus > 1e-15) bands[key] = { plus: Math.max(0, plus), minus: Math.max(0, minus) };
  }
  return bands;
}

/** Limits from the parameter table (positive parts, integer registers), before the model's own physics. */
export function limitIssues(model: CircuitModel, values: Readonly<Record<string, number>>): ModelIssue[] {
  const issues: ModelIssue[] = [];
  for (let i = 0; i < model.params.length; i++) {
    const spec = model.params[i];
    if (spec.kind !== 'quantity' || !(spec.key in values)) continue;
    const value = values[spec.key];
    // An integer key is a register (or a count such as stages): its limits are the register's range.
    const code = spec.integer ? Code.registerRange : undefined;
    if (!Number.isFinite(value)) issues.push({ key: spec.key, message: `\`${spec.key}\` does not evaluate to a finite number` });
    else if (spec.min !== undefined && value < spec.min) issues.push({ key: spec.key, code, message: `\`${spec.key}\` must be at least ${spec.min}${spec.dim ? ' ' + spec.dim : ''} (${spec.label})` });
    else if (spec.max !== undefined && value > spec.max) issues.push({ key: spec.key, code, message: `\`${spec.key}\` must be at most ${spec.max}${spec.dim ? ' ' + spec.dim : ''} (${spec.label})` });
    else if (spec.integer && !Number.isInteger(value)) issues.push({ key: spec.key, code, message: `\`${spec.key}\` must be a whole number, not ${value}` });
  }
  return issues;
}

const limitedByModel = new WeakMap<CircuitModel, QuantityParam[]>();

/** Whether `limitIssues` would find nothing, without building its messages: computeAt runs per sample. */
function withinLimits(model: CircuitModel, values: Readonly<Record<string, number>>): boolean {
  let specs = limitedByModel.get(model);
  if (!specs) {
    specs = model.params.filter((p): p is QuantityParam => p.kind === 'quantity');
    limitedByModel.set(model, specs);
  }
  for (let i = 0; i < specs.length; i++) {
    const spec = specs[i];
    if (!(spec.key in values)) continue;
    const value = values[spec.key];
    if (!Number.isFinite(value)) return false;
    if (spec.min !== undefined && value < spec.min) return false;
    if (spec.max !== undefined && value > spec.max) return false;
    if (spec.integer && !Number.isInteger(value)) return false;
  }
  return true;
}

function hasError(issues: readonly ModelIssue[]): boolean {
  for (let i = 0; i < issues.length; i++) if ((issues[i].severity ?? 'error') === 'error') return true;
  return false;
}

const requiredByModel = new WeakMap<CircuitModel, string[]>();

/**
 * The one place a model's `compute` runs: once per evaluation, its results checked afterwards for every result
 * the model always gives (`missing` names those that came out infinite or NaN: an overflow of a double).
 * Throws what the model throws.
 */
export function runModel(model: CircuitModel, input: ModelInput): { values: Record<string, number>; missing: string[] } {
  let required = requiredByModel.get(model);
  if (!required) requiredByModel.set(model, (required = model.results.filter((r) => !r.optional).map((r) => r.key)));
  const values = finiteRecord(model.compute(input));
  const missing: string[] = [];
  for (let i = 0; i < required.length; i++) if (!(required[i] in values)) missing.push(required[i]);
  return { values, missing };
}

/** Results of one evaluation, or undefined when the inputs break the model (never throws). */
export function computeAt(plan: Plan, offsets?: Offsets, overrides?: Readonly<Record<string, number>>, upstream?: Offsets): Record<string, number> | undefined {
  const values = evaluateParams(plan, offsets, overrides, upstream ?? offsets);
  try {
    const input = modelInput(plan, values);
    if (!withinLimits(plan.model, values) || hasError(plan.model.validate(input))) return undefined;
    const run = runModel(plan.model, input);
    return run.missing.length ? undefined : run.values;
  } catch {
    return undefined;
  }
}


const preference = ['frequency', 'period', 'width', 'time', 'duty', 'baud', 'load', 'counts'];

const measuresByModel = new WeakMap<CircuitModel, Map<Dim, string | undefined>>();

/** The result a claimed unit speaks of: `Hz` frequency, `s` period (or width, time), `%` duty, `baud` rate. */
export function measureFor(model: CircuitModel, dim: Dim): string | undefined {
  // Answered once per model and unit: every `expect:` item of every block asks.
  let measures = measuresByModel.get(model);
  if (!measures) measuresByModel.set(model, (measures = new Map()));
  if (measures.has(dim)) return measures.get(dim);
  const measure = findMeasure(model, dim);
  measures.set(dim, measure);
  return measure;
}

function findMeasure(model: CircuitModel, dim: Dim): string | undefined {
  const candidates = model.results.filter((r) => {
    if (dim === '%') return r.percent === true;
    if (dim === 'baud') return r.key === 'baud';
    if (dim === 'Hz' && r.key === 'baud') return false;
    return r.dim === dim;
  });
  candidates.sort((a, b) => rank(a.key) - rank(b.key));
  return candidates[0]?.key;
}

function rank(key: string): number {
  const index = preference.indexOf(key);
  return index < 0 ? preference.length : index;
}

export function quantitySpec(model: CircuitModel, key: string): QuantityParam | undefined {
  const spec = model.params.find((p) => p.key === key);
  return spec && spec.kind === 'quantity' ? spec : undefined;
}
