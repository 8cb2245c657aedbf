// Physics checks: each bad input is a ModelIssue naming the offending key, never an exception.
import { strict as assert } from 'assert';
import { analyzeText } from '../helpers/analyze';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults, type GivenInput } from '../../core/circuits/defaults';
import type { CircuitModel, ModelIssue } from '../../core/circuits/model';

function issues(id: string, given: GivenInput): ModelIssue[] {
  const model = circuitById(id) as CircuitModel;
  return model.validate(withDefaults(model, given));
}

function errorKeys(id: string, given: GivenInput): string[] {
  return issues(id, given).filter((i) => (i.severity ?? 'error') === 'error').map((i) => i.key);
}

const schmitt = { supply: 3.3, 'vt+': 2.0, 'vt-': 1.1, r: 47e3, c: 100e-9 };
const astable = { supply: 5, ra: 1e3, rb: 10e3, c: 10e-9 };
const timer = { clock: 16e6, prescaler: 64, reload: 249 };

// Expected behaviour per DESIGN.md "Values that break a model's physics are errors, not numbers".
const cases: Array<[string, string, GivenInput, string]> = [
  ['schmitt-rc', 'vt- at vt+', { values: { ...schmitt, 'vt-': 2.0 } }, 'vt-'],
  ['schmitt-rc', 'vt- above vt+', { values: { ...schmitt, 'vt-': 2.5 } }, 'vt-'],
  ['schmitt-rc', 'vt+ at the output high level', { values: { ...schmitt, 'vt+': 3.3 } }, 'vt+'],
  ['schmitt-rc', 'vt- below output low', { values: { ...schmitt, vol: 1.2 } }, 'vt-'],
  ['schmitt-rc', 'zero R', { values: { ...schmitt, r: 0 } }, 'r'],
  ['schmitt-rc', 'negative C', { values: { ...schmitt, c: -1e-9 } }, 'c'],
  ['schmitt-rc', 'negative tpd', { values: { ...schmitt, tpd: -1e-9 } }, 'tpd'],
  ['schmitt-rc', 'missing vt+', { values: { supply: 3.3, 'vt-': 1.1, r: 1e3, c: 1e-9 } }, 'vt+'],
  ['schmitt-rc', 'output low above output high', { values: { ...schmitt, voh: 1, vol: 2 } }, 'voh'],
  ['comparator-rc', 'vref outside the swing', { values: { voh: 5, vol: 0, vref: 5, r1: 1e3, r2: 1e3, r: 1e3, c: 1e-9 } }, 'vref'],
  ['comparator-rc', 'zero r1', { values: { voh: 5, vol: -5, r1: 0, r2: 1e3, r: 1e3, c: 1e-9 } }, 'r1'],
  ['555-astable', 'control at the supply', { values: { ...astable, control: 5 } }, 'control'],
  ['555-astable', 'control above the supply', { values: { ...astable, control: 7 } }, 'control'],
  ['555-astable', 'zero RA', { values: { ...astable, ra: 0 } }, 'ra'],
  ['555-monostable', 'control at the supply', { values: { supply: 5, r: 1e3, c: 1e-6, control: 5 } }, 'control'],
  ['inverter-rc', 'threshold at the supply', { values: { supply: 5, threshold: 5, r: 1e3, c: 1e-9 } }, 'threshold'],
  ['inverter-rc', 'threshold at 0 V', { values: { supply: 5, threshold: 0, r: 1e3, c: 1e-9 } }, 'threshold'],
  ['ring', 'even stages', { values: { stages: 4, tpd: 1e-9 } }, 'stages'],
  ['ring', 'one stage', { values: { stages: 1, tpd: 1e-9 } }, 'stages'],
  ['ring', 'fractional stages', { values: { stages: 3.5, tpd: 1e-9 } }, 'stages'],
  ['ring', 'zero delay', { values: { stages: 5, tpd: 0 } }, 'tpd'],
  ['rc-delay', 'level beyond the final voltage', { values: { r: 1e3, c: 1e-6, to: 5, supply: 5 } }, 'to'],
  ['rc-delay', 'level behind the start', { values: { r: 1e3, c: 1e-6, from: 2, to: 1, supply: 5 } }, 'to'],
  ['rc-delay', 'neither toward nor supply', { values: { r: 1e3, c: 1e-6, to: 1 } }, 'toward'],
  ['timer', 'reload beyond 16 bits', { values: { ...timer, reload: 65536 } }, 'reload'],
  ['timer', 'reload beyond 8 bits', { values: { ...timer, reload: 256, bits: 8 } }, 'reload'],
  ['timer', 'prescaler not in the list', { values: { ...timer, prescaler: 32 }, lists: { prescalers: { kind: 'list', values: [1, 8, 64, 256, 1024] } } }, 'prescaler'],
  ['timer', 'prescaler outside the range', { values: { ...timer, prescaler: 9 }, lists: { prescalers: { kind: 'range', min: 1, max: 8 } } }, 'prescaler'],
  ['timer', 'prescaler zero', { values: { ...timer, prescaler: 0 } }, 'prescaler'],
  ['timer', 'fractional reload', { values: { ...timer, reload: 10.5 } }, 'reload'],
  ['timer', 'up-down with reload 0', { values: { ...timer, reload: 0 }, choices: { mode: 'up-down' } }, 'reload'],
  ['timer', 'negative compare', { values: { ...timer, compare: -1 } }, 'compare'],
  ['timer', 'zero bits', { values: { ...timer, bits: 0 } }, 'bits'],
  ['timer', 'zero clock', { values: { ...timer, clock: 0 } }, 'clock'],
  ['baud', 'zero baud', { values: { clock: 16e6, baud: 0 } }, 'baud'],
  ['baud', 'zero divisor', { values: { clock: 16e6, baud: 9600, divisor: 0 } }, 'divisor'],
  ['crystal-load', 'negative stray', { values: { cl: 12e-12, cstray: -1e-12, c1: 18e-12, c2: 18e-12 } }, 'cstray'],
  ['crystal-load', 'missing stray', { values: { cl: 12e-12, c1: 18e-12, c2: 18e-12 } }, 'cstray'],
  ['crystal-load', 'zero C1', { values: { cl: 12e-12, cstray: 3e-12, c1: 0, c2: 18e-12 } }, 'c1'],
];

