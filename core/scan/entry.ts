// One `key: value` line of a block, read from a slice of the text so every span stays exact.
import type { BlockEntry, Finding, Span } from '../types';
import { Code } from '../codes';
import { BLANK_CLASS, skipBlanks, trimEnd } from './lines';

export type LineReading =
  | { kind: 'blank' }
  | { kind: 'entry'; entry: ScannedEntry }
  | { kind: 'malformed'; span: Span; message: string };

/** Keys are the trade's short names: a letter, then letters, digits, `+ - _ .` (`vt+`, `data-model`). */
function isKeyChar(ch: number, first: boolean): boolean {
  const letter = (ch >= 65 && ch <= 90) || (ch >= 97 && ch <= 122);
  if (first) return letter;
  return letter || (ch >= 48 && ch <= 57) || ch === 43 || ch === 45 || ch === 95 || ch === 46;
}

/** isKeyChar's spelling of a key as a regular expression: a letter, then letters, digits and `+ - _ .`. */
export const KEY_PATTERN = '[A-Za-z][A-Za-z0-9+\\-_.]*';
/** The colon with the blanks around it (blanks as `isBlank` in lines.ts). */
export const COLON_PATTERN = `${BLANK_CLASS}*:${BLANK_CLASS}*`;

/** `key:` from the first non-blank of a line, then the colon and its blanks. */
const KEY_COLON = new RegExp(`${KEY_PATTERN}(?=${BLANK_CLASS}*:)`, 'y');
const COLON_BLANKS = new RegExp(COLON_PATTERN, 'y');
const BLANK: LineReading = Object.freeze({ kind: 'blank' });

/**
 * A scanned `key: value` line: the key lower-cased, the value as written, and where each stands as two offsets; the
 * spans are made when read. A firmware file holds thousands of blocks whose entries live as long as the analysis,
 * and on a cold start each object kept that long is copied through V8's young generation and makes it grow (new
 * pages touched): one object per line instead of three (README, Speed).
 */
export class ScannedEntry implements BlockEntry {
  // Assigned in the constructor alone (declared, not defined): one entry per scanned line. The ends are not kept:
  // the key is the spelled key lower-cased (ASCII, so as long) and the value is the text where it stands.
  declare readonly key: string;
  declare readonly valueText: string;
  declare readonly keyStart: number;
  declare readonly valueStart: number;

  constructor(key: string, valueText: string, keyStart: number, valueStart: number) {
    this.key = key;
    this.valueText = valueText;
    this.keyStart = keyStart;
    this.valueStart = valueStart;
  }

  get keySpan(): Span {
    return { start: this.keyStart, end: this.keyStart + this.key.length };
  }

  get valueSpan(): Span {
    return { start: this.valueStart, end: this.valueEnd };
  }

  get valueEnd(): number {
    return this.valueStart + this.valueText.length;
  }

  /** The plain shape, spans included, wherever an entry is sent as JSON (the language server's `tickmark/block`). */
  toJSON(): BlockEntry {
    return { key: this.key, keySpan: this.keySpan, valueText: this.valueText, valueSpan: this.valueSpan };
  }
}

/** Keys already seen, each kept as one string: a file's thousand `clock:` lines share one. Bounded, for hostile text. */
const seenKeys = new Map<string, string>();
const MAX_SEEN_KEYS = 1024;

/** The entry of text[keyStart, keyEnd) `:` text[valueStart, valueEnd): its key (ASCII key characters) lower-cased and shared. */
export function scannedEntry(text: string, keyStart: number, keyEnd: number, valueStart: number, valueEnd: number): ScannedEntry {
  const spelled = text.slice(keyStart, keyEnd).toLowerCase();
  let key = seenKeys.get(spelled);
  if (key === undefined) {
    key = spelled;
    if (seenKeys.size < MAX_SEEN_KEYS) seenKeys.set(spelled, spelled);
  }
  return new ScannedEntry(key, text.slice(valueStart, valueEnd), keyStart, valueStart);
}

