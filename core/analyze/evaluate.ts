// Replaying a plan: every quantity key evaluated in plan order, with tolerance offsets and overrides. This runs
// for every corner, Monte Carlo sample and solver step, so the plan's steps are resolved once.
import type { Tolerance } from '../types';
import type { Offsets } from './context';
import type { Plan } from './plan';

function applyTolerance(value: number, tolerance: Tolerance, u: number): number {
  const amount = u >= 0 ? u * tolerance.plus : u * tolerance.minus;
  return tolerance.kind === 'relative' ? value * (1 + amount) : value + amount;
}

/**
 * Block references by the names they are written with, one scratch table per plan shared by every replay: each
 * slot writes its own references before it reads them, and firmware names are compiled into the slots. Kept
 * beside the plan, not on it: a plan is complete and immutable once built.
 */
const envs = new WeakMap<Plan, Record<string, number>>();

/** Shared by every plan whose values read no block reference: nothing writes to it or reads from it. */
const noEnv: Record<string, number> = Object.freeze(Object.create(null));

function envOf(plan: Plan): Record<string, number> {
  if (!plan.readsEnv) return noEnv;
  let env = envs.get(plan);
  if (!env) envs.set(plan, (env = Object.create(null) as Record<string, number>));
  return env;
}

/**
 * Evaluations under way inside another block's (a reference's upstream), and a count of outermost ones: an
 * upstream block answers once per outermost evaluation, however many paths lead to it.
 */
const nesting = { depth: 0, epoch: 0 };

/** Runs an upstream block's evaluation inside the current one; see `upstreamEpoch`. */
export function nested<T>(run: () => T): T {
  nesting.depth++;
  try {
    return run();
  } finally {
    nesting.depth--;
  }
}

/** Which outermost evaluation is under way: an upstream answer is reused within one. */
export function upstreamEpoch(): number {
  return nesting.epoch;
}

/**
 * Evaluates every quantity key in plan order; `overrides` replace a key (solved or trial values). `offsets` hold
 * the block's own toleranced keys and the ids of toleranced inputs upstream of its references; `upstream`, when
 * given, is where references read theirs (an upstream block evaluated for a dependant).
 */
export function evaluateParams(plan: Plan, offsets?: Offsets, overrides?: Readonly<Record<string, number>>, upstream: Offsets | undefined = offsets): Record<string, number> {
  if (nesting.depth === 0) nesting.epoch++;
  const values: Record<string, number> = {};
  const env = envOf(plan);
  const steps = plan.steps;
  for (let s = 0; s < steps.length; s++) {
    const { key, slot, spec } = steps[s];
    let value: number;
    if (overrides && key in overrides) value = overrides[key];
    else if (slot) {
      const refs = slot.blockRefs;
      for (let i = 0; i < refs.length; i++) env[refs[i][0]] = values[refs[i][1]];
      const others = slot.upstream;
      if (others) {
        for (let i = 0; i < others.length; i++) {
          const [name, output, result] = others[i];
          env[name] = upstream ? output.at(upstream)?.[result] ?? NaN : output.values[result];
        }
      }
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
export function ownTolerancedKeys(plan: Plan): readonly string[] {
  return plan.ownToleranced;
}

/** Every input that moves the block's results: its own toleranced keys, then the ids of toleranced inputs upstream. */
export function tolerancedKeys(plan: Plan): readonly string[] {
  const inputs = plan.upstreamInputs;
  if (inputs.length === 0) return plan.ownToleranced;
  const keys = plan.ownToleranced.slice();
  for (let i = 0; i < inputs.length; i++) keys.push(inputs[i].id);
  return keys;
}
