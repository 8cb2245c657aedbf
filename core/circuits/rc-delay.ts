// RC delay: the time for a capacitor charging through R to pass a level (power-on reset, enable delays).
import { rcReaches, rcSegmentTime } from '../rc';
import type { CircuitModel, ModelInput, ModelIssue } from './model';
import { capacitor, checkFinite, checkPositive, eng, finiteOnly, resistor, voltage, voltageCautions } from './common';
import { sampleRcSegments } from './segments';

function delayTime(input: ModelInput): number {
  const v = input.values;
  return rcSegmentTime(v.from, v.to, v.toward, v.r * v.c);
}

export const rcDelay: CircuitModel = {
  id: 'rc-delay',
  title: 'RC delay',
  summary: 'A capacitor charging (or discharging) through R from one voltage toward another: the time to reach a level.',
  assumptions: [
    'A single RC: ideal source at `toward`, no load on the capacitor node, no leakage.',
    'The capacitor starts at `from` at time 0 (a step applied then); `to` is the level that ends the delay, such as a reset threshold.',
  ],
  params: [
    resistor('r', 'resistor R', 'Series resistor of the RC.'),
    capacitor('c', 'capacitor C', 'Capacitor of the RC.'),
    voltage('from', 'starting voltage', 'Capacitor voltage at time 0.', { default: 0, defaultText: '0 V' }),
    voltage('to', 'end level', 'Voltage whose crossing ends the delay.'),
    voltage('toward', 'final voltage', 'Voltage the capacitor heads for.', { default: (v) => v.supply ?? Number.NaN, defaultText: 'supply' }),
    voltage('supply', 'supply voltage', 'Supply the RC charges from; the default of `toward`.', { default: (v) => v.toward ?? Number.NaN, defaultText: 'toward', optional: true }),
  ],
  results: [{ key: 'time', label: 'delay to the end level', dim: 's' }],
  headline: ['time'],

  validate(input) {
    const issues: ModelIssue[] = [];
    const positive = checkPositive(input, ['r', 'c'], issues);
    if (!Number.isFinite(input.values.toward ?? Number.NaN)) {
      issues.push({ key: 'toward', message: 'give `toward` (or `supply`): the voltage the capacitor charges toward' });
      return issues;
    }
    if (!checkFinite(input, ['from', 'to'], issues) || !positive) return issues;
    const { from, to, toward } = input.values;
    if (!rcReaches(from, to, toward)) {
      issues.push({ key: 'to', message: `starting at ${eng(from, 'V')} and heading for ${eng(toward, 'V')}, the capacitor never reaches ${eng(to, 'V')}` });
    }
    return issues;
  },

  compute: (input) => finiteOnly({ time: delayTime(input) }),

  working(input, results) {
    const { r, c, from, to, toward } = input.values;
    return [
      {
        formula: 't = R·C·ln((Vfinal − Vstart)/(Vfinal − Vend))',
        substituted: `t = ${eng(r, 'Ω')} · ${eng(c, 'F')} · ln((${eng(toward, 'V')} − ${eng(from, 'V')})/(${eng(toward, 'V')} − ${eng(to, 'V')})) = ${eng(results.time, 's')}`,
        source: 'standard RC charging law, common practice',
      },
    ];
  },

  waveform(input) {
    const { r, c, from, toward } = input.values;
    const time = delayTime(input);
    // The curve runs on past the crossing, so the level is seen being passed.
    const tail = time > 0 ? time / 2 : r * c;
    const [capacitorTrace] = sampleRcSegments([
      { v0: from, vInf: toward, tau: r * c, duration: time, output: 0 },
      { v0: input.values.to, vInf: toward, tau: r * c, duration: tail, output: 0 },
    ]);
    return { traces: [capacitorTrace], levels: [{ label: 'end level', value: input.values.to }], duration: time + tail };
  },

  cautions: (input) => voltageCautions(input, ['from', 'to', 'toward', 'supply']),
};
