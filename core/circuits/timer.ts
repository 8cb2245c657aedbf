// MCU timer: a counter clocked at clock/prescaler that wraps at the reload (period) register.
import type { CircuitModel, ModelInput, ModelIssue, RegisterSearch, Waveform } from './model';
import { Code } from '../codes';
import { checkPositive, eng, finiteOnly, percent, quantity } from './common';
import { anyPrescaler, normaliseSet, setContains, setText } from './integer-set';
import { searchTimerRegisters, ticksPerPeriod, type CountMode } from './timer-search';
import { clampCycles, finitePoints } from './segments';

const source = 'counter arithmetic of a reload timer (period = prescaler · ticks / clock), common practice';
const dutySource = 'edge-aligned PWM: output active while the count is below compare; centre-aligned counts compare twice per period (common practice)';

function mode(input: ModelInput): CountMode {
  return input.choices.mode === 'up-down' ? 'up-down' : 'up';
}

function hasCompare(input: ModelInput): boolean {
  return input.values.compare !== undefined && Number.isFinite(input.values.compare);
}

/** Up: duty = compare/(reload + 1); up-down (centre-aligned): compare/reload. Capped at 100 %. */
function duty(input: ModelInput): number {
  const ticks = ticksPerPeriod(mode(input), input.values.reload);
  const active = mode(input) === 'up' ? input.values.compare : 2 * input.values.compare;
  return Math.min(1, Math.max(0, active / ticks));
}

export const timer: CircuitModel = {
  id: 'timer',
  title: 'MCU timer (prescaler and reload)',
  summary: 'A hardware timer: clock divided by the prescaler, counting to the reload value, with an optional compare for PWM duty.',
  assumptions: [
    'mode up: the counter runs 0 … reload, so a period is reload + 1 ticks of clock/prescaler; duty = compare/(reload + 1), output active while the count is below compare.',
    'mode up-down: 0 → reload → 0, a period of 2·reload ticks; duty = compare/reload (centre-aligned PWM).',
    'prescaler is the division ratio itself (a register that holds ratio − 1 must be converted); a clock written without a tolerance is taken as exact.',
  ],
  params: [
    quantity('clock', 'timer input clock', 'Hz', 'Clock into the prescaler.'),
    quantity('prescaler', 'prescaler division ratio', '', 'Division ratio of the prescaler (1 = undivided).', { integer: true, min: 1, solvable: true }),
    quantity('reload', 'reload (period) register', '', 'Top count of the counter; a period is reload + 1 ticks counting up.', { integer: true, min: 0, solvable: true }),
    { kind: 'choice', key: 'mode', label: 'counting mode', options: ['up', 'up-down'], default: 'up', description: 'up: 0 … reload then wrap; up-down: 0 → reload → 0.' },
    quantity('compare', 'compare register', '', 'Compare value for PWM; gives the duty.', { integer: true, min: 0, optional: true }),
    quantity('bits', 'counter width', '', 'Width of the counter and reload register, bits.', { default: 16, defaultText: '16', integer: true, min: 1, max: 53 }),
    { kind: 'list', key: 'prescalers', label: 'allowed prescaler ratios', defaultText: 'any of 1..65536', description: 'Division ratios the prescaler offers: a list (1, 8, 64, 256, 1024) or a range (1..65536).' },
  ],
  results: [
    { key: 'period', label: 'period', dim: 's' },
    { key: 'frequency', label: 'frequency', dim: 'Hz' },
    { key: 'duty', label: 'duty', dim: '', percent: true, optional: true },
    { key: 'counts', label: 'clock ticks per period (after the prescaler)', dim: '' },
  ],
  headline: ['frequency', 'period', 'duty'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['clock'], issues)) return issues;
    const { prescaler, reload, bits } = input.values;
    if (!(Number.isInteger(bits) && bits >= 1 && bits <= 53)) {
      issues.push({ key: 'bits', code: Code.registerRange, message: `bits must be a whole number from 1 to 53 (got ${bits})` });
      return issues;
    }
    const prescalers = normaliseSet(input.lists.prescalers ?? anyPrescaler);
    if (!(Number.isInteger(prescaler) && prescaler >= 1)) {
      issues.push({ key: 'prescaler', code: Code.registerRange, message: `prescaler must be a whole division ratio of 1 or more (got ${prescaler})` });
    } else if (!setContains(prescalers, prescaler)) {
      issues.push({ key: 'prescaler', code: Code.registerRange, message: `prescaler ${prescaler} is not one of the allowed ratios (${setText(prescalers)})` });
    }
    const top = 2 ** bits - 1;
    const least = mode(input) === 'up' ? 0 : 1;
    if (!Number.isInteger(reload)) {
      issues.push({ key: 'reload', code: Code.registerRange, message: `reload must be a whole number (got ${reload})` });
    } else if (reload < least || reload > top) {
      issues.push({ key: 'reload', code: Code.registerRange, message: `reload ${reload} is outside ${least}..${top} for a ${bits}-bit ${mode(input)} counter` });
    }
    if (hasCompare(input)) {
      const compare = input.values.compare;
      const full = mode(input) === 'up' ? reload + 1 : reload;
      if (!Number.isInteger(compare) || compare < 0) {
        issues.push({ key: 'compare', code: Code.registerRange, message: `compare must be a whole number of 0 or more (got ${compare})` });
      } else if (Number.isInteger(reload) && compare > full) {
        issues.push({ key: 'compare', severity: 'warning', code: Code.registerRange, message: `compare ${compare} is beyond the period (${full}): the output stays active, duty 100 %` });
      }
    }
    return issues;
  },

  compute(input) {
    const { clock, prescaler, reload } = input.values;
    const counts = ticksPerPeriod(mode(input), reload);
    const period = (prescaler * counts) / clock;
    const results: Record<string, number> = { period, frequency: 1 / period, counts };
    if (hasCompare(input)) results.duty = duty(input);
    return finiteOnly(results);
  },

  working(input, results) {
    const { clock, prescaler, reload, compare } = input.values;
    const up = mode(input) === 'up';
    const lines = [
      {
        formula: up ? 'T = prescaler · (reload + 1) / clock' : 'T = prescaler · 2·reload / clock',
        substituted: `T = ${prescaler} · ${up ? `(${reload} + 1)` : `2·${reload}`} / ${eng(clock, 'Hz')} = ${eng(results.period, 's')} (f = ${eng(results.frequency, 'Hz')})`,
        source,
      },
    ];
    if (results.duty !== undefined) {
      lines.push({
        formula: up ? 'duty = compare / (reload + 1)' : 'duty = compare / reload',
        substituted: `duty = ${compare} / ${up ? reload + 1 : reload} = ${percent(results.duty)}`,
        source: dutySource,
      });
    }
    return lines;
  },

  waveform: timerWaveform,


  search(input, search: RegisterSearch) {
    if (search.measure !== 'frequency' && search.measure !== 'period') {
      return { error: `a timer search needs a target frequency or period, not ${search.measure}` };
    }
    const known = (key: string) => (search.unknowns.includes(key) ? undefined : input.values[key]);
    return searchTimerRegisters({
      clock: input.values.clock,
      mode: mode(input),
      bits: input.values.bits ?? 16,
      prescalers: input.lists.prescalers ?? anyPrescaler,
      prescaler: known('prescaler'),
      reload: known('reload'),
      measure: search.measure,
      target: search.target,
    });
  },
};

