import { strict as assert } from 'assert';
import { Code, codeInfo, codeTable } from '../../core/codes';
import { analyzeText, noteBlock } from '../helpers/analyze';

const codesOf = (findings: Array<{ code: string; severity: string }>) => findings.map((f) => `${f.severity} ${f.code}`);

describe('diagnostic codes: one table, one meaning each', () => {
  it('describes every code once, with a short and a full description and help', () => {
    const ids = codeTable.map((row) => row.id);
    assert.deepEqual(ids, Object.values(Code));
    assert.equal(new Set(ids).size, ids.length);
    for (const row of codeTable) {
      assert.match(row.id, /^[a-z]+(-[a-z]+)*$/, `${row.id}: kebab-case rule id (SARIF reportingDescriptor.id)`);
      assert.ok(row.short.endsWith('.') && row.full.endsWith('.') && row.help.endsWith('.'), `${row.id}: sentences`);
      assert.notEqual(row.short, row.full, `${row.id}: the full description says more than the short one`);
      assert.ok(['error', 'warning', 'info'].includes(row.severity));
    }
    assert.equal(codeInfo('no-such-code'), undefined);
  });

  it('a `?` waiting for the errors is `solve-blocked` (info), a `?` that cannot be solved is `solve-failed` (error)', () => {
    const waiting = noteBlock(['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1 V', 'r: ?', 'c: 100n', 'target: 1 kHz', 'bogus: 1']);
    const blocked = noteBlock(['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 3 X', 'r: ?', 'c: 100n', 'target: 1 kHz']);
    assert.deepEqual(blocked.findings.filter((f) => f.code === Code.solveBlocked).map((f) => f.severity), ['info']);
    assert.equal(blocked.findings.filter((f) => f.code === Code.solveFailed).length, 0);
    assert.equal(waiting.findings.filter((f) => f.code === Code.solveBlocked).length, 0, 'a warning alone does not block solving');
    const noTarget = noteBlock(['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1 V', 'r: ?', 'c: 100n']);
    assert.deepEqual(noTarget.findings.filter((f) => f.code === Code.solveFailed).map((f) => f.severity), ['error']);
  });

  it('`from:` in C is `firmware-in-c`, an unknown key stays `key-unknown`', () => {
    const source = ['// @timing t', '// circuit: timer', '// firmware: board.h', '// clock: 1 MHz', '// prescaler: 1', '// reload: 9', '// bogus: 1', ''].join('\n');
    const block = analyzeText('src/t.c', source).blocks[0];
    assert.deepEqual(codesOf(block.findings).sort(), ['warning firmware-in-c', 'warning key-unknown']);
  });

  it('`safety: no` on a guard is `safety-kept`; a word `safety` does not take is `value-option`', () => {
    const text = (value: string) => ['```timing reset-hold', 'circuit: rc-delay', 'r: 10k', 'c: 1u', 'toward: 5 V', 'to: 2 V', `safety: ${value}`, '```', ''].join('\n');
    assert.deepEqual(analyzeText('n.md', text('no')).blocks[0].findings.filter((f) => f.code !== Code.caution).map((f) => f.code), [Code.safetyKept]);
    assert.deepEqual(analyzeText('n.md', text('maybe')).blocks[0].findings.filter((f) => f.code !== Code.caution).map((f) => f.code), [Code.valueOption]);
  });

  it('register range, UART rate error, 555 supply and overflow each have their code, apart from `physics`', () => {
    const reload = noteBlock(['circuit: timer', 'clock: 16 MHz', 'prescaler: 1', 'reload: 70000', 'bits: 16']);
    assert.deepEqual(codesOf(reload.findings), ['error register-range']);
    // 16 MHz / (16 · 9600) = 104.17, rounded to 104: 9615 Bd, +0.16 % (common practice: within ±2 %).
    assert.deepEqual(codesOf(noteBlock(['circuit: baud', 'clock: 16 MHz', 'baud: 9600']).findings), []);
    // 1 MHz / (16 · 115200) rounds to 1: 62500 Bd, −45.7 %, far beyond the ±2 % an 8-N-1 link tolerates.
    assert.deepEqual(codesOf(noteBlock(['circuit: baud', 'clock: 1 MHz', 'baud: 115200']).findings), ['warning rate-error']);
    // NE555 (SLFS022): 18 V absolute maximum.
    const supply = noteBlock(['circuit: 555-monostable', 'supply: 24 V', 'r: 10k', 'c: 10n']);
    assert.ok(codesOf(supply.findings).includes('warning supply-range'));
    const overflow = noteBlock(['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1 V', 'r: 1e300', 'c: 1e300']);
    assert.deepEqual(codesOf(overflow.findings), ['error result-overflow']);
    const even = noteBlock(['circuit: ring', 'stages: 4', 'tpd: 1 ns']);
    assert.deepEqual(codesOf(even.findings), ['error physics']);
  });

  it('a name with no firmware to read is `identifier-unknown`; a name the firmware lacks is `c-unknown`', () => {
    assert.deepEqual(codesOf(noteBlock(['circuit: timer', 'clock: CLK', 'prescaler: 1', 'reload: 9']).findings), ['error identifier-unknown']);
    const withFirmware = noteBlock(['circuit: timer', 'firmware: ../fw/b.h', 'clock: CLK', 'prescaler: 1', 'reload: 9'], { 'fw/b.h': '#define OTHER 1\n' });
    assert.deepEqual(codesOf(withFirmware.findings), ['error c-unknown']);
  });

  it('a claim of a result the block leaves out is `expect-not-computed`; a unit no result has is `expect-unknown-measure`', () => {
    const duty = noteBlock(['circuit: timer', 'clock: 1 MHz', 'prescaler: 1', 'reload: 9', 'expect: 50 %']);
    assert.deepEqual(codesOf(duty.findings), ['info expect-not-computed']);
    const load = noteBlock(['circuit: timer', 'clock: 1 MHz', 'prescaler: 1', 'reload: 9', 'expect: 10 pF']);
    assert.deepEqual(codesOf(load.findings), ['error expect-unknown-measure']);
  });
});
