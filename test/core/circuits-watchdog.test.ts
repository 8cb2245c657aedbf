// Watchdog timeout, refresh margin and window, worst case over the clock's tolerance (counter arithmetic,
// common practice: a down-counter from reload at clock / prescaler reaches zero after reload + 1 ticks).
import { strict as assert } from 'assert';
import { safetyCaution } from '../../core/circuits/common';
import { analyzeText, errors, noteBlock } from '../helpers/analyze';

const base = ['circuit: watchdog', 'prescaler: 32', 'reload: 999'];

describe('watchdog model', () => {
  // 32 · 1000 / 32 kHz = 1 s; at +40 % the clock runs at 44.8 kHz and the timeout shrinks to 1/1.4 s.
  it('times out after prescaler · (reload + 1) / clock, and takes the shortest timeout for the margin', () => {
    const block = noteBlock([...base, 'clock: 32 kHz ±40%', 'refresh: 500 ms']);
    assert.deepEqual(errors(block), []);
    assert.ok(Math.abs(block.values.timeout - 1) < 1e-12);
    assert.ok(Math.abs(block.values.margin - (1 / 1.4 / 0.5 - 1)) < 1e-12);
    assert.ok(Math.abs(block.spread!.timeout.min - 1 / 1.4) < 1e-12 && Math.abs(block.spread!.timeout.max - 1 / 0.6) < 1e-12);
  });

  it('is an error when the refresh reaches the shortest timeout', () => {
    // Nominal 1 s is fine for 800 ms, but at +40 % the timeout is 714 ms.
    const block = noteBlock([...base, 'clock: 32 kHz ±40%', 'refresh: 800 ms']);
    assert.match(errors(block)[0], /`refresh`.*714\.3 ms/);
    assert.equal(noteBlock([...base, 'clock: 32 kHz', 'refresh: 1 s']).findings.some((f) => f.severity === 'error'), true);
  });

  it('opens the window prescaler · (reload − window) / clock after a refresh; an earlier refresh is an error', () => {
    // 32 · (999 − 500) / 32 kHz = 499 ms nominal; at −10 % the window opens at 554.4 ms.
    const early = noteBlock([...base, 'clock: 32 kHz ±10%', 'window: 500', 'refresh: 520 ms']);
    assert.ok(Math.abs(early.params.window - 500) < 1e-12);
    assert.match(errors(early)[0], /before the window opens \(554\.4 ms/);
    const ok = noteBlock([...base, 'clock: 32 kHz ±10%', 'window: 500', 'refresh: 700 ms']);
    assert.deepEqual(errors(ok), []);
    assert.ok(Math.abs(ok.values['window-open'] - 0.499) < 1e-12);
  });

  it('always carries the safety-timing caution, whatever the block is called', () => {
    const block = noteBlock([...base, 'clock: 32 kHz', 'refresh: 100 ms']);
    assert.ok(block.findings.some((f) => f.code === 'caution' && f.message === safetyCaution));
    assert.match(safetyCaution, /functional-safety standards and licensed practice/);
  });
});

describe('watchdog fed by a clock block', () => {
  it('takes the referenced clock\'s tolerance for the worst case, as if written on its own clock', () => {
    const text = ['```timing slow-osc', 'circuit: clock', 'frequency: 32 kHz ±40%', '```', '', '```timing dog', 'circuit: watchdog', 'clock: @slow-osc', 'prescaler: 32', 'reload: 999', 'refresh: 800 ms', '```', ''].join('\n');
    const dog = analyzeText('notes/clocks.md', text).blocks[1];
    // As above: at +40 % the timeout is 714.3 ms, before the 800 ms refresh.
    assert.match(errors(dog)[0], /`refresh`.*714\.3 ms.*\+40 %/);
  });
});
