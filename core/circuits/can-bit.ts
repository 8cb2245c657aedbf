// CAN bit timing (ISO 11898-1): prescaler and segments in time quanta → bit rate, sample point, tolerance.
import type { CircuitModel, IntegerSet, ModelInput, ModelIssue, RegisterSearch, Waveform, WorkingLine } from './model';
import { checkPositive, checkWhole, eng, finiteOnly, hasErrors, percent, quantity } from './common';
import { classicLimits, nominalBitTime, oscillatorTolerance, samplePoint, type BitSegments } from './can-timing';
import { canDefaultSets, searchCanTiming } from './can-search';
import { clampCycles, finitePoints } from './segments';
import { Code } from '../codes';

const source = 'ISO 11898-1, bit timing (NBT = 1 + prop-seg + phase-seg1 + phase-seg2 quanta, tq = prescaler / clock)';
const toleranceSource = 'ISO 11898-1, oscillator tolerance conditions';

function has(input: ModelInput, key: string): boolean {
  return input.values[key] !== undefined && Number.isFinite(input.values[key]);
}

/** The segments as written: prop-seg and phase-seg1, or tseg1 (split when one of the two is given too). */
export function segmentsOf(input: ModelInput): BitSegments | { key: string; message: string } {
  const v = input.values;
  const phase2 = v['phase-seg2'];
  if (has(input, 'tseg1')) {
    const tseg1 = v.tseg1;
    const prop = has(input, 'prop-seg') ? v['prop-seg'] : undefined;
    const given1 = has(input, 'phase-seg1') ? v['phase-seg1'] : undefined;
    if (prop !== undefined && given1 !== undefined && prop + given1 !== tseg1) {
      return { key: 'tseg1', message: `tseg1 ${tseg1} is not prop-seg + phase-seg1 (${prop} + ${given1}): give tseg1 or the two segments` };
    }
    const phase1 = given1 ?? (prop !== undefined ? tseg1 - prop : undefined);
    if (phase1 !== undefined && phase1 < 1) return { key: 'prop-seg', message: `prop-seg ${prop} leaves no phase-seg1 within tseg1 ${tseg1}` };
    return { prop: prop ?? (phase1 !== undefined ? tseg1 - phase1 : undefined), phase1, tseg1, phase2 };
  }
  if (!has(input, 'prop-seg') || !has(input, 'phase-seg1')) {
    return { key: has(input, 'prop-seg') ? 'phase-seg1' : 'prop-seg', message: 'can-bit needs `prop-seg` and `phase-seg1` (or their sum `tseg1`)' };
  }
  return { prop: v['prop-seg'], phase1: v['phase-seg1'], tseg1: v['prop-seg'] + v['phase-seg1'], phase2 };
}

function isSegments(s: ReturnType<typeof segmentsOf>): s is BitSegments {
  return !('message' in s);
}

function clockBand(input: ModelInput): number {
  const band = input.tolerances?.clock;
  return band ? Math.max(band.plus, band.minus) : 0;
}

