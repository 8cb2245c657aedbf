// Properties of the circuit models over generated inputs (fast-check).
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { circuits, circuitById } from '../../core/circuits/registry';
import { withDefaults, type GivenInput } from '../../core/circuits/defaults';
import type { CircuitModel, IntegerSet } from '../../core/circuits/model';
import { runModel } from '../../core/analyze/measure';

const positive = fc.double({ min: 1e-12, max: 1e9, noNaN: true });
const scale = fc.double({ min: 1e-3, max: 1e3, noNaN: true });

function compute(id: string, given: GivenInput): Record<string, number> {
  const model = circuitById(id) as CircuitModel;
  const input = withDefaults(model, given);
  assert.deepEqual(model.validate(input).filter((i) => (i.severity ?? 'error') === 'error'), []);
  return model.compute(input);
}

function close(a: number, b: number, relative = 1e-9): boolean {
  return Math.abs(a - b) <= relative * Math.max(Math.abs(a), Math.abs(b));
}

// A valid Schmitt block: thresholds inside the swing, vt- below vt+ (DESIGN.md physics rules).
const schmittValues = fc
  .record({ supply: fc.double({ min: 0.5, max: 50, noNaN: true }), lo: fc.double({ min: 0.02, max: 0.48, noNaN: true }), hi: fc.double({ min: 0.52, max: 0.98, noNaN: true }), r: fc.double({ min: 10, max: 1e7, noNaN: true }), c: fc.double({ min: 1e-12, max: 1e-3, noNaN: true }) })
  .map(({ supply, lo, hi, r, c }) => ({ supply, 'vt+': hi * supply, 'vt-': lo * supply, r, c }));

