// The value language's additions for the clock circuits: `?` with allowed values, ranges with units, bit/s.
import { strict as assert } from 'assert';
import { parseRange, parseUnknown, parseValue, dimOf } from '../../core/value';
import { errors, noteBlock } from '../helpers/analyze';

describe('allowed values after ?', () => {
  it('reads a register range and a list after `?`', () => {
    assert.deepEqual(parseUnknown('? 1..63', 10)?.allowed, { kind: 'range', min: 1, max: 63 });
    assert.deepEqual(parseUnknown('?2, 4, 8, 6', 0)?.allowed, { kind: 'list', values: [2, 4, 6, 8] });
    assert.deepEqual(parseUnknown('  ?', 0), { span: { start: 2, end: 3 }, findings: [] });
    assert.equal(parseUnknown('47k', 0), undefined);
  });

  it('refuses a backwards range or a unit after `?`, at the text', () => {
    assert.match(parseUnknown('? 63..1', 0)!.findings[0].message, /backwards/);
    assert.match(parseUnknown('? 1 MHz, 2', 0)!.findings[0].message, /whole number/);
  });

  it('is refused where a part is solved exactly, and the fix replaces the whole `? …`', () => {
    assert.match(errors(noteBlock(['circuit: rc-delay', 'r: ? 1..10', 'c: 1u', 'to: 2 V', 'supply: 3.3 V', 'target: 1 ms']))[0], /register searches/);
    const block = noteBlock(['circuit: divider', 'clock: 48 MHz', 'divide: ? 1..8', 'target: 12 MHz']);
    const fix = block.findings.find((f) => f.code === 'solved')!.fixes![0].edits[0];
    assert.equal(fix.newText, '4');
    assert.equal(fix.span.end - fix.span.start, '? 1..8'.length);
  });
});

describe('ranges with units', () => {
  it('reads `96 MHz .. 344 MHz` and a bare number beside a unit', () => {
    assert.deepEqual(parseRange('96 MHz .. 344 MHz', 0, 'Hz', 'vco-range'), { min: 96e6, max: 344e6, findings: [] });
    assert.deepEqual(parseRange('1 .. 2 MHz', 0, 'Hz', 'pfd-range'), { min: 1, max: 2e6, findings: [] });
  });

  it('refuses a range in the wrong unit, backwards, or without `..`', () => {
    assert.match(parseRange('1 V .. 2 V', 0, 'Hz', 'vco-range').findings[0].message, /range in Hz/);
    assert.match(parseRange('2 MHz .. 1 MHz', 0, 'Hz', 'pfd-range').findings[0].message, /backwards/);
    assert.match(parseRange('2 MHz', 0, 'Hz', 'pfd-range').findings[0].message, /low \.\. high/);
  });
});

describe('bit/s', () => {
  it('is a bitrate with SI prefixes, with or without a space', () => {
    for (const [text, value] of [['500 kbit/s', 500e3], ['1Mbit/s', 1e6], ['125000 bit/s', 125e3]] as const) {
      const parsed = parseValue(text, 0);
      assert.deepEqual(parsed.findings, []);
      assert.equal((parsed.expr as { value: number }).value, value);
      assert.deepEqual(dimOf(parsed.expr!, () => undefined), { dim: 'bit/s' });
    }
  });

  it('is not a frequency: a bitrate claim on a clock is refused', () => {
    const block = noteBlock(['circuit: clock', 'frequency: 8 MHz', 'expect: 8 Mbit/s']);
    assert.ok(block.findings.some((f) => f.code === 'expect-unknown-measure'));
  });
});
