// How a block's dimensions read in messages, and the one rule for absolute tolerances.
import type { Dim, Tolerance } from '../types';

/**
 * An absolute tolerance must be in its value's unit: `r: 10k ±1 V` cannot mean ±1 Ω. `here`: the value's unit is the
 * one written beside it (a claim), not its key's.
 */
export function toleranceMismatch(tolerance: Tolerance | undefined, toleranceDim: Dim | undefined, valueDim: Dim, key: string, here = false): string | undefined {
  if (tolerance?.kind !== 'absolute' || !toleranceDim || toleranceDim === valueDim) return undefined;
  return `the tolerance of \`${key}\` is ${describeDim(toleranceDim)}, but \`${key}\` is ${describeDim(valueDim)}${here ? ' here' : ''}: give it in the same unit or as a percentage`;
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
  'bit/s': 'a bitrate (bit/s)',
  other: 'a compound unit',
};

export function describeDim(dim: string): string {
  return dimWords[dim] ?? dim;
}
