// Independent watchdog: a down-counter clocked at clock / prescaler from reload; a refresh reloads it, and
// reaching zero resets the system. A window watchdog also refuses a refresh while the count is above `window`.
import type { CircuitModel, ModelInput, ModelIssue, Waveform, WorkingLine } from './model';
import { checkPositive, checkWhole, eng, finiteOnly, hasErrors, percent, quantity } from './common';
import { clampCycles, finitePoints } from './segments';
import { Code } from '../codes';

const source = 'down-counter arithmetic: timeout = prescaler · (reload + 1) / clock, common practice';
const windowSource = 'window watchdog: a refresh is accepted once the count has fallen below window (common practice)';

function has(input: ModelInput, key: string): boolean {
  return input.values[key] !== undefined && Number.isFinite(input.values[key]);
}

/** The clock's relative band (an internal low-speed oscillator's ±40 % is usual); none when exact. */
function clockBand(input: ModelInput): { plus: number; minus: number } {
  return input.tolerances?.clock ?? { plus: 0, minus: 0 };
}

/** Timeouts and window openings at the nominal clock and at both ends of its band. */
function timing(input: ModelInput) {
  const { clock, prescaler, reload } = input.values;
  const band = clockBand(input);
  const ticks = prescaler * (reload + 1);
  const timeout = ticks / clock;
  // A fast clock shortens the timeout: the worst case for a refresh that must come in time.
  const shortest = ticks / (clock * (1 + band.plus));
  const longest = ticks / (clock * (1 - band.minus));
  const out: Record<string, number> = { timeout, shortest, longest };
  if (has(input, 'window')) {
    const opening = (prescaler * (reload - input.values.window)) / clock;
    out['window-open'] = opening;
    // A slow clock opens the window late: the worst case for a refresh that must not come too early.
    out['window-open-latest'] = opening / (1 - band.minus);
  }
  return out;
}

