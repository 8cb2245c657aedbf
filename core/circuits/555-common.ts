// What the 555 astable and monostable share: the control pin and its levels.
import type { ModelInput, ModelIssue, QuantityParam, Waveform } from './model';
import { Code } from '../codes';
import { eng, voltage } from './common';

/** The internal divider puts the control pin at 2/3 VCC when it is left open (NE555 datasheet, SLFS022). */
export const controlParam: QuantityParam = voltage('control', 'control voltage (threshold level)', 'Voltage on the control pin; the trigger level is half of it.', {
  default: (v) => (2 / 3) * v.supply,
  defaultText: '2/3 supply',
});

export function controlIssues(input: ModelInput): ModelIssue[] {
  const { supply, control } = input.values;
  if (control >= supply) {
    return [{ key: 'control', message: `control ${eng(control, 'V')} is at or above the supply ${eng(supply, 'V')}: the capacitor never reaches the threshold` }];
  }
  return [];
}

/** Threshold levels, named by their share of the supply when the control pin is left at its default. */
export function levelLabels(input: ModelInput): Waveform['levels'] {
  const { supply, control } = input.values;
  const atDefault = Math.abs(control - (2 / 3) * supply) <= 1e-9 * supply;
  return [
    { label: atDefault ? '2/3 supply' : 'control', value: control },
    { label: atDefault ? '1/3 supply' : 'control/2', value: control / 2 },
  ];
}

/**
 * The supply a 555 can run from (NE555 datasheet SLFS022, recommended operating conditions, from memory:
 * 4.5 V to 16 V; 18 V absolute maximum). Below 4.5 V only a CMOS 555 works; above 18 V none does.
 */
export function supplyCautions(input: ModelInput): string[] {
  const { supply } = input.values;
  if (supply > 18) return [];
  if (supply > 16) return [`supply ${eng(supply, 'V')} is above the NE555's recommended 16 V (SLFS022); check the part's own limits`];
  if (supply < 4.5) return [`supply ${eng(supply, 'V')} is below the bipolar NE555's 4.5 V minimum (SLFS022): this needs a CMOS 555, whose own datasheet sets the limits`];
  return [];
}

/** Above the NE555's 18 V absolute maximum (SLFS022, from memory) the part is destroyed: a warning, not a number to trust. */
export function supplyIssues(input: ModelInput): ModelIssue[] {
  const { supply } = input.values;
  if (!(supply > 18)) return [];
  return [{ key: 'supply', severity: 'warning', code: Code.supplyRange, message: `supply ${eng(supply, 'V')} is above the 18 V absolute maximum of the NE555 (SLFS022): no standard 555 survives it` }];
}
