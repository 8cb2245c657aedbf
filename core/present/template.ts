// The lines of a new timing block for a circuit, from its parameter table: every key the model needs
// (no default), then `expect:`. Keys with defaults are left out so a fresh block states only choices made.
import { circuitById } from '../circuits/registry';

export interface TemplateLine {
  key: string;
  /** Text to type over: the unit the value is written in, or the parameter's label for plain numbers. */
  placeholder: string;
}

const unitHint: Record<string, string> = { 'Ω': 'Ω', F: 'F', V: 'V', Hz: 'Hz', s: 's', A: 'A', '%': '%', baud: 'baud', 'bit/s': 'bit/s' };

/** Undefined for an unknown circuit id. */
export function blockTemplate(circuitId: string): TemplateLine[] | undefined {
  const model = circuitById(circuitId);
  if (!model) return undefined;
  const lines: TemplateLine[] = [{ key: 'circuit', placeholder: model.id }];
  for (const param of model.params) {
    if (param.kind !== 'quantity' || param.default !== undefined || (param.optional && !param.template)) continue;
    lines.push({ key: param.key, placeholder: unitHint[param.dim] ?? param.label });
  }
  const claim = model.results.find((r) => model.headline[0] === r.key);
  lines.push({ key: 'expect', placeholder: claim ? (unitHint[claim.dim] ?? claim.label) : 'value' });
  return lines;
}
