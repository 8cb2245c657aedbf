// End to end: blocks written as a user writes them (SI prefixes, IEC 60062 codes, units with and without a space,
// expressions, the block's own keys, defaults), run through `tickmark check --json` in-process, and the JSON
// compared with published formulas evaluated here, and with ngspice (eecircuit-engine) for three oscillators.
import { skipUnlessCi } from '../helpers/reference';
import { strict as assert } from 'assert';
import { checkJson, cleanBlock, markdownBlock, near, workspace, type JsonBlock, type JsonReport } from './cli-json';
import { compileConstants, compilerAvailable, REFERENCE_COMPILERS, type Target } from './gcc-print';
import { boardHeader, firmwareBlocks, firmwareSource } from './firmware-fixture';
import { comparatorNetlist, measure, ne555AstableNetlist, schmittNetlist, simulate, startEngine, tran, type Engine } from './spice-netlists';

// Each block of the design note, with the SI values its text stands for: SI prefixes as in the SI Brochure
// (BIPM, 9th edition, table 7), letter-and-digit codes as in IEC 60062:2016 (3V3 for volts: common practice).
const blocks: Record<string, { lines: string[]; si: Record<string, number> }> = {
  'status-blink': { lines: ['circuit: schmitt-rc', 'supply: 3V3', 'vt+: 0.6 * supply', 'vt-: 950 mV', 'r: 68 kΩ', 'c: 4n7'], si: { supply: 3.3, 'vt+': 1.98, 'vt-': 0.95, r: 68e3, c: 4.7e-9 } },
  'cmp-clock': { lines: ['circuit: comparator-rc', 'voh: 4.6 V', 'vol: 200mV', 'vref: 2V5', 'r1: 10k', 'r2: 33 kohm', 'r: 15000', 'c: 10 nF'], si: { voh: 4.6, vol: 0.2, vref: 2.5, r1: 10e3, r2: 33e3, r: 15e3, c: 10e-9 } },
  beeper: { lines: ['circuit: 555-astable', 'supply: 12V', 'ra: 1k5', 'rb: 6.8 kΩ', 'c: 10nF'], si: { supply: 12, ra: 1.5e3, rb: 6.8e3, c: 10e-9 } },
  'diode-steered': { lines: ['circuit: 555-astable', 'supply: 5 V', 'ra: 2k2', 'rb: 3.3k', 'c: 0.47 uF', 'control: 0.6 * supply', 'diode: yes'], si: { supply: 5, ra: 2.2e3, rb: 3.3e3, c: 0.47e-6, control: 3 } },
  debounce: { lines: ['circuit: 555-monostable', 'supply: 9 V', 'r: 1M5', 'c: 2.2 µF'], si: { supply: 9, r: 1.5e6, c: 2.2e-6 } },
  'aux-clock': { lines: ['circuit: inverter-rc', 'supply: 5V', 'r: 220k', 'c: 330p'], si: { supply: 5, r: 220e3, c: 330e-12 } },
  'ring-probe': { lines: ['circuit: ring', 'stages: 11', 'tpd: 1 / (8 GHz)'], si: { stages: 11, tpd: 125e-12 } },
  'enable-delay': { lines: ['circuit: rc-delay', 'supply: 3.3 V', 'r: 100k', 'c: 1 uF', 'to: 0.7 * supply'], si: { r: 100e3, c: 1e-6, to: 2.31, toward: 3.3 } },
  bleed: { lines: ['circuit: rc-delay', 'r: 2M2', 'c: 10µF', 'from: 12 V', 'to: 1V8', 'toward: 0 V'], si: { r: 2.2e6, c: 10e-6, from: 12, to: 1.8, toward: 0 } },
  'tick-up': { lines: ['circuit: timer', 'clock: 8 MHz * 2', 'prescaler: 8', 'reload: 2499', 'compare: 625'], si: { clock: 16e6, prescaler: 8, reload: 2499, compare: 625 } },
  'tick-centre': { lines: ['circuit: timer', 'clock: 72 MHz', 'prescaler: 3', 'reload: 1200', 'compare: 300', 'mode: up-down'], si: { clock: 72e6, prescaler: 3, reload: 1200, compare: 300 } },
  'servo-frame': { lines: ['circuit: timer', 'clock: 16MHz', 'prescaler: ?', 'reload: ?', 'prescalers: 1, 8, 64, 256, 1024', 'target: 1 / (20 ms)'], si: { clock: 16e6 } },
  'console-fast': { lines: ['circuit: baud', 'clock: 14.7456 MHz', 'baud: 115200'], si: { clock: 14.7456e6, baud: 115200, oversampling: 16 } },
  'console-avr': { lines: ['circuit: baud', 'clock: 16 MHz', 'baud: 38.4k'], si: { clock: 16e6, baud: 38400, oversampling: 16 } },
  'crystal-caps': { lines: ['circuit: crystal-load', 'cl: 12.5 pF', 'c1: 15p', 'c2: 18 pF', 'cstray: 4p7'], si: { cl: 12.5e-12, c1: 15e-12, c2: 18e-12, cstray: 4.7e-12 } },
};

