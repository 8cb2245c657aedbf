// Which traces share a vertical axis: same dimension and comparable swing, so a capacitor voltage and
// the output it drives read against one voltage scale, while a 0…65535 counter and a 0/1 output do not.
import type { Dim } from '../types';
import type { Trace, Waveform } from '../circuits/model';
import { niceDomain } from './ticks';

export interface Lane {
  dim: Dim;
  traces: Array<{ trace: Trace; index: number }>;
  min: number;
  max: number;
  /** Whether the waveform's levels are drawn here (the first trace's lane). */
  hasLevels: boolean;
}

/** Beyond this a sample is no physical voltage or time; it is left out like a NaN. */
export const MAX_DRAWABLE = 1e150;

export function drawable(t: number, v: number): boolean {
  return Math.abs(t) <= MAX_DRAWABLE && Math.abs(v) <= MAX_DRAWABLE;
}

/** Ranges wider than this factor apart get their own lanes. */
const SHARED_SWING_RATIO = 4;

function finiteRange(points: ReadonlyArray<[number, number]>): [number, number] | undefined {
  let min = Infinity;
  let max = -Infinity;
  for (const [t, v] of points) {
    if (!drawable(t, v)) continue;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return min <= max ? [min, max] : undefined;
}

function swing(min: number, max: number): number {
  return Math.max(max - min, Math.abs(max), Math.abs(min), Number.MIN_VALUE);
}

export function assignLanes(wave: Waveform): Lane[] {
  const lanes: Lane[] = [];
  wave.traces.forEach((trace, index) => {
    const range = finiteRange(trace.points ?? []);
    if (!range) return;
    const [min, max] = range;
    const lane = lanes.find((candidate) => {
      if (candidate.dim !== trace.dim) return false;
      const together = swing(Math.min(min, candidate.min), Math.max(max, candidate.max));
      return together <= SHARED_SWING_RATIO * Math.min(swing(min, max), swing(candidate.min, candidate.max));
    });
    if (lane) {
      lane.traces.push({ trace, index });
      lane.min = Math.min(lane.min, min);
      lane.max = Math.max(lane.max, max);
    } else {
      lanes.push({ dim: trace.dim, traces: [{ trace, index }], min, max, hasLevels: lanes.length === 0 });
    }
  });
  for (const lane of lanes) {
    if (lane.hasLevels) {
      for (const level of wave.levels ?? []) {
        if (!(Math.abs(level.value) <= MAX_DRAWABLE)) continue;
        lane.min = Math.min(lane.min, level.value);
        lane.max = Math.max(lane.max, level.value);
      }
    }
    // Voltages read best from 0 V up, as on a scope with the trace's ground at the bottom.
    if (lane.dim === 'V' || lane.dim === '') lane.min = Math.min(lane.min, 0);
    [lane.min, lane.max] = niceDomain(lane.min, lane.max, 4);
  }
  return lanes;
}