export const canBit: CircuitModel = {
  id: 'can-bit',
  title: 'CAN bit timing',
  summary: 'CAN bit timing (ISO 11898-1): bit rate, sample point, time quantum and the oscillator tolerance the bus survives; `?` searches the prescaler and segments.',
  assumptions: [
    'Classic CAN nominal bit timing: a bit is 1 (sync) + prop-seg + phase-seg1 + phase-seg2 time quanta; tq = prescaler / clock.',
    'tseg1 stands for prop-seg + phase-seg1 (one register field in many controllers); the tolerance needs phase-seg1, so give prop-seg or phase-seg1 beside it.',
    'tolerance is the largest clock deviation each node may have, by the two conditions of ISO 11898-1 (resynchronisation with sjw; sampling after an error frame).',
    'A search keeps the exact bit rate first, then the sample point nearest `sample-point:` (87.5 % by default, common practice for classic CAN), then the larger tolerance and more quanta.',
    'The propagation delay of the bus and transceivers is not checked against prop-seg.',
  ],
  params: [
    quantity('clock', 'CAN controller clock', 'Hz', 'Clock into the bit-rate prescaler, with its tolerance (`16 MHz ±50 ppm`).'),
    quantity('prescaler', 'bit-rate prescaler', '', 'Division ratio from the clock to one time quantum.', { integer: true, min: 1, solvable: true }),
    quantity('prop-seg', 'propagation segment', '', 'Propagation segment, time quanta.', { integer: true, min: 1, optional: true, solvable: true, template: true }),
    quantity('phase-seg1', 'phase segment 1', '', 'Phase buffer segment 1 (before the sample point), time quanta.', { integer: true, min: 1, optional: true, solvable: true, template: true }),
    quantity('phase-seg2', 'phase segment 2', '', 'Phase buffer segment 2 (after the sample point), time quanta.', { integer: true, min: 1, solvable: true }),
    quantity('tseg1', 'time segment 1 (prop-seg + phase-seg1)', '', 'prop-seg + phase-seg1 as one number, as many controllers\' registers hold it.', { integer: true, min: 2, optional: true, solvable: true }),
    quantity('sjw', 'synchronisation jump width', '', 'Resynchronisation jump width, time quanta.', { default: 1, defaultText: '1', integer: true, min: 1 }),
    quantity('sample-point', 'wanted sample point', '', 'Sample point a search aims for (87.5 % is common practice for classic CAN).', { default: 0.875, defaultText: '87.5 %', min: 0, max: 1 }),
  ],
  results: [
    { key: 'bitrate', label: 'bit rate', dim: 'bit/s' },
    { key: 'sample-point', label: 'sample point', dim: '', percent: true },
    { key: 'tq', label: 'time quantum', dim: 's' },
    { key: 'tolerance', label: 'tolerable clock deviation (ISO 11898-1)', dim: '', percent: true, optional: true },
    { key: 'nbt', label: 'time quanta per bit', dim: '' },
  ],
  headline: ['bitrate', 'sample-point', 'tolerance'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['clock', 'prescaler', 'phase-seg2', 'sjw'], issues)) return issues;
    // Hard bounds of the arithmetic (wider than any controller); ISO's classic ranges are warnings below.
    const whole: Array<[string, number, number]> = [['prescaler', 1, 1 << 20], ['prop-seg', 1, 1024], ['phase-seg1', 1, 1024], ['phase-seg2', 1, 1024], ['tseg1', 2, 2048], ['sjw', 1, 1024]];
    if (!whole.every(([key, min, max]) => checkWhole(input, key, min, max, issues))) return issues;
    const sp = input.values['sample-point'];
    if (sp !== undefined && !(sp > 0 && sp < 1)) return [...issues, { key: 'sample-point', message: `the wanted sample point must lie between 0 and 100 % (got ${percent(sp)})` }];
    const segments = segmentsOf(input);
    if (!isSegments(segments)) return [...issues, segments];
    issues.push(...classicWarnings(input, segments));
    if (hasErrors(issues)) return issues;
    const results = canBit.compute(input);
    if (segments.phase1 === undefined) {
      issues.push({ key: 'tseg1', severity: 'info', message: 'the tolerable clock deviation needs `prop-seg` or `phase-seg1` beside `tseg1` to split it' });
    }
    const band = clockBand(input);
    if (results.tolerance !== undefined && band > results.tolerance) {
      issues.push({
        key: 'clock',
        severity: 'warning',
        code: Code.clockTolerance,
        message: `the clock's tolerance ±${percent(band)} exceeds the ±${percent(results.tolerance)} this bit timing tolerates (ISO 11898-1): nodes may lose synchronisation`,
      });
    }
    return issues;
  },

  compute(input) {
    const segments = segmentsOf(input);
    if (!isSegments(segments)) return {};
    const { clock, prescaler, sjw } = input.values;
    const nbt = nominalBitTime(segments);
    const tq = prescaler / clock;
    const results: Record<string, number> = { bitrate: 1 / (nbt * tq), 'sample-point': samplePoint(segments), tq, nbt };
    const tolerance = oscillatorTolerance(segments, sjw);
    if (tolerance) results.tolerance = tolerance.tolerance;
    return finiteOnly(results);
  },

  working(input, results) {
    const segments = segmentsOf(input);
    if (!isSegments(segments)) return [];
    const { clock, prescaler, sjw } = input.values;
    const nbt = nominalBitTime(segments);
    const split = segments.prop !== undefined ? `${segments.prop} + ${segments.phase1}` : `${segments.tseg1}`;
    const lines: WorkingLine[] = [
      { formula: 'tq = prescaler / clock', substituted: `tq = ${prescaler} / ${eng(clock, 'Hz')} = ${eng(results.tq, 's')}`, source },
      { formula: 'NBT = 1 + prop-seg + phase-seg1 + phase-seg2', substituted: `NBT = 1 + ${split} + ${segments.phase2} = ${nbt} tq`, source },
      { formula: 'bitrate = 1 / (NBT · tq)', substituted: `bitrate = 1 / (${nbt} · ${eng(results.tq, 's')}) = ${eng(results.bitrate, 'bit/s')}`, source },
      { formula: 'sample point = (1 + prop-seg + phase-seg1) / NBT', substituted: `sample point = (1 + ${split}) / ${nbt} = ${percent(results['sample-point'])}`, source },
    ];
    const tolerance = oscillatorTolerance(segments, sjw);
    if (tolerance) {
      lines.push({
        formula: 'df ≤ min(sjw / (20 · NBT), min(phase-seg1, phase-seg2) / (2 · (13 · NBT − phase-seg2)))',
        substituted: `df ≤ min(${sjw} / (20 · ${nbt}), ${Math.min(segments.phase1!, segments.phase2)} / (2 · (13 · ${nbt} − ${segments.phase2}))) = min(${percent(tolerance.resync)}, ${percent(tolerance.sampling)}) = ${percent(tolerance.tolerance)}`,
        source: toleranceSource,
      });
    }
    return lines;
  },

  waveform: canWaveform,

  search(input, search: RegisterSearch) {
    if (search.measure !== 'bitrate') return { error: `a CAN bit-timing search needs a target bit rate (\`target: 500 kbit/s\`), not ${search.measure || 'none'}` };
    const unknown = new Set(search.unknowns);
    const usesTseg1 = unknown.has('tseg1') || has(input, 'tseg1');
    const keys = ['prescaler', 'phase-seg2', ...(usesTseg1 ? ['tseg1'] : []), 'prop-seg', 'phase-seg1'] as const;
    const sets: Partial<Record<(typeof keys)[number], IntegerSet>> = {};
    for (const key of keys) {
      if (unknown.has(key)) sets[key] = search.allowed?.[key] ?? canDefaultSets[key];
      else if (has(input, key)) sets[key] = { kind: 'list', values: [input.values[key]] };
    }
    if (!sets['phase-seg2'] || !sets.prescaler) return { error: 'the search needs `prescaler` and `phase-seg2` (a value or `?`)' };
    if (!usesTseg1 && (!sets['prop-seg'] || !sets['phase-seg1'])) return { error: 'the search needs `prop-seg` and `phase-seg1` (a value or `?`), or `tseg1`' };
    const explicit = search.unknowns.some((k) => k !== 'prescaler' && search.allowed?.[k]);
    const found = searchCanTiming({
      clock: input.values.clock,
      bitrate: search.target,
      samplePoint: input.values['sample-point'] ?? 0.875,
      sjw: input.values.sjw ?? 1,
      sets,
      classicBitTime: !explicit,
    });
    if ('values' in found) found.values = Object.fromEntries(search.unknowns.map((k) => [k, found.values[k]]));
    return found;
  },
};