const note = ['# Timing of the bench unit', '', ...Object.entries(blocks).map(([name, b]) => markdownBlock(name, b.lines))].join('\n');

let report: JsonReport;
let exitCode: number;

function block(name: string): JsonBlock {
  const found = cleanBlock(report, name);
  for (const [key, value] of Object.entries(blocks[name].si)) near(found.params[key] as number, value, 1e-12, `${name} ${key} (value as written)`);
  return found;
}

/** High, low and first edge of an inverting hysteresis oscillator by the RC charging law, common practice. */
function hysteresisTimes(tau: number, upper: number, lower: number, voh: number, vol: number) {
  const high = tau * Math.log((voh - lower) / (voh - upper));
  const low = tau * Math.log((upper - vol) / (lower - vol));
  return { high, low, frequency: 1 / (high + low), duty: high / (high + low), 'first-edge': tau * Math.log(voh / (voh - upper)) };
}

function ne555Times(v: Record<string, number>) {
  // NE555 datasheet SLFS022: charge through RA + RB toward VCC between control/2 and control, discharge through RB.
  const high = (v.ra + v.rb) * v.c * Math.log((v.supply - v.control / 2) / (v.supply - v.control));
  const low = v.rb * v.c * Math.LN2;
  return { high, low, frequency: 1 / (high + low), duty: high / (high + low), 'first-edge': (v.ra + v.rb) * v.c * Math.log(v.supply / (v.supply - v.control)) };
}

