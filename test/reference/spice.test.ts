// Closed-form oscillator timing against ngspice (npm eecircuit-engine, ngspice compiled to WebAssembly).
// Each circuit is a switch-level netlist of our own values; frequency, duty and startup are measured from
// the simulated output edges and must agree with the model within 0.3 %.
import { strict as assert } from 'assert';
import type { CircuitModel } from '../../core/circuits/model';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';

type Engine = { setNetList(text: string): void; runSim(): Promise<{ variableNames: string[]; data: Array<{ name: string; values: unknown[] }> }>; getError(): string[] };

let engine: Engine;

async function simulate(netlist: string): Promise<{ time: number[]; out: number[] }> {
  engine.setNetList(netlist);
  const result = await engine.runSim();
  const column = (name: string) => {
    const found = result.data.find((d) => d.name.toLowerCase() === name);
    assert.ok(found, `ngspice returned no ${name} (has ${result.variableNames.join(', ')}; errors: ${engine.getError().join(' | ')})`);
    return found.values as number[];
  };
  return { time: column('time'), out: column('v(out)') };
}

/** Output edges through `level`, linearly interpolated between samples. */
function edges(time: number[], out: number[], level: number): Array<{ t: number; rising: boolean }> {
  const found: Array<{ t: number; rising: boolean }> = [];
  for (let i = 1; i < out.length; i++) {
    const a = out[i - 1] - level;
    const b = out[i] - level;
    if (a < 0 !== b < 0) found.push({ t: time[i - 1] + ((time[i] - time[i - 1]) * a) / (a - b), rising: b > a });
  }
  return found;
}

/** Startup (first edge), and period and duty averaged over the steady cycles after the first one. */
function measure(time: number[], out: number[], level: number) {
  const all = edges(time, out, level);
  const rises = all.filter((e) => e.rising).map((e) => e.t);
  const falls = all.filter((e) => !e.rising).map((e) => e.t);
  assert.ok(rises.length >= 4 && falls.length >= 4, `too few edges: ${rises.length} rising, ${falls.length} falling`);
  const steadyFalls = falls.slice(1);
  const period = (steadyFalls[steadyFalls.length - 1] - steadyFalls[0]) / (steadyFalls.length - 1);
  // High times: from each rise to the next fall.
  const highs = rises.map((r) => { const f = falls.find((t) => t > r); return f === undefined ? undefined : f - r; }).filter((h): h is number => h !== undefined);
  const high = highs.reduce((s, h) => s + h, 0) / highs.length;
  return { startup: all[0].t, frequency: 1 / period, duty: high / period };
}

function closeTo(actual: number, expected: number, relative: number, what: string) {
  assert.ok(Math.abs(actual / expected - 1) <= relative, `${what}: simulated ${actual}, model ${expected} (${((actual / expected - 1) * 100).toFixed(3)} %)`);
}

function model(id: string): CircuitModel {
  const found = circuitById(id);
  assert.ok(found, id);
  return found;
}

/** Simulated time and step for `cycles` periods plus startup, a step of period/4000 for sharp edges. */
function tran(period: number, startup: number, cycles: number): string {
  const stop = startup + cycles * period;
  const step = period / 4000;
  return `.tran ${step} ${stop} 0 ${step} uic`;
}

describe('oscillators against ngspice (eecircuit-engine)', function () {
  this.timeout(60000);

  before(async () => {
    // The package's type entry sits only under "exports", which this project's `node` resolution does not read.
    const specifier = 'eecircuit-engine';
    const { Simulation } = (await import(specifier)) as { Simulation: new () => Engine & { start(): Promise<void> } };
    const sim = new Simulation();
    await sim.start();
    engine = sim;
  });

  it('schmitt-rc: hysteresis switch driving R into C', async () => {
    const m = model('schmitt-rc');
    // Values of our own: 5 V gate, thresholds 3.1 V / 1.4 V, 22 kΩ, 33 nF.
    const input = withDefaults(m, { values: { supply: 5, 'vt+': 3.1, 'vt-': 1.4, r: 22e3, c: 33e-9 } });
    assert.deepEqual(m.validate(input), []);
    const expected = m.compute(input);
    const vt = (3.1 + 1.4) / 2;
    const vh = (3.1 - 1.4) / 2;
    const sim = await simulate(`schmitt rc oscillator
.model hyst sw vt=${vt} vh=${vh} ron=1m roff=1e12
vone one 0 dc 1
rpull one ctl 1k
s1 ctl 0 cap 0 hyst
bout out 0 v = 5 * v(ctl)
r1 out cap 22k
c1 cap 0 33n ic=0
${tran(expected.period, expected.startup, 6)}
.end`);
    const got = measure(sim.time, sim.out, 2.5);
    closeTo(got.frequency, expected.frequency, 0.003, 'frequency');
    closeTo(got.duty, expected.duty, 0.003, 'duty');
    closeTo(got.startup, expected.startup, 0.003, 'startup');
  });

  it('comparator-rc: regenerative comparator with r1/r2 feedback, split supply and an offset vref', async () => {
    const m = model('comparator-rc');
    // ±6 V output, vref 1 V, r1 15 kΩ, r2 27 kΩ, R 39 kΩ, C 4.7 nF: asymmetric, so the duty is not 50 %.
    const input = withDefaults(m, { values: { voh: 6, vol: -6, vref: 1, r1: 15e3, r2: 27e3, r: 39e3, c: 4.7e-9 } });
    assert.deepEqual(m.validate(input), []);
    const expected = m.compute(input);
    // The comparator is a steep tanh of (v+ − v−); 1 pF at v+ gives the regenerative edge a few ns to happen.
    // v+ starts at its output-high value, the power-up state the model assumes (else ngspice sits metastable).
    const sim = await simulate(`comparator relaxation oscillator
bcmp out 0 v = 6 * tanh(20000 * (v(plus) - v(cap)))
vref ref 0 dc 1
r1 plus ref 15k
r2 out plus 27k
cp plus 0 1p ic=${expected['vt+']}
r3 out cap 39k
c1 cap 0 4.7n ic=0
${tran(expected.period, expected.startup, 6)}
.end`);
    const got = measure(sim.time, sim.out, 0);
    closeTo(got.frequency, expected.frequency, 0.003, 'frequency');
    closeTo(got.duty, expected.duty, 0.003, 'duty');
    closeTo(got.startup, expected.startup, 0.003, 'startup');
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
      const sim = await simulate(`555 astable, switch level
.model latch sw vt=${0.75 * upper} vh=${0.25 * upper} ron=1m roff=1e12
vcc vcc 0 dc 9
ra vcc dis 4.7k
rb dis cap 12k
c1 cap 0 22n ic=0
sdis dis 0 cap 0 latch
rout vcc out 1k
sout out 0 cap 0 latch
${tran(expected.period, expected.startup, 6)}
.end`);
      const got = measure(sim.time, sim.out, 4.5);
      closeTo(got.frequency, expected.frequency, 0.003, 'frequency');
      closeTo(got.duty, expected.duty, 0.003, 'duty');
      closeTo(got.startup, expected.startup, 0.003, 'startup');
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
${tran(expected.period, expected.startup, 6)}
.end`);
    const got = measure(sim.time, sim.out, 1.65);
    closeTo(got.frequency, expected.frequency, 0.003, 'frequency');
    closeTo(got.duty, expected.duty, 0.003, 'duty');
    closeTo(got.startup, expected.startup, 0.003, 'startup');
  });
});
