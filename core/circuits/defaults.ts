// Fills a model's defaults into given values: what the block engine does before validate() and compute().
import type { CircuitModel, IntegerSet, ModelInput } from './model';

export interface GivenInput {
  values?: Record<string, number>;
  choices?: Record<string, string>;
  lists?: Record<string, IntegerSet>;
  name?: string;
}

/**
 * Constant defaults first, then derived ones in table order, repeated once so a default may lean on another
 * default (`toward` ← `supply` ← `toward`). A derived default that comes out non-finite is left out.
 */
export function withDefaults(model: CircuitModel, given: GivenInput): ModelInput {
  const values: Record<string, number> = { ...given.values };
  const choices: Record<string, string> = { ...given.choices };
  for (const param of model.params) {
    if (param.kind === 'quantity' && typeof param.default === 'number' && values[param.key] === undefined) values[param.key] = param.default;
    if (param.kind === 'choice' && choices[param.key] === undefined) choices[param.key] = param.default;
  }
  for (let pass = 0; pass < 2; pass++) {
    for (const param of model.params) {
      if (param.kind !== 'quantity' || typeof param.default !== 'function' || values[param.key] !== undefined) continue;
      const value = param.default(values);
      if (Number.isFinite(value)) values[param.key] = value;
    }
  }
  return { values, choices, lists: { ...given.lists }, name: given.name };
}
