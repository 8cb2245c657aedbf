// A bus or peripheral clock divider: one node of the clock tree between a source and what it clocks.
import type { CircuitModel, ModelIssue, RegisterSearch } from './model';
import { checkPositive, checkWhole, eng, finiteOnly, quantity } from './common';
import { nearestMembers, normaliseSet } from './integer-set';

const source = 'f = clock / divide (a whole-number clock divider), common practice';

/** A bare `divide: ?` chooses among these; `? a..b` or `? 1, 2, 4` narrows it. */
const anyDivide = { kind: 'range', min: 1, max: 65536 } as const;

export const divider: CircuitModel = {
  id: 'divider',
  title: 'Clock divider',
  summary: 'A bus or peripheral clock divider: the frequency and period a clock divided by a whole number gives.',
  assumptions: ['The divider divides by the whole number `divide` exactly (a register that holds divide − 1 must be converted).'],
  params: [
    quantity('clock', 'input clock', 'Hz', 'Clock into the divider.'),
    quantity('divide', 'division ratio', '', 'Whole division ratio (1 = undivided).', { integer: true, min: 1, solvable: true }),
  ],
  results: [
    { key: 'frequency', label: 'frequency', dim: 'Hz' },
    { key: 'period', label: 'period', dim: 's' },
  ],
  headline: ['frequency', 'period'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (checkPositive(input, ['clock', 'divide'], issues)) checkWhole(input, 'divide', 1, Number.MAX_SAFE_INTEGER, issues);
    return issues;
  },

  compute(input) {
    const frequency = input.values.clock / input.values.divide;
    return finiteOnly({ frequency, period: 1 / frequency });
  },

  working(input, results) {
    const { clock, divide } = input.values;
    return [{ formula: 'f = clock / divide', substituted: `f = ${eng(clock, 'Hz')} / ${divide} = ${eng(results.frequency, 'Hz')}`, source }];
  },

  search(input, search: RegisterSearch) {
    if (search.measure !== 'frequency' && search.measure !== 'period') return { error: 'a divider search needs a target frequency or period' };
    const clockHz = input.values.clock;
    if (!(clockHz > 0) || !(search.target > 0)) return { error: 'the search needs a positive `clock` and target' };
    const wanted = search.measure === 'frequency' ? search.target : 1 / search.target;
    const set = normaliseSet(search.allowed?.divide ?? anyDivide);
    let best: { divide: number; error: number } | undefined;
    for (const divide of nearestMembers(set, clockHz / wanted)) {
      const error = clockHz / divide / wanted - 1;
      if (!best || Math.abs(error) < Math.abs(best.error)) best = { divide, error };
    }
    if (!best) return { error: '`divide` allows no value' };
    const achieved = search.measure === 'frequency' ? best.error : 1 / (1 + best.error) - 1;
    return { values: { divide: best.divide }, error: Math.abs(achieved) < 1e-12 ? 0 : achieved };
  },
};
