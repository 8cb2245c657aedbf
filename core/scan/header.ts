// The optional block name after `timing` / `@timing`: one word. Text after it is not part of the block, and
// the scanners say so rather than drop it silently (`@timing x circuit: ring` would lose a key).
import type { Finding, Span } from '../types';
import { Code } from '../codes';
import { isBlank, skipBlanks, trimEnd } from './lines';

export interface HeaderName {
  name?: string;
  nameSpan?: Span;
  /** Text after the name on the header line, trimmed; ignored by the block. */
  restSpan?: Span;
}

/** Reads the first blank-delimited word of text[from, to), and where any text after it stands. */
export function readHeaderName(text: string, from: number, to: number): HeaderName {
  const start = skipBlanks(text, from, to);
  let end = start;
  while (end < to && !isBlank(text.charCodeAt(end))) end++;
  if (end === start) return {};
  const restStart = skipBlanks(text, end, to);
  const restEnd = trimEnd(text, restStart, to);
  const name = text.slice(start, end);
  if (restStart === restEnd) return { name, nameSpan: { start, end } };
  return { name, nameSpan: { start, end }, restSpan: { start: restStart, end: restEnd } };
}

/** The warning on the ignored text after a block name, or undefined when the header holds only the name. */
export function ignoredHeaderText(text: string, header: HeaderName): Finding | undefined {
  const rest = header.restSpan;
  if (!rest || header.name === undefined) return undefined;
  const ignored = text.slice(rest.start, rest.end);
  // A long tail is shortened so a pasted paragraph does not fill the Problems list.
  const quoted = ignored.length > 24 ? `${ignored.slice(0, 24)}…` : ignored;
  const hint = ignored.includes(':') ? '; put each `key: value` on a line of its own' : '';
  return {
    severity: 'warning',
    code: Code.blockLineMalformed,
    message: `a block name is one word: the block is named \`${header.name}\` and \`${quoted}\` after it is ignored${hint}`,
    span: rest,
  };
}

/** Whether text[at, to) starts with `word` followed by a blank or the end. */
export function startsWithWord(text: string, at: number, to: number, word: string): boolean {
  if (to - at < word.length || !text.startsWith(word, at)) return false;
  const after = at + word.length;
  return after === to || isBlank(text.charCodeAt(after));
}
