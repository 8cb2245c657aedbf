// Waveforms and the RC segment law: start discharged, exact corners at transitions, levels named.
import { strict as assert } from 'assert';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults, type GivenInput } from '../../core/circuits/defaults';
import type { CircuitModel, Trace } from '../../core/circuits/model';
import { rcReaches, rcSegmentTime, rcVoltageAt } from '../../core/rc';

function wave(id: string, given: GivenInput, cycles = 3) {
  const model = circuitById(id) as CircuitModel;
  const input = withDefaults(model, given);
  assert.deepEqual(model.validate(input), []);
  return { wave: model.waveform!(input, cycles), results: model.compute(input) };
}

function trace(traces: Trace[], name: string): Trace {
  const found = traces.find((t) => t.name === name);
  assert.ok(found, `no ${name} trace`);
  return found;
}

/** Times at which a step trace changes level (two points at one time). */
function edgesOf(t: Trace): number[] {
  const times: number[] = [];
  for (let i = 1; i < t.points.length; i++) if (t.points[i][0] === t.points[i - 1][0] && t.points[i][1] !== t.points[i - 1][1]) times.push(t.points[i][0]);
  return times;
}

describe('RC segment law', () => {
  it('is τ·ln((vInf − v0)/(vInf − v1)) and inverts rcVoltageAt', () => {
    // Standard RC charging law, common practice: one τ from 0 toward 1 V reaches 1 − e^−1.
    assert.ok(Math.abs(rcSegmentTime(0, 1 - Math.exp(-1), 1, 2e-3) - 2e-3) < 1e-15);
    for (const [v0, v1, vInf] of [[0, 2, 5], [4, 1, 0], [-3, 2, 6], [2.5, -1, -5]]) {
      const t = rcSegmentTime(v0, v1, vInf, 1e-3);
      assert.ok(Math.abs(rcVoltageAt(v0, vInf, 1e-3, t) - v1) < 1e-12);
    }
  });

  it('says clearly when a level is never reached', () => {
    assert.equal(rcSegmentTime(0, 5, 5, 1), Infinity);
    assert.equal(rcSegmentTime(0, 6, 5, 1), Infinity);
    assert.equal(rcSegmentTime(2, 1, 5, 1), Infinity);
    assert.equal(rcSegmentTime(1, 2, 1, 1), Infinity);
    assert.equal(rcSegmentTime(0, 1, 5, 0), Infinity);
    assert.equal(rcSegmentTime(0, 1, 5, Number.NaN), Infinity);
    assert.equal(rcSegmentTime(1, 1, 5, 1), 0);
    assert.equal(rcReaches(0, 4.99, 5), true);
    assert.equal(rcReaches(0, -1, 5), false);
  });
});

