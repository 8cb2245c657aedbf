// Chooses the scanner for a document: by language id, else by the file extension of its uri.
import type { RawBlock, TextDocumentLike } from '../types';
import { scanMarkdown } from './markdown';
import { scanC } from './c';

export { scanMarkdown } from './markdown';
export { scanC } from './c';
export { lineStarts, lineOf } from './lines';

// The one table of file types Tickmark reads: the scanner, the CLI's folder walk and the workspace check.
const MARKDOWN_EXTENSIONS: ReadonlySet<string> = new Set(['md', 'markdown']);
const C_EXTENSIONS: ReadonlySet<string> = new Set(['c', 'h', 'cc', 'cpp', 'cxx', 'hpp', 'hh']);
/** The C-family extensions, without the dot (a note's `firmware:` file). */
export const cExtensions: readonly string[] = [...C_EXTENSIONS];

/** The lower-cased extension of a uri or path, ignoring any query or fragment. */
function extensionOf(uri: string): string {
  let end = uri.length;
  for (const mark of ['?', '#']) {
    const at = uri.indexOf(mark);
    if (at >= 0 && at < end) end = at;
  }
  const path = uri.slice(0, end);
  const slash = Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\'));
  const dot = path.lastIndexOf('.');
  return dot > slash ? path.slice(dot + 1).toLowerCase() : '';
}

export type ScanHost = 'markdown' | 'c' | undefined;

/** Which scanner reads this document, or undefined when Tickmark does not read it. */
export function hostOf(doc: Pick<TextDocumentLike, 'uri' | 'languageId'>): ScanHost {
  if (doc.languageId === 'markdown') return 'markdown';
  if (doc.languageId === 'c' || doc.languageId === 'cpp') return 'c';
  const extension = extensionOf(doc.uri);
  if (MARKDOWN_EXTENSIONS.has(extension)) return 'markdown';
  if (C_EXTENSIONS.has(extension)) return 'c';
  return undefined;
}

/** The scanner a file path calls for, by its extension alone. */
export function hostOfPath(path: string): ScanHost {
  return hostOf({ uri: path, languageId: '' });
}

export function scanDocument(doc: TextDocumentLike): RawBlock[] {
  const host = hostOf(doc);
  if (host === 'markdown') return scanMarkdown(doc.text);
  if (host === 'c') return scanC(doc.text);
  return [];
}
