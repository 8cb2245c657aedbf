// Inverting Schmitt trigger with R from its output to C at its input (one-gate RC oscillator).
import type { CircuitModel, ModelInput, ModelIssue } from './model';
import { capacitor, checkFinite, checkPositive, eng, finiteOnly, oscillatorHeadline, oscillatorResults, quantity, resistor, voltage, voltageCautions } from './common';
import { hysteresisIssues, hysteresisRelaxation, hysteresisWorking, type Hysteresis } from './hysteresis';
import { relaxationResults, relaxationWaveform } from './relaxation';

const source = 'standard RC charging law between the two thresholds, common practice';

function hysteresis(input: ModelInput): Hysteresis {
  const v = input.values;
  return { upper: v['vt+'], lower: v['vt-'], voh: v.voh, vol: v.vol, tau: v.r * v.c, delay: v.tpd };
}

export const schmittRc: CircuitModel = {
  id: 'schmitt-rc',
  title: 'Schmitt-trigger RC oscillator',
  summary: 'An inverting Schmitt trigger whose output charges and discharges C through R between its two thresholds.',
  assumptions: [
    'Ideal inverting Schmitt trigger: no input current, output at exactly voh or vol (rail-to-rail, supply and 0 V, unless voh/vol are given).',
    'The output resistance is part of r; the thresholds do not move with load or temperature.',
    'tpd delays each output edge; meanwhile the capacitor keeps running past the threshold, and the next half starts from that overshoot.',
    'first-edge: the capacitor starts at 0 V with the output high (0 V below VT+); it is the time to the first output edge, VT+ reached plus tpd.',
  ],
  params: [
    voltage('supply', 'supply voltage', 'Supply of the Schmitt-trigger gate.'),
    voltage('vt+', 'upper threshold VT+', 'Input voltage at which a rising input switches the output low.'),
    voltage('vt-', 'lower threshold VT−', 'Input voltage at which a falling input switches the output high.'),
    resistor('r', 'timing resistor R', 'Resistor from the output to the capacitor.'),
    capacitor('c', 'timing capacitor C', 'Capacitor from the input to 0 V.'),
    voltage('voh', 'output high level', 'Output voltage when high.', { default: (v) => v.supply, defaultText: 'supply' }),
    voltage('vol', 'output low level', 'Output voltage when low.', { default: 0, defaultText: '0 V' }),
    quantity('tpd', 'propagation delay', 's', 'Delay from a threshold crossing to the output edge.', { default: 0, defaultText: '0 s', min: 0 }),
  ],
  results: oscillatorResults,
  headline: oscillatorHeadline,

  validate(input) {
    const issues: ModelIssue[] = [];
    const positive = checkPositive(input, ['supply', 'r', 'c'], issues);
    const finite = checkFinite(input, ['vt+', 'vt-', 'voh', 'vol', 'tpd'], issues);
    if (!positive || !finite) return issues;
    if (input.values.tpd < 0) issues.push({ key: 'tpd', message: '`tpd` cannot be negative' });
    if (input.values.voh > input.values.supply) {
      issues.push({ key: 'voh', severity: 'warning', message: `output high ${eng(input.values.voh, 'V')} is above the supply ${eng(input.values.supply, 'V')}` });
    }
    issues.push(...hysteresisIssues(hysteresis(input), { upper: 'vt+', lower: 'vt-', swing: 'voh' }));
    return issues;
  },

  compute(input) {
    return finiteOnly(relaxationResults(hysteresisRelaxation(hysteresis(input))));
  },

  working(input, results) {
    const v = input.values;
    return [
      { formula: 'τ = R·C', substituted: `τ = ${eng(v.r, 'Ω')} · ${eng(v.c, 'F')} = ${eng(v.r * v.c, 's')}`, source },
      ...hysteresisWorking(hysteresis(input), results, source),
    ];
  },

  waveform(input, cycles) {
    return relaxationWaveform(hysteresisRelaxation(hysteresis(input)), cycles, [
      { label: 'VT+', value: input.values['vt+'] },
      { label: 'VT−', value: input.values['vt-'] },
    ]);
  },

  cautions: (input) => voltageCautions(input, ['supply', 'voh', 'vol']),
};
