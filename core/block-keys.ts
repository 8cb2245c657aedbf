// The keys a block may carry besides its circuit's parameters, as one table like the circuits' parameter tables:
// parsing (which keys steer rather than describe), limits, completion, hover and the docs all read it.
import { SERIES_NAMES } from './series';

export interface BlockKeyWord {
  word: string;
  detail: string;
}

export interface BlockKeySpec {
  key: string;
  /** One line beside the key in completion ("claimed rate, e.g. 1 kHz ±1%"). */
  label: string;
  description: string;
  /** What the value holds. */
  value: 'circuit' | 'claims' | 'word' | 'integer' | 'path';
  /** Words the key takes, for completion and messages. */
  words?: readonly BlockKeyWord[];
  /** Inclusive limits of an integer key. */
  min?: number;
  max?: number;
  /** Only in Markdown notes (a C block reads its own file's constants). */
  markdownOnly?: boolean;
  /** Offered only in a block whose circuit gives this result (`target2` for a PLL's `frequency2`). */
  forResult?: string;
}

const seriesWords: BlockKeyWord[] = [
  ...(['3 values per decade (±40 %)', '6 values per decade (±20 %)', '12 values per decade (±10 %)', '24 values per decade (±5 %)', '48 values per decade (±2 %)', '96 values per decade (±1 %)', '192 values per decade (±0.5 % and better)'].map((detail, i) => ({ word: SERIES_NAMES[i], detail }))),
  { word: 'none', detail: 'keep the exact value' },
];

export const blockKeys: readonly BlockKeySpec[] = [
  { key: 'circuit', label: 'which circuit model', value: 'circuit', description: 'The circuit this block describes; every other key depends on it.' },
  { key: 'expect', label: 'claimed rate, e.g. 1 kHz ±1%', value: 'claims', description: 'What the block claims: comma-separated quantities whose unit names the measure (Hz, s, %, baud). A computed value outside the tolerance is a warning.' },
  { key: 'target', label: 'what a ? value must meet', value: 'claims', description: 'With one `?` value: the measure to meet (`target: 10 kHz`). R and C are then rounded to the `series:` part.' },
  { key: 'target2', label: 'second output\'s target (pll)', value: 'claims', forResult: 'frequency2', description: 'A PLL searched with `?`: what its second output (`frequency2`) must meet, together with `target:`.' },
  { key: 'target3', label: 'third output\'s target (pll)', value: 'claims', forResult: 'frequency3', description: 'A PLL searched with `?`: what its third output (`frequency3`) must meet, together with `target:` and `target2:`.' },
  { key: 'series', label: 'E3 … E192 or none (setting default E24)', value: 'word', words: seriesWords, description: 'IEC 60063 series for solved parts; when written, R and C values off the series are flagged with a fix.' },
  { key: 'samples', label: 'Monte Carlo runs', value: 'integer', min: 1, max: 1_000_000, description: 'Number of random draws within the tolerances (and those of referenced blocks), for p1/p99 percentiles beside the worst case.' },
  { key: 'seed', label: 'Monte Carlo seed', value: 'integer', min: 0, max: 2 ** 32 - 1, description: 'Seed of the random draws, so a run repeats exactly.' },
  { key: 'firmware', label: 'firmware file for names', value: 'path', markdownOnly: true, description: 'Path (relative to this note) of a C file or header whose constants the block may name.' },
  {
    key: 'data-model', label: 'ilp32, lp64 or ip16', value: 'word',
    words: [
      { word: 'ilp32', detail: 'int, long and pointers 32-bit (most 32-bit microcontrollers)' },
      { word: 'lp64', detail: 'long and pointers 64-bit (a 64-bit host)' },
      { word: 'ip16', detail: 'int 16-bit, long 32-bit (8-bit microcontrollers)' },
    ],
    description: 'Integer widths for evaluating firmware constants; overrides the tickmark.c.dataModel setting.',
  },
  {
    key: 'safety', label: 'yes or no', value: 'word',
    words: [
      { word: 'yes', detail: 'add the safety caution' },
      { word: 'no', detail: 'not safety timing (a guard-named block keeps its caution)' },
    ],
    description: 'Whether this timing guards people or property (watchdog, reset, interlock): `yes` adds the safety caution. A block named like `watchdog` always carries it.',
  },
];

const byKey = new Map(blockKeys.map((spec) => [spec.key, spec]));

export function blockKey(key: string): BlockKeySpec | undefined {
  return byKey.get(key);
}

/** The block keys as Markdown for the docs, from the table. */
export function blockKeysMarkdown(): string {
  return blockKeys
    .map((spec) => {
      const takes = spec.words ? ` (${spec.words.map((w) => `\`${w.word}\``).join(', ')})` : spec.min !== undefined ? ` (${spec.min} to ${spec.max})` : '';
      return `- \`${spec.key}\`${takes}${spec.markdownOnly ? ', notes only' : ''} — ${spec.description}`;
    })
    .join('\n');
}
