// UART baud-rate generator: rate = clock / (oversampling · divisor), error against the wanted rate.
// Without `divisor` the nearest whole divisor (at least 1) is used, as integer divisor UARTs do
// (the register often holds the ratio − 1); give `divisor` for fractional baud-rate generators.
import type { CircuitModel, ModelInput, ModelIssue, WorkingLine } from './model';
import { Code } from '../codes';
import { formatBaud } from '../format';
import { checkPositive, eng, finiteOnly, percent, quantity, hasErrors } from './common';

const source = 'UART baud-rate generator arithmetic (rate = clock / (oversampling · divisor)), common practice';

/** Usual ceiling for the total rate mismatch of an 8-N-1 link, from memory (common practice): ±2 %. */
const usualErrorLimit = 0.02;

function divisorUsed(input: ModelInput): number {
  const { clock, baud, oversampling, divisor } = input.values;
  if (divisor !== undefined && Number.isFinite(divisor)) return divisor;
  return Math.max(1, Math.round(clock / (oversampling * baud)));
}

function rates(input: ModelInput): Record<string, number> {
  const { clock, baud, oversampling } = input.values;
  const divisor = divisorUsed(input);
  const actual = clock / (oversampling * divisor);
  return { baud: actual, error: actual / baud - 1, divisor };
}

export const baud: CircuitModel = {
  id: 'baud',
  title: 'UART baud rate',
  summary: 'A UART baud-rate divisor: the rate a clock, oversampling and divisor really give, and its error against the wanted rate.',
  assumptions: [
    'divisor is the whole division ratio after oversampling (a register that holds ratio − 1 must be converted); it may be fractional for fractional generators.',
    'Without `divisor`, the nearest whole divisor of at least 1 is used.',
    'A clock written without a tolerance is taken as exact; give it one, or reference a clock block, and its tolerance enters the error band.',
  ],
  params: [
    quantity('clock', 'UART clock', 'Hz', 'Clock into the baud-rate generator.'),
    quantity('baud', 'wanted baud rate', 'baud', 'Baud rate the link expects.'),
    quantity('oversampling', 'oversampling', '', 'Clocks per bit in the receiver (16 normal, 8 double speed).', { default: 16, defaultText: '16', integer: true, min: 1 }),
    quantity('divisor', 'divisor', '', 'Division ratio of the baud-rate generator; may be fractional.', { optional: true, register: true }),
  ],
  results: [
    { key: 'baud', label: 'actual baud rate', dim: 'baud' },
    { key: 'error', label: 'rate error', dim: '', percent: true },
    { key: 'divisor', label: 'divisor used', dim: '' },
  ],
  headline: ['baud', 'error'],

  validate(input) {
    const issues: ModelIssue[] = [];
    checkPositive(input, ['clock', 'baud', 'oversampling'], issues);
    const divisor = input.values.divisor;
    if (divisor !== undefined && !(Number.isFinite(divisor) && divisor > 0)) {
      issues.push({ key: 'divisor', message: `divisor must be greater than zero (got ${divisor})` });
    }
    // `baud:` states the wanted rate, so a divisor that misses it is a stale claim like any other: a warning.
    if (!hasErrors(issues)) {
      const { error } = rates(input);
      if (Math.abs(error) > usualErrorLimit) {
        issues.push({
          key: input.values.divisor !== undefined ? 'divisor' : 'baud',
          severity: 'warning',
          code: Code.rateError,
          message: `rate error ${percent(error)} is beyond the ±2 % an 8-N-1 link usually tolerates between both ends (common practice)`,
        });
      }
    }
    return issues;
  },

  compute: (input) => finiteOnly(rates(input)),

  working(input, results) {
    const { clock, baud: wanted, oversampling } = input.values;
    const given = input.values.divisor !== undefined;
    const lines: WorkingLine[] = [];
    if (!given) {
      lines.push({
        formula: 'divisor = round(clock / (oversampling · baud))',
        substituted: `divisor = round(${eng(clock, 'Hz')} / (${oversampling} · ${formatBaud(wanted)})) = round(${(clock / (oversampling * wanted)).toPrecision(6)}) = ${results.divisor}`,
        source,
      });
    }
    lines.push(
      {
        formula: 'rate = clock / (oversampling · divisor)',
        substituted: `rate = ${eng(clock, 'Hz')} / (${oversampling} · ${results.divisor}) = ${formatBaud(results.baud)}`,
        source,
      },
      { formula: 'error = rate / baud − 1', substituted: `error = ${formatBaud(results.baud)} / ${formatBaud(wanted)} − 1 = ${percent(results.error)}`, source },
    );
    return lines;
  },
};
