import { strict as assert } from 'assert';
import { bandText, headline } from '../../core/present/values';
import { escapeMarkdown, hoverMarkdown } from '../../core/present/hover';
import { blockView } from '../../core/present/view';
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

describe('one presented block', () => {
  // Schmitt trigger, 47 kΩ ±1 %, 100 nF ±10 %: the period τ·[ln(…)+ln(…)] moves with R·C, so its worst case spans
  // (0.99·0.9 … 1.01·1.1) of nominal (RC charging law, common practice); Monte Carlo percentiles lie inside it.
  const lines = ['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1.1 V', 'r: 47k ±1%', 'c: 100n ±10%', 'samples: 2000'];

  it('gives the hover, the CLI line and the lens the same rows and headline', () => {
    const block = noteBlock(lines);
    const view = blockView(block);
    assert.equal(view.headline, headline(block));
    assert.deepEqual(view.results.map((r) => r.key), ['high', 'low', 'period', 'frequency', 'duty', 'first-edge']);
    const hover = hoverMarkdown(block);
    for (const row of view.results) assert.ok(hover.includes(`| ${escapeMarkdown(row.label)} | ${row.value} | ${row.worstCase} | ${row.percentiles} |`), row.key);
  });

  it('shows the 1st to 99th percentiles of `samples:` in the hover, inside the worst case', () => {
    const block = noteBlock(lines);
    const view = blockView(block);
    assert.ok(view.hasPercentiles);
    assert.match(hoverMarkdown(block), /\| result \| value \| worst case \| 1–99 % of samples \|/);
    const period = block.spread!.period;
    const nominal = block.values.period;
    assert.ok(Math.abs(period.min / (nominal * 0.99 * 0.9) - 1) < 1e-9 && Math.abs(period.max / (nominal * 1.01 * 1.1) - 1) < 1e-9);
    assert.ok(period.min < period.p1! && period.p1! < nominal && nominal < period.p99! && period.p99! < period.max);
    assert.equal(view.results.find((r) => r.key === 'period')!.percentiles, bandText(circuitById('schmitt-rc')!, 'period', period.p1!, period.p99!));
    assert.equal(blockView(noteBlock(lines.slice(0, -1))).hasPercentiles, false);
  });
});
