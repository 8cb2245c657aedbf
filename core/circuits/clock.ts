// A clock source: the root of a clock tree (crystal, resonator, internal RC oscillator), with its tolerance.
import type { CircuitModel, ModelIssue } from './model';
import { checkPositive, eng, finiteOnly, quantity } from './common';

const source = 'T = 1 / f (definition of the period)';

export const clock: CircuitModel = {
  id: 'clock',
  title: 'Clock source',
  summary: 'A clock source with its tolerance (`8 MHz ±20 ppm`): the root that PLLs, dividers, timers, UARTs and CAN controllers reference.',
  assumptions: [
    'The tolerance written after the frequency (`±20 ppm`, `±1 %`) is the whole band over temperature, supply and ageing, taken as a bound.',
  ],
  params: [quantity('frequency', 'frequency', 'Hz', 'Frequency of the source; write its tolerance after it (`8 MHz ±20 ppm`).')],
  results: [
    { key: 'frequency', label: 'frequency', dim: 'Hz' },
    { key: 'period', label: 'period', dim: 's' },
  ],
  headline: ['frequency', 'period'],

  validate(input) {
    const issues: ModelIssue[] = [];
    checkPositive(input, ['frequency'], issues);
    return issues;
  },

  compute(input) {
    const { frequency } = input.values;
    return finiteOnly({ frequency, period: 1 / frequency });
  },

  working(input, results) {
    return [{ formula: 'T = 1 / f', substituted: `T = 1 / ${eng(input.values.frequency, 'Hz')} = ${eng(results.period, 's')}`, source }];
  },
};
