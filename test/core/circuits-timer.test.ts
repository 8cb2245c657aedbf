// Timer model and register search (`prescaler: ?`, `reload: ?`): DESIGN.md timer note and "target:" rules.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults, type GivenInput } from '../../core/circuits/defaults';
import type { CircuitModel, IntegerSet, RegisterSearch } from '../../core/circuits/model';

const timer = circuitById('timer') as CircuitModel;

function search(given: GivenInput, query: RegisterSearch) {
  return timer.search!(withDefaults(timer, given), query);
}

/** Every pair, the slow obvious way: the oracle for small sets. */
function bruteForce(clock: number, target: number, bits: number, prescalers: number[], mode: 'up' | 'up-down') {
  let best = Infinity;
  for (const p of prescalers) {
    for (let reload = mode === 'up' ? 0 : 1; reload <= 2 ** bits - 1; reload++) {
      const ticks = p * (mode === 'up' ? reload + 1 : 2 * reload);
      best = Math.min(best, Math.abs(clock / target / ticks - 1));
    }
  }
  return best;
}

const avr: IntegerSet = { kind: 'list', values: [1, 8, 64, 256, 1024] };

describe('timer model', () => {
  // Up counting passes 0 … ARR, so ARR + 1 ticks (STM32 reference manuals' update-event formula); phase-correct
  // up-down PWM runs 0 → TOP → 0 in 2·TOP ticks (AVR datasheets) — both from memory.
  it('counts reload + 1 ticks counting up and 2·reload up-down (DESIGN.md timer note)', () => {
    const up = timer.compute(withDefaults(timer, { values: { clock: 1e6, prescaler: 1, reload: 9, compare: 5 } }));
    assert.deepEqual([up.counts, up.period, up.duty], [10, 10e-6, 0.5]);
    const updown = timer.compute(withDefaults(timer, { values: { clock: 1e6, prescaler: 1, reload: 10, compare: 5 }, choices: { mode: 'up-down' } }));
    assert.deepEqual([updown.counts, updown.period, updown.duty], [20, 20e-6, 0.5]);
  });

  it('gives no duty without compare', () => {
    const r = timer.compute(withDefaults(timer, { values: { clock: 1e6, prescaler: 1, reload: 9 } }));
    assert.equal('duty' in r, false);
  });
});

