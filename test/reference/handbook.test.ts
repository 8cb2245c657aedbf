// Model results against published formulas and figures of the trade. Each check names its source.
import { strict as assert } from 'assert';
import type { CircuitModel } from '../../core/circuits/model';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults, type GivenInput } from '../../core/circuits/defaults';
import { rcVoltageAt } from '../../core/rc';

function run(id: string, given: GivenInput): Record<string, number> {
  const model = circuitById(id) as CircuitModel;
  assert.ok(model, id);
  const input = withDefaults(model, given);
  assert.deepEqual(model.validate(input).filter((i) => (i.severity ?? 'error') === 'error'), []);
  return model.compute(input);
}

function near(actual: number, expected: number, relative: number, what = '') {
  assert.ok(Math.abs(actual - expected) <= relative * Math.abs(expected), `${what}: ${actual} is not within ${relative * 100} % of ${expected}`);
}

describe('handbook formulas', () => {
  describe('555 timer', () => {
    it('astable high = ln2·(RA+RB)·C and low = ln2·RB·C', () => {
      // Texas Instruments NE555 datasheet (SLFS022), astable operation: tH = 0.693(RA+RB)C, tL = 0.693·RB·C.
      const r = run('555-astable', { values: { supply: 12, ra: 6.8e3, rb: 15e3, c: 47e-9 } });
      near(r.high, Math.LN2 * (6.8e3 + 15e3) * 47e-9, 1e-12, 'high');
      near(r.low, Math.LN2 * 15e3 * 47e-9, 1e-12, 'low');
      // Same datasheet: f ≈ 1.44 / ((RA + 2RB)·C); 1.44 rounds 1/ln2 = 1.4427, so agreement to 0.2 %.
      near(r.frequency, 1.44 / ((6.8e3 + 2 * 15e3) * 47e-9), 0.002, 'frequency');
    });

    it('astable with a diode across RB charges through RA alone: high = ln2·RA·C', () => {
      // Common practice (diode-steered 555 for duty below 50 %): tH = 0.693·RA·C, tL = 0.693·RB·C.
      const r = run('555-astable', { values: { supply: 5, ra: 3.3e3, rb: 10e3, c: 10e-9 }, choices: { diode: 'yes' } });
      near(r.high, Math.LN2 * 3.3e3 * 10e-9, 1e-12, 'high');
      near(r.duty, 3.3 / 13.3, 1e-12, 'duty');
    });

    it('monostable width = 1.1·R·C', () => {
      // Texas Instruments NE555 datasheet (SLFS022), monostable operation: tw = 1.1·RA·C (1.1 rounds ln 3 = 1.0986).
      const r = run('555-monostable', { values: { supply: 9, r: 220e3, c: 4.7e-6 } });
      near(r.width, 1.1 * 220e3 * 4.7e-6, 0.002, 'width ≈ 1.1 RC');
      near(r.width, Math.log(3) * 220e3 * 4.7e-6, 1e-12, 'width = ln3 RC');
    });
  });

  describe('comparator relaxation oscillator', () => {
    for (const [r1, r2] of [[10e3, 10e3], [4.7e3, 22e3], [33e3, 12e3]]) {
      it(`symmetric ±V, vref 0: T = 2RC·ln((1+β)/(1−β)), β = r1/(r1+r2) (r1 ${r1}, r2 ${r2})`, () => {
        // Standard op-amp relaxation (astable multivibrator) result, common practice.
        const r = run('comparator-rc', { values: { voh: 12, vol: -12, r1, r2, r: 100e3, c: 22e-9 } });
        const beta = r1 / (r1 + r2);
        near(r.period, 2 * 100e3 * 22e-9 * Math.log((1 + beta) / (1 - beta)), 1e-12, 'period');
        near(r.duty, 0.5, 1e-12, 'duty');
      });
    }
    it('r1 = r2 gives T = 2·ln3·RC ≈ 2.2·RC', () => {
      // Common practice: with equal divider resistors the op-amp astable runs at T ≈ 2.2 RC.
      const r = run('comparator-rc', { values: { voh: 5, vol: -5, r1: 47e3, r2: 47e3, r: 10e3, c: 100e-9 } });
      near(r.period, 2.2 * 10e3 * 100e-9, 0.002, 'period ≈ 2.2 RC');
    });
  });

  it('two-inverter oscillator at a mid-supply threshold: T ≈ 2.2·RC (exactly 2·ln3·RC)', () => {
    // Common practice for the CMOS two-inverter RC oscillator: T ≈ 2.2 RC with Vth = V/2.
    const r = run('inverter-rc', { values: { supply: 5, r: 100e3, c: 1e-9 } });
    near(r.period, 2.2 * 100e3 * 1e-9, 0.002, 'period ≈ 2.2 RC');
    near(r.period, 2 * Math.log(3) * 100e3 * 1e-9, 1e-12, 'period = 2 ln3 RC');
    near(r.duty, 0.5, 1e-12, 'duty');
  });

  it('ring oscillator: f = 1/(2·N·tpd)', () => {
    // Standard ring-oscillator result, common practice: an edge circles the N stages twice per period.
    const r = run('ring', { values: { stages: 7, tpd: 120e-12 } });
    near(r.frequency, 1 / (2 * 7 * 120e-12), 1e-12, 'frequency');
    near(r.period, 2 * 7 * 120e-12, 1e-12, 'period');
  });

  describe('RC step response', () => {
    it('reaches 63.2 % of a step at one time constant', () => {
      // 1 − e^−1 = 0.632 (standard RC charging law, common practice).
      const tau = 10e3 * 1e-6;
      near(rcVoltageAt(0, 1, tau, tau), 0.632, 0.001, 'v(τ)');
      const r = run('rc-delay', { values: { r: 10e3, c: 1e-6, to: 0.632 * 5, toward: 5 } });
      near(r.time, tau, 0.001, 'time to 63.2 %');
    });
    it('reaches 99.3 % at five time constants', () => {
      // 1 − e^−5 = 0.99326: "settled after 5 τ", common practice.
      const r = run('rc-delay', { values: { r: 4.7e3, c: 220e-9, to: 0.99326 * 3.3, supply: 3.3 } });
      near(r.time, 5 * 4.7e3 * 220e-9, 0.001, 'time to 99.3 %');
    });
    it('discharge from 5 V to half takes ln2·RC', () => {
      // Half-life of an RC discharge, t = RC·ln2, common practice.
      const r = run('rc-delay', { values: { r: 1e6, c: 1e-6, from: 5, to: 2.5, toward: 0 } });
      near(r.time, Math.LN2, 1e-12, 'time');
    });
  });

  describe('UART baud rates', () => {
    it('16 MHz, 16× oversampling, 9600 baud: divisor 104 → 9615.4 baud, +0.16 %', () => {
      // Commonly tabulated in AVR datasheets (UBRR = 103 at 16 MHz), from memory.
      const r = run('baud', { values: { clock: 16e6, baud: 9600 } });
      assert.equal(r.divisor, 104);
      near(r.baud, 9615.4, 1e-5, 'baud');
      assert.equal(Number((r.error * 100).toFixed(2)), 0.16);
    });
    it('16 MHz, 115200 baud: −3.5 % at 16×, +2.1 % at 8×', () => {
      // AVR datasheet baud tables at 16 MHz: UBRR 8 → −3.5 %, with U2X UBRR 16 → 2.1 %, from memory.
      const normal = run('baud', { values: { clock: 16e6, baud: 115200 } });
      assert.equal(Number((normal.error * 100).toFixed(1)), -3.5);
      const double = run('baud', { values: { clock: 16e6, baud: 115200, oversampling: 8 } });
      assert.equal(Number((double.error * 100).toFixed(1)), 2.1);
    });
    it('a 1.8432 MHz clock divides 16× to 9600 baud exactly', () => {
      // 1.8432 MHz is the classic UART crystal: 1843200 / 16 / 12 = 9600 (16550 divisor latch 12), a fact of the trade.
      const r = run('baud', { values: { clock: 1.8432e6, baud: 9600 } });
      assert.equal(r.divisor, 12);
      assert.equal(r.error, 0);
    });
    it('a fractional divisor is used as given', () => {
      // rate = clock / (oversampling · divisor): the STM32 USART fractional baud generator, baud = f/(16·USARTDIV)
      // (STM32 reference manual, from memory); 48 MHz / (16 · 26.0417) ≈ 115200.
      const r = run('baud', { values: { clock: 48e6, baud: 115200, divisor: 26.0416667 } });
      near(r.baud, 115200, 1e-6, 'baud');
    });
  });

  it('crystal load: two 22 pF capacitors and 5 pF stray give 16 pF', () => {
    // Common practice: CL = C1·C2/(C1 + C2) + Cstray.
    const r = run('crystal-load', { values: { cl: 16e-12, cstray: 5e-12, c1: 22e-12, c2: 22e-12 } });
    near(r.load, 16e-12, 1e-12, 'load');
    assert.ok(Math.abs(r.error) < 1e-12);
  });

  describe('MCU timers', () => {
    it('AVR fast PWM, 8-bit at 16 MHz / 64: 976.5625 Hz', () => {
      // AVR datasheet fast PWM f = fclk/(N·256), from memory; the 977 Hz of Arduino pins 5 and 6, a fact of the trade.
      const r = run('timer', { values: { clock: 16e6, prescaler: 64, reload: 255, bits: 8 } });
      assert.equal(r.frequency, 976.5625);
      assert.equal(r.counts, 256);
    });
    it('AVR phase-correct PWM (up-down), 8-bit at 16 MHz / 64: 490.2 Hz', () => {
      // AVR datasheet phase-correct PWM f = fclk/(N·510), from memory; the 490 Hz of Arduino pins 9 and 10.
      const r = run('timer', { values: { clock: 16e6, prescaler: 64, reload: 255, bits: 8, compare: 64 }, choices: { mode: 'up-down' } });
      near(r.frequency, 16e6 / (64 * 510), 1e-12, 'frequency');
      near(r.duty, 64 / 255, 1e-12, 'duty');
    });
    it('STM32-style 72 MHz, prescaler 72, reload 999: 1 kHz', () => {
      // Common practice: PSC = 71 (ratio 72), ARR = 999 gives a 1 ms update at 72 MHz.
      const r = run('timer', { values: { clock: 72e6, prescaler: 72, reload: 999, compare: 250 } });
      near(r.frequency, 1000, 1e-12, 'frequency');
      near(r.duty, 0.25, 1e-12, 'duty');
    });
    it('search finds the 1 ms CTC tick of an 8-bit AVR timer: prescaler 64, reload 249', () => {
      // Common practice: 16 MHz / 64 / 250 = 1 kHz (OCR0A = 249), prescalers 1, 8, 64, 256, 1024 (AVR timer 0, from memory).
      const model = circuitById('timer') as CircuitModel;
      const input = withDefaults(model, { values: { clock: 16e6, bits: 8 }, lists: { prescalers: { kind: 'list', values: [1, 8, 64, 256, 1024] } } });
      const found = model.search!(input, { unknowns: ['prescaler', 'reload'], measure: 'frequency', target: 1000 });
      assert.deepEqual(found, { values: { prescaler: 64, reload: 249 }, error: 0 });
    });
  });
});
