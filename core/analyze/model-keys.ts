// A model's parameter table by key, built once per model: plans are built per block and per edit.
import type { CircuitModel, QuantityParam } from '../circuits/model';

export interface ModelKeys {
  /** Every parameter by key (the first, should a table repeat one). */
  params: Map<string, CircuitModel['params'][number]>;
  quantities: Map<string, QuantityParam>;
  quantityList: QuantityParam[];
  /** Every choice at its default: shared, frozen, by the plans of the blocks that choose nothing. */
  defaultChoices: Readonly<Record<string, string>>;
}

const keysByModel = new WeakMap<CircuitModel, ModelKeys>();

export function modelKeys(model: CircuitModel): ModelKeys {
  let keys = keysByModel.get(model);
  if (!keys) {
    const params = new Map<string, CircuitModel['params'][number]>();
    for (const p of model.params) if (!params.has(p.key)) params.set(p.key, p);
    const quantityList = model.params.filter((p): p is QuantityParam => p.kind === 'quantity');
    const defaultChoices: Record<string, string> = {};
    for (const p of model.params) if (p.kind === 'choice' && !(p.key in defaultChoices)) defaultChoices[p.key] = p.default;
    keys = { params, quantities: new Map(quantityList.map((p) => [p.key, p])), quantityList, defaultChoices: Object.freeze(defaultChoices) };
    keysByModel.set(model, keys);
  }
  return keys;
}
