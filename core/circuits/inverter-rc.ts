// Two-inverter RC oscillator: C from the second inverter's output kicks the timing node past the supply rails.
import { rcSegmentTime } from '../rc';
import type { CircuitModel, ModelInput, ModelIssue } from './model';
import { capacitor, checkPositive, eng, finiteOnly, oscillatorHeadline, oscillatorResults, resistor, voltage, voltageCautions } from './common';
import { relaxationResults, relaxationWaveform, type Relaxation } from './relaxation';

const source = 'standard RC charging law for the two-inverter RC oscillator (≈ 2.2·R·C at a mid-supply threshold), common practice';

function relaxation(input: ModelInput): Relaxation {
  const { supply, threshold, r, c } = input.values;
  const tau = r * c;
  // Each output edge couples a full supply step through C: the node jumps to threshold ± supply.
  return {
    startup: { v0: 0, vInf: supply, tau, duration: rcSegmentTime(0, threshold, supply, tau), output: 0 },
    first: { v0: threshold + supply, vInf: 0, tau, duration: rcSegmentTime(threshold + supply, threshold, 0, tau), output: supply },
    second: { v0: threshold - supply, vInf: supply, tau, duration: rcSegmentTime(threshold - supply, threshold, supply, tau), output: 0 },
    highIs: 'first',
  };
}

export const inverterRc: CircuitModel = {
  id: 'inverter-rc',
  title: 'Two-inverter RC oscillator',
  summary: 'Two logic inverters in a loop; R from the first output and C from the second output meet at the first input.',
  assumptions: [
    'Ideal inverters switching at `threshold` with rail-to-rail outputs (supply and 0 V) and no delay.',
    "A series resistor keeps the first inverter's protection diodes out, so the timing node swings to threshold ± supply unclamped; no input current.",
    'output is the second inverter; the `capacitor` trace is the timing node (the end of C at the first input).',
    'first-edge: the capacitor starts discharged with the timing node at 0 V and the output low; it is the time for the node to charge through R to the threshold (the first output edge).',
  ],
  params: [
    voltage('supply', 'supply voltage', 'Supply of both inverters.'),
    voltage('threshold', 'inverter switching threshold', 'Input voltage at which the first inverter switches.', { default: (v) => v.supply / 2, defaultText: 'supply/2' }),
    resistor('r', 'timing resistor R', 'Resistor from the first inverter output to the timing node.'),
    capacitor('c', 'timing capacitor C', 'Capacitor from the second inverter output to the timing node.'),
  ],
  results: oscillatorResults,
  headline: oscillatorHeadline,

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['supply', 'r', 'c'], issues)) return issues;
    const { supply, threshold } = input.values;
    if (!Number.isFinite(threshold)) {
      issues.push({ key: 'threshold', message: '`threshold` needs a finite value' });
    } else if (!(threshold > 0 && threshold < supply)) {
      issues.push({ key: 'threshold', message: `threshold ${eng(threshold, 'V')} must lie strictly between 0 V and the supply ${eng(supply, 'V')}` });
    }
    return issues;
  },

  compute: (input) => finiteOnly(relaxationResults(relaxation(input))),

  working(input, results) {
    const { supply, threshold, r, c } = input.values;
    const rc = `${eng(r, 'Ω')} · ${eng(c, 'F')}`;
    return [
      {
        formula: 'T = R·C·[ln((V + Vth)/Vth) + ln((2V − Vth)/(V − Vth))]',
        substituted: `T = ${rc} · [ln((${eng(supply, 'V')} + ${eng(threshold, 'V')})/${eng(threshold, 'V')}) + ln((${eng(2 * supply, 'V')} − ${eng(threshold, 'V')})/(${eng(supply, 'V')} − ${eng(threshold, 'V')}))] = ${eng(results.period, 's')}`,
        source,
      },
      { formula: 't_high = R·C·ln((V + Vth)/Vth)', substituted: `t_high = ${eng(results.high, 's')}`, source },
      { formula: 'first edge = R·C·ln(V/(V − Vth))', substituted: `first edge = ${rc} · ln(${eng(supply, 'V')}/(${eng(supply, 'V')} − ${eng(threshold, 'V')})) = ${eng(results['first-edge'], 's')}`, source },
      { formula: 'f = 1/T', substituted: `f = ${eng(results.frequency, 'Hz')}`, source: 'definition of frequency' },
    ];
  },

  waveform: (input, cycles) => relaxationWaveform(relaxation(input), cycles, [{ label: 'threshold', value: input.values.threshold }]),

  cautions: (input) => voltageCautions(input, ['supply']),
};
