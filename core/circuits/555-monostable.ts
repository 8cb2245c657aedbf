// 555 timer as a one-shot: after a trigger, C charges through R from 0 V to the control voltage.
import { rcSegmentTime } from '../rc';
import type { CircuitModel, ModelInput, ModelIssue } from './model';
import { capacitor, checkPositive, eng, finiteOnly, resistor, voltage, voltageCautions } from './common';
import { controlIssues, controlParam, levelLabels, supplyCautions, supplyIssues } from './555-common';
import { sampleRcSegments } from './segments';

function width(input: ModelInput): number {
  const { supply, r, c, control } = input.values;
  return rcSegmentTime(0, control, supply, r * c);
}

export const ne555Monostable: CircuitModel = {
  id: '555-monostable',
  title: '555 monostable (one-shot)',
  summary: 'A 555 timer as a one-shot: a trigger starts C charging through R from 0 V; the output pulse ends at the control voltage.',
  assumptions: [
    'Ideal 555: threshold at the control voltage, no pin currents; the discharge transistor holds C at 0 V until the trigger.',
    'The trigger pulse is shorter than the output pulse; the output is at supply for the width and 0 V otherwise.',
  ],
  params: [
    voltage('supply', 'supply voltage VCC', 'Supply of the 555.'),
    resistor('r', 'timing resistor R', 'Resistor from VCC to the threshold/discharge node.'),
    capacitor('c', 'timing capacitor C', 'Capacitor from threshold/discharge to 0 V.'),
    controlParam,
  ],
  results: [{ key: 'width', label: 'output pulse width', dim: 's' }],
  headline: ['width'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['supply', 'r', 'c', 'control'], issues)) return issues;
    issues.push(...controlIssues(input), ...supplyIssues(input));
    return issues;
  },

  compute: (input) => finiteOnly({ width: width(input) }),

  working(input, results) {
    const { supply, r, c, control } = input.values;
    return [
      {
        formula: 't_w = R·C·ln(VCC/(VCC − Vctl)) (= 1.1·R·C at Vctl = 2/3 VCC)',
        substituted: `t_w = ${eng(r, 'Ω')} · ${eng(c, 'F')} · ln(${eng(supply, 'V')}/(${eng(supply, 'V')} − ${eng(control, 'V')})) = ${eng(results.width, 's')}`,
        source: 'Texas Instruments NE555 datasheet (SLFS022), monostable operation; generalised to any control voltage by the RC charging law',
      },
    ];
  },

  waveform(input) {
    const { supply, r, c } = input.values;
    const pulse = width(input);
    // The pulse, then a quarter of it at rest so the falling edge shows.
    const traces = sampleRcSegments([
      { v0: 0, vInf: supply, tau: r * c, duration: pulse, output: supply },
      { v0: 0, vInf: 0, tau: r * c, duration: pulse / 4, output: 0 },
    ]);
    return { traces, levels: levelLabels(input).slice(0, 1), duration: pulse * 1.25 };
  },

  cautions: (input) => [...supplyCautions(input), ...voltageCautions(input, ['supply', 'control'])],
};
