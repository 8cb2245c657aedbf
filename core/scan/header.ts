// The optional block name after `timing` / `@timing`: the first word; the rest of the line is free text.
import type { Span } from '../types';
import { isBlank, skipBlanks } from './lines';

export interface HeaderName {
  name?: string;
  nameSpan?: Span;
}

/** Reads the first blank-delimited word of text[from, to). */
export function readHeaderName(text: string, from: number, to: number): HeaderName {
  const start = skipBlanks(text, from, to);
  let end = start;
  while (end < to && !isBlank(text.charCodeAt(end))) end++;
  if (end === start) return {};
  return { name: text.slice(start, end), nameSpan: { start, end } };
}

/** Whether text[at, to) starts with `word` followed by a blank or the end. */
export function startsWithWord(text: string, at: number, to: number, word: string): boolean {
  if (to - at < word.length || !text.startsWith(word, at)) return false;
  const after = at + word.length;
  return after === to || isBlank(text.charCodeAt(after));
}