describe('circuit properties', () => {
  it('period scales linearly with R and with C (standard RC charging law: every time is a multiple of τ)', () => {
    fc.assert(
      fc.property(schmittValues, scale, scale, (values, kr, kc) => {
        const base = compute('schmitt-rc', { values });
        const scaled = compute('schmitt-rc', { values: { ...values, r: values.r * kr, c: values.c * kc } });
        assert.ok(close(scaled.period, base.period * kr * kc), `${scaled.period} vs ${base.period * kr * kc}`);
        assert.ok(close(scaled['first-edge'], base['first-edge'] * kr * kc));
        assert.ok(close(scaled.duty, base.duty));
      }),
    );
    fc.assert(
      fc.property(positive, positive, fc.double({ min: 1e-12, max: 1e-2, noNaN: true }), scale, (ra, rb, c, k) => {
        const base = compute('555-astable', { values: { supply: 5, ra, rb, c } });
        const scaled = compute('555-astable', { values: { supply: 5, ra: ra * k, rb: rb * k, c } });
        const bigger = compute('555-astable', { values: { supply: 5, ra, rb, c: c * k } });
        assert.ok(close(scaled.period, base.period * k) && close(bigger.period, base.period * k));
      }),
    );
    for (const id of ['inverter-rc', 'comparator-rc']) {
      fc.assert(
        fc.property(positive, fc.double({ min: 1e-12, max: 1e-2, noNaN: true }), scale, (r, c, k) => {
          const values: Record<string, number> = id === 'inverter-rc' ? { supply: 3.3, threshold: 1.2, r, c } : { voh: 5, vol: -2, vref: 1, r1: 1e3, r2: 3e3, r, c };
          const base = compute(id, { values });
          const scaled = compute(id, { values: { ...values, r: r * k } });
          assert.ok(close(scaled.period, base.period * k), id);
        }),
      );
    }
  });

  // Equal exponential segments: with thresholds symmetric about the middle of the swing, charge and discharge
  // cover mirror-image stretches of the same RC curve (RC charging law, common practice).
  it('thresholds symmetric about mid-swing give 50 % duty', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -20, max: 20, noNaN: true }),
        fc.double({ min: 0.1, max: 30, noNaN: true }),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        positive,
        (vol, swing, share, r) => {
          const voh = vol + swing;
          const mid = (voh + vol) / 2;
          const h = (share * swing) / 2;
          const schmitt = compute('schmitt-rc', { values: { supply: Math.max(voh, 0.1), voh, vol, 'vt+': mid + h, 'vt-': mid - h, r, c: 1e-9 } });
          assert.ok(Math.abs(schmitt.duty - 0.5) < 1e-9, `schmitt duty ${schmitt.duty}`);
          const comparator = compute('comparator-rc', { values: { voh, vol, vref: mid, r1: share * 1e4, r2: (1 - share) * 1e4, r, c: 1e-9 } });
          assert.ok(Math.abs(comparator.duty - 0.5) < 1e-9, `comparator duty ${comparator.duty}`);
        },
      ),
    );
  });

  // Any number at all, including the awkward ones a block can produce.
  const anyNumber = fc.oneof(
    fc.double(),
    fc.constantFrom(0, -0, 1, -1, 3, 4, 16, 255, 65535, 65536, 2 ** 32, 1e-15, 1e300, Number.NaN, Infinity, -Infinity, Number.MIN_VALUE),
    fc.integer({ min: -10, max: 100_000 }),
  );
  const anySet: fc.Arbitrary<IntegerSet> = fc.oneof(
    fc.record({ kind: fc.constant('list' as const), values: fc.array(anyNumber, { maxLength: 6 }) }),
    fc.record({ kind: fc.constant('range' as const), min: anyNumber, max: anyNumber }),
  );

  for (const model of circuits) {
    it(`${model.id}: no input makes validate, compute, working, waveform or cautions throw; validated results are finite`, () => {
      const keys = model.params.filter((p) => p.kind === 'quantity').map((p) => p.key);
      const choiceKeys = model.params.filter((p) => p.kind === 'choice');
      fc.assert(
        fc.property(
          fc.dictionary(fc.constantFrom(...keys), anyNumber),
          fc.record(Object.fromEntries(choiceKeys.map((p) => [p.key, fc.constantFrom(...p.options, 'bogus')]))),
          fc.option(anySet),
          (values, choices, prescalers) => {
            const input = withDefaults(model, { values, choices: choices as Record<string, string>, lists: prescalers ? { prescalers } : {}, name: 'reset-watchdog' });
            const issues = model.validate(input);
            for (const issue of issues) assert.ok(model.params.some((p) => p.key === issue.key), `issue names unknown key ${issue.key}`);
            if (issues.some((i) => (i.severity ?? 'error') === 'error')) return;
            for (const [key, value] of Object.entries(model.compute(input))) assert.ok(Number.isFinite(value), `${key} = ${value} for ${JSON.stringify(input.values)}`);
            // A result that overflows a double is the engine's `result-overflow` error (test/core/codes.test.ts).
            const { values: results, missing } = runModel(model, input);
            if (missing.length) return;
            model.working(input, results);
            model.cautions?.(input);
            const wave = model.waveform?.(input, 2);
            if (wave) for (const trace of wave.traces) for (const [t, v] of trace.points) assert.ok(Number.isFinite(t) && Number.isFinite(v), `${trace.name} point not finite`);
          },
        ),
        { numRuns: 400 },
      );
    });
  }

  it('the register search never throws and returns a finite error', () => {
    const timer = circuitById('timer') as CircuitModel;
    fc.assert(
      fc.property(anyNumber, anyNumber, fc.option(anySet), fc.constantFrom('frequency', 'period', 'duty'), fc.subarray(['prescaler', 'reload'], { minLength: 1 }), anyNumber, anyNumber, (clock, bits, prescalers, measure, unknowns, target, known) => {
        const values: Record<string, number> = { clock, bits: Math.abs(bits) % 40 };
        for (const key of ['prescaler', 'reload']) if (!unknowns.includes(key)) values[key] = known;
        const input = withDefaults(timer, { values, lists: prescalers ? { prescalers } : {} });
        const found = timer.search!(input, { unknowns, measure, target });
        if (typeof found.error === 'number') assert.ok(Number.isFinite(found.error));
      }),
      { numRuns: 300 },
    );
  });
});
