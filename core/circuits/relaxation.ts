// The two-phase RC relaxation oscillator shared by schmitt-rc, comparator-rc, 555-astable and inverter-rc.
import type { Waveform } from './model';
import { clampCycles, sampleRcSegments, type RcSegment } from './segments';

/**
 * A relaxation oscillator as segments: `startup` (the `first-edge` result) runs from the discharged capacitor to the first output
 * transition; then `first` and `second` alternate for ever. `highIs` names the half with the output high.
 */
export interface Relaxation {
  startup: RcSegment;
  first: RcSegment;
  second: RcSegment;
  highIs: 'first' | 'second';
}

export function relaxationResults(osc: Relaxation): Record<string, number> {
  const high = osc.highIs === 'first' ? osc.first.duration : osc.second.duration;
  const low = osc.highIs === 'first' ? osc.second.duration : osc.first.duration;
  const period = high + low;
  return { high, low, period, frequency: 1 / period, duty: high / period, 'first-edge': osc.startup.duration };
}

export function relaxationWaveform(
  osc: Relaxation,
  cycles: number,
  levels: Array<{ label: string; value: number }>,
): Waveform {
  const segments: RcSegment[] = [osc.startup];
  for (let i = 0; i < clampCycles(cycles); i++) segments.push(osc.first, osc.second);
  const duration = segments.reduce((sum, s) => sum + s.duration, 0);
  return { traces: sampleRcSegments(segments), levels, duration };
}
