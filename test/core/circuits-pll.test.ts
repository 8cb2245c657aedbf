// Clock sources, dividers and the PLL: hand-derived cases, range errors, and the joint search checked by
// recomputing every answer against its allowed values and ranges, and against a brute-force oracle.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';
import type { CircuitModel } from '../../core/circuits/model';
import { searchPll } from '../../core/circuits/pll-search';
import { errors, noteBlock } from '../helpers/analyze';

const pll = circuitById('pll') as CircuitModel;

/** Every combination, the slow obvious way: the smallest worst relative error over the targets. */
function bruteForce(ref: number, predivs: number[], mults: number[], posts: number[][], targets: number[], vco?: [number, number], pfd?: [number, number]): number {
  let best = Infinity;
  for (const p of predivs) {
    const f = ref / p;
    if (pfd && (f < pfd[0] || f > pfd[1])) continue;
    for (const m of mults) {
      const v = f * m;
      if (vco && (v < vco[0] || v > vco[1])) continue;
      let worst = 0;
      targets.forEach((t, i) => (worst = Math.max(worst, Math.min(...posts[i].map((d) => Math.abs(v / d / t - 1))))));
      best = Math.min(best, worst);
    }
  }
  return best;
}

const span = (a: number, b: number) => Array.from({ length: b - a + 1 }, (_, i) => a + i);

describe('clock and divider', () => {
  it('a clock source gives its frequency and period, and carries its ppm tolerance into the spread', () => {
    const block = noteBlock(['circuit: clock', 'frequency: 8 MHz ±20 ppm']);
    assert.deepEqual(block.values, { frequency: 8e6, period: 125e-9 });
    // 20 ppm of 8 MHz is 160 Hz (arithmetic of the unit: 1 ppm = 1e-6).
    assert.ok(Math.abs(block.spread!.frequency.min - 7_999_840) < 1e-6 && Math.abs(block.spread!.frequency.max - 8_000_160) < 1e-6);
  });

  it('a divider divides by a whole number, and `divide: ?` finds the ratio for a target', () => {
    const block = noteBlock(['circuit: divider', 'clock: 72 MHz', 'divide: 2']);
    assert.equal(block.values.frequency, 36e6);
    const solved = noteBlock(['circuit: divider', 'clock: 72 MHz', 'divide: ? 1, 2, 4, 8, 16', 'target: 18 MHz']);
    assert.equal(solved.solved!.divide.value, 4);
    assert.equal(solved.values.frequency, 18e6);
  });
});

