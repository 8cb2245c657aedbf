// Crystal load capacitance: the two loading capacitors in series plus the stray capacitance.
import type { CircuitModel, ModelIssue } from './model';
import { capacitor, checkFinite, checkPositive, eng, finiteOnly, percent } from './common';

const source = 'Pierce oscillator load: CL = C1·C2/(C1 + C2) + Cstray, common practice (crystal makers\' application notes)';

export const crystalLoad: CircuitModel = {
  id: 'crystal-load',
  title: 'Crystal load capacitance',
  summary: 'The load a Pierce crystal oscillator presents: C1 and C2 in series plus stray, against the load the crystal is specified for.',
  assumptions: [
    'Pierce oscillator: C1 and C2 from each crystal pin to ground, in series as seen by the crystal.',
    'cstray lumps pin, trace and the MCU\'s own capacitance (typically 2–5 pF, common practice); it has no default on purpose.',
  ],
  params: [
    capacitor('cl', 'specified load capacitance CL', 'Load capacitance the crystal is specified for.', { solvable: false }),
    capacitor('cstray', 'stray capacitance', 'Pin, trace and oscillator input capacitance, in parallel with the series pair.', { solvable: false }),
    capacitor('c1', 'load capacitor C1', 'Capacitor from the first crystal pin to ground.'),
    capacitor('c2', 'load capacitor C2', 'Capacitor from the second crystal pin to ground.'),
  ],
  results: [
    { key: 'load', label: 'load capacitance', dim: 'F' },
    { key: 'error', label: 'load error against CL', dim: '', percent: true },
  ],
  headline: ['load', 'error'],

  validate(input) {
    const issues: ModelIssue[] = [];
    checkPositive(input, ['cl', 'c1', 'c2'], issues);
    if (checkFinite(input, ['cstray'], issues) && input.values.cstray < 0) {
      issues.push({ key: 'cstray', message: `cstray cannot be negative (got ${eng(input.values.cstray, 'F')})` });
    }
    return issues;
  },

  compute(input) {
    const { cl, cstray, c1, c2 } = input.values;
    const load = (c1 * c2) / (c1 + c2) + cstray;
    return finiteOnly({ load, error: load / cl - 1 });
  },

  working(input, results) {
    const { cl, cstray, c1, c2 } = input.values;
    return [
      {
        formula: 'CL = C1·C2/(C1 + C2) + Cstray',
        substituted: `CL = ${eng(c1, 'F')} · ${eng(c2, 'F')} / (${eng(c1, 'F')} + ${eng(c2, 'F')}) + ${eng(cstray, 'F')} = ${eng(results.load, 'F')}`,
        source,
      },
      { formula: 'error = load / CL(spec) − 1', substituted: `error = ${eng(results.load, 'F')} / ${eng(cl, 'F')} − 1 = ${percent(results.error)}`, source: 'definition' },
    ];
  },
};
