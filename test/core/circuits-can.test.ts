// CAN bit timing against ISO 11898-1: the nominal bit time, sample point and the two oscillator-tolerance
// conditions written out here, a hand-derived case, and the search against an exhaustive oracle.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';
import type { CircuitModel } from '../../core/circuits/model';
import { searchCanTiming, canDefaultSets } from '../../core/circuits/can-search';
import { analyzeText, errors, noteBlock } from '../helpers/analyze';
import { blockTemplate } from '../../core/present/template';

const can = circuitById('can-bit') as CircuitModel;
const compute = (values: Record<string, number>) => can.compute(withDefaults(can, { values }));

describe('can-bit model', () => {
  // Hand-derived: 16 MHz / 2 = 8 MHz quanta (125 ns); 1 + 5 + 8 + 2 = 16 quanta = 2 µs per bit = 500 kbit/s;
  // sampled after 1 + 5 + 8 = 14 of 16 quanta = 87.5 %.
  it('16 MHz, prescaler 2, segments 5 + 8 + 2: 500 kbit/s sampled at 87.5 % (hand-derived, ISO 11898-1 bit time)', () => {
    const r = compute({ clock: 16e6, prescaler: 2, 'prop-seg': 5, 'phase-seg1': 8, 'phase-seg2': 2 });
    assert.equal(r.nbt, 16);
    assert.ok(Math.abs(r.tq - 125e-9) < 1e-21);
    assert.ok(Math.abs(r.bitrate - 500e3) < 1e-6);
    assert.equal(r['sample-point'], 0.875);
  });

  // ISO 11898-1, oscillator tolerance: df ≤ sjw / (20 · NBT) and df ≤ min(ps1, ps2) / (2 · (13 · NBT − ps2)).
  it('takes the smaller of ISO 11898-1\'s two oscillator-tolerance conditions', () => {
    // NBT 16, sjw 1: condition 1 is 1/320 = 0.3125 %; condition 2 is 2 / (2 · 206) = 0.485 %.
    assert.ok(Math.abs(compute({ clock: 16e6, prescaler: 2, 'prop-seg': 5, 'phase-seg1': 8, 'phase-seg2': 2 }).tolerance - 1 / 320) < 1e-15);
    // NBT 10, sjw 4: condition 1 is 4/200 = 2 %; condition 2 is 4 / (2 · 126) = 1.587 %, the smaller.
    assert.ok(Math.abs(compute({ clock: 10e6, prescaler: 1, 'prop-seg': 1, 'phase-seg1': 4, 'phase-seg2': 4, sjw: 4 }).tolerance - 4 / 252) < 1e-15);
  });

  it('reads tseg1 as prop-seg + phase-seg1, and needs one of the two for the tolerance', () => {
    const bare = noteBlock(['circuit: can-bit', 'clock: 16 MHz', 'prescaler: 2', 'tseg1: 13', 'phase-seg2: 2']);
    assert.equal(bare.values['sample-point'], 0.875);
    assert.equal(bare.values.tolerance, undefined);
    assert.ok(bare.findings.some((f) => f.severity === 'info' && /tseg1/.test(f.message)));
    const split = noteBlock(['circuit: can-bit', 'clock: 16 MHz', 'prescaler: 2', 'tseg1: 13', 'prop-seg: 5', 'phase-seg2: 2']);
    assert.ok(Math.abs(split.values.tolerance - 1 / 320) < 1e-15);
    assert.match(errors(noteBlock(['circuit: can-bit', 'clock: 16 MHz', 'prescaler: 2', 'tseg1: 13', 'prop-seg: 5', 'phase-seg1: 7', 'phase-seg2: 2']))[0], /tseg1/);
  });

  it('warns when the clock\'s own tolerance exceeds what the bit timing tolerates', () => {
    const lines = (clock: string) => ['circuit: can-bit', `clock: ${clock}`, 'prescaler: 2', 'prop-seg: 5', 'phase-seg1: 8', 'phase-seg2: 2'];
    const loose = noteBlock(lines('16 MHz ±0.5%'));
    assert.ok(loose.findings.some((f) => f.severity === 'warning' && /0\.5 %.*0\.3125 %/.test(f.message)));
    const crystal = noteBlock(lines('16 MHz ±100 ppm'));
    assert.equal(crystal.findings.filter((f) => f.severity === 'warning').length, 0);
  });

  it('takes bit/s, kbit/s and Mbit/s in claims', () => {
    const block = noteBlock(['circuit: can-bit', 'clock: 16 MHz', 'prescaler: 2', 'prop-seg: 5', 'phase-seg1: 8', 'phase-seg2: 2', 'expect: 500 kbit/s, 87.5 %']);
    assert.equal(block.findings.filter((f) => f.severity !== 'info').length, 0);
    const stale = noteBlock(['circuit: can-bit', 'clock: 16 MHz', 'prescaler: 2', 'prop-seg: 5', 'phase-seg1: 8', 'phase-seg2: 2', 'expect: 1 Mbit/s']);
    assert.ok(stale.findings.some((f) => f.severity === 'warning' && f.code === 'expect-mismatch'));
  });
});

