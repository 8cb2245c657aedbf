// I²C rise time against the I²C-bus specification (UM10204: rise from 30 % to 70 %, t = 0.8473·R·C; limits per
// mode), and ADC settling against the RC charging law (an error e^(−t/τ) falls to ½ LSB = 2^−(bits+1)).
import { strict as assert } from 'assert';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';
import type { CircuitModel } from '../../core/circuits/model';
import { errors, noteBlock } from '../helpers/analyze';

const i2c = circuitById('i2c-rise') as CircuitModel;
const adc = circuitById('adc-sample') as CircuitModel;

describe('i2c-rise', () => {
  // UM10204: tr = 0.8473 · Rp · Cb; the model uses ln(7/3) = 0.84730, which the specification rounds.
  it('rise = 0.8473 · R · C (I²C-bus specification)', () => {
    const r = i2c.compute(withDefaults(i2c, { values: { supply: 3.3, pullup: 4.7e3, 'bus-c': 100e-12 } }));
    assert.ok(Math.abs(r.rise / (0.8473 * 4.7e3 * 100e-12) - 1) < 1e-4);
  });

  // UM10204: Rp(min) = (VDD − VOL(max)) / IOL; Rp(max) = tr / (0.8473 · Cb). Fast-mode: tr 300 ns, 3 mA at 0.4 V.
  it('pull-up bounds for fast-mode at 3.3 V and 200 pF: 966.7 Ω … 1.770 kΩ', () => {
    const r = i2c.compute(withDefaults(i2c, { values: { supply: 3.3, pullup: 1.5e3, 'bus-c': 200e-12 }, choices: { mode: 'fast' } }));
    assert.ok(Math.abs(r['pullup-min'] - 2.9 / 3e-3) < 1e-9);
    assert.ok(Math.abs(r['pullup-max'] / (300e-9 / (0.8473 * 200e-12)) - 1) < 1e-4);
  });

  // UM10204 limits: Standard 1000 ns / 400 pF, Fast 300 ns / 400 pF, Fast-mode Plus 120 ns / 550 pF, 20 mA.
  it('uses the specification\'s limits per mode', () => {
    const at = (mode: string) => i2c.compute(withDefaults(i2c, { values: { supply: 5, pullup: 1e3, 'bus-c': 100e-12 }, choices: { mode } }));
    assert.ok(Math.abs(at('standard')['pullup-max'] * 0.8473 * 100e-12 / 1000e-9 - 1) < 1e-4);
    assert.ok(Math.abs(at('fast')['pullup-max'] * 0.8473 * 100e-12 / 300e-9 - 1) < 1e-4);
    assert.ok(Math.abs(at('fast-plus')['pullup-max'] * 0.8473 * 100e-12 / 120e-9 - 1) < 1e-4);
    assert.ok(Math.abs(at('fast-plus')['pullup-min'] - 4.6 / 20e-3) < 1e-9);
    const busWarning = (mode: string, c: string) => noteBlock(['circuit: i2c-rise', 'supply: 3.3 V', 'pullup: 470', `bus-c: ${c}`, `mode: ${mode}`]).findings.some((f) => f.code === 'bus-limit' && /bus capacitance/.test(f.message));
    assert.equal(busWarning('fast', '450 pF'), true);
    assert.equal(busWarning('fast-plus', '450 pF'), false);
  });

  it('`pullup: ?` picks the largest E24 value inside the bounds, and says so when none fits', () => {
    const block = noteBlock(['circuit: i2c-rise', 'supply: 3.3 V', 'pullup: ?', 'bus-c: 200 pF', 'mode: fast']);
    // Largest E24 value below 1.770 kΩ is 1.6 kΩ (IEC 60063 E24: … 1.5, 1.6, 1.8 …), above the 966.7 Ω minimum.
    assert.equal(block.solved!.pullup.value, 1600);
    assert.equal(block.solved!.pullup.series, 'E24');
    assert.ok(block.values.rise <= 300e-9);
    const e12 = noteBlock(['circuit: i2c-rise', 'supply: 3.3 V', 'pullup: ?', 'bus-c: 200 pF', 'mode: fast', 'series: E12']);
    assert.equal(e12.solved!.pullup.value, 1500);
    // 5 V at 3 mA needs at least 1.533 kΩ; 300 ns on 400 pF allows at most 885 Ω.
    const none = noteBlock(['circuit: i2c-rise', 'supply: 5 V', 'pullup: ?', 'bus-c: 400 pF', 'mode: fast']);
    assert.match(errors(none)[0], /no E24 pull-up fits between/);
  });

  it('a rise beyond the mode\'s limit is a warning that names the largest pull-up', () => {
    const block = noteBlock(['circuit: i2c-rise', 'supply: 3.3 V', 'pullup: 10k', 'bus-c: 200 pF', 'mode: fast']);
    assert.ok(block.findings.some((f) => f.severity === 'warning' && /1\.695 µs exceeds the 300 ns/.test(f.message)));
  });
});

