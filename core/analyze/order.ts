// The order in which a block's quantity keys get their values: found once per plan, replayed for every evaluation.
import type { BlockEntry, Finding, RawBlock } from '../types';
import type { CircuitModel } from '../circuits/model';
import { Code } from '../codes';
import { modelKeys } from './model-keys';

/** What the order depends on: the plan's model, given values (with the block keys they name) and `?` keys. */
export interface OrderInput {
  model: CircuitModel;
  entries: ReadonlyMap<string, BlockEntry>;
  slots: ReadonlyMap<string, { blockRefs: ReadonlyArray<readonly [string, string]>; entry: BlockEntry }>;
  unknowns: ReadonlyArray<{ key: string }>;
}

/**
 * The order in which quantity keys get values: a given key once the keys it names have theirs, a default once
 * its inputs exist. Found once by a fixed-point pass, then replayed for every evaluation.
 */
export function evaluationOrder(plan: OrderInput, raw: RawBlock): { order: string[]; findings: Finding[] } {
  const order: string[] = [];
  const findings: Finding[] = [];
  const done = new Set<string>();
  const unknownKeys = new Set(plan.unknowns.map((u) => u.key));
  const quantitySpecs = modelKeys(plan.model).quantityList;
  const probe: Record<string, number> = {};
  for (const k of unknownKeys) probe[k] = 1;
  let progress = true;
  while (progress) {
    progress = false;
    for (let i = 0; i < quantitySpecs.length; i++) {
      const spec = quantitySpecs[i];
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
  for (let i = 0; i < quantitySpecs.length; i++) {
    const spec = quantitySpecs[i];
    if (done.has(spec.key)) continue;
    const slot = plan.slots.get(spec.key);
    if (slot) {
      const names = slot.blockRefs.map(([, key]) => key).filter((k) => !done.has(k));
      findings.push({
        severity: 'error',
        code: Code.identifierCycle,
        message: `\`${spec.key}\` depends on ${names.map((n) => `\`${n}\``).join(', ')}, which ${names.length > 1 ? 'have' : 'has'} no value (a cycle, or a missing key)`,
        span: slot.entry.valueSpan,
      });
    } else if (!plan.entries.has(spec.key) && !spec.optional && spec.default === undefined) {
      // A key with a default is only missing when its inputs are, and those are reported themselves.
      findings.push({ severity: 'error', code: Code.keyRequired, message: `${plan.model.id} needs \`${spec.key}\` (${spec.label})`, span: raw.headerSpan });
    }
  }
  return { order, findings };
}

function probeValues(plan: OrderInput, order: string[], probe: Record<string, number>): Record<string, number> {
  const values: Record<string, number> = {};
  for (const key of order) values[key] = probe[key];
  return values;
}
