// Timing helpers and the printed table of the benchmark: every figure beside its target.
import * as os from 'node:os';

/** Median of `runs` timings of `work` in milliseconds, after one warm-up call. */
export function medianMs(runs: number, work: () => unknown): number {
  work();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const start = performance.now();
    work();
    times.push(performance.now() - start);
  }
  return median(times);
}

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

export interface Row {
  figure: string;
  value: string;
  target: string;
  met: boolean;
  note?: string;
}

export function machine(): string {
  const cpus = os.cpus();
  return `${cpus[0]?.model ?? 'unknown cpu'}, ${cpus.length} cores, node ${process.version}, ${os.platform()} ${os.arch()}`;
}

export function printRows(rows: Row[], out: (line: string) => void): void {
  const width = (pick: (r: Row) => string) => Math.max(...rows.map((r) => pick(r).length));
  const wf = width((r) => r.figure);
  const wv = width((r) => r.value);
  const wt = width((r) => r.target);
  for (const r of rows) {
    out(`${r.figure.padEnd(wf)}  ${r.value.padStart(wv)}  target ${r.target.padEnd(wt)}  ${r.met ? 'met ' : 'OVER'}${r.note ? `  ${r.note}` : ''}`);
  }
}

export const ms = (value: number) => `${value < 10 ? value.toFixed(2) : value.toFixed(1)} ms`;
export const times = (value: number) => `${value < 10 ? value.toFixed(2) : value.toFixed(0)}×`;
