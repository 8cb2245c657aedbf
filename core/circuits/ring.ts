// Ring oscillator: an odd number of inverters in a loop, each adding its propagation delay.
import type { CircuitModel, ModelIssue } from './model';
import { checkPositive, eng, finiteOnly, quantity } from './common';
import { clampCycles, sampleSteps } from './segments';

export const ring: CircuitModel = {
  id: 'ring',
  title: 'Ring oscillator',
  summary: 'An odd number of inverting stages in a loop; an edge travels round twice per period.',
  assumptions: [
    'Every stage has the same propagation delay tpd, equal for rising and falling edges, and does not change with load or supply.',
    'The output is drawn as a logic level (0 or 1), not a voltage.',
  ],
  params: [
    quantity('stages', 'number of inverting stages N', '', 'Inverters in the loop: odd, 3 or more.', { integer: true, min: 3 }),
    quantity('tpd', 'stage propagation delay', 's', 'Propagation delay of one stage.', { min: 0 }),
  ],
  results: [
    { key: 'period', label: 'period', dim: 's' },
    { key: 'frequency', label: 'frequency', dim: 'Hz' },
  ],
  headline: ['frequency', 'period'],

  validate(input) {
    const issues: ModelIssue[] = [];
    const stages = input.values.stages;
    if (stages === undefined || !Number.isFinite(stages)) {
      issues.push({ key: 'stages', message: '`stages` needs a finite value' });
    } else if (!Number.isInteger(stages)) {
      issues.push({ key: 'stages', message: `stages must be a whole number (got ${stages})` });
    } else if (stages < 3) {
      issues.push({ key: 'stages', message: `a ring needs 3 or more stages (got ${stages})` });
    } else if (stages % 2 === 0) {
      issues.push({ key: 'stages', message: `an even ring (${stages} stages) latches instead of oscillating: use an odd number` });
    }
    checkPositive(input, ['tpd'], issues);
    return issues;
  },

  // Half a period is one trip of an edge round the N stages (a standard result, common practice).
  compute(input) {
    const period = 2 * input.values.stages * input.values.tpd;
    return finiteOnly({ period, frequency: 1 / period });
  },

  working(input, results) {
    const { stages, tpd } = input.values;
    return [
      {
        formula: 'f = 1/(2·N·tpd)',
        substituted: `f = 1/(2 · ${stages} · ${eng(tpd, 's')}) = ${eng(results.frequency, 'Hz')}`,
        source: 'ring oscillator: one edge passes all N stages each half period, common practice',
      },
    ];
  },

  waveform(input, cycles) {
    const half = input.values.stages * input.values.tpd;
    const steps: Array<{ duration: number; level: number }> = [];
    for (let i = 0; i < clampCycles(cycles); i++) steps.push({ duration: half, level: 1 }, { duration: half, level: 0 });
    const output = { ...sampleSteps(steps, 'output'), dim: '' as const };
    return { traces: [output], levels: [], duration: 2 * half * clampCycles(cycles) };
  },
};
