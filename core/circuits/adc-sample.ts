// ADC sampling: the sample-and-hold capacitor charges through the source and switch resistance and must settle
// to within ½ LSB of a full-scale step during the sampling time (the RC charging law).
import type { CircuitModel, ModelIssue, Waveform } from './model';
import { capacitor, checkWhole, eng, finiteOnly, percent, quantity, resistor } from './common';
import { Code } from '../codes';

const source = 'RC charging law: a full-scale step settles to ½ LSB after τ · ln(2^(bits+1))';

/** Time constants to settle a full-scale step to ½ LSB: ln(2^(bits+1)) = (bits + 1) · ln 2. */
export function settleConstants(bits: number): number {
  return (bits + 1) * Math.LN2;
}

export const adcSample: CircuitModel = {
  id: 'adc-sample',
  title: 'ADC sampling time',
  summary: 'An ADC\'s sample-and-hold: the time its capacitor needs to settle to ½ LSB through the source and switch resistance, the margin of the sampling time, and the largest source resistance.',
  assumptions: [
    'A full-scale step at the start of sampling (the worst case: the capacitor held the opposite extreme); settled when within ½ LSB.',
    'One RC: the source resistance and the switch resistance in series charge c-sample; pin and board capacitance and any external capacitor are not modelled.',
    'The source is otherwise ideal (no op-amp settling, no reference droop).',
  ],
  params: [
    quantity('bits', 'resolution', '', 'Resolution of the converter, bits.', { integer: true, min: 1, max: 32 }),
    resistor('r-source', 'source resistance', 'Output resistance of what drives the pin (a divider\'s Thevenin resistance).', { min: 0 }),
    resistor('r-switch', 'sampling switch resistance', 'On-resistance of the ADC\'s sampling switch (datasheet).', { min: 0 }),
    capacitor('c-sample', 'sampling capacitance', 'Capacitance of the sample-and-hold (datasheet).'),
    quantity('sample-time', 'sampling time', 's', 'Time the switch is closed (cycles / ADC clock).', { solvable: true }),
  ],
  results: [
    { key: 'settle', label: 'time to settle to ½ LSB', dim: 's' },
    { key: 'margin', label: 'sampling-time margin (sample-time / settle − 1)', dim: '', percent: true },
    { key: 'r-source-max', label: 'largest source resistance that settles', dim: 'Ω' },
  ],
  headline: ['settle', 'margin'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkWhole(input, 'bits', 1, 32, issues)) return issues;
    for (const key of ['r-source', 'r-switch']) {
      const v = input.values[key];
      if (!(v >= 0) || !Number.isFinite(v)) issues.push({ key, message: `\`${key}\` must be zero or more (got ${eng(v, 'Ω')})` });
    }
    for (const key of ['c-sample', 'sample-time']) {
      const v = input.values[key];
      if (!(v > 0) || !Number.isFinite(v)) issues.push({ key, message: `\`${key}\` must be greater than zero` });
    }
    if (issues.length) return issues;
    if (!(input.values['r-source'] + input.values['r-switch'] > 0)) return [{ key: 'r-switch', message: 'the source and switch resistance cannot both be zero: the capacitor would charge in no time' }];
    const { margin, settle } = adcSample.compute(input);
    if (margin < 0) {
      issues.push({ key: 'sample-time', severity: 'warning', code: Code.sampleSettling, message: `sampling time ${eng(input.values['sample-time'], 's')} is shorter than the ${eng(settle, 's')} the capacitor needs to settle to ½ LSB (margin ${percent(margin)})` });
    }
    return issues;
  },

  compute(input) {
    const { bits } = input.values;
    const rs = input.values['r-source'];
    const rsw = input.values['r-switch'];
    const c = input.values['c-sample'];
    const time = input.values['sample-time'];
    const settle = (rs + rsw) * c * settleConstants(bits);
    return finiteOnly({ settle, margin: time / settle - 1, 'r-source-max': time / (c * settleConstants(bits)) - rsw });
  },

  working(input, results) {
    const { bits } = input.values;
    const rs = input.values['r-source'];
    const rsw = input.values['r-switch'];
    const c = input.values['c-sample'];
    const k = settleConstants(bits);
    return [
      { formula: 'settle = (r-source + r-switch) · c-sample · ln(2^(bits+1))', substituted: `settle = (${eng(rs, 'Ω')} + ${eng(rsw, 'Ω')}) · ${eng(c, 'F')} · ${k.toFixed(3)} = ${eng(results.settle, 's')}`, source },
      { formula: 'margin = sample-time / settle − 1', substituted: `margin = ${eng(input.values['sample-time'], 's')} / ${eng(results.settle, 's')} − 1 = ${percent(results.margin)}`, source },
      { formula: 'r-source-max = sample-time / (c-sample · ln(2^(bits+1))) − r-switch', substituted: `r-source-max = ${eng(input.values['sample-time'], 's')} / (${eng(c, 'F')} · ${k.toFixed(3)}) − ${eng(rsw, 'Ω')} = ${eng(results['r-source-max'], 'Ω')}`, source },
    ];
  },

  waveform(input) {
    const tau = (input.values['r-source'] + input.values['r-switch']) * input.values['c-sample'];
    const time = input.values['sample-time'];
    const settle = tau * settleConstants(input.values.bits);
    const duration = 1.2 * Math.max(time, settle);
    const points: Array<[number, number]> = [];
    for (let i = 0; i <= 200; i++) {
      const t = (duration * i) / 200;
      points.push([t, 1 - Math.exp(-t / tau)]);
    }
    const wave: Waveform = {
      traces: [
        { name: 'capacitor (share of the step)', dim: '', points: points.filter(([t, v]) => Number.isFinite(t) && Number.isFinite(v)) },
        { name: 'sampling switch', dim: '', points: [[0, 1], [time, 1], [time, 0], [duration, 0]].filter(([t]) => Number.isFinite(t)) as Array<[number, number]> },
      ],
      levels: [{ label: '½ LSB from the final value', value: 1 - 2 ** -(input.values.bits + 1) }],
      duration,
    };
    return wave;
  },
};
