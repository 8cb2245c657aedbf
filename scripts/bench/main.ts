// Runs every case in order and prints one table; the exit code is 0 even when a target is missed.
import { machine, printRows, type Row } from './measure';
import { bundle } from './activation';
import { headerFigure } from './headers';
import { clockTreeRescore, firmwareScan, monteCarlo, noteRescore, pllSearch, spiceRatio, timerSearch } from './cases';
import { protocolEdits } from './lsp';

export async function runBench(out: (line: string) => void): Promise<number> {
  out(`Tickmark bench — ${machine()}`);
  const rows: Row[] = [];
  const steps: Array<[string, () => Row[] | Promise<Row[]>]> = [
    ['1', firmwareScan],
    ['2', noteRescore],
    ['2b', clockTreeRescore],
    ['3', timerSearch],
    ['3b', pllSearch],
    ['4', spiceRatio],
    ['5', monteCarlo],
    ['6', bundle],
    ['7', protocolEdits],
    ['8', headerFigure],
  ];
  for (const [label, step] of steps) {
    try {
      rows.push(...(await step()));
    } catch (cause) {
      rows.push({ figure: `${label}  (failed)`, value: 'n/a', target: '—', met: false, note: cause instanceof Error ? cause.message.split('\n')[0] : String(cause) });
    }
  }
  printRows(rows, out);
  return 0;
}
