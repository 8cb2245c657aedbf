// The diagnostic-code section of docs/blocks.md, written from the one table of codes (core/codes.ts): each code
// is a heading of its own, so SARIF `helpUri`s and hover links can point at `docs/blocks.md#<code>`.
import { codeTable } from '../codes';

const severityWords = { error: 'error', warning: 'warning', info: 'note' } as const;

export function codesMarkdown(): string {
  const lines: string[] = [];
  for (const info of codeTable) {
    lines.push(`### \`${info.id}\``, '');
    lines.push(`*${severityWords[info.severity]}* — ${info.short}`, '');
    lines.push(info.full, '');
    if (info.help) lines.push(`**What to do:** ${info.help}`, '');
  }
  return lines.join('\n').trimEnd();
}

export const codesStart = '<!-- codes: written by `npm run docs` from core/codes.ts; do not edit by hand -->';
export const codesEnd = '<!-- end of codes -->';

/** The document with its code section replaced by the current one; unchanged when it has no markers. */
export function withCodes(doc: string): string {
  const start = doc.indexOf(codesStart);
  const end = doc.indexOf(codesEnd);
  if (start < 0 || end < start) return doc;
  return doc.slice(0, start + codesStart.length) + '\n\n' + codesMarkdown() + '\n\n' + doc.slice(end);
}