/** Reads text[from, to) as `key: value`. */
export function readEntryLine(text: string, from: number, to: number): LineReading {
  const start = skipBlanks(text, from, to);
  const end = trimEnd(text, start, to);
  if (start === end) return BLANK;
  // The common well-formed line in native regex steps; anything it does not take goes the long way below.
  KEY_COLON.lastIndex = start;
  if (KEY_COLON.test(text)) {
    const keyEnd = KEY_COLON.lastIndex;
    COLON_BLANKS.lastIndex = keyEnd;
    COLON_BLANKS.test(text);
    const valueStart = COLON_BLANKS.lastIndex;
    if (valueStart < end) return entryReading(text, start, keyEnd, valueStart, end);
  }
  return readLine(text, start, end);
}

/** readEntryLine by character steps alone, which the regex steps must agree with. */
export function readEntryLineGeneral(text: string, from: number, to: number): LineReading {
  const start = skipBlanks(text, from, to);
  const end = trimEnd(text, start, to);
  if (start === end) return BLANK;
  return readLine(text, start, end);
}

/** text[start, end), trimmed and not empty, as `key: value` or what is wrong with it. */
function readLine(text: string, start: number, end: number): LineReading {
  // Searched within the line only: a line without `:` must not send the search on through the file.
  let colon = start;
  while (colon < end && text.charCodeAt(colon) !== 58) colon++;
  const span = { start, end };
  if (colon >= end) {
    return { kind: 'malformed', span, message: 'Expected `key: value`; this line has no `:`.' };
  }
  const keyEnd = trimEnd(text, start, colon);
  if (keyEnd === start) {
    return { kind: 'malformed', span, message: 'Expected `key: value`; the key before `:` is missing.' };
  }
  for (let i = start; i < keyEnd; i++) {
    if (!isKeyChar(text.charCodeAt(i), i === start)) {
      const key = text.slice(start, keyEnd);
      return {
        kind: 'malformed',
        span: { start, end: keyEnd },
        message: `\`${key}\` is not a key: keys start with a letter and hold letters, digits and \`+ - _ .\`.`,
      };
    }
  }
  const valueStart = skipBlanks(text, colon + 1, end);
  if (valueStart === end) {
    return {
      kind: 'malformed',
      span,
      message: `\`${text.slice(start, keyEnd)}\` has no value after \`:\`.`,
    };
  }
  return entryReading(text, start, keyEnd, valueStart, end);
}

/** The entry of a well-formed line: key text[start, keyEnd) lower-cased, value text[valueStart, end). */
function entryReading(text: string, start: number, keyEnd: number, valueStart: number, end: number): LineReading {
  return { kind: 'entry', entry: scannedEntry(text, start, keyEnd, valueStart, end) };
}

/** Collects entries, keeping the first of a repeated key and flagging the later one. */
export class EntryCollector {
  // Set in the constructor rather than by class-body initialisers: one collector per block.
  declare readonly entries: BlockEntry[];
  declare readonly findings: Finding[];
  /** Made once a block holds many entries; a few are searched in the array. */
  declare private seen: Map<string, BlockEntry> | undefined;

  constructor() {
    this.entries = [];
    this.findings = [];
    this.seen = undefined;
  }

  private firstOf(key: string): BlockEntry | undefined {
    const entries = this.entries;
    if (this.seen) return this.seen.get(key);
    if (entries.length < 16) {
      for (let i = 0; i < entries.length; i++) if (entries[i].key === key) return entries[i];
      return undefined;
    }
    this.seen = new Map();
    for (let i = entries.length - 1; i >= 0; i--) this.seen.set(entries[i].key, entries[i]);
    return this.seen.get(key);
  }

  add(entry: BlockEntry): void {
    const first = this.firstOf(entry.key);
    if (first) {
      this.findings.push({
        severity: 'warning',
        code: Code.blockKeyRepeated,
        message: `\`${entry.key}\` is given twice; the first value (\`${first.valueText}\`) is used.`,
        span: entry.keySpan,
      });
      return;
    }
    this.seen?.set(entry.key, entry);
    this.entries.push(entry);
  }

  malformed(span: Span, message: string): void {
    this.findings.push({ severity: 'error', code: Code.blockLineMalformed, message, span });
  }
}