export const watchdog: CircuitModel = {
  id: 'watchdog',
  title: 'Watchdog timeout and refresh',
  summary: 'A watchdog counter: its timeout nominal and worst case over the clock\'s tolerance, the firmware refresh\'s margin, and an optional refresh window.',
  assumptions: [
    'The counter counts reload … 0 at clock / prescaler, so a timeout is prescaler · (reload + 1) clock periods after a refresh.',
    'Worst case over the clock\'s tolerance: the shortest timeout (fast clock) against the refresh interval; the latest window opening (slow clock) against an early refresh.',
    'window is the count below which a refresh is accepted; a refresh earlier than prescaler · (reload − window) / clock resets the system.',
    'The refresh interval is the longest time between two refreshes in the firmware, jitter and worst-case paths included.',
  ],
  params: [
    quantity('clock', 'watchdog clock', 'Hz', 'Clock of the watchdog counter, with its tolerance (`32 kHz ±40%`).'),
    quantity('prescaler', 'prescaler division ratio', '', 'Division ratio before the counter.', { default: 1, defaultText: '1', integer: true, min: 1 }),
    quantity('reload', 'reload value', '', 'Value the counter restarts from at each refresh; it counts down to 0.', { integer: true, min: 0 }),
    quantity('refresh', 'refresh interval', 's', 'Longest interval between two refreshes in the firmware.', { optional: true, min: 0, template: true }),
    quantity('window', 'window value', '', 'Count below which a refresh is accepted (window watchdog).', { integer: true, min: 0, optional: true }),
  ],
  results: [
    { key: 'timeout', label: 'timeout (nominal clock)', dim: 's' },
    { key: 'margin', label: 'refresh margin (shortest timeout / refresh − 1)', dim: '', percent: true, optional: true },
    { key: 'window-open', label: 'window opens after a refresh (nominal clock)', dim: 's', optional: true },
  ],
  headline: ['timeout', 'margin'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['clock', 'prescaler'], issues)) return issues;
    if (!(checkWhole(input, 'prescaler', 1, Number.MAX_SAFE_INTEGER, issues) && checkWhole(input, 'reload', 0, Number.MAX_SAFE_INTEGER, issues) && checkWhole(input, 'window', 0, Number.MAX_SAFE_INTEGER, issues))) return issues;
    if (!Number.isFinite(input.values.reload)) return [...issues, { key: 'reload', message: '`reload` needs a value' }];
    const refresh = input.values.refresh;
    if (refresh !== undefined && !(refresh > 0 && Number.isFinite(refresh))) return [...issues, { key: 'refresh', message: `\`refresh\` must be a time greater than zero (got ${eng(refresh, 's')})` }];
    const band = clockBand(input);
    if (band.minus >= 1) issues.push({ key: 'clock', message: 'a clock tolerance of −100 % or more leaves no worst case to compute' });
    if (has(input, 'window') && input.values.window > input.values.reload) {
      issues.push({ key: 'window', message: `window ${input.values.window} is above reload ${input.values.reload}: the counter never starts above it, so the window is always open` , severity: 'warning' });
    }
    if (hasErrors(issues)) return issues;
    // The refresh is judged against the whole band at the nominal evaluation (see ModelInput.tolerances).
    if (hasErrors(issues) || !has(input, 'refresh') || !input.tolerances) return issues;
    const t = timing(input);
    const tolerated = band.plus > 0 ? ` at the clock's fastest (+${percent(band.plus)})` : '';
    if (refresh >= t.shortest) {
      issues.push({ key: 'refresh', code: Code.refreshTiming, message: `refresh every ${eng(refresh, 's')} is at or beyond the shortest timeout ${eng(t.shortest, 's')}${tolerated}: the watchdog resets a healthy system` });
    }
    const latest = t['window-open-latest'];
    if (latest !== undefined && refresh < latest) {
      const slow = band.minus > 0 ? ` at the clock's slowest (−${percent(band.minus)})` : '';
      issues.push({ key: 'refresh', code: Code.refreshTiming, message: `refresh every ${eng(refresh, 's')} comes before the window opens (${eng(latest, 's')} after a refresh${slow}): the early refresh resets the system` });
    }
    return issues;
  },

  compute(input) {
    const t = timing(input);
    const results: Record<string, number> = { timeout: t.timeout };
    if (has(input, 'refresh') && input.values.refresh > 0) results.margin = t.shortest / input.values.refresh - 1;
    if (t['window-open'] !== undefined) results['window-open'] = t['window-open'];
    return finiteOnly(results);
  },

  working(input, results) {
    const { clock, prescaler, reload, refresh } = input.values;
    const band = clockBand(input);
    const lines: WorkingLine[] = [
      { formula: 'timeout = prescaler · (reload + 1) / clock', substituted: `timeout = ${prescaler} · (${reload} + 1) / ${eng(clock, 'Hz')} = ${eng(results.timeout, 's')}`, source },
    ];
    if (results.margin !== undefined) {
      const t = timing(input);
      lines.push({
        formula: 'margin = prescaler · (reload + 1) / (clock · (1 + tol+)) / refresh − 1',
        substituted: `margin = ${eng(t.shortest, 's')} / ${eng(refresh, 's')} − 1 = ${percent(results.margin)}${band.plus ? ` (clock +${percent(band.plus)})` : ''}`,
        source,
      });
    }
    if (results['window-open'] !== undefined) {
      lines.push({
        formula: 'window opens = prescaler · (reload − window) / clock',
        substituted: `window opens = ${prescaler} · (${reload} − ${input.values.window}) / ${eng(clock, 'Hz')} = ${eng(results['window-open'], 's')}`,
        source: windowSource,
      });
    }
    return lines;
  },

  waveform: watchdogWaveform,

  // Watchdog timing guards the system whatever the block is called.
  safetyRelated: true,
};

/** The count after each refresh at the nominal and the fastest clock, with the window and zero as levels. */
function watchdogWaveform(input: ModelInput, cycles: number): Waveform {
  const { reload } = input.values;
  const t = timing(input);
  const refresh = has(input, 'refresh') && input.values.refresh > 0 ? input.values.refresh : undefined;
  const n = clampCycles(cycles);
  const interval = refresh ?? t.longest;
  const duration = n * interval;
  const trace = (timeout: number) => {
    const points: Array<[number, number]> = [];
    for (let k = 0; k < n; k++) {
      const start = k * interval;
      const end = start + interval;
      const zeroAt = start + timeout;
      points.push([start, reload]);
      if (zeroAt <= end) points.push([zeroAt, 0], [end, 0]);
      else points.push([end, reload * (1 - interval / timeout)]);
    }
    return finitePoints(points);
  };
  const traces = [{ name: 'count (nominal clock)', dim: '' as const, points: trace(t.timeout) }];
  if (t.shortest < t.timeout) traces.push({ name: 'count (fastest clock)', dim: '' as const, points: trace(t.shortest) });
  const levels = [{ label: 'reset at 0', value: 0 }];
  if (has(input, 'window')) levels.push({ label: 'window', value: input.values.window });
  return { traces, levels, duration };
}
