// Comparator (or op-amp) relaxation oscillator: positive feedback r2/r1 sets the thresholds, R–C the timing.
import type { CircuitModel, ModelInput, ModelIssue, WorkingLine } from './model';
import { capacitor, checkFinite, checkPositive, eng, finiteOnly, oscillatorHeadline, oscillatorResults, resistor, voltage, voltageCautions } from './common';
import { hysteresisIssues, hysteresisRelaxation, hysteresisWorking, type Hysteresis } from './hysteresis';
import { relaxationResults, relaxationWaveform } from './relaxation';

const source = 'standard RC charging law between the divider thresholds (op-amp relaxation oscillator), common practice';

/** Fraction of (output − vref) that the r1/r2 divider puts on the + input. */
function feedbackFraction(v: Readonly<Record<string, number>>): number {
  return v.r1 / (v.r1 + v.r2);
}

function hysteresis(input: ModelInput): Hysteresis {
  const v = input.values;
  const beta = feedbackFraction(v);
  return {
    upper: v.vref + (v.voh - v.vref) * beta,
    lower: v.vref + (v.vol - v.vref) * beta,
    voh: v.voh,
    vol: v.vol,
    tau: v.r * v.c,
    delay: 0,
  };
}

export const comparatorRc: CircuitModel = {
  id: 'comparator-rc',
  title: 'Comparator RC relaxation oscillator',
  summary: 'A comparator with positive feedback (r2 output to + input, r1 + input to vref) charging C through R at its − input.',
  assumptions: [
    'Ideal comparator: infinite gain, no input current, no delay; the output sits at exactly voh or vol.',
    'The divider is not loaded and the output resistance is part of r (and negligible against r1 + r2).',
    'Thresholds: V± = vref + (voh or vol − vref)·r1/(r1 + r2).',
    'first-edge: the capacitor starts at 0 V; with 0 V below the upper threshold the output is assumed high (between the thresholds the latch state is unknown); it is the time to the first output edge.',
  ],
  params: [
    voltage('voh', 'output high level', 'Comparator output voltage when high.'),
    voltage('vol', 'output low level', 'Comparator output voltage when low (negative for a split supply).'),
    voltage('vref', 'reference voltage', 'Voltage at the far end of r1.', { default: 0, defaultText: '0 V' }),
    resistor('r1', 'divider resistor r1', 'Resistor from the + input to vref.'),
    resistor('r2', 'feedback resistor r2', 'Resistor from the output to the + input.'),
    resistor('r', 'timing resistor R', 'Resistor from the output to the capacitor at the − input.'),
    capacitor('c', 'timing capacitor C', 'Capacitor from the − input to 0 V.'),
  ],
  results: [
    ...oscillatorResults,
    { key: 'vt+', label: 'upper threshold VT+', dim: 'V' },
    { key: 'vt-', label: 'lower threshold VT−', dim: 'V' },
  ],
  headline: oscillatorHeadline,

  validate(input) {
    const issues: ModelIssue[] = [];
    const positive = checkPositive(input, ['r1', 'r2', 'r', 'c'], issues);
    const finite = checkFinite(input, ['voh', 'vol', 'vref'], issues);
    if (!positive || !finite) return issues;
    if (input.values.voh > input.values.vol && !(input.values.vref > input.values.vol && input.values.vref < input.values.voh)) {
      issues.push({ key: 'vref', message: `vref ${eng(input.values.vref, 'V')} must lie between output low ${eng(input.values.vol, 'V')} and output high ${eng(input.values.voh, 'V')}, or one threshold is never reached` });
      return issues;
    }
    issues.push(...hysteresisIssues(hysteresis(input), { upper: 'vref', lower: 'vref', swing: 'voh' }));
    return issues;
  },

  compute(input) {
    const h = hysteresis(input);
    return finiteOnly({ ...relaxationResults(hysteresisRelaxation(h)), 'vt+': h.upper, 'vt-': h.lower });
  },

  working(input, results) {
    const v = input.values;
    const h = hysteresis(input);
    const beta = feedbackFraction(v);
    const lines: WorkingLine[] = [
      {
        formula: 'β = r1/(r1 + r2); VT± = vref + (VOH or VOL − vref)·β',
        substituted: `β = ${eng(v.r1, 'Ω')}/(${eng(v.r1, 'Ω')} + ${eng(v.r2, 'Ω')}) = ${beta.toPrecision(4)}; VT+ = ${eng(h.upper, 'V')}, VT− = ${eng(h.lower, 'V')}`,
        source: 'voltage divider rule, common practice',
      },
      { formula: 'τ = R·C', substituted: `τ = ${eng(v.r, 'Ω')} · ${eng(v.c, 'F')} = ${eng(h.tau, 's')}`, source },
    ];
    return [...lines, ...hysteresisWorking(h, results, source)];
  },

  waveform(input, cycles) {
    const h = hysteresis(input);
    return relaxationWaveform(hysteresisRelaxation(h), cycles, [
      { label: 'VT+', value: h.upper },
      { label: 'VT−', value: h.lower },
    ]);
  },

  cautions: (input) => voltageCautions(input, ['voh', 'vol', 'vref']),
};
