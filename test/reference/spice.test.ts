// Closed-form oscillator timing against ngspice (npm eecircuit-engine, ngspice compiled to WebAssembly).
// Each circuit is a switch-level netlist of our own values; frequency, duty and the first edge are measured from
// the simulated output edges and must agree with the model within 0.3 %.
import { strict as assert } from 'assert';
import type { CircuitModel } from '../../core/circuits/model';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';
import { comparatorNetlist, ne555AstableNetlist, schmittNetlist, simulate as simulateOn, startEngine, measure, tran, type Engine } from './spice-netlists';

let engine: Engine;
const simulate = (netlist: string) => simulateOn(engine, netlist);

function closeTo(actual: number, expected: number, relative: number, what: string) {
  assert.ok(Math.abs(actual / expected - 1) <= relative, `${what}: simulated ${actual}, model ${expected} (${((actual / expected - 1) * 100).toFixed(3)} %)`);
}

/** Frequency, duty and first edge of the simulation against the closed form, within 0.3 % (the project's bar). */
function agrees(got: { frequency: number; duty: number; firstEdge: number }, expected: Record<string, number>) {
  closeTo(got.frequency, expected.frequency, 0.003, 'frequency');
  closeTo(got.duty, expected.duty, 0.003, 'duty');
  closeTo(got.firstEdge, expected['first-edge'], 0.003, 'first edge');
}

function model(id: string): CircuitModel {
  const found = circuitById(id);
  assert.ok(found, id);
  return found;
}

describe('oscillators against ngspice (eecircuit-engine)', function () {
  this.timeout(60000);

  before(async () => {
    engine = await startEngine();
  });

  it('schmitt-rc: hysteresis switch driving R into C', async () => {
    const m = model('schmitt-rc');
    // Values of our own: 5 V gate, thresholds 3.1 V / 1.4 V, 22 kΩ, 33 nF.
    const input = withDefaults(m, { values: { supply: 5, 'vt+': 3.1, 'vt-': 1.4, r: 22e3, c: 33e-9 } });
    assert.deepEqual(m.validate(input), []);
    const expected = m.compute(input);
    const sim = await simulate(schmittNetlist({ supply: 5, upper: 3.1, lower: 1.4, r: 22e3, c: 33e-9 }, tran(expected.period, expected['first-edge'], 6)));
    const got = measure(sim.time, sim.out, 2.5);
    agrees(got, expected);
  });

  it('comparator-rc: regenerative comparator with r1/r2 feedback, split supply and an offset vref', async () => {
    const m = model('comparator-rc');
    // ±6 V output, vref 1 V, r1 15 kΩ, r2 27 kΩ, R 39 kΩ, C 4.7 nF: asymmetric, so the duty is not 50 %.
    const input = withDefaults(m, { values: { voh: 6, vol: -6, vref: 1, r1: 15e3, r2: 27e3, r: 39e3, c: 4.7e-9 } });
    assert.deepEqual(m.validate(input), []);
    const expected = m.compute(input);
    // The comparator is a steep tanh of (v+ − v−); 1 pF at v+ gives the regenerative edge a few ns to happen.
    // v+ starts at its output-high value, the power-up state the model assumes (else ngspice sits metastable).
    const sim = await simulate(comparatorNetlist({ voh: 6, vol: -6, vref: 1, r1: 15e3, r2: 27e3, r: 39e3, c: 4.7e-9 }, tran(expected.period, expected['first-edge'], 6)));
    const got = measure(sim.time, sim.out, 0);
    agrees(got, expected);
  });

  for (const control of [undefined, 3.0]) {
    it(`555-astable: discharge switch with thresholds at control and control/2 (control ${control ?? 'default 2/3 supply'})`, async () => {
      const m = model('555-astable');
      // 9 V, RA 4.7 kΩ, RB 12 kΩ, C 22 nF.
      const values: Record<string, number> = { supply: 9, ra: 4.7e3, rb: 12e3, c: 22e-9 };
      if (control !== undefined) values.control = control;
      const input = withDefaults(m, { values });
      assert.deepEqual(m.validate(input), []);
      const expected = m.compute(input);
      const upper = input.values.control;
      // The 555's latch is a hysteresis window on the capacitor voltage: on above `upper`, off below `upper/2`.
      const sim = await simulate(ne555AstableNetlist({ supply: 9, ra: 4.7e3, rb: 12e3, c: 22e-9, control: upper }, tran(expected.period, expected['first-edge'], 6)));
      const got = measure(sim.time, sim.out, 4.5);
      agrees(got, expected);
    });
  }

  it('inverter-rc: two unclamped inverters, C from the second output to the timing node', async () => {
    const m = model('inverter-rc');
    // 3.3 V logic, threshold 1.4 V (not mid-supply), 68 kΩ, 2.2 nF. Both inverters share the threshold, as two
    // gates of one package do; 1 Ω + 1 pF between them lets the loop's regenerative edge take a few ps.
    const input = withDefaults(m, { values: { supply: 3.3, threshold: 1.4, r: 68e3, c: 2.2e-9 } });
    assert.deepEqual(m.validate(input), []);
    const expected = m.compute(input);
    const sim = await simulate(`two-inverter rc oscillator
binv1 a 0 v = 1.65 - 1.65 * tanh(20000 * (v(x) - 1.4))
binv2 b 0 v = 1.65 - 1.65 * tanh(20000 * (v(a1) - 1.4))
ra1 a a1 1
ca1 a1 0 1p ic=3.3
bout out 0 v = v(b)
r1 a x 68k
c1 b x 2.2n ic=0
${tran(expected.period, expected['first-edge'], 6)}
.end`);
    const got = measure(sim.time, sim.out, 1.65);
    agrees(got, expected);
  });
});