describe('circuit validation', () => {
  for (const [id, what, given, key] of cases) {
    it(`${id}: ${what} is an error on \`${key}\``, () => {
      const keys = errorKeys(id, given);
      assert.ok(keys.includes(key), `expected an error on ${key}, got ${JSON.stringify(issues(id, given))}`);
      for (const issue of issues(id, given)) assert.ok(issue.message.length > 10, 'a message a user understands');
    });
  }

  it('accepts the DESIGN.md example block', () => {
    // DESIGN.md, "Timing blocks": status-led at 190 Hz ±5 %.
    assert.deepEqual(issues('schmitt-rc', { values: schmitt }), []);
  });

  it('warns, without refusing, when compare is beyond the period', () => {
    const found = issues('timer', { values: { ...timer, compare: 300 } });
    assert.deepEqual(found.map((i) => [i.key, i.severity]), [['compare', 'warning']]);
    const model = circuitById('timer') as CircuitModel;
    assert.equal(model.compute(withDefaults(model, { values: { ...timer, compare: 300 } })).duty, 1);
  });

  it('warns when voh is above the supply', () => {
    const found = issues('schmitt-rc', { values: { ...schmitt, voh: 3.6 } });
    assert.deepEqual(found.map((i) => [i.key, i.severity]), [['voh', 'warning']]);
  });

  it('accepts a split supply comparator whose 0 V lies between the thresholds', () => {
    assert.deepEqual(issues('comparator-rc', { values: { voh: 5, vol: -5, r1: 1e3, r2: 2e3, r: 1e3, c: 1e-9 } }), []);
  });
});

describe('cautions', () => {
  it('names supplies above the 60 V DC extra-low-voltage limit', () => {
    // 60 V DC: SELV of IEC 60950-1 / ES1 of IEC 62368-1 (from memory), common practice.
    const model = circuitById('555-astable') as CircuitModel;
    const low = withDefaults(model, { values: { ...astable, supply: 15 } });
    const high = withDefaults(model, { values: { ...astable, supply: 72 } });
    assert.deepEqual(model.cautions?.(low), []);
    const all = model.cautions?.(high) ?? [];
    const text = all.filter((t) => /60 V/.test(t));
    assert.equal(text.length, 1);
    assert.match(text[0], /hazardous/);
    // NE555 datasheet (SLFS022), from memory: 18 V absolute maximum supply — a warning on `supply`.
    const issues = model.validate(high);
    assert.deepEqual(issues.map((i) => [i.key, i.severity]), [['supply', 'warning']]);
    assert.match(issues[0].message, /18 V absolute maximum/);
  });

  it('notes a 555 supply outside the NE555 range of 4.5 V to 16 V', () => {
    // NE555 datasheet (SLFS022), recommended operating conditions, from memory: VCC 4.5 V to 16 V.
    const model = circuitById('555-monostable') as CircuitModel;
    const at = (supply: number) => model.cautions?.(withDefaults(model, { values: { supply, r: 10e3, c: 1e-6 } })) ?? [];
    assert.match(at(3.3)[0], /below the bipolar NE555's 4\.5 V minimum/);
    assert.deepEqual(at(12), []);
    assert.match(at(17)[0], /recommended 16 V/);
  });

  it('reminds that watchdog and reset timing needs independent verification', () => {
    // Common practice in functional safety: timing that guards people or property is verified apart from its arithmetic.
    const safetyNotes = (name: string, circuit: string, keys: string) =>
      analyzeText('n.md', `\`\`\`timing ${name}\ncircuit: ${circuit}\n${keys}\`\`\`\n`).blocks[0].findings.filter((f) => f.code === 'caution' && /verify it independently/.test(f.message)).length;
    const delay = 'r: 10k\nc: 1u\nto: 2 V\nsupply: 3.3 V\n';
    assert.equal(safetyNotes('por-reset', 'rc-delay', delay), 1);
    assert.equal(safetyNotes('led-fade', 'rc-delay', delay), 0);
    assert.equal(safetyNotes('watchdog-kick', 'timer', 'clock: 1 MHz\nprescaler: 8\nreload: 999\n'), 1);
    // A watchdog's timing guards by what it is, whatever the block is called.
    assert.equal(safetyNotes('kick', 'watchdog', 'clock: 32 kHz ±40%\nprescaler: 16\nreload: 3999\nrefresh: 100 ms\n'), 1);
  });

  it('warns of a baud error beyond ±2 %', () => {
    // Common practice: an 8-N-1 link tolerates about ±2 % total mismatch. 16 MHz / 16 / 9 = 111111 baud, −3.5 %
    // from 115200 (AVR baud tables, from memory); 16 MHz / 16 / 104 = 9615 baud, +0.16 %.
    const model = circuitById('baud') as CircuitModel;
    const fast = model.validate(withDefaults(model, { values: { clock: 16e6, baud: 115200 } }));
    assert.deepEqual(fast.map((i) => [i.key, i.severity]), [['baud', 'warning']]);
    assert.match(fast[0].message, /−3\.5\d* %/);
    assert.deepEqual(model.validate(withDefaults(model, { values: { clock: 16e6, baud: 9600 } })), []);
  });
});
