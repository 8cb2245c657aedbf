// The registry and each model's tables against the contract of DESIGN.md (circuit keys, defaults, results).
import { strict as assert } from 'assert';
import { circuits, circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';
import type { CircuitModel, QuantityParam } from '../../core/circuits/model';

// DESIGN.md, table "Circuits": keys and results per circuit.
const contract: Record<string, { keys: string[]; results: string[] }> = {
  'schmitt-rc': { keys: ['supply', 'vt+', 'vt-', 'r', 'c', 'voh', 'vol', 'tpd'], results: ['high', 'low', 'period', 'frequency', 'duty', 'first-edge'] },
  'comparator-rc': { keys: ['voh', 'vol', 'vref', 'r1', 'r2', 'r', 'c'], results: ['high', 'low', 'period', 'frequency', 'duty', 'first-edge'] },
  '555-astable': { keys: ['supply', 'ra', 'rb', 'c', 'control', 'diode'], results: ['high', 'low', 'period', 'frequency', 'duty', 'first-edge'] },
  '555-monostable': { keys: ['supply', 'r', 'c', 'control'], results: ['width'] },
  'inverter-rc': { keys: ['supply', 'threshold', 'r', 'c'], results: ['high', 'low', 'period', 'frequency', 'duty', 'first-edge'] },
  ring: { keys: ['stages', 'tpd'], results: ['period', 'frequency'] },
  'rc-delay': { keys: ['r', 'c', 'from', 'to', 'toward'], results: ['time'] },
  timer: { keys: ['clock', 'prescaler', 'reload', 'mode', 'compare', 'bits', 'prescalers'], results: ['period', 'frequency', 'duty', 'counts'] },
  baud: { keys: ['clock', 'baud', 'oversampling', 'divisor'], results: ['baud', 'error'] },
  'crystal-load': { keys: ['cl', 'cstray', 'c1', 'c2'], results: ['load', 'error'] },
  clock: { keys: ['frequency'], results: ['frequency', 'period'] },
  divider: { keys: ['clock', 'divide'], results: ['frequency', 'period'] },
  pll: { keys: ['ref', 'prediv', 'mult', 'postdiv', 'postdiv2', 'postdiv3', 'pfd-range', 'vco-range'], results: ['pfd', 'vco', 'frequency', 'frequency2', 'frequency3'] },
  'can-bit': { keys: ['clock', 'prescaler', 'prop-seg', 'phase-seg1', 'phase-seg2', 'sjw', 'sample-point'], results: ['bitrate', 'sample-point', 'tq', 'tolerance'] },
  'i2c-rise': { keys: ['supply', 'pullup', 'bus-c', 'mode', 'vol', 'iol'], results: ['rise', 'pullup-min', 'pullup-max'] },
  'adc-sample': { keys: ['bits', 'r-source', 'r-switch', 'c-sample', 'sample-time'], results: ['settle', 'margin', 'r-source-max'] },
  watchdog: { keys: ['clock', 'prescaler', 'reload', 'refresh', 'window'], results: ['timeout', 'margin'] },
};

function param(model: CircuitModel, key: string) {
  const found = model.params.find((p) => p.key === key);
  assert.ok(found, `${model.id} has no ${key}`);
  return found;
}

describe('circuit registry', () => {
  it('lists exactly the circuits of DESIGN.md, once each', () => {
    assert.deepEqual(circuits.map((m) => m.id).sort(), Object.keys(contract).sort());
    assert.equal(new Set(circuits.map((m) => m.id)).size, circuits.length);
  });

  it('finds models by id, case-insensitively, and nothing for an unknown id', () => {
    assert.equal(circuitById('555-astable')?.id, '555-astable');
    assert.equal(circuitById('Schmitt-RC')?.id, 'schmitt-rc');
    assert.equal(circuitById('555'), undefined);
    assert.equal(circuitById(''), undefined);
  });

  for (const [id, { keys, results }] of Object.entries(contract)) {
    it(`${id}: every contract key and result is present`, () => {
      const model = circuitById(id) as CircuitModel;
      const paramKeys = model.params.map((p) => p.key);
      for (const key of keys) assert.ok(paramKeys.includes(key), `${id} lacks key ${key}`);
      const resultKeys = model.results.map((r) => r.key);
      for (const key of results) assert.ok(resultKeys.includes(key), `${id} lacks result ${key}`);
      for (const key of model.headline) assert.ok(resultKeys.includes(key), `${id} headline ${key} is not a result`);
      assert.equal(new Set(paramKeys).size, paramKeys.length, 'repeated key');
      assert.ok(model.assumptions.length > 0, 'assumptions in words');
    });
  }

  // DESIGN.md defaults in brackets: voh (supply), vol (0), tpd (0), vref (0), control (2/3 supply),
  // diode (no), threshold (supply/2), from (0), toward (supply), mode (up), bits (16), oversampling (16).
  it('applies the contract defaults', () => {
    const at = (id: string, values: Record<string, number>) => withDefaults(circuitById(id) as CircuitModel, { values });
    const schmitt = at('schmitt-rc', { supply: 3.3 });
    assert.equal(schmitt.values.voh, 3.3);
    assert.equal(schmitt.values.vol, 0);
    assert.equal(schmitt.values.tpd, 0);
    assert.equal(at('comparator-rc', {}).values.vref, 0);
    const astable = at('555-astable', { supply: 9 });
    assert.equal(astable.values.control, 6);
    assert.equal(astable.choices.diode, 'no');
    assert.equal(at('555-monostable', { supply: 12 }).values.control, 8);
    assert.equal(at('inverter-rc', { supply: 5 }).values.threshold, 2.5);
    const delay = at('rc-delay', { supply: 3.3 });
    assert.equal(delay.values.from, 0);
    assert.equal(delay.values.toward, 3.3);
    const timer = withDefaults(circuitById('timer') as CircuitModel, { values: {} });
    assert.equal(timer.choices.mode, 'up');
    assert.equal(timer.values.bits, 16);
    assert.equal(at('baud', {}).values.oversampling, 16);
  });

  it('marks R, C and the timer registers solvable, and integers as integers', () => {
    for (const model of circuits) {
      for (const p of model.params) {
        if (p.kind === 'quantity' && (p.dim === 'Ω' || (p.dim === 'F' && model.id !== 'crystal-load'))) assert.ok(p.solvable, `${model.id}.${p.key}`);
      }
    }
    const timer = circuitById('timer') as CircuitModel;
    for (const key of ['prescaler', 'reload']) {
      const p = param(timer, key) as QuantityParam;
      assert.ok(p.solvable && p.integer, key);
    }
    assert.ok((param(circuitById('ring') as CircuitModel, 'stages') as QuantityParam).integer);
    assert.equal(param(timer, 'mode').kind, 'choice');
    assert.equal(param(timer, 'prescalers').kind, 'list');
  });

  it('reports duty and error as fractions shown in percent', () => {
    for (const model of circuits) {
      for (const r of model.results) if (r.key === 'duty' || r.key === 'error') assert.ok(r.percent && r.dim === '', `${model.id}.${r.key}`);
    }
  });

  // Sample blocks of our own, one per circuit, for the hover's working.
  const samples: Record<string, { values: Record<string, number>; choices?: Record<string, string> }> = {
    'schmitt-rc': { values: { supply: 5, 'vt+': 3, 'vt-': 2, r: 10e3, c: 1e-9, tpd: 20e-9 } },
    'comparator-rc': { values: { voh: 5, vol: -5, r1: 1e3, r2: 2e3, r: 10e3, c: 1e-9 } },
    '555-astable': { values: { supply: 5, ra: 1e3, rb: 10e3, c: 1e-9 }, choices: { diode: 'yes' } },
    '555-monostable': { values: { supply: 5, r: 10e3, c: 1e-6 } },
    'inverter-rc': { values: { supply: 5, r: 10e3, c: 1e-9 } },
    ring: { values: { stages: 5, tpd: 1e-9 } },
    'rc-delay': { values: { r: 10e3, c: 1e-6, to: 2, supply: 3.3 } },
    timer: { values: { clock: 16e6, prescaler: 8, reload: 1999, compare: 500 } },
    baud: { values: { clock: 16e6, baud: 9600 } },
    'crystal-load': { values: { cl: 12.5e-12, cstray: 3e-12, c1: 18e-12, c2: 18e-12 } },
    clock: { values: { frequency: 12e6 } },
    divider: { values: { clock: 48e6, divide: 3 } },
    pll: { values: { ref: 12e6, prediv: 3, mult: 80, postdiv: 4, postdiv2: 5 } },
    'can-bit': { values: { clock: 24e6, prescaler: 3, 'prop-seg': 5, 'phase-seg1': 8, 'phase-seg2': 2 } },
    'i2c-rise': { values: { supply: 3.3, pullup: 2.2e3, 'bus-c': 100e-12 } },
    'adc-sample': { values: { bits: 10, 'r-source': 4.7e3, 'r-switch': 2e3, 'c-sample': 5e-12, 'sample-time': 1.5e-6 } },
    watchdog: { values: { clock: 40e3, prescaler: 16, reload: 2499, refresh: 0.2, window: 1000 } },
  };

  for (const model of circuits) {
    it(`${model.id}: working shows each formula with numbers and a source`, () => {
      const input = withDefaults(model, samples[model.id]);
      assert.deepEqual(model.validate(input), []);
      const lines = model.working(input, model.compute(input));
      assert.ok(lines.length >= 1);
      for (const line of lines) {
        assert.ok(line.formula.length > 3 && line.source.length > 5, JSON.stringify(line));
        assert.match(line.substituted, /\d/);
        assert.doesNotMatch(line.substituted, /NaN|undefined|Infinity/);
      }
    });
  }

  it('cites the NE555 datasheet for the 555 formulas', () => {
    for (const id of ['555-astable', '555-monostable']) {
      const model = circuitById(id) as CircuitModel;
      const input = withDefaults(model, samples[id]);
      assert.ok(model.working(input, model.compute(input)).some((line) => /NE555 datasheet \(SLFS022\)/.test(line.source)), id);
    }
  });
});
