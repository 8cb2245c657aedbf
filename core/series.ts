// Preferred number series of IEC 60063 (E3 … E192), as mantissas in [1, 10).

export type SeriesName = 'E3' | 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';

export const SERIES_NAMES: readonly SeriesName[] = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192'];

// IEC 60063 rounds E24 by hand: 2.7, 3.0, 3.3 … 8.2, 9.1 are not the geometric series.
const seriesE24 = [
  1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0,
  3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5, 8.2, 9.1,
] as const;

/** E3, E6 and E12 are every 8th, 4th and 2nd member of E24. */
function everyNth(values: readonly number[], step: number): number[] {
  return values.filter((_, i) => i % step === 0);
}

// E48 … E192 are round(10^(i/n), 2 decimals), except where IEC 60063 departs from the formula.
const threeFigureExceptions: Partial<Record<SeriesName, Record<number, number>>> = {
  E192: { 185: 9.2 }, // the formula gives 9.19
};

function threeFigureSeries(name: SeriesName, n: number): number[] {
  const exceptions = threeFigureExceptions[name] ?? {};
  const values: number[] = [];
  for (let i = 0; i < n; i++) {
    values.push(exceptions[i] ?? Math.round(Math.pow(10, i / n) * 100) / 100);
  }
  return values;
}

const table: Record<SeriesName, readonly number[]> = {
  E3: Object.freeze(everyNth(seriesE24, 8)),
  E6: Object.freeze(everyNth(seriesE24, 4)),
  E12: Object.freeze(everyNth(seriesE24, 2)),
  E24: Object.freeze([...seriesE24]),
  E48: Object.freeze(threeFigureSeries('E48', 48)),
  E96: Object.freeze(threeFigureSeries('E96', 96)),
  E192: Object.freeze(threeFigureSeries('E192', 192)),
};

export function seriesValues(name: SeriesName): readonly number[] {
  return table[name];
}

/** Mantissa × 10^decade without binary noise (4.7e-9, not 4.700000000000001e-9). */
function scaled(mantissa: number, decade: number): number {
  return Number(`${mantissa}e${decade}`);
}

/** Candidates around x: the series in x's decade and both neighbours, ascending. */
function candidates(x: number, name: SeriesName): number[] {
  const decade = Math.floor(Math.log10(x));
  const out: number[] = [];
  for (let d = decade - 1; d <= decade + 1; d++) {
    for (const m of table[name]) out.push(scaled(m, d));
  }
  return out;
}

/** The standard value nearest to x on a log scale, at any decade; NaN for x ≤ 0 or non-finite. */
export function nearestInSeries(x: number, name: SeriesName): number {
  if (!(x > 0) || !Number.isFinite(x)) return NaN;
  let best = NaN;
  let bestDistance = Infinity;
  for (const c of candidates(x, name)) {
    const distance = Math.abs(Math.log(c / x));
    if (distance < bestDistance) {
      best = c;
      bestDistance = distance;
    }
  }
  return best;
}

/** Standard values with below ≤ x ≤ above (both equal x when x is standard to 1e-12 relative); NaN for x ≤ 0. */
export function neighboursInSeries(x: number, name: SeriesName): { below: number; above: number } {
  if (!(x > 0) || !Number.isFinite(x)) return { below: NaN, above: NaN };
  const slack = x * 1e-12;
  let below = NaN;
  let above = NaN;
  for (const c of candidates(x, name)) {
    if (c <= x + slack) below = c;
    if (c >= x - slack && Number.isNaN(above)) above = c;
  }
  return { below, above };
}

/** `E24`, `e96`, `none` (any case); undefined for anything else. */
export function parseSeriesName(text: string): SeriesName | 'none' | undefined {
  const word = text.trim().toUpperCase();
  if (word === 'NONE') return 'none';
  return (SERIES_NAMES as readonly string[]).includes(word) ? (word as SeriesName) : undefined;
}
