// The I²C line's rise and the ADC's settling against ngspice (npm eecircuit-engine, ngspice compiled to
// WebAssembly): a pull-up charging the bus capacitance, and a step charging the sampling capacitor through the
// source and switch resistance. Values of our own; times read from the simulated node by interpolation.
import { strict as assert } from 'assert';
import type { CircuitModel } from '../../core/circuits/model';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';
import { simulate, startEngine, type Engine } from './spice-netlists';

let engine: Engine;

/** First time the node rises through `level`, linearly interpolated between samples. */
function crossing(time: number[], out: number[], level: number): number {
  for (let i = 1; i < out.length; i++) {
    if (out[i - 1] < level && out[i] >= level) return time[i - 1] + ((time[i] - time[i - 1]) * (level - out[i - 1])) / (out[i] - out[i - 1]);
  }
  throw new Error(`the node never reached ${level}`);
}

/** A source charging a capacitor from 0 V through one resistor, simulated tightly enough for the last LSB. */
function rcNetlist(title: string, supply: number, r: number, c: number, stop: number): string {
  const step = stop / 20000;
  return `${title}
.options reltol=1e-7 abstol=1e-15 vntol=1e-10 chgtol=1e-20
v1 src 0 dc ${supply}
r1 src out ${r}
c1 out 0 ${c} ic=0
.tran ${step} ${stop} 0 ${step} uic
.end`;
}

function model(id: string): CircuitModel {
  const found = circuitById(id);
  assert.ok(found, id);
  return found;
}

describe('bus edges and ADC settling against ngspice (eecircuit-engine)', function () {
  this.timeout(60000);

  before(async () => {
    engine = await startEngine();
  });

  it('i2c-rise: 30 % → 70 % of the released line through 2.2 kΩ into 150 pF', async () => {
    const m = model('i2c-rise');
    const input = withDefaults(m, { values: { supply: 3.3, pullup: 2.2e3, 'bus-c': 150e-12 } });
    const expected = m.compute(input);
    const sim = await simulate(engine, rcNetlist('i2c line released at 0', 3.3, 2.2e3, 150e-12, 3e-6));
    const rise = crossing(sim.time, sim.out, 0.7 * 3.3) - crossing(sim.time, sim.out, 0.3 * 3.3);
    assert.ok(Math.abs(rise / expected.rise - 1) < 0.003, `simulated ${rise}, model ${expected.rise}`);
  });

  it('adc-sample: a full-scale step settles to ½ LSB of 12 bits through 10 kΩ + 1.5 kΩ into 7 pF', async () => {
    const m = model('adc-sample');
    const input = withDefaults(m, { values: { bits: 12, 'r-source': 10e3, 'r-switch': 1.5e3, 'c-sample': 7e-12, 'sample-time': 2e-6 } });
    const expected = m.compute(input);
    const sim = await simulate(engine, rcNetlist('adc sampling capacitor', 1, 11.5e3, 7e-12, 1.2e-6));
    const settled = crossing(sim.time, sim.out, 1 - 2 ** -13);
    assert.ok(Math.abs(settled / expected.settle - 1) < 0.003, `simulated ${settled}, model ${expected.settle}`);
  });
});
