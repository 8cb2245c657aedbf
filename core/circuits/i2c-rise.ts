// I²C bus rise time through the pull-up (I²C-bus specification UM10204): the open-drain line is released and
// the bus capacitance charges through the pull-up resistor; the rise time is taken from 30 % to 70 % of the supply.
import type { CircuitModel, ModelInput, ModelIssue, RegisterSearch, RegisterSearchFailure, RegisterSearchResult, Waveform, WorkingLine } from './model';
import { capacitor, checkPositive, eng, finiteOnly, quantity, resistor, voltage } from './common';
import { neighboursInSeries, parseSeriesName } from '../series';
import { Code } from '../codes';

const source = 'I²C-bus specification (UM10204), rise time and pull-up sizing';

/** ln(7/3): an RC edge takes τ·ln(0.7/0.3) from 30 % to 70 %; the specification rounds it to 0.8473. */
export const riseFactor = Math.log(7 / 3);

/** Per mode: the rise-time limit, the largest bus capacitance and the low-level current at VOL (UM10204). */
export const i2cModes = {
  standard: { riseLimit: 1000e-9, busLimit: 400e-12, iol: 3e-3, label: 'Standard-mode (100 kbit/s)' },
  fast: { riseLimit: 300e-9, busLimit: 400e-12, iol: 3e-3, label: 'Fast-mode (400 kbit/s)' },
  'fast-plus': { riseLimit: 120e-9, busLimit: 550e-12, iol: 20e-3, label: 'Fast-mode Plus (1 Mbit/s)' },
} as const;

type Mode = keyof typeof i2cModes;

function modeOf(input: ModelInput): (typeof i2cModes)[Mode] {
  return i2cModes[(input.choices.mode as Mode) in i2cModes ? (input.choices.mode as Mode) : 'fast'];
}

function iolOf(input: ModelInput): number {
  const iol = input.values.iol;
  return iol !== undefined && Number.isFinite(iol) ? iol : modeOf(input).iol;
}

/** Pull-up bounds: the driver must sink the current at VOL; the edge must meet the mode's rise time. */
function bounds(input: ModelInput): { min: number; max: number } {
  const { supply, vol } = input.values;
  return { min: (supply - vol) / iolOf(input), max: modeOf(input).riseLimit / (riseFactor * input.values['bus-c']) };
}

