// The order in which a block's quantity keys get their values: found once per plan, replayed for every evaluation.
import type { BlockEntry, Finding, RawBlock } from '../types';
import type { CircuitModel } from '../circuits/model';
import { Code } from '../codes';
import { modelKeys } from './model-keys';
import { emptyList } from '../empty';

/** What the order depends on: the plan's model, given values (with the block keys they name) and `?` keys. */
export interface OrderInput {
  model: CircuitModel;
  entries: ReadonlyMap<string, BlockEntry>;
  slots: ReadonlyMap<string, { blockRefs: ReadonlyArray<readonly [string, string]>; entry: BlockEntry }>;
  unknowns: ReadonlyArray<{ key: string }>;
}

/** Shared by every order without findings: nothing adds to it. */
const noFindings: Finding[] = emptyList;

function isUnknown(unknowns: ReadonlyArray<{ key: string }>, key: string): boolean {
  for (let i = 0; i < unknowns.length; i++) if (unknowns[i].key === key) return true;
  return false;
}

function allDone(refs: ReadonlyArray<readonly [string, string]>, order: readonly string[]): boolean {
  for (let i = 0; i < refs.length; i++) if (!order.includes(refs[i][1])) return false;
  return true;
}

/**
 * The order in which quantity keys get values: a given key once the keys it names have theirs, a default once
 * its inputs exist. Found once by a fixed-point pass, then replayed for every evaluation.
 */
export function evaluationOrder(plan: OrderInput, raw: RawBlock): { order: string[]; findings: Finding[] } {
  // The keys placed so far, in order: a handful per block, searched natively rather than kept in a Set as well.
  const order: string[] = [];
  const unknowns = plan.unknowns;
  const quantitySpecs = modelKeys(plan.model).quantityList;
  // What a computed default sees of the keys before it: 1 for a given or unknown key, a default its value. Kept
  // only for defaults (most are plain numbers, and most keys are given).
  let defaults: Record<string, number> | undefined;
  // Another pass can only place a key this one left waiting: a value naming keys not yet placed, or a default
  // that was not finite with the keys placed so far. Without one, the order is complete.
  let waiting = true;
  while (waiting) {
    let progress = false;
    waiting = false;
    for (let i = 0; i < quantitySpecs.length; i++) {
      const spec = quantitySpecs[i];
      if (order.includes(spec.key)) continue;
      const slot = plan.slots.get(spec.key);
      if (unknowns.length && isUnknown(unknowns, spec.key)) {
        order.push(spec.key);
        progress = true;
      } else if (slot) {
        if (allDone(slot.blockRefs, order)) {
          order.push(spec.key);
          progress = true;
        } else waiting = true;
      } else if (!plan.entries.has(spec.key) && spec.default !== undefined) {
        const value = typeof spec.default === 'number' ? spec.default : spec.default(probeValues(order, defaults));
        if (Number.isFinite(value)) {
          order.push(spec.key);
          (defaults ??= Object.create(null) as Record<string, number>)[spec.key] = value;
          progress = true;
        } else waiting = true;
      }
    }
    waiting &&= progress;
  }
  let findings = noFindings;
  if (order.length === quantitySpecs.length) return { order, findings };
  for (let i = 0; i < quantitySpecs.length; i++) {
    const spec = quantitySpecs[i];
    if (order.includes(spec.key)) continue;
    const slot = plan.slots.get(spec.key);
    if (slot) {
      const names = slot.blockRefs.map(([, key]) => key).filter((k) => !order.includes(k));
      if (findings === noFindings) findings = [];
      findings.push({
        severity: 'error',
        code: Code.identifierCycle,
        message: `\`${spec.key}\` depends on ${names.map((n) => `\`${n}\``).join(', ')}, which ${names.length > 1 ? 'have' : 'has'} no value (a cycle, or a missing key)`,
        span: slot.entry.valueSpan,
      });
    } else if (!plan.entries.has(spec.key) && !spec.optional && spec.default === undefined) {
      // A key with a default is only missing when its inputs are, and those are reported themselves.
      if (findings === noFindings) findings = [];
      findings.push({ severity: 'error', code: Code.keyRequired, message: `${plan.model.id} needs \`${spec.key}\` (${spec.label})`, span: raw.headerSpan });
    }
  }
  return { order, findings };
}

function probeValues(order: readonly string[], defaults: Readonly<Record<string, number>> | undefined): Record<string, number> {
  const values: Record<string, number> = {};
  for (let i = 0; i < order.length; i++) {
    const key = order[i];
    values[key] = defaults !== undefined && key in defaults ? defaults[key] : 1;
  }
  return values;
}