describe('pll model', () => {
  // Hand-derived: 12 MHz / 3 = 4 MHz at the detector; × 80 = 320 MHz; / 4 = 80 MHz and / 5 = 64 MHz.
  it('pfd = ref / prediv, vco = pfd · mult, frequency = vco / postdiv (hand-derived case)', () => {
    const r = pll.compute(withDefaults(pll, { values: { ref: 12e6, prediv: 3, mult: 80, postdiv: 4, postdiv2: 5 } }));
    assert.deepEqual(r, { pfd: 4e6, vco: 320e6, frequency: 80e6, frequency2: 64e6 });
  });

  it('a pfd or vco outside its range is an error naming the key', () => {
    const pfd = noteBlock(['circuit: pll', 'ref: 12 MHz', 'prediv: 3', 'mult: 80', 'postdiv: 4', 'pfd-range: 1 MHz .. 2 MHz']);
    assert.equal(errors(pfd).length, 1);
    assert.match(errors(pfd)[0], /`prediv`.*4 MHz.*`pfd-range`/);
    const vco = noteBlock(['circuit: pll', 'ref: 12 MHz', 'prediv: 6', 'mult: 200', 'postdiv: 4', 'vco-range: 96 MHz .. 344 MHz']);
    assert.match(errors(vco)[0], /`mult`.*400 MHz.*`vco-range`/);
    assert.equal(vco.values.vco, undefined);
  });

  it('warns when the reference\'s tolerance carries the pfd beyond its range, and the search avoids that edge', () => {
    const edge = noteBlock(['circuit: pll', 'ref: 8 MHz ±20 ppm', 'prediv: 4', 'mult: 168', 'postdiv: 2', 'pfd-range: 1 MHz .. 2 MHz']);
    assert.ok(edge.findings.some((f) => f.severity === 'warning' && /pfd spans/.test(f.message)));
    const searched = noteBlock(['circuit: pll', 'ref: 8 MHz ±20 ppm', 'prediv: ? 1..63', 'mult: ? 50..432', 'postdiv: 2', 'pfd-range: 1 MHz .. 2 MHz', 'target: 168 MHz']);
    assert.ok(searched.params.ref / searched.params.prediv < 2e6 / (1 + 20e-6));
    assert.equal(searched.values.frequency, 168e6);
  });

  it('searches the dividers for two targets together, within the ranges (recomputed here)', () => {
    const block = noteBlock([
      'circuit: pll', 'ref: 8 MHz', 'prediv: ? 1..63', 'mult: ? 50..432', 'postdiv: ? 2, 4, 6, 8', 'postdiv2: ? 2..15',
      'pfd-range: 1 MHz .. 2 MHz', 'vco-range: 100 MHz .. 432 MHz', 'target: 168 MHz', 'target2: 48 MHz',
    ]);
    assert.deepEqual(errors(block), []);
    const { prediv, mult, postdiv, postdiv2 } = block.params;
    assert.ok(prediv >= 1 && prediv <= 63 && mult >= 50 && mult <= 432 && [2, 4, 6, 8].includes(postdiv) && postdiv2 >= 2 && postdiv2 <= 15);
    const pfd = 8e6 / prediv;
    const vco = pfd * mult;
    assert.ok(pfd >= 1e6 && pfd <= 2e6 && vco >= 100e6 && vco <= 432e6, `pfd ${pfd} vco ${vco}`);
    assert.ok(Math.abs(vco / postdiv / 168e6 - 1) < 1e-12 && Math.abs(vco / postdiv2 / 48e6 - 1) < 1e-12);
    assert.equal(block.solved!.mult.error, 0);
  });

  it('states the smallest worst error when no exact set exists (brute force as the oracle)', () => {
    const targets = [100.3e6, 33.1e6];
    const block = noteBlock(['circuit: pll', 'ref: 25 MHz', 'prediv: ? 1..16', 'mult: ? 8..120', 'postdiv: ? 2, 4, 6, 8', 'postdiv2: ? 1..16', 'vco-range: 200 MHz .. 800 MHz', 'target: 100.3 MHz', 'target2: 33.1 MHz']);
    const oracle = bruteForce(25e6, span(1, 16), span(8, 120), [[2, 4, 6, 8], span(1, 16)], targets, [200e6, 800e6]);
    const worst = Math.max(Math.abs(block.values.frequency / targets[0] - 1), Math.abs(block.values.frequency2 / targets[1] - 1));
    assert.ok(Math.abs(worst - oracle) < 1e-12, `${worst} vs ${oracle}`);
    assert.ok(Math.abs(Math.abs(block.solved!.prediv.error!) - oracle) < 1e-12);
    assert.ok(block.findings.some((f) => /worst/.test(f.message)));
  });

  it('refuses a target2 for an output without postdiv2, and a ? without its target', () => {
    assert.match(errors(noteBlock(['circuit: pll', 'ref: 8 MHz', 'mult: ?', 'target: 168 MHz', 'target2: 48 MHz']))[0], /postdiv2/);
    assert.match(errors(noteBlock(['circuit: pll', 'ref: 8 MHz', 'mult: 42', 'postdiv2: ?', 'target: 168 MHz']))[0], /target2/);
  });

  const smallSets = fc.record({
    ref: fc.integer({ min: 1, max: 50 }).map((k) => k * 1e6),
    prediv: fc.integer({ min: 1, max: 8 }),
    mult: fc.integer({ min: 1, max: 60 }),
    post1: fc.integer({ min: 1, max: 8 }),
    post2: fc.integer({ min: 1, max: 8 }),
  });

  // Property: an exact set is found whenever one exists (targets made from one), checked exhaustively.
  it('finds an exact set whenever one exists, within the allowed values (fast-check, exhaustive oracle)', () => {
    fc.assert(
      fc.property(smallSets, ({ ref, prediv, mult, post1, post2 }) => {
        const vco = (ref / prediv) * mult;
        const targets = [vco / post1, vco / post2];
        const found = searchPll({ ref, sets: { prediv: { kind: 'range', min: 1, max: 8 }, mult: { kind: 'range', min: 1, max: 60 } }, outputs: targets.map((target, i) => ({ divider: `p${i}`, target, set: { kind: 'range', min: 1, max: 8 } })) });
        assert.ok(!('error' in found && typeof found.error === 'string'));
        const f = found as { values: Record<string, number>; error: number };
        assert.equal(f.error, 0);
        const v = (ref / f.values.prediv) * f.values.mult;
        assert.ok(f.values.prediv <= 8 && f.values.mult <= 60 && f.values.p0 <= 8 && f.values.p1 <= 8);
        assert.ok(Math.abs(v / f.values.p0 / targets[0] - 1) < 1e-12 && Math.abs(v / f.values.p1 / targets[1] - 1) < 1e-12);
      }),
      { numRuns: 200 },
    );
  });

  // Property: any targets, lists and ranges — the answer lies within them and matches the oracle's worst error.
  it('every answer lies within its allowed values and ranges and is as good as the oracle\'s (fast-check)', () => {
    const list = fc.uniqueArray(fc.integer({ min: 1, max: 40 }), { minLength: 1, maxLength: 6 });
    fc.assert(
      fc.property(
        fc.integer({ min: 1, max: 40 }).map((k) => k * 1e6),
        list, list, list,
        fc.double({ min: 1e6, max: 300e6, noNaN: true }),
        fc.option(fc.tuple(fc.double({ min: 10e6, max: 200e6, noNaN: true }), fc.double({ min: 1, max: 4, noNaN: true }))),
        (ref, predivs, mults, posts, target, vcoBand) => {
          const vco = vcoBand ? ([vcoBand[0], vcoBand[0] * vcoBand[1]] as [number, number]) : undefined;
          const found = searchPll({ ref, sets: { prediv: { kind: 'list', values: predivs }, mult: { kind: 'list', values: mults } }, outputs: [{ divider: 'postdiv', target, set: { kind: 'list', values: posts } }], vcoRange: vco && { min: vco[0], max: vco[1] } });
          const oracle = bruteForce(ref, predivs, mults, [posts], [target], vco);
          if ('error' in found && typeof found.error === 'string') {
            assert.equal(oracle, Infinity, found.error);
            return;
          }
          const f = found as { values: Record<string, number>; error: number };
          assert.ok(predivs.includes(f.values.prediv) && mults.includes(f.values.mult) && posts.includes(f.values.postdiv));
          const v = (ref / f.values.prediv) * f.values.mult;
          if (vco) assert.ok(v >= vco[0] * (1 - 1e-12) && v <= vco[1] * (1 + 1e-12));
          const worst = Math.abs(v / f.values.postdiv / target - 1);
          assert.ok(worst <= oracle + 1e-12, `${worst} vs oracle ${oracle}`);
        },
      ),
      { numRuns: 300 },
    );
  });
});