describe('timer register search', () => {
  it('matches a brute-force search over every pair (8-bit, AVR prescalers)', () => {
    fc.assert(
      fc.property(
        fc.constantFrom(1e6, 8e6, 12e6, 16e6, 20e6),
        fc.double({ min: 30, max: 200_000, noNaN: true }),
        fc.constantFrom<'up' | 'up-down'>('up', 'up-down'),
        (clock, target, mode) => {
          const found = search({ values: { clock, bits: 8 }, lists: { prescalers: avr }, choices: { mode } }, { unknowns: ['prescaler', 'reload'], measure: 'frequency', target });
          assert.ok(!('error' in found && typeof found.error === 'string'));
          const result = found as { values: Record<string, number>; error: number };
          const oracle = bruteForce(clock, target, 8, avr.values, mode);
          assert.ok(Math.abs(Math.abs(result.error) - oracle) <= 1e-12, `search ${result.error}, brute force ${oracle}`);
          assert.ok(avr.values.includes(result.values.prescaler));
        },
      ),
      { numRuns: 60 },
    );
  });

  it('matches a brute-force search with a prescaler range (10-bit, 1..300), by frequency and by period', () => {
    const range = Array.from({ length: 300 }, (_, i) => i + 1);
    fc.assert(
      fc.property(fc.double({ min: 20, max: 2e6, noNaN: true }), fc.constantFrom<'up' | 'up-down'>('up', 'up-down'), fc.boolean(), (target, mode, byPeriod) => {
        const clock = 24e6;
        const query: RegisterSearch = byPeriod
          ? { unknowns: ['prescaler', 'reload'], measure: 'period', target: 1 / target }
          : { unknowns: ['prescaler', 'reload'], measure: 'frequency', target };
        const found = search({ values: { clock, bits: 10 }, lists: { prescalers: { kind: 'range', min: 1, max: 300 } }, choices: { mode } }, query) as { values: Record<string, number>; error: number };
        const ticks = found.values.prescaler * (mode === 'up' ? found.values.reload + 1 : 2 * found.values.reload);
        const achieved = clock / ticks;
        const oracle = bruteForce(clock, target, 10, range, mode);
        // Frequency error and period error differ at second order; both must match the oracle's pair closely.
        assert.ok(Math.abs(Math.abs(achieved / target - 1) - oracle) <= (byPeriod ? oracle * oracle * 4 + 1e-12 : 1e-12), `${achieved} vs oracle ${oracle}`);
      }),
      { numRuns: 30 },
    );
  });

  it('finds an exact pair whenever one exists (32-bit counter, any prescaler 1..65536)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 65536 }), fc.integer({ min: 1, max: 2 ** 20 }), (prescaler, ticks) => {
        const clock = 170e6;
        const target = clock / (prescaler * ticks);
        const found = search({ values: { clock, bits: 32 } }, { unknowns: ['prescaler', 'reload'], measure: 'frequency', target }) as { values: Record<string, number>; error: number };
        assert.equal(found.error, 0, JSON.stringify(found));
        assert.ok(Math.abs((found.values.prescaler * (found.values.reload + 1)) / (prescaler * ticks) - 1) < 1e-12);
      }),
      { numRuns: 40 },
    );
  });

  it('prefers the smaller prescaler among exact pairs (finer compare resolution, common practice)', () => {
    const found = search({ values: { clock: 16e6 } }, { unknowns: ['prescaler', 'reload'], measure: 'frequency', target: 1000 });
    assert.deepEqual(found, { values: { prescaler: 1, reload: 15999 }, error: 0 });
  });

  it('searches the reload alone for a given prescaler, by period', () => {
    const found = search({ values: { clock: 16e6, prescaler: 8 } }, { unknowns: ['reload'], measure: 'period', target: 2.5e-3 });
    assert.deepEqual(found, { values: { reload: 4999 }, error: 0 });
  });

  it('searches the prescaler alone for a given reload', () => {
    const found = search({ values: { clock: 16e6, reload: 249, bits: 8 }, lists: { prescalers: avr } }, { unknowns: ['prescaler'], measure: 'frequency', target: 1000 });
    assert.deepEqual(found, { values: { prescaler: 64 }, error: 0 });
  });

  it('returns the nearest corner, with its error, when the target is out of reach', () => {
    // 8 bits and at most ÷1024: 16 MHz / (1024 · 256) = 61.035 Hz is the slowest rate.
    const found = search({ values: { clock: 16e6, bits: 8 }, lists: { prescalers: avr } }, { unknowns: ['prescaler', 'reload'], measure: 'frequency', target: 10 }) as { values: Record<string, number>; error: number };
    assert.deepEqual(found.values, { prescaler: 1024, reload: 255 });
    assert.ok(Math.abs(found.error - (16e6 / 262144 / 10 - 1)) < 1e-12);
  });

  it('handles a 32-bit counter with every prescaler and an awkward target', () => {
    const found = search({ values: { clock: 72e6, bits: 32 } }, { unknowns: ['prescaler', 'reload'], measure: 'frequency', target: 1 / 7.77777 }) as { values: Record<string, number>; error: number };
    // With ÷1 the reload alone resolves 1 part in 5.6e8, so the best error is below that.
    assert.ok(Math.abs(found.error) < 2e-9, String(found.error));
  });

  it('refuses what it cannot search, in words', () => {
    const notRate = search({ values: { clock: 16e6 } }, { unknowns: ['reload'], measure: 'duty', target: 0.5 });
    assert.ok('error' in notRate && typeof notRate.error === 'string');
    const badKnown = search({ values: { clock: 16e6, prescaler: 3 }, lists: { prescalers: avr } }, { unknowns: ['reload'], measure: 'frequency', target: 1000 });
    assert.match(String((badKnown as { error: unknown }).error), /prescaler 3/);
    const noClock = search({ values: { clock: 0 } }, { unknowns: ['reload', 'prescaler'], measure: 'frequency', target: 1000 });
    assert.match(String((noClock as { error: unknown }).error), /clock/);
  });
});
