// Completion inside a timing block, from the one source of truth for each fact: circuit ids and summaries
// from the registry, keys with units, defaults and descriptions from each model's parameter table.
import type { ParamSpec } from '../circuits/model';
import { circuitById, circuits } from '../circuits/registry';
import { SERIES_NAMES } from '../series';
import type { Span, TextDocumentLike } from '../types';
import { cursorPlace, type CursorPlace } from './completion-context';

export interface CompletionEntry {
  label: string;
  kind: 'circuit' | 'key' | 'meta' | 'word';
  /** One line beside the label (unit and default, or the circuit's title). */
  detail: string;
  documentation: string;
  insertText: string;
  /** Text the editor filters on (the label, without any leading space of insertText). */
  filterText: string;
  /** The document text the entry replaces. */
  replace: Span;
  /** The key takes a word the editor can offer next (`mode: ` → `up`, `up-down`). */
  offersWords?: boolean;
}

interface MetaKeyDoc {
  key: string;
  detail: string;
  documentation: string;
  markdownOnly?: boolean;
  /** Offered only in a block whose circuit gives this result (`target2` for a PLL's `frequency2`). */
  forResult?: string;
}

const metaKeyDocs: readonly MetaKeyDoc[] = [
  { key: 'circuit', detail: 'which circuit model', documentation: 'The circuit this block describes; every other key depends on it.' },
  { key: 'expect', detail: 'claimed rate, e.g. 1 kHz ±1%', documentation: 'What the block claims: comma-separated quantities whose unit names the measure (Hz, s, %, baud). A computed value outside the tolerance is a warning.' },
  { key: 'target', detail: 'what a ? value must meet', documentation: 'With one `?` value: the measure to meet (`target: 10 kHz`). R and C are then rounded to the `series:` part.' },
  { key: 'target2', detail: 'second output\'s target (pll)', documentation: 'A PLL searched with `?`: what its second output (`frequency2`) must meet, together with `target:`.', forResult: 'frequency2' },
  { key: 'target3', detail: 'third output\'s target (pll)', documentation: 'A PLL searched with `?`: what its third output (`frequency3`) must meet, together with `target:` and `target2:`.', forResult: 'frequency3' },
  { key: 'series', detail: 'E3 … E192 or none (setting default E24)', documentation: 'IEC 60063 series for solved parts; when written, R and C values off the series are flagged with a fix.' },
  { key: 'samples', detail: 'Monte Carlo runs', documentation: 'Number of random draws within the tolerances, for p1/p99 percentiles beside the worst case.' },
  { key: 'seed', detail: 'Monte Carlo seed', documentation: 'Seed of the random draws, so a run repeats exactly.' },
  { key: 'firmware', detail: 'firmware file for names', documentation: 'Path (relative to this note) of a C file or header whose constants the block may name.', markdownOnly: true },
  { key: 'data-model', detail: 'ilp32, lp64 or ip16', documentation: 'Integer widths for evaluating firmware constants; overrides the tickmark.c.dataModel setting.' },
  { key: 'safety', detail: 'yes or no', documentation: 'Whether this timing guards people or property (watchdog, reset, interlock): `yes` adds the safety caution. A block named like `watchdog` always carries it.' },
];

const seriesDocs: Record<string, string> = {
  E3: '3 values per decade (±40 %)', E6: '6 values per decade (±20 %)', E12: '12 values per decade (±10 %)', E24: '24 values per decade (±5 %)',
  E48: '48 values per decade (±2 %)', E96: '96 values per decade (±1 %)', E192: '192 values per decade (±0.5 % and better)',
};

const dataModelDocs: Record<string, string> = {
  ilp32: 'int, long and pointers 32-bit (most 32-bit microcontrollers)',
  lp64: 'long and pointers 64-bit (a 64-bit host)',
  ip16: 'int 16-bit, long 32-bit (8-bit microcontrollers)',
};

/** Completion entries for the cursor at `offset`, or an empty list outside a block. */
export function blockCompletions(doc: TextDocumentLike, offset: number): CompletionEntry[] {
  const place = cursorPlace(doc, offset);
  if (!place) return [];
  return place.kind === 'key' ? keyEntries(place) : valueEntries(place);
}