describe('end to end: timing blocks through tickmark check --json', function () {
  before(() => {
    const run = checkJson(workspace({ 'notes/timing.md': note }), ['notes/timing.md']);
    report = run.report;
    exitCode = run.code;
  });

  it('checks the whole note cleanly: exit 0, every block computed', () => {
    assert.equal(exitCode, 0);
    assert.deepEqual(report.files[0].blocks.map((b) => b.name), Object.keys(blocks));
  });

  it('schmitt-rc: the RC charging law between VT− and VT+, VT+ following the supply', () => {
    const b = block('status-blink');
    assert.equal(b.params.voh, 3.3, 'voh defaults to the supply');
    // Standard RC charging law between the two thresholds, rail-to-rail output, common practice.
    const want = hysteresisTimes(68e3 * 4.7e-9, 0.6 * 3.3, 0.95, 3.3, 0);
    for (const key of ['high', 'low', 'frequency', 'duty', 'first-edge'] as const) near(b.values[key], want[key], 1e-9, key);
  });

  it('comparator-rc: thresholds vref + (Vout − vref)·r1/(r1 + r2), then the RC charging law', () => {
    const b = block('cmp-clock');
    // Op-amp relaxation oscillator with a referenced divider (common practice), RC charging law between thresholds.
    const beta = 10e3 / (10e3 + 33e3);
    const upper = 2.5 + (4.6 - 2.5) * beta;
    const lower = 2.5 + (0.2 - 2.5) * beta;
    near(b.values['vt+'], upper, 1e-12, 'vt+');
    near(b.values['vt-'], lower, 1e-12, 'vt-');
    const want = hysteresisTimes(15e3 * 10e-9, upper, lower, 4.6, 0.2);
    for (const key of ['high', 'low', 'frequency', 'duty', 'first-edge'] as const) near(b.values[key], want[key], 1e-9, key);
  });

  it('555-astable: tH = 0.693(RA+RB)C, tL = 0.693·RB·C, f ≈ 1.44/((RA+2RB)C) with control left at 2/3 VCC', () => {
    const b = block('beeper');
    near(b.params.control as number, 8, 1e-12, 'control defaults to 2/3 of 12 V (SLFS022 internal divider)');
    // Texas Instruments NE555 datasheet (SLFS022), astable operation; 0.693 rounds ln 2.
    near(b.values.high, Math.LN2 * (1.5e3 + 6.8e3) * 10e-9, 1e-9, 'high');
    near(b.values.low, Math.LN2 * 6.8e3 * 10e-9, 1e-9, 'low');
    // Same datasheet: f = 1.44/((RA + 2RB)·C); 1.44 rounds 1/ln 2 = 1.4427, so 0.2 %.
    near(b.values.frequency, 1.44 / ((1.5e3 + 2 * 6.8e3) * 10e-9), 0.002, 'frequency');
    near(b.values.duty, (1.5e3 + 6.8e3) / (1.5e3 + 2 * 6.8e3), 1e-9, 'duty = (RA+RB)/(RA+2RB), SLFS022');
    // RC charging law from 0 V to 2/3 VCC: (RA + RB)·C·ln 3, common practice.
    near(b.values['first-edge'], (1.5e3 + 6.8e3) * 10e-9 * Math.log(3), 1e-9, 'first-edge');
  });

  it('555-astable with a diode across RB and the control pin at 0.6·VCC: charge through RA alone', () => {
    const b = block('diode-steered');
    // Diode-steered 555, common practice: charge through RA only; RC charging law between control/2 and control.
    const high = 2.2e3 * 0.47e-6 * Math.log((5 - 1.5) / (5 - 3));
    const low = 3.3e3 * 0.47e-6 * Math.LN2; // discharge through RB to half the control level, SLFS022
    near(b.values.high, high, 1e-9, 'high');
    near(b.values.low, low, 1e-9, 'low');
    near(b.values.frequency, 1 / (high + low), 1e-9, 'frequency');
  });

  it('555-monostable: tw = 1.1·R·C', () => {
    const b = block('debounce');
    // Texas Instruments NE555 datasheet (SLFS022), monostable operation: tw = 1.1·R·C, 1.1 rounding ln 3.
    near(b.values.width, 1.1 * 1.5e6 * 2.2e-6, 0.002, 'width ≈ 1.1 RC');
    near(b.values.width, Math.log(3) * 1.5e6 * 2.2e-6, 1e-9, 'width = ln 3 · RC');
  });

  it('inverter-rc at the default mid-supply threshold: T ≈ 2.2·RC, duty 50 %', () => {
    const b = block('aux-clock');
    near(b.params.threshold as number, 2.5, 1e-12, 'threshold defaults to supply/2');
    // CMOS two-inverter RC oscillator, T = 2·ln 3·RC ≈ 2.2 RC at Vth = V/2: common practice.
    near(b.values.period, 2.2 * 220e3 * 330e-12, 0.002, 'period ≈ 2.2 RC');
    near(b.values.period, 2 * Math.log(3) * 220e3 * 330e-12, 1e-9, 'period = 2 ln 3 RC');
    near(b.values.duty, 0.5, 1e-9, 'duty');
  });

  it('ring: f = 1/(2·N·tpd)', () => {
    const b = block('ring-probe');
    // Ring oscillator, an edge goes round the N stages twice per period: common practice.
    near(b.values.frequency, 1 / (2 * 11 * 125e-12), 1e-12, 'frequency');
    near(b.values.period, 2 * 11 * 125e-12, 1e-12, 'period');
  });

  it('rc-delay: t = RC·ln((V∞ − V0)/(V∞ − V1)), charging toward the supply and discharging toward 0 V', () => {
    // RC charging law V(t) = V∞ + (V0 − V∞)·e^(−t/RC), common practice.
    near(block('enable-delay').values.time, 100e3 * 1e-6 * Math.log(3.3 / (3.3 - 0.7 * 3.3)), 1e-9, 'charge to 70 %');
    near(block('bleed').values.time, 2.2e6 * 10e-6 * Math.log(12 / 1.8), 1e-9, 'discharge 12 V → 1.8 V');
  });

  it('timer, up-counting: f = clock/(prescaler·(reload + 1)), duty = compare/(reload + 1)', () => {
    const b = block('tick-up');
    // Up-counting timer law as in STM32 reference manuals (update rate = f/((PSC+1)(ARR+1)), here the prescaler key
    // is the ratio PSC+1) and AVR CTC mode f = fclk/(N·(1 + OCR)), from memory.
    near(b.values.frequency, 16e6 / (8 * 2500), 1e-12, 'frequency');
    near(b.values.duty, 625 / 2500, 1e-12, 'duty');
    assert.equal(b.values.counts, 2500);
  });

  it('timer, up-down: f = clock/(2·prescaler·reload), duty = compare/reload', () => {
    const b = block('tick-centre');
    // AVR phase-correct PWM f = fclk/(2·N·TOP) and STM32 centre-aligned mode, from memory.
    near(b.values.frequency, 72e6 / (2 * 3 * 1200), 1e-12, 'frequency');
    near(b.values.duty, 300 / 1200, 1e-12, 'duty');
  });

  it('timer search: the register pair found meets a 50 Hz servo frame by the timer law', () => {
    const b = block('servo-frame');
    const prescaler = b.solved?.prescaler?.value as number;
    const reload = b.solved?.reload?.value as number;
    // AVR timer 1 prescaler ratios 1, 8, 64, 256, 1024 and its 16-bit TOP, from memory; 20 ms servo frame, a fact of the trade.
    assert.ok([1, 8, 64, 256, 1024].includes(prescaler), `prescaler ${prescaler}`);
    assert.ok(Number.isInteger(reload) && reload >= 0 && reload <= 0xffff, `reload ${reload}`);
    near(16e6 / (prescaler * (reload + 1)), 50, 1e-12, 'timer law with the found pair');
    near(b.values.frequency, 50, 1e-12, 'frequency recomputed with the found pair');
  });

  it('baud: rate = clock/(16·divisor) with the nearest whole divisor', () => {
    // Baud law f/(16·divisor) as in the AVR and STM32 reference manuals, from memory; 14.7456 MHz divides to
    // 115200 exactly (8 × 1.8432 MHz, a UART crystal: fact of the trade).
    const exact = block('console-fast');
    assert.equal(exact.values.divisor, 8);
    near(exact.values.baud, 115200, 1e-12, 'baud');
    assert.equal(exact.values.error, 0);
    // AVR baud table at 16 MHz, 38.4 kbaud: UBRR 25 (divisor 26), error 0.2 %, from memory.
    const avr = block('console-avr');
    const divisor = Math.round(16e6 / (16 * 38400));
    assert.equal(avr.values.divisor, divisor);
    near(avr.values.baud, 16e6 / (16 * divisor), 1e-12, 'baud');
    near(avr.values.error, 16e6 / (16 * divisor) / 38400 - 1, 1e-9, 'error');
    assert.equal(Number((avr.values.error * 100).toFixed(1)), 0.2);
  });

  it('crystal-load: CL = C1·C2/(C1 + C2) + Cstray', () => {
    const b = block('crystal-caps');
    // Pierce load as in crystal makers' application notes, from memory.
    const load = (15e-12 * 18e-12) / (15e-12 + 18e-12) + 4.7e-12;
    near(b.values.load, load, 1e-12, 'load');
    near(b.values.error, load / 12.5e-12 - 1, 1e-9, 'error');
  });

  describe('the same oscillators in ngspice (eecircuit-engine), values as in the blocks', function () {
    this.timeout(30000);
    let engine: Engine;
    before(async () => (engine = await startEngine()));

    async function againstSpice(b: JsonBlock, netlist: (analysis: string) => string, level: number): Promise<void> {
      const sim = await simulate(engine, netlist(tran(b.values.period, b.values['first-edge'], 6)));
      const got = measure(sim.time, sim.out, level);
      // Switch-level netlists of our own; ideal switching, so the closed form should hold within 0.3 %.
      near(b.values.frequency, got.frequency, 0.003, 'frequency against ngspice');
      near(b.values.duty, got.duty, 0.003, 'duty against ngspice');
      near(b.values['first-edge'], got.firstEdge, 0.003, 'first edge against ngspice');
    }

    it('schmitt-rc status-blink', async () => {
      await againstSpice(block('status-blink'), (a) => schmittNetlist({ supply: 3.3, upper: 0.6 * 3.3, lower: 0.95, r: 68e3, c: 4.7e-9 }, a), 1.65);
    });
    it('comparator-rc cmp-clock', async () => {
      await againstSpice(block('cmp-clock'), (a) => comparatorNetlist({ voh: 4.6, vol: 0.2, vref: 2.5, r1: 10e3, r2: 33e3, r: 15e3, c: 10e-9 }, a), 2.4);
    });
    it('555-astable beeper', async () => {
      await againstSpice(block('beeper'), (a) => ne555AstableNetlist({ supply: 12, ra: 1.5e3, rb: 6.8e3, c: 10e-9, control: 8 }, a), 6);
    });
  });

  describe('worst-case spread of a toleranced 555', () => {
    // ±5 % supply, ±1 % and ±5 % resistors, an electrolytic's +80 % −20 %, a control pin held to ±0.1 V.
    const bands: Record<string, [number, number]> = { supply: [9 * 0.95, 9 * 1.05], ra: [4.7e3 * 0.99, 4.7e3 * 1.01], rb: [10e3 * 0.95, 10e3 * 1.05], c: [0.8e-6, 1.8e-6], control: [5.9, 6.1] };
    const text = markdownBlock('tone-spread', ['circuit: 555-astable', 'supply: 9 V ±5%', 'ra: 4k7 ±1%', 'rb: 10 kΩ +-5%', 'c: 1 µF +80% -20%', 'control: 6 V ±0.1 V']);
    const keys = Object.keys(bands);

    function rangeOver(points: Array<Record<string, number>>): Record<string, { min: number; max: number }> {
      const ranges: Record<string, { min: number; max: number }> = {};
      for (const point of points) {
        for (const [result, value] of Object.entries(ne555Times(point))) {
          const r = (ranges[result] ??= { min: value, max: value });
          r.min = Math.min(r.min, value);
          r.max = Math.max(r.max, value);
        }
      }
      return ranges;
    }

    function grid(levels: number): Array<Record<string, number>> {
      const points: Array<Record<string, number>> = [];
      for (let n = 0; n < levels ** keys.length; n++) {
        const point: Record<string, number> = {};
        keys.forEach((key, i) => {
          const step = Math.floor(n / levels ** i) % levels;
          const [low, high] = bands[key];
          point[key] = low + ((high - low) * step) / (levels - 1);
        });
        points.push(point);
      }
      return points;
    }

    it('min and max of every result equal the extremes over all 32 corners of the NE555 formula', () => {
      const { code, report: spreadReport } = checkJson(workspace({ 'tone.md': text }), ['tone.md']);
      assert.equal(code, 0);
      const b = cleanBlock(spreadReport, 'tone-spread');
      const corners = rangeOver(grid(2));
      // Every result is monotonic in each input, so no interior point of a finer grid lies outside the corners.
      const fine = rangeOver(grid(5));
      const nominal = ne555Times({ supply: 9, ra: 4.7e3, rb: 10e3, c: 1e-6, control: 6 });
      for (const result of ['high', 'low', 'frequency', 'duty', 'first-edge'] as const) {
        assert.ok(fine[result].min >= corners[result].min * (1 - 1e-12) && fine[result].max <= corners[result].max * (1 + 1e-12), `${result} is monotonic`);
        near(b.values[result], nominal[result], 1e-9, `${result} nominal`);
        near(b.spread?.[result]?.min, corners[result].min, 1e-9, `${result} min`);
        near(b.spread?.[result]?.max, corners[result].max, 1e-9, `${result} max`);
      }
    });
  });
});