/** Warnings outside ISO 11898-1's classic ranges (from memory); controllers for CAN FD go further. */
function classicWarnings(input: ModelInput, s: BitSegments): ModelIssue[] {
  const issues: ModelIssue[] = [];
  const nbt = nominalBitTime(s);
  const outside = (value: number | undefined, r: { min: number; max: number }) => value !== undefined && (value < r.min || value > r.max);
  const warn = (key: string, message: string) => issues.push({ key, severity: 'warning', code: Code.registerRange, message: `${message} (ISO 11898-1 classic CAN, from memory)` });
  if (outside(nbt, classicLimits.nbt)) warn(has(input, 'tseg1') ? 'tseg1' : 'prop-seg', `${nbt} time quanta per bit is outside 8–25`);
  if (outside(s.prop, classicLimits.prop) && has(input, 'prop-seg')) warn('prop-seg', `prop-seg ${s.prop} is outside 1–8`);
  if (outside(s.phase1, classicLimits.phase1) && has(input, 'phase-seg1')) warn('phase-seg1', `phase-seg1 ${s.phase1} is outside 1–8`);
  if (outside(s.phase2, classicLimits.phase2)) warn('phase-seg2', `phase-seg2 ${s.phase2} is outside 2–8`);
  const sjw = input.values.sjw;
  const sjwMax = Math.min(4, s.phase1 ?? Infinity, s.phase2);
  if (sjw > sjwMax) warn('sjw', `sjw ${sjw} is above min(4, phase-seg1, phase-seg2) = ${sjwMax}`);
  return issues;
}

/** The quantum count through each bit as a staircase; the segment ends and the sample point as levels. */
function canWaveform(input: ModelInput, cycles: number): Waveform {
  const segments = segmentsOf(input);
  if (!isSegments(segments)) return { traces: [], levels: [], duration: 0 };
  const tq = input.values.prescaler / input.values.clock;
  const nbt = nominalBitTime(segments);
  // A few thousand quanta at most: enough bits to see, never a runaway drawing.
  const n = Math.max(1, Math.min(clampCycles(cycles), 20, Math.floor(2000 / nbt)));
  const quanta: Array<[number, number]> = [];
  const sample: Array<[number, number]> = [];
  const sampleAt = (1 + segments.tseg1) * tq;
  for (let bit = 0; bit < n; bit++) {
    const t0 = bit * nbt * tq;
    for (let q = 0; q < nbt; q++) quanta.push([t0 + q * tq, q], [t0 + (q + 1) * tq, q]);
    sample.push([t0, 0], [t0 + sampleAt, 0], [t0 + sampleAt, 1], [t0 + sampleAt + tq / 4, 1], [t0 + sampleAt + tq / 4, 0], [t0 + nbt * tq, 0]);
  }
  const levels = [{ label: 'sync ends', value: 1 }];
  if (segments.prop !== undefined) levels.push({ label: 'prop-seg ends', value: 1 + segments.prop });
  levels.push({ label: `sample point ${percent(samplePoint(segments))}`, value: 1 + segments.tseg1 }, { label: 'bit ends', value: nbt });
  return {
    traces: [
      { name: 'time quantum', dim: '', points: finitePoints(quanta) },
      { name: 'sample', dim: '', points: finitePoints(sample) },
    ],
    levels,
    duration: n * nbt * tq,
  };
}