describe('adc-sample', () => {
  // RC charging law: the error of a full-scale step after t is e^(−t/τ); ½ LSB of n bits is 2^−(n+1), so
  // t = τ · (n + 1) · ln 2. 12 bits: 13 · ln 2 = 9.011 time constants.
  it('settles in τ · ln(2^(bits+1)): 9.011 τ for 12 bits', () => {
    const r = adc.compute(withDefaults(adc, { values: { bits: 12, 'r-source': 10e3, 'r-switch': 1e3, 'c-sample': 8e-12, 'sample-time': 1e-6 } }));
    const tau = 11e3 * 8e-12;
    assert.ok(Math.abs(r.settle / (tau * 13 * Math.log(2)) - 1) < 1e-12);
    assert.ok(Math.abs(Math.exp(-r.settle / tau) - 2 ** -13) < 1e-15);
    assert.ok(Math.abs(r.margin - (1e-6 / r.settle - 1)) < 1e-12);
    // At r-source-max the settling time equals the sampling time exactly.
    const edge = adc.compute(withDefaults(adc, { values: { bits: 12, 'r-source': r['r-source-max'], 'r-switch': 1e3, 'c-sample': 8e-12, 'sample-time': 1e-6 } }));
    assert.ok(Math.abs(edge.margin) < 1e-12);
  });

  it('a negative margin is a warning', () => {
    const block = noteBlock(['circuit: adc-sample', 'bits: 12', 'r-source: 100k', 'r-switch: 1k', 'c-sample: 8 pF', 'sample-time: 1 us']);
    assert.ok(block.findings.some((f) => f.severity === 'warning' && f.code === 'sample-settling'));
    assert.ok(block.values.margin < 0);
  });
});

describe('bus and ADC waveforms', () => {
  const crossing = (points: Array<[number, number]>, level: number) => {
    for (let i = 1; i < points.length; i++) {
      const [t0, v0] = points[i - 1];
      const [t1, v1] = points[i];
      if (v0 < level && v1 >= level) return t0 + ((t1 - t0) * (level - v0)) / (v1 - v0);
    }
    return NaN;
  };

  // The drawn edge is the RC charging law itself: it passes 30 % and 70 % ln(7/3)·RC apart (I²C-bus specification).
  it('draws the I²C edge against its 30 % and 70 % levels', () => {
    const input = withDefaults(i2c, { values: { supply: 3.3, pullup: 2.2e3, 'bus-c': 150e-12 } });
    const wave = i2c.waveform!(input, 1);
    assert.deepEqual(wave.levels.map((l) => l.value), [0.3 * 3.3, 0.7 * 3.3]);
    const points = wave.traces[0].points;
    const rise = crossing(points, 0.7 * 3.3) - crossing(points, 0.3 * 3.3);
    assert.ok(Math.abs(rise / (Math.log(7 / 3) * 2.2e3 * 150e-12) - 1) < 0.01);
  });

  it('draws the ADC settling against ½ LSB and the sampling window', () => {
    const input = withDefaults(adc, { values: { bits: 8, 'r-source': 1e3, 'r-switch': 1e3, 'c-sample': 10e-12, 'sample-time': 200e-9 } });
    const wave = adc.waveform!(input, 1);
    assert.equal(wave.levels[0].value, 1 - 2 ** -9);
    // RC law: 1 − e^(−t/τ) reaches 1 − 2^−9 at 9·ln2·τ.
    assert.ok(Math.abs(crossing(wave.traces[0].points, 1 - 2 ** -9) / (9 * Math.LN2 * 20e-9) - 1) < 0.01);
    assert.deepEqual(wave.traces[1].points.slice(0, 3), [[0, 1], [200e-9, 1], [200e-9, 0]]);
  });
});