/** Counter as a staircase when few ticks are drawn, as straight ramps otherwise; output only with compare. */
function timerWaveform(input: ModelInput, cycles: number): Waveform {
  const { clock, prescaler, reload } = input.values;
  const tick = prescaler / clock;
  const n = clampCycles(cycles);
  const up = mode(input) === 'up';
  const ticks = ticksPerPeriod(mode(input), reload);
  const stairs = ticks * n <= 400;
  const counter: Array<[number, number]> = [];
  const output: Array<[number, number]> = [];
  const compare = hasCompare(input) ? input.values.compare : undefined;
  for (let k = 0; k < n; k++) {
    const t0 = k * ticks * tick;
    const countAt = (i: number) => (up ? i : i <= reload ? i : 2 * reload - i);
    if (stairs) {
      for (let i = 0; i < ticks; i++) counter.push([t0 + i * tick, countAt(i)], [t0 + (i + 1) * tick, countAt(i)]);
    } else if (up) {
      counter.push([t0, 0], [t0 + reload * tick, reload], [t0 + ticks * tick, reload]);
    } else {
      counter.push([t0, 0], [t0 + reload * tick, reload], [t0 + ticks * tick, 0]);
    }
    if (compare !== undefined) {
      const period = ticks * tick;
      const active = Math.min(ticks, up ? compare : 2 * compare) * tick;
      // Active while the count is below compare: at the start counting up, and for up-down again at the end.
      if (up) output.push([t0, 1], [t0 + active, 1], [t0 + active, 0], [t0 + period, 0]);
      else {
        const rise = t0 + period - active / 2;
        output.push([t0, 1], [t0 + active / 2, 1], [t0 + active / 2, 0], [rise, 0], [rise, 1], [t0 + period, 1]);
      }
    }
  }
  const levels = [{ label: 'reload', value: reload }];
  if (compare !== undefined) levels.push({ label: 'compare', value: compare });
  const traces = [{ name: 'counter', dim: '' as const, points: finitePoints(counter) }];
  if (compare !== undefined) traces.push({ name: 'output', dim: '' as const, points: finitePoints(output) });
  return { traces, levels, duration: n * ticks * tick };
}
