// Switch-level netlists of our own values for the closed form vs ngspice (eecircuit-engine) comparison.
import { circuitById } from '../../core/circuits/registry';
import { withDefaults } from '../../core/circuits/defaults';
// The engine loader the reference tests use, so bench and tests run ngspice the same way.
import { startEngine, type Engine } from '../../test/reference/spice-netlists';
export { startEngine };


export interface SpiceCase {
  circuit: string;
  values: Record<string, number>;
  /** Output level the edges are measured at. */
  level: number;
  netlist: (expected: Record<string, number>) => string;
}

const tran = (period: number, startup: number) => `.tran ${period / 4000} ${startup + 6 * period} 0 ${period / 4000} uic`;

export const spiceCases: SpiceCase[] = [
  {
    circuit: 'schmitt-rc',
    values: { supply: 5, 'vt+': 3.2, 'vt-': 1.5, r: 33e3, c: 22e-9 },
    level: 2.5,
    netlist: (e) => `schmitt\n.model hyst sw vt=2.35 vh=0.85 ron=1m roff=1e12\nvone one 0 dc 1\nrpull one ctl 1k\ns1 ctl 0 cap 0 hyst\nbout out 0 v = 5 * v(ctl)\nr1 out cap 33k\nc1 cap 0 22n ic=0\n${tran(e.period, e['first-edge'])}\n.end`,
  },
  {
    circuit: '555-astable',
    values: { supply: 12, ra: 3.3e3, rb: 15e3, c: 47e-9 },
    level: 6,
    netlist: (e) => `555\n.model latch sw vt=6 vh=2 ron=1m roff=1e12\nvcc vcc 0 dc 12\nra vcc dis 3.3k\nrb dis cap 15k\nc1 cap 0 47n ic=0\nsdis dis 0 cap 0 latch\nrout vcc out 1k\nsout out 0 cap 0 latch\n${tran(e.period, e['first-edge'])}\n.end`,
  },
  {
    circuit: 'inverter-rc',
    values: { supply: 5, threshold: 2.5, r: 47e3, c: 10e-9 },
    level: 2.5,
    netlist: (e) => `inverters\nbinv1 a 0 v = 2.5 - 2.5 * tanh(20000 * (v(x) - 2.5))\nbinv2 b 0 v = 2.5 - 2.5 * tanh(20000 * (v(a1) - 2.5))\nra1 a a1 1\nca1 a1 0 1p ic=5\nbout out 0 v = v(b)\nr1 a x 47k\nc1 b x 10n ic=0\n${tran(e.period, e['first-edge'])}\n.end`,
  },
];

export function closedForm(c: SpiceCase): { compute: () => Record<string, number> } {
  const model = circuitById(c.circuit);
  if (!model) throw new Error(`no circuit ${c.circuit}`);
  const input = withDefaults(model, { values: c.values });
  return { compute: () => model.compute(input) };
}

/** Frequency from the simulated output: mean period between falling edges after the first cycle. */
export async function simulatedFrequency(engine: Engine, netlist: string, level: number): Promise<number> {
  engine.setNetList(netlist);
  const result = await engine.runSim();
  const column = (name: string) => (result.data.find((d) => d.name.toLowerCase() === name)?.values ?? []) as number[];
  const time = column('time');
  const out = column('v(out)');
  const falls: number[] = [];
  for (let i = 1; i < out.length; i++) {
    const a = out[i - 1] - level;
    const b = out[i] - level;
    if (a >= 0 && b < 0) falls.push(time[i - 1] + ((time[i] - time[i - 1]) * a) / (a - b));
  }
  const steady = falls.slice(1);
  if (steady.length < 2) return NaN;
  return (steady.length - 1) / (steady[steady.length - 1] - steady[0]);
}
