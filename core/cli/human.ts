// The report a person reads in a terminal or a CI log: `file:line: severity: message`, a summary per block.
import type { Finding } from '../types';
import { blockView, severityWord } from '../present/view';
import { displayPath } from './files';
import { locate } from './locate';
import type { CheckedFile } from './run';

export interface Paint {
  severity(severity: Finding['severity'], text: string): string;
  dim(text: string): string;
  bold(text: string): string;
}

export const noPaint: Paint = { severity: (_s, t) => t, dim: (t) => t, bold: (t) => t };

export const ansiPaint: Paint = {
  severity: (s, t) => `\x1b[${s === 'error' ? '31' : s === 'warning' ? '33' : '36'}m${t}\x1b[0m`,
  dim: (t) => `\x1b[2m${t}\x1b[0m`,
  bold: (t) => `\x1b[1m${t}\x1b[0m`,
};

/** Control characters from a document would steer the terminal (ECMA-48 escape sequences): shown as \uXXXX. */
export function printable(text: string): string {
  // Also the bidirectional controls (Unicode TR9): a block name must not reorder the line it is printed on.
  return text.replace(/[\u0000-\u0008\u000b-\u001f\u007f-\u009f\u061c\u200e\u200f\u202a-\u202e\u2066-\u2069]/g, (ch) => `\\u${ch.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

export function humanReport(checked: CheckedFile[], cwd: string, paint: Paint): string {
  const lines: string[] = [];
  let blocks = 0;
  const counts = { error: 0, warning: 0, info: 0 };
  const line = (finding: Finding, file: CheckedFile) => {
    const where = locate(finding, file);
    counts[finding.severity]++;
    return `${printable(displayPath(where.file, cwd))}:${where.line}:${where.column}: ${paint.severity(finding.severity, severityWord[finding.severity])}: ${printable(finding.message)}`;
  };
  for (const file of checked) {
    for (const finding of file.analysis.findings) lines.push(line(finding, file));
    for (const block of file.analysis.blocks) {
      blocks++;
      // The block's status is the worst severity among its findings, in the words the finding lines use.
      const worst = block.findings.some((f) => f.severity === 'error') ? 'error' : block.findings.some((f) => f.severity === 'warning') ? 'warning' : 'ok';
      const mark = worst === 'ok' ? paint.dim('ok') : paint.severity(worst, worst);
      const view = blockView(block);
      lines.push(`${printable(file.display)}:${view.line}: ${paint.bold(printable(view.name))} (${printable(view.circuit ?? 'no circuit')}) ${mark} — ${printable(view.headline)}`);
      for (const finding of block.findings) lines.push(line(finding, file));
    }
  }
  const files = checked.filter((f) => f.analysis.blocks.length).length;
  lines.push(
    `${blocks} block${blocks === 1 ? '' : 's'} in ${files} file${files === 1 ? '' : 's'}: ` +
      `${counts.error} error${counts.error === 1 ? '' : 's'}, ${counts.warning} warning${counts.warning === 1 ? '' : 's'}, ${counts.info} note${counts.info === 1 ? '' : 's'}`,
  );
  return lines.join('\n') + '\n';
}
