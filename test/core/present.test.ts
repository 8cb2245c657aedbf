import { strict as assert } from 'assert';
import { bandText, headline } from '../../core/present/values';
import { hoverMarkdown } from '../../core/present/hover';
import { circuitById } from '../../core/circuits/registry';
import { noteBlock } from '../helpers/analyze';

describe('how results read', () => {
  const crystal = circuitById('crystal-load')!;
  const astable = circuitById('555-astable')!;

  it('writes a band with one unit, and signed bands with both', () => {
    assert.equal(bandText(astable, 'frequency', 172.4, 209.1), '172.4–209.1 Hz');
    assert.equal(bandText(crystal, 'error', -0.138, 0.137), '−13.8 % … +13.7 %');
  });

  it('puts frequency, period, duty and the worst case on the lens, as DESIGN.md shows', () => {
    // NE555 datasheet (SLFS022): f = 1.44 / ((RA + 2·RB)·C); 10k, 47k, 10 nF → about 1.382 kHz.
    const block = noteBlock(['circuit: 555-astable', 'supply: 5 V', 'ra: 10k', 'rb: 47k ±5%', 'c: 10n']);
    assert.match(headline(block), /^1\.38\d kHz · 72\d\.\d µs · 5\d\.\d+ % duty · 1\.3\d+–1\.4\d+ kHz worst case$/);
  });

  it('shows a block\'s first error on the lens instead of numbers', () => {
    const block = noteBlock(['circuit: ring', 'stages: 4', 'tpd: 1n']);
    assert.match(headline(block), /^⛔ `stages`/);
  });

  it('gives the working with its source and the firmware locations in the hover', () => {
    const block = noteBlock(['circuit: timer', 'firmware: ../fw/clock.h', 'clock: CLK', 'prescaler: 8', 'reload: 999'], { 'fw/clock.h': '\n#define CLK 8000000\n' });
    const hover = hoverMarkdown(block);
    assert.match(hover, /`CLK` = 8000000 — clock\\\.h:2/);
    assert.match(hover, /\| clock ticks per period .* \| 1000 \|/);
    assert.match(hover, /\*\*working\*\*/);
    assert.match(hover, /\| frequency \| 1 kHz \|/);
  });

  it('shows the assumption of the chosen counting mode only', () => {
    const up = hoverMarkdown(noteBlock(['circuit: timer', 'clock: 1 MHz', 'prescaler: 1', 'reload: 999']));
    assert.match(up, /mode up: the counter runs 0/);
    assert.doesNotMatch(up, /mode up-down:/);
    const upDown = hoverMarkdown(noteBlock(['circuit: timer', 'clock: 1 MHz', 'prescaler: 1', 'reload: 999', 'mode: up-down']));
    assert.match(upDown, /mode up-down: 0 → reload → 0/);
    assert.doesNotMatch(upDown, /mode up: /);
  });
});
