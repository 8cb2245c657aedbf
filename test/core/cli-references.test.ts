// `tickmark check` resolves references across every file it reads: JSON lists them with the referenced block's
// file and line, and a finding on a reference (human, JSON, SARIF) points at the line that holds it.
import { strict as assert } from 'assert';
import { runCli, tempWorkspace } from '../helpers/cli';

const workspace = (files: Record<string, string>) => tempWorkspace(files, 'tickmark-cli-refs-');
const run = runCli;

const files = {
  'notes/clocks.md': ['# clocks', '', '```timing xtal', 'circuit: clock', 'frequency: 8 MHz ±20 ppm', '```', ''].join('\n'),
  'src/tick.c': ['/* @timing tick', ' * circuit: timer', ' * clock: @xtal', ' * prescaler: 8', ' * reload: 999', ' * expect: 1 kHz', ' */', '/* @timing typo', ' * circuit: timer', ' * clock: @xtl.frequency', ' * prescaler: 8', ' * reload: 999', ' */', ''].join('\n'),
};

describe('tickmark check with block references', () => {
  it('JSON lists each reference with the referenced block\'s file, line and value', () => {
    const dir = workspace(files);
    const { out } = run(['check', '--json', '.'], dir);
    const json = JSON.parse(out) as { files: Array<{ path: string; blocks: Array<{ name: string; values: Record<string, number>; references: unknown[]; spread?: Record<string, { min: number; max: number }> }> }> };
    const tick = json.files.find((f) => f.path === 'src/tick.c')!.blocks.find((b) => b.name === 'tick')!;
    assert.deepEqual(tick.references, [{ name: 'xtal', result: 'frequency', file: 'notes/clocks.md', line: 3, value: 8e6 }]);
    // Timer law: 8 MHz / 8 / (999 + 1) = 1 kHz; ±20 ppm at the crystal is ±20 ppm here: 999.98 … 1000.02 Hz.
    assert.equal(tick.values.frequency, 1000);
    assert.ok(Math.abs(tick.spread!.frequency.min - 999.98) < 1e-9 && Math.abs(tick.spread!.frequency.max - 1000.02) < 1e-9);
  });

  it('an unknown name is reported on the line of the key that holds it, with the nearest name, in every format', () => {
    const dir = workspace(files);
    const human = run(['check', '.'], dir);
    assert.equal(human.code, 1);
    assert.match(human.out, /^src\/tick\.c:10:\d+: error: `@xtl`: no block named `xtl` in this file or the workspace — nearest: `xtal`$/m);
    const sarif = JSON.parse(run(['check', '--sarif', '.'], dir).out) as { runs: Array<{ results: Array<{ ruleId: string; locations: Array<{ physicalLocation: { artifactLocation: { uri: string }; region: { startLine: number } } }> }> }> };
    const result = sarif.runs[0].results.find((r) => r.ruleId === 'reference-unknown')!;
    assert.match(result.locations[0].physicalLocation.artifactLocation.uri, /src\/tick\.c$/);
    assert.equal(result.locations[0].physicalLocation.region.startLine, 10);
  });
});
