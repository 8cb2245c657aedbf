// ngspice (npm eecircuit-engine, ngspice compiled to WebAssembly) as a reference: loading the engine, switch-level
// netlists of the oscillators, and edge measurement of the simulated output. Shared by spice.test.ts (models
// called directly) and end-to-end.test.ts (the same circuits through the CLI).
import { strict as assert } from 'assert';

export type Engine = { setNetList(text: string): void; runSim(): Promise<{ variableNames: string[]; data: Array<{ name: string; values: unknown[] }> }>; getError(): string[] };

export async function startEngine(): Promise<Engine> {
  // The package's type entry sits only under "exports", which this project's `node` resolution does not read.
  const specifier = 'eecircuit-engine';
  const { Simulation } = (await import(specifier)) as { Simulation: new () => Engine & { start(): Promise<void> } };
  const sim = new Simulation();
  await sim.start();
  return sim;
}

export async function simulate(engine: Engine, netlist: string): Promise<{ time: number[]; out: number[] }> {
  engine.setNetList(netlist);
  const result = await engine.runSim();
  const column = (name: string) => {
    const found = result.data.find((d) => d.name.toLowerCase() === name);
    assert.ok(found, `ngspice returned no ${name} (has ${result.variableNames.join(', ')}; errors: ${engine.getError().join(' | ')})`);
    return found.values as number[];
  };
  return { time: column('time'), out: column('v(out)') };
}

/** Output edges through `level`, linearly interpolated between samples. */
function edges(time: number[], out: number[], level: number): Array<{ t: number; rising: boolean }> {
  const found: Array<{ t: number; rising: boolean }> = [];
  for (let i = 1; i < out.length; i++) {
    const a = out[i - 1] - level;
    const b = out[i] - level;
    if (a < 0 !== b < 0) found.push({ t: time[i - 1] + ((time[i] - time[i - 1]) * a) / (a - b), rising: b > a });
  }
  return found;
}

export interface Measured { firstEdge: number; frequency: number; duty: number }

/** Startup (first edge), and period and duty averaged over the steady cycles after the first one. */
export function measure(time: number[], out: number[], level: number): Measured {
  const all = edges(time, out, level);
  const rises = all.filter((e) => e.rising).map((e) => e.t);
  const falls = all.filter((e) => !e.rising).map((e) => e.t);
  assert.ok(rises.length >= 4 && falls.length >= 4, `too few edges: ${rises.length} rising, ${falls.length} falling`);
  const steadyFalls = falls.slice(1);
  const period = (steadyFalls[steadyFalls.length - 1] - steadyFalls[0]) / (steadyFalls.length - 1);
  // High times: from each rise to the next fall.
  const highs = rises.map((r) => { const f = falls.find((t) => t > r); return f === undefined ? undefined : f - r; }).filter((h): h is number => h !== undefined);
  const high = highs.reduce((s, h) => s + h, 0) / highs.length;
  return { firstEdge: all[0].t, frequency: 1 / period, duty: high / period };
}

/** Simulated time and step for `cycles` periods plus startup, a step of period/4000 for sharp edges. */
export function tran(period: number, startup: number, cycles: number): string {
  const stop = startup + cycles * period;
  const step = period / 4000;
  return `.tran ${step} ${stop} 0 ${step} uic`;
}

export interface SchmittValues { supply: number; upper: number; lower: number; r: number; c: number }

/** Inverting Schmitt gate, rail-to-rail output: a hysteresis switch pulls the output's control node low above `upper`. */
export function schmittNetlist(v: SchmittValues, analysis: string): string {
  return `schmitt rc oscillator
.model hyst sw vt=${(v.upper + v.lower) / 2} vh=${(v.upper - v.lower) / 2} ron=1m roff=1e12
vone one 0 dc 1
rpull one ctl 1k
s1 ctl 0 cap 0 hyst
bout out 0 v = ${v.supply} * v(ctl)
r1 out cap ${v.r}
c1 cap 0 ${v.c} ic=0
${analysis}
.end`;
}

export interface ComparatorValues { voh: number; vol: number; vref: number; r1: number; r2: number; r: number; c: number }

/**
 * Regenerative comparator: a steep tanh of (v+ − v−) between vol and voh; 1 pF at v+ gives the edge a few ns.
 * v+ starts at its output-high value, the power-up state the model assumes (else ngspice sits metastable).
 */
export function comparatorNetlist(v: ComparatorValues, analysis: string): string {
  const mid = (v.voh + v.vol) / 2;
  const half = (v.voh - v.vol) / 2;
  const plusAtHigh = v.vref + ((v.voh - v.vref) * v.r1) / (v.r1 + v.r2);
  return `comparator relaxation oscillator
bcmp out 0 v = ${mid} + ${half} * tanh(20000 * (v(plus) - v(cap)))
vref ref 0 dc ${v.vref}
r1 plus ref ${v.r1}
r2 out plus ${v.r2}
cp plus 0 1p ic=${plusAtHigh}
r3 out cap ${v.r}
c1 cap 0 ${v.c} ic=0
${analysis}
.end`;
}

export interface Ne555Values { supply: number; ra: number; rb: number; c: number; control: number }

/** 555 at switch level: the latch is a hysteresis window on the capacitor, on above `control`, off below control/2. */
export function ne555AstableNetlist(v: Ne555Values, analysis: string): string {
  return `555 astable, switch level
.model latch sw vt=${0.75 * v.control} vh=${0.25 * v.control} ron=1m roff=1e12
vcc vcc 0 dc ${v.supply}
ra vcc dis ${v.ra}
rb dis cap ${v.rb}
c1 cap 0 ${v.c} ic=0
sdis dis 0 cap 0 latch
rout vcc out 1k
sout out 0 cap 0 latch
${analysis}
.end`;
}
