// Completion inside a timing block, from the one source of truth for each fact: circuit ids and summaries
// from the registry, keys with units, defaults and descriptions from each model's parameter table.
import type { ParamSpec } from '../circuits/model';
import { circuitById, circuits } from '../circuits/registry';
import { blockKey, blockKeys } from '../block-keys';
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
  for (const meta of blockKeys) {
    if (present.has(meta.key) || (meta.markdownOnly && place.host !== 'markdown')) continue;
    if (meta.forResult && !model?.results.some((r) => r.key === meta.forResult)) continue;
    if (model?.params.some((p) => p.key === meta.key)) continue;
    entries.push({ ...keyText(meta.key, place.replace), kind: 'meta', detail: meta.label, documentation: meta.description, offersWords: meta.value === 'circuit' || meta.words !== undefined });
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
  const meta = blockKey(place.key);
  if (meta?.words) return meta.words.map(({ word, detail }) => ({ word, detail, documentation: meta.description, kind: 'word' }));
  const model = circuitById(place.block.entries.find((e) => e.key === 'circuit')?.valueText ?? '');
  const param = model?.params.find((p) => p.key === place.key);
  if (param?.kind !== 'choice') return [];
  return param.options.map((word) => ({ word, detail: word === param.default ? `${param.label} (default)` : param.label, documentation: param.description, kind: 'word' }));
}