function keyEntries(place: Extract<CursorPlace, { kind: 'key' }>): CompletionEntry[] {
  const present = new Set(place.block.entries.map((e) => e.key));
  const model = circuitById(place.block.entries.find((e) => e.key === 'circuit')?.valueText ?? '');
  const entries: CompletionEntry[] = [];
  for (const param of model?.params ?? []) {
    if (present.has(param.key)) continue;
    entries.push({ ...keyText(param.key, place.replace), kind: 'key', detail: paramDetail(param), documentation: param.description, offersWords: param.kind === 'choice' });
  }
  for (const meta of metaKeyDocs) {
    if (present.has(meta.key) || (meta.markdownOnly && place.host !== 'markdown')) continue;
    if (meta.forResult && !model?.results.some((r) => r.key === meta.forResult)) continue;
    if (model?.params.some((p) => p.key === meta.key)) continue;
    entries.push({ ...keyText(meta.key, place.replace), kind: 'meta', detail: meta.detail, documentation: meta.documentation, offersWords: meta.key === 'circuit' || meta.key === 'series' || meta.key === 'data-model' || meta.key === 'safety' });
  }
  return entries;
}

function keyText(key: string, replace: Span) {
  return { label: key, insertText: `${key}: `, filterText: key, replace };
}

const unitOf: Record<string, string> = { 'Ω': 'Ω', F: 'F', V: 'V', Hz: 'Hz', s: 's', A: 'A', '%': '%', baud: 'baud', 'bit/s': 'bit/s', '': 'number', other: '' };

function paramDetail(param: ParamSpec): string {
  if (param.kind === 'choice') return `${param.label}: ${param.options.join(' | ')} (default ${param.default})`;
  if (param.kind === 'list') return `${param.label}: list or a..b${param.defaultText ? ` (default ${param.defaultText})` : ''}`;
  if (param.kind === 'range') return `${param.label} [${param.dim} .. ${param.dim}] (optional)`;
  const unit = unitOf[param.dim] ?? '';
  const fallback = param.defaultText ?? (typeof param.default === 'number' ? String(param.default) : undefined);
  const need = fallback !== undefined ? `default ${fallback}` : param.optional ? 'optional' : 'required';
  return `${param.label}${unit ? ` [${unit}]` : ''} (${need})`;
}

function valueEntries(place: Extract<CursorPlace, { kind: 'value' }>): CompletionEntry[] {
  const words = wordsFor(place);
  const lead = place.needsSpace ? ' ' : '';
  return words.map(({ word, detail, documentation, kind }) => ({
    label: word, kind, detail, documentation, insertText: `${lead}${word}`, filterText: word, replace: place.replace,
  }));
}

interface Word {
  word: string;
  detail: string;
  documentation: string;
  kind: CompletionEntry['kind'];
}

function wordsFor(place: Extract<CursorPlace, { kind: 'value' }>): Word[] {
  if (place.key === 'circuit') return circuits.map((m) => ({ word: m.id, detail: m.title, documentation: m.summary, kind: 'circuit' }));
  if (place.key === 'series') {
    return [...SERIES_NAMES, 'none'].map((s) => ({ word: s, detail: seriesDocs[s] ?? 'keep the exact value', documentation: 'IEC 60063 preferred number series.', kind: 'word' }));
  }
  if (place.key === 'data-model') return Object.entries(dataModelDocs).map(([word, detail]) => ({ word, detail, documentation: 'C integer widths.', kind: 'word' }));
  if (place.key === 'safety') return ['yes', 'no'].map((word) => ({ word, detail: word === 'yes' ? 'add the safety caution' : 'not safety timing (a guard-named block keeps its caution)', documentation: 'Whether this timing guards people or property.', kind: 'word' }));
  const model = circuitById(place.block.entries.find((e) => e.key === 'circuit')?.valueText ?? '');
  const param = model?.params.find((p) => p.key === place.key);
  if (param?.kind !== 'choice') return [];
  return param.options.map((word) => ({ word, detail: word === param.default ? `${param.label} (default)` : param.label, documentation: param.description, kind: 'word' }));
}