describe('can-bit search', () => {
  it('16 MHz to 500 kbit/s: exact, sampled at 87.5 %, within ISO 11898-1\'s classic ranges', () => {
    const block = noteBlock(['circuit: can-bit', 'clock: 16 MHz', 'prescaler: ?', 'prop-seg: ?', 'phase-seg1: ?', 'phase-seg2: ?', 'target: 500 kbit/s']);
    assert.deepEqual(errors(block), []);
    const p = block.params;
    const nbt = 1 + p['prop-seg'] + p['phase-seg1'] + p['phase-seg2'];
    assert.ok(nbt >= 8 && nbt <= 25);
    assert.ok(p['prop-seg'] >= 1 && p['prop-seg'] <= 8 && p['phase-seg1'] >= 1 && p['phase-seg1'] <= 8 && p['phase-seg2'] >= 2 && p['phase-seg2'] <= 8);
    assert.equal(16e6 / (p.prescaler * nbt), 500e3);
    assert.equal((1 + p['prop-seg'] + p['phase-seg1']) / nbt, 0.875);
  });

  it('keeps to `? a..b` given for a segment, and aims at the sample point asked for', () => {
    const block = noteBlock(['circuit: can-bit', 'clock: 40 MHz', 'prescaler: ? 1..64', 'tseg1: ? 2..16', 'phase-seg2: ? 2..8', 'sample-point: 75 %', 'target: 1 Mbit/s']);
    assert.deepEqual(errors(block), []);
    assert.equal(block.values.bitrate, 1e6);
    assert.equal(block.values['sample-point'], 0.75);
  });

  // Every combination in the classic ranges, the slow way: exact bit rate, then the nearest sample point.
  it('finds the exact bit rate whenever one exists, with the nearest sample point (fast-check, exhaustive oracle)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 64 }).map((k) => k * 1e6), fc.constantFrom(125e3, 250e3, 500e3, 1e6, 83.333e3, 100e3), fc.double({ min: 0.6, max: 0.95, noNaN: true }), (clock, bitrate, wanted) => {
        let bestSp = Infinity;
        let exists = false;
        for (let prop = 1; prop <= 8; prop++) for (let ps1 = 1; ps1 <= 8; ps1++) for (let ps2 = 2; ps2 <= 8; ps2++) {
          const nbt = 1 + prop + ps1 + ps2;
          if (nbt < 8 || nbt > 25) continue;
          const prescaler = clock / (bitrate * nbt);
          if (Number.isInteger(prescaler) && prescaler <= 1024) {
            exists = true;
            bestSp = Math.min(bestSp, Math.abs((1 + prop + ps1) / nbt - wanted));
          }
        }
        const found = searchCanTiming({ clock, bitrate, samplePoint: wanted, sjw: 1, sets: { prescaler: canDefaultSets.prescaler, 'prop-seg': canDefaultSets['prop-seg'], 'phase-seg1': canDefaultSets['phase-seg1'], 'phase-seg2': canDefaultSets['phase-seg2'] }, classicBitTime: true });
        if (!('values' in found)) throw new Error(found.error);
        const v = found.values;
        const nbt = 1 + v['prop-seg'] + v['phase-seg1'] + v['phase-seg2'];
        if (exists) {
          assert.equal(found.error, 0);
          assert.ok(Math.abs(Math.abs((1 + v.tseg1) / nbt - wanted) - bestSp) < 1e-12);
        } else assert.notEqual(found.error, 0);
      }),
      { numRuns: 200 },
    );
  });
});

describe('can-bit fed by a clock block', () => {
  it('warns when the referenced clock\'s tolerance exceeds the tolerable one (ISO 11898-1)', () => {
    const text = (tolerance: string) => ['```timing can-osc', 'circuit: clock', `frequency: 16 MHz ${tolerance}`, '```', '', '```timing bus', 'circuit: can-bit', 'clock: @can-osc', 'prescaler: 2', 'prop-seg: 5', 'phase-seg1: 8', 'phase-seg2: 2', '```', ''].join('\n');
    const rc = analyzeText('notes/can.md', text('±1%')).blocks[1];
    assert.ok(rc.findings.some((f) => f.code === 'clock-tolerance' && /±1 %.*0\.3125 %/.test(f.message)));
    const crystal = analyzeText('notes/can.md', text('±50 ppm')).blocks[1];
    assert.equal(crystal.findings.some((f) => f.code === 'clock-tolerance'), false);
  });
});

describe('can-bit template', () => {
  it('a new block names both segments before the sample point (the model needs them, or tseg1)', () => {
    assert.deepEqual(blockTemplate('can-bit')!.map((l) => l.key), ['circuit', 'clock', 'prescaler', 'prop-seg', 'phase-seg1', 'phase-seg2', 'expect']);
    assert.equal(blockTemplate('can-bit')!.at(-1)!.placeholder, 'bit/s');
  });
});