describe('waveforms', () => {
  it('schmitt-rc starts discharged, charges to VT+, then swings between the thresholds', () => {
    const { wave: w, results } = wave('schmitt-rc', { values: { supply: 3.3, 'vt+': 2.0, 'vt-': 1.1, r: 47e3, c: 100e-9 } });
    const cap = trace(w.traces, 'timing node');
    const out = trace(w.traces, 'output');
    assert.deepEqual(cap.points[0], [0, 0]);
    assert.equal(out.points[0][1], 3.3);
    assert.deepEqual(w.levels.map((l) => l.label), ['VT+', 'VT−']);
    const edges = edgesOf(out);
    assert.equal(edges.length, 6);
    // RC charging law (common practice), written out rather than taken from the model: τ = 4.7 ms; startup
    // charges 0 → 2.0 V toward 3.3 V, a period charges 1.1 → 2.0 V toward 3.3 V and discharges 2.0 → 1.1 V to 0.
    const tau = 47e3 * 100e-9;
    const startup = tau * Math.log(3.3 / (3.3 - 2.0));
    const period = tau * (Math.log((3.3 - 1.1) / (3.3 - 2.0)) + Math.log(2.0 / 1.1));
    assert.ok(Math.abs(edges[0] - startup) < 1e-12, `${edges[0]} vs ${startup}`);
    assert.ok(Math.abs(edges[2] - edges[0] - period) < 1e-12);
    assert.ok(Math.abs(w.duration - (startup + 3 * period)) < 1e-12);
    assert.ok(Math.abs(results.period - period) < 1e-12);
    // The capacitor sits exactly on a threshold at every output edge.
    for (const t of edges) {
      const atEdge = cap.points.filter((p) => Math.abs(p[0] - t) < 1e-15).map((p) => p[1]);
      assert.ok(atEdge.some((v) => Math.abs(v - 2.0) < 1e-9 || Math.abs(v - 1.1) < 1e-9), `edge at ${t}: ${atEdge}`);
    }
    // About 50 points per exponential segment: startup + 6 halves.
    assert.ok(cap.points.length >= 7 * 50 && cap.points.length <= 7 * 60);
  });

  it('with tpd the capacitor overshoots the threshold before the output falls', () => {
    const { wave: w } = wave('schmitt-rc', { values: { supply: 5, 'vt+': 3, 'vt-': 2, r: 1e3, c: 1e-9, tpd: 100e-9 } });
    const peak = Math.max(...trace(w.traces, 'timing node').points.map((p) => p[1]));
    // RC charging law: 100 ns past VT+ = 3 V toward 5 V with τ = 1 µs, v = 5 + (3 − 5)·e^(−0.1).
    assert.ok(Math.abs(peak - (5 + (3 - 5) * Math.exp(-0.1))) < 1e-9, String(peak));
  });

  it('555-astable levels are labelled by their share of the supply at the default control', () => {
    const { wave: w } = wave('555-astable', { values: { supply: 9, ra: 1e3, rb: 10e3, c: 10e-9 } });
    assert.deepEqual(w.levels, [{ label: '2/3 supply', value: 6 }, { label: '1/3 supply', value: 3 }]);
    const { wave: moved } = wave('555-astable', { values: { supply: 9, ra: 1e3, rb: 10e3, c: 10e-9, control: 4 } });
    assert.deepEqual(moved.levels.map((l) => l.label), ['control', 'control/2']);
  });

  it('inverter-rc timing node jumps by a full supply at each edge', () => {
    const { wave: w } = wave('inverter-rc', { values: { supply: 5, r: 10e3, c: 1e-9 } }, 2);
    const node = trace(w.traces, 'timing node').points;
    const values = node.map((p) => p[1]);
    // From the DESIGN.md note: the node swings to threshold ± supply (2.5 ± 5 V).
    assert.ok(Math.abs(Math.max(...values) - 7.5) < 1e-9);
    assert.ok(Math.abs(Math.min(...values) - -2.5) < 1e-9);
  });

  it('timer draws the counter and the PWM output', () => {
    const { wave: w, results } = wave('timer', { values: { clock: 1e6, prescaler: 1, reload: 9, compare: 3 } }, 2);
    const counter = trace(w.traces, 'counter');
    assert.equal(Math.max(...counter.points.map((p) => p[1])), 9);
    const out = trace(w.traces, 'output');
    const high = out.points.filter((p, i) => i > 0 && p[1] === 1 && out.points[i - 1][1] === 1);
    assert.ok(high.length > 0);
    assert.ok(Math.abs(w.duration - 2 * results.period) < 1e-15);
    assert.deepEqual(w.levels.map((l) => l.label), ['reload', 'compare']);
  });

  it('rc-delay draws one charge curve through its `to` level', () => {
    const { wave: w, results } = wave('rc-delay', { values: { r: 10e3, c: 1e-6, to: 2, supply: 3.3 } });
    const cap = trace(w.traces, 'timing node').points;
    assert.deepEqual(cap[0], [0, 0]);
    // RC charging law: 0 → 2 V toward 3.3 V with τ = 10 ms takes τ·ln(3.3/1.3).
    const time = 10e-3 * Math.log(3.3 / 1.3);
    assert.ok(Math.abs(results.time - time) < 1e-12);
    const atTime = cap.find((p) => Math.abs(p[0] - time) < 1e-12);
    assert.ok(atTime && Math.abs(atTime[1] - 2) < 1e-9);
    assert.deepEqual(w.levels, [{ label: 'end level', value: 2 }]);
  });

  it('ring draws a square wave of the computed period', () => {
    const { wave: w, results } = wave('ring', { values: { stages: 3, tpd: 1e-9 } }, 4);
    const edges = edgesOf(trace(w.traces, 'output'));
    // Ring oscillator: T = 2·N·tpd = 6 ns for three stages of 1 ns (common practice).
    assert.ok(Math.abs(edges[2] - edges[0] - 6e-9) < 1e-18);
    assert.ok(Math.abs(results.period - 6e-9) < 1e-18);
  });

  it('asks for absurd cycle counts without hanging', () => {
    const { wave: w } = wave('schmitt-rc', { values: { supply: 3.3, 'vt+': 2.0, 'vt-': 1.1, r: 47e3, c: 100e-9 } }, 1e12);
    assert.ok(trace(w.traces, 'timing node').points.length < 100_000);
    const { wave: none } = wave('schmitt-rc', { values: { supply: 3.3, 'vt+': 2.0, 'vt-': 1.1, r: 47e3, c: 100e-9 } }, Number.NaN);
    assert.ok(none.duration > 0);
  });
});