for (const dataModel of ['lp64', 'ilp32', 'ip16'] as Target[]) {
  const compiler = REFERENCE_COMPILERS[dataModel];
  describe(`end to end: firmware constants through tickmark check --json against ${compiler.label} as reference, ${dataModel}`, () => {
    // With a 16-bit int, 8u * CONSOLE_BAUD and 16u * CONSOLE_BAUD wrap (C11 6.2.5p9) in avr-gcc as in Tickmark:
    // the divisor comes out 799, not 117, and the console block rightly warns of its rate error.
    const wraps = dataModel === 'ip16';
    let json: JsonReport;
    let gcc: Map<string, number>;
    before(function () {
      if (!compilerAvailable(dataModel)) skipUnlessCi(this, `${compiler.command} is not installed; reference check skipped`);
      const dir = workspace({ 'fw/board.h': boardHeader, 'fw/main.c': firmwareSource() });
      const expressions = Object.values(firmwareBlocks).flatMap((b) => Object.values(b.keys));
      const compiled = compileConstants(dataModel, { prelude: '#include "board.h"', expressions, dir: `${dir}/fw` });
      // Every value fits 2^53, so the integers convert to numbers exactly.
      gcc = new Map(expressions.map((expr, i) => {
        const c = compiled[i];
        if (!c.ok) throw new Error(`${compiler.command} refuses ${expr}: ${c.diagnostic}`);
        return [expr, Number(c.value)];
      }));
      const run = checkJson(dir, ['--data-model', dataModel, 'fw/main.c']);
      assert.equal(run.code, wraps ? 1 : 0);
      json = run.report;
    });
    const firmwareBlock = (name: string): JsonBlock => {
      if (!(wraps && name === 'console')) return cleanBlock(json, name);
      const found = json.files.flatMap((f) => f.blocks).find((b) => b.name === name) as JsonBlock;
      assert.deepEqual(found.diagnostics.map((d) => [d.severity, /rate error/.test(d.message)]), [['warning', true]]);
      return found;
    };

    for (const [name, b] of Object.entries(firmwareBlocks)) {
      it(`${name}: every param equals gcc's value of the same text`, () => {
        const got = firmwareBlock(name);
        for (const [key, expr] of Object.entries(b.keys)) assert.equal(got.params[key], gcc.get(expr), `${key}: ${expr}`);
      });
    }

    it('motor-pwm: the up-counting timer law with gcc\'s register values', () => {
      const v = firmwareBlock('motor-pwm').values;
      const [clock, prescaler, reload, compare] = ['SYS_HZ', 'PWM_PRESCALE', 'PWM_TOP', 'PWM_CMP'].map((e) => gcc.get(e) as number);
      // Up-counting timer law (STM32 reference manuals, AVR CTC mode), from memory.
      near(v.frequency, clock / (prescaler * (reload + 1)), 1e-12, 'frequency');
      near(v.duty, compare / (reload + 1), 1e-12, 'duty');
    });

    it('console: the baud law f/(16·divisor) with gcc\'s divisor', () => {
      const v = firmwareBlock('console').values;
      const [clock, wanted, divisor] = ['SYS_HZ / 2', 'CONSOLE_BAUD', 'UART_DIV'].map((e) => gcc.get(e) as number);
      // Baud law f/(16·divisor), AVR and STM32 reference manuals, from memory.
      near(v.baud, clock / (16 * divisor), 1e-12, 'baud');
      near(v.error, clock / (16 * divisor) / wanted - 1, 1e-9, 'error');
    });
  });
}
