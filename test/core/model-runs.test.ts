// How often the engine runs a circuit model for one block: once per evaluation (nominal, each worst-case grid
// point, each one-at-a-time swing, each Monte Carlo sample), never again to check a result.
import { strict as assert } from 'assert';
import { circuitById } from '../../core/circuits/registry';
import { noteBlock } from '../helpers/analyze';

function runsFor(lines: string[]): number {
  const model = circuitById(lines[0].replace('circuit: ', ''))!;
  const compute = model.compute;
  let runs = 0;
  model.compute = (input) => {
    runs++;
    return compute.call(model, input);
  };
  try {
    const block = noteBlock(lines);
    assert.deepEqual(block.findings.filter((f) => f.severity === 'error'), []);
  } finally {
    model.compute = compute;
  }
  return runs;
}

const led = ['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1.1 V', 'r: 47k', 'c: 100n'];

describe('model runs per block', () => {
  it('a block without tolerances runs its model once', () => {
    assert.equal(runsFor(led), 1);
  });

  it('two toleranced parts: the nominal and a 3 × 3 worst-case grid, one run each; the swings are grid points', () => {
    // 1 + 3² = 10 evaluations (core/analyze/spread.ts: grid steps −1, 0, +1 for up to six inputs; each part's
    // one-at-a-time swing is the grid point where only that part moves).
    assert.equal(runsFor(['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1.1 V', 'r: 47k ±1%', 'c: 100n ±10%']), 10);
  });

  it('`samples: 1000` adds one run per sample', () => {
    assert.equal(runsFor(['circuit: schmitt-rc', 'supply: 3.3 V', 'vt+: 2 V', 'vt-: 1.1 V', 'r: 47k ±1%', 'c: 100n ±10%', 'samples: 1000']), 1010);
  });

  it('a claim that holds costs no further run', () => {
    // 47 kΩ · 100 nF with thresholds 2 V / 1.1 V of 3.3 V: about 190 Hz (the LED block of the demo).
    assert.equal(runsFor([...led, 'expect: 190 Hz ±5%']), 1);
  });
});
