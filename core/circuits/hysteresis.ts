// An inverting comparator with hysteresis whose output charges C through R: the shared core of
// schmitt-rc and comparator-rc. Standard RC charging law between two thresholds, common practice.
import { rcSegmentTime, rcVoltageAt } from '../rc';
import type { ModelIssue, WorkingLine } from './model';
import type { Relaxation } from './relaxation';
import { eng, term } from './common';

export interface Hysteresis {
  upper: number;
  lower: number;
  voh: number;
  vol: number;
  tau: number;
  /** Output delay after the capacitor crosses a threshold, seconds (0 for an ideal comparator). */
  delay: number;
}

/** Keys to blame for each kind of threshold problem, since the two models name them differently. */
export interface HysteresisKeys {
  upper: string;
  lower: string;
  swing: string;
}

export function hysteresisIssues(h: Hysteresis, keys: HysteresisKeys): ModelIssue[] {
  const issues: ModelIssue[] = [];
  if (!(h.voh > h.vol)) {
    issues.push({ key: keys.swing, message: `output high (${eng(h.voh, 'V')}) must be above output low (${eng(h.vol, 'V')})` });
    return issues;
  }
  if (!(h.lower < h.upper)) {
    issues.push({ key: keys.lower, message: `lower threshold ${eng(h.lower, 'V')} is at or above the upper threshold ${eng(h.upper, 'V')}: no hysteresis, no oscillation` });
  }
  if (!(h.upper < h.voh)) {
    issues.push({ key: keys.upper, message: `upper threshold ${eng(h.upper, 'V')} is not below output high ${eng(h.voh, 'V')}: the capacitor never reaches it` });
  }
  if (!(h.lower > h.vol)) {
    issues.push({ key: keys.lower, message: `lower threshold ${eng(h.lower, 'V')} is not above output low ${eng(h.vol, 'V')}: the capacitor never reaches it` });
  }
  return issues;
}

/**
 * The capacitor starts discharged (0 V). Below the upper threshold the output starts high (between the
 * thresholds the latch state is unknown; high is assumed); at or above it the output starts low.
 * During the delay the capacitor keeps running past the threshold, so each half starts from that overshoot.
 */
export function hysteresisRelaxation(h: Hysteresis): Relaxation {
  const peak = rcVoltageAt(h.upper, h.voh, h.tau, h.delay);
  const trough = rcVoltageAt(h.lower, h.vol, h.tau, h.delay);
  const high = { v0: trough, vInf: h.voh, tau: h.tau, duration: rcSegmentTime(trough, h.upper, h.voh, h.tau) + h.delay, output: h.voh };
  const low = { v0: peak, vInf: h.vol, tau: h.tau, duration: rcSegmentTime(peak, h.lower, h.vol, h.tau) + h.delay, output: h.vol };
  if (0 < h.upper) {
    const startup = { v0: 0, vInf: h.voh, tau: h.tau, duration: rcSegmentTime(0, h.upper, h.voh, h.tau) + h.delay, output: h.voh };
    return { startup, first: low, second: high, highIs: 'second' };
  }
  const startup = { v0: 0, vInf: h.vol, tau: h.tau, duration: rcSegmentTime(0, h.lower, h.vol, h.tau) + h.delay, output: h.vol };
  return { startup, first: high, second: low, highIs: 'first' };
}

/** Working lines for both halves, with the start voltages the halves really begin from. */
export function hysteresisWorking(h: Hysteresis, results: Readonly<Record<string, number>>, source: string): WorkingLine[] {
  const osc = hysteresisRelaxation(h);
  const high = osc.highIs === 'first' ? osc.first : osc.second;
  const low = osc.highIs === 'first' ? osc.second : osc.first;
  const delay = h.delay > 0 ? ` + ${eng(h.delay, 's')}` : '';
  const from = h.delay > 0 ? 'V₀ (threshold plus the overshoot during tpd)' : 'V₀';
  return [
    {
      formula: `t_high = τ·ln((VOH − V₀)/(VOH − VT+))${h.delay > 0 ? ' + tpd' : ''}, ${from}`,
      substituted: `t_high = ${eng(h.tau, 's')} · ln((${term(h.voh, 'V')} − ${term(high.v0, 'V')})/(${term(h.voh, 'V')} − ${term(h.upper, 'V')}))${delay} = ${eng(results.high, 's')}`,
      source,
    },
    {
      formula: `t_low = τ·ln((V₀ − VOL)/(VT− − VOL))${h.delay > 0 ? ' + tpd' : ''}`,
      substituted: `t_low = ${eng(h.tau, 's')} · ln((${term(low.v0, 'V')} − ${term(h.vol, 'V')})/(${term(h.lower, 'V')} − ${term(h.vol, 'V')}))${delay} = ${eng(results.low, 's')}`,
      source,
    },
    {
      formula: 'first edge = τ·ln((Vfinal − 0)/(Vfinal − Vthreshold)), from a discharged capacitor',
      substituted: `first edge = ${eng(h.tau, 's')} · ln(${term(osc.startup.vInf, 'V')}/(${term(osc.startup.vInf, 'V')} − ${term(osc.highIs === 'second' ? h.upper : h.lower, 'V')}))${delay} = ${eng(results['first-edge'], 's')}`,
      source,
    },
    { formula: 'f = 1/(t_high + t_low)', substituted: `f = 1/${eng(results.period, 's')} = ${eng(results.frequency, 'Hz')}`, source: 'definition of frequency' },
  ];
}
