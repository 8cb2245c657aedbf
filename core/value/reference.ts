// `@name.result`: a reference to another block's result inside a value. Names are letters, digits and `_`,
// joined by single hyphens (`scheduler-tick`); a `-` with a space after it is a minus (`@bus - 1 MHz`).
import type { BlockRef } from './ast';

const isNameChar = (c: string | undefined): boolean =>
  c !== undefined && ((c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c === '_');

/** End of a name starting at `at` (exclusive): name characters, and `-` between two of them. */
function nameEnd(text: string, at: number): number {
  let end = at;
  while (end < text.length) {
    if (isNameChar(text[end])) end++;
    else if (text[end] === '-' && end > at && isNameChar(text[end + 1])) end++;
    else break;
  }
  return end;
}

/** The result a bare `@name` stands for. */
export const defaultReferenceResult = 'frequency';

/** Reads a reference at text[at] === '@'; spans are document offsets (`offset` is the offset of text[0]). */
export function readReference(text: string, at: number, offset: number): { ref: BlockRef; end: number } | { problem: string; end: number } {
  const blockStart = at + 1;
  const blockEnd = nameEnd(text, blockStart);
  if (blockEnd === blockStart) return { problem: '`@` starts a reference to another block: write `@name` or `@name.result` (e.g. `@xtal.frequency`)', end: blockStart };
  const block = text.slice(blockStart, blockEnd);
  const blockSpan = { start: offset + blockStart, end: offset + blockEnd };
  if (text[blockEnd] !== '.' || !isNameChar(text[blockEnd + 1]) || (text[blockEnd + 1] >= '0' && text[blockEnd + 1] <= '9')) {
    return { ref: { block, blockSpan, key: `@${block}.${defaultReferenceResult}` }, end: blockEnd };
  }
  const resultStart = blockEnd + 1;
  const resultEnd = nameEnd(text, resultStart);
  const result = text.slice(resultStart, resultEnd).toLowerCase();
  return {
    ref: { block, result, blockSpan, resultSpan: { start: offset + resultStart, end: offset + resultEnd }, key: `@${block}.${result}` },
    end: resultEnd,
  };
}

/** Every reference in a value's text, in order (for the workspace's reference graph and the editor). */
export function referencesIn(text: string, offset: number): BlockRef[] {
  const refs: BlockRef[] = [];
  for (let i = text.indexOf('@'); i >= 0; i = text.indexOf('@', i + 1)) {
    const read = readReference(text, i, offset);
    if ('ref' in read) refs.push(read.ref);
    i = Math.max(i, read.end - 1);
  }
  return refs;
}