export const i2cRise: CircuitModel = {
  id: 'i2c-rise',
  title: 'I²C rise time and pull-up',
  summary: 'An I²C line\'s rise time from its pull-up and bus capacitance, and the pull-up range each mode allows (I²C-bus specification); `pullup: ?` picks the series value.',
  assumptions: [
    'The line rises as an RC edge through the pull-up alone (no current-source pull-up or bus buffer); rise time from 30 % to 70 % of the supply, t = ln(7/3)·R·C ≈ 0.8473·R·C.',
    'bus-c is the whole capacitance of the line: wiring, connectors and every device\'s pin.',
    'pullup-min keeps the low level at or below vol while a device sinks iol; pullup-max keeps the rise within the mode\'s limit.',
    'mode standard: rise ≤ 1000 ns, bus ≤ 400 pF, 3 mA at 0.4 V.',
    'mode fast: rise ≤ 300 ns, bus ≤ 400 pF, 3 mA at 0.4 V.',
    'mode fast-plus: rise ≤ 120 ns, bus ≤ 550 pF, 20 mA at 0.4 V.',
  ],
  params: [
    voltage('supply', 'pull-up supply', 'Voltage the pull-up resistor returns to (VDD).'),
    resistor('pullup', 'pull-up resistor', 'Pull-up resistor of the line; `?` picks the largest series value within the bounds.'),
    capacitor('bus-c', 'bus capacitance', 'Total capacitance of the line (wiring and pins).'),
    { kind: 'choice', key: 'mode', label: 'bus mode', options: ['standard', 'fast', 'fast-plus'], default: 'fast', description: 'Speed mode of the I²C-bus specification: its rise-time and bus-capacitance limits.' },
    voltage('vol', 'low-level output voltage', 'Largest low level a device must pull the line to.', { default: 0.4, defaultText: '0.4 V', min: 0 }),
    quantity('iol', 'low-level output current', 'A', 'Current a device sinks at vol.', { optional: true, defaultText: '3 mA; 20 mA in fast-plus', min: Number.MIN_VALUE }),
  ],
  results: [
    { key: 'rise', label: 'rise time (30 % → 70 %)', dim: 's' },
    { key: 'pullup-min', label: 'smallest pull-up (sink current at vol)', dim: 'Ω' },
    { key: 'pullup-max', label: 'largest pull-up (rise-time limit)', dim: 'Ω' },
  ],
  headline: ['rise', 'pullup-min', 'pullup-max'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['supply', 'pullup', 'bus-c'], issues)) return issues;
    const { supply, vol } = input.values;
    if (!(vol >= 0 && vol < supply)) return [{ key: 'vol', message: `vol ${eng(vol, 'V')} must lie between 0 V and the supply ${eng(supply, 'V')}` }];
    if (input.values.iol !== undefined && !(input.values.iol > 0)) return [{ key: 'iol', message: '`iol` must be greater than zero' }];
    const mode = modeOf(input);
    const busC = input.values['bus-c'];
    if (busC > mode.busLimit) {
      issues.push({ key: 'bus-c', severity: 'warning', code: Code.busLimit, message: `bus capacitance ${eng(busC, 'F')} is above the ${eng(mode.busLimit, 'F')} of ${mode.label} (I²C-bus specification)` });
    }
    const { rise } = i2cRise.compute(input);
    if (rise > mode.riseLimit * (1 + 1e-12)) {
      issues.push({ key: 'pullup', severity: 'warning', code: Code.busLimit, message: `rise time ${eng(rise, 's')} exceeds the ${eng(mode.riseLimit, 's')} of ${mode.label}: use a pull-up of at most ${eng(bounds(input).max, 'Ω')}` });
    }
    const least = bounds(input).min;
    if (input.values.pullup < least * (1 - 1e-12)) {
      issues.push({ key: 'pullup', severity: 'warning', code: Code.busLimit, message: `pull-up ${eng(input.values.pullup, 'Ω')} is below ${eng(least, 'Ω')}: a device sinking ${eng(iolOf(input), 'A')} cannot pull the line down to ${eng(vol, 'V')}` });
    }
    return issues;
  },

  compute(input) {
    const b = bounds(input);
    return finiteOnly({ rise: riseFactor * input.values.pullup * input.values['bus-c'], 'pullup-min': b.min, 'pullup-max': b.max });
  },

  working(input, results) {
    const { supply, vol, pullup } = input.values;
    const busC = input.values['bus-c'];
    const mode = modeOf(input);
    const lines: WorkingLine[] = [
      { formula: 'rise = ln(7/3) · pullup · bus-c', substituted: `rise = 0.8473 · ${eng(pullup, 'Ω')} · ${eng(busC, 'F')} = ${eng(results.rise, 's')}`, source },
      { formula: 'pullup-min = (supply − vol) / iol', substituted: `pullup-min = (${eng(supply, 'V')} − ${eng(vol, 'V')}) / ${eng(iolOf(input), 'A')} = ${eng(results['pullup-min'], 'Ω')}`, source },
      { formula: 'pullup-max = rise limit / (ln(7/3) · bus-c)', substituted: `pullup-max = ${eng(mode.riseLimit, 's')} / (0.8473 · ${eng(busC, 'F')}) = ${eng(results['pullup-max'], 'Ω')}`, source },
    ];
    return lines;
  },

  waveform(input) {
    const { supply, pullup } = input.values;
    const tau = pullup * input.values['bus-c'];
    const duration = Math.max(5 * tau, modeOf(input).riseLimit * 1.5);
    const points: Array<[number, number]> = [];
    for (let i = 0; i <= 200; i++) {
      const t = (duration * i) / 200;
      points.push([t, supply * (1 - Math.exp(-t / tau))]);
    }
    const finite = points.filter(([t, v]) => Number.isFinite(t) && Number.isFinite(v));
    const wave: Waveform = {
      traces: [{ name: 'line (released at 0)', dim: 'V', points: finite }],
      levels: [
        { label: '30 %', value: 0.3 * supply },
        { label: '70 %', value: 0.7 * supply },
      ],
      duration,
    };
    return wave;
  },

  searchWithoutTarget: true,

  search(input, search: RegisterSearch): RegisterSearchResult | RegisterSearchFailure {
    const unknown = search.unknowns[0];
    if (search.unknowns.length !== 1 || (unknown !== 'pullup' && unknown !== 'bus-c')) return { error: 'i2c-rise solves `pullup: ?` (or `bus-c: ?` with a target rise)' };
    const { supply, vol } = input.values;
    const busC = input.values['bus-c'];
    if (unknown === 'bus-c') {
      if (search.measure !== 'rise' || !(input.values.pullup > 0)) return { error: '`bus-c: ?` needs `pullup` and a target rise time (`target: 300 ns`)' };
      const exact = search.target / (riseFactor * input.values.pullup);
      return { values: { 'bus-c': exact }, error: 0 };
    }
    if (!(supply > 0) || !(busC > 0) || !(vol >= 0 && vol < supply)) return { error: '`pullup: ?` needs `supply`, `bus-c` and a `vol` below the supply' };
    const series = parseSeriesName(search.series ?? 'E24') ?? 'E24';
    if (search.measure === 'rise') {
      const exact = search.target / (riseFactor * busC);
      const value = series === 'none' ? exact : neighboursInSeries(exact, series).below;
      return { values: { pullup: value }, exact: { pullup: exact }, ...(series === 'none' ? {} : { series }), error: (riseFactor * value * busC) / search.target - 1 };
    }
    if (search.measure) return { error: `\`pullup: ?\` takes a target rise time, or no target; not ${search.measure}` };
    const b = bounds({ ...input, values: { ...input.values, pullup: 1 } });
    const value = series === 'none' ? b.max : neighboursInSeries(b.max, series).below;
    if (!(value >= b.min * (1 - 1e-12))) {
      return { error: `no ${series === 'none' ? '' : `${series} `}pull-up fits between ${eng(b.min, 'Ω')} (sink current) and ${eng(b.max, 'Ω')} (rise time): lower the bus capacitance, use a current-source pull-up or a slower mode` };
    }
    return {
      values: { pullup: value },
      exact: { pullup: b.max },
      ...(series === 'none' ? {} : { series }),
      error: 0,
      note: `the largest ${series === 'none' ? 'value' : `${series} value`} within ${eng(b.min, 'Ω')} … ${eng(b.max, 'Ω')} (slowest edge the mode allows, least current)`,
    };
  },
};
