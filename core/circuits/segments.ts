// Sampling of piecewise-exponential and piecewise-constant waveforms for the panel and SVG.
import { rcVoltageAt } from '../rc';
import type { Trace } from './model';

/** One stretch of an RC waveform: the node heads from v0 toward vInf while the output holds. */
export interface RcSegment {
  v0: number;
  vInf: number;
  tau: number;
  /** Seconds. */
  duration: number;
  /** Output level during the segment, volts. */
  output: number;
}

/** Points per exponential segment: enough for a smooth curve at panel width. */
export const pointsPerSegment = 50;

/** Waveforms draw at most this many cycles, whatever is asked: a block must never hang the panel. */
export const maxCycles = 200;

export function clampCycles(cycles: number): number {
  if (!Number.isFinite(cycles)) return 1;
  return Math.min(maxCycles, Math.max(1, Math.round(cycles)));
}

/**
 * The timing node and output traces of consecutive segments, with exact corners where they meet. The node is
 * where C meets the switching input: the capacitor's voltage in most circuits, not in inverter-rc (it swings
 * beyond the supply there, docs/blocks.md).
 */
export function sampleRcSegments(segments: readonly RcSegment[]): Trace[] {
  const capacitor: Array<[number, number]> = [];
  const output: Array<[number, number]> = [];
  let t0 = 0;
  for (const segment of segments) {
    for (let i = 0; i <= pointsPerSegment; i++) {
      const dt = (segment.duration * i) / pointsPerSegment;
      capacitor.push([t0 + dt, rcVoltageAt(segment.v0, segment.vInf, segment.tau, dt)]);
    }
    output.push([t0, segment.output], [t0 + segment.duration, segment.output]);
    t0 += segment.duration;
  }
  return [
    { name: 'timing node', dim: 'V', points: finitePoints(capacitor) },
    { name: 'output', dim: 'V', points: finitePoints(output) },
  ];
}

/** A level that holds for each duration in turn (counter outputs, ring stages). */
export function sampleSteps(steps: ReadonlyArray<{ duration: number; level: number }>, name: string): Trace {
  const points: Array<[number, number]> = [];
  let t0 = 0;
  for (const step of steps) {
    points.push([t0, step.level], [t0 + step.duration, step.level]);
    t0 += step.duration;
  }
  return { name, dim: 'V', points: finitePoints(points) };
}

/** Extreme but valid inputs can overflow a time axis (1e300 F); a drawing keeps only the points that exist. */
export function finitePoints(points: Array<[number, number]>): Array<[number, number]> {
  return points.every(([t, v]) => Number.isFinite(t) && Number.isFinite(v)) ? points : points.filter(([t, v]) => Number.isFinite(t) && Number.isFinite(v));
}
