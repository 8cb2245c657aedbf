// `--format github`: one workflow command per finding (GitHub Actions' `::error file=…,line=…::message`), so
// findings show as annotations on the changed lines where code scanning is not available; a plain summary last.
import type { Finding } from '../types';
import { displayPath } from './files';
import { locate } from './locate';
import type { CheckedFile } from './run';

const commands: Record<Finding['severity'], string> = { error: 'error', warning: 'warning', info: 'notice' };

/** Workflow-command escaping: the message loses nothing to `%`, CR or LF. */
function escapeData(text: string): string {
  return text.replace(/%/g, '%25').replace(/\r/g, '%0D').replace(/\n/g, '%0A');
}

/** Property values also escape the separators `:` and `,`. */
function escapeProperty(text: string): string {
  return escapeData(text).replace(/:/g, '%3A').replace(/,/g, '%2C');
}

export function githubReport(checked: CheckedFile[], cwd: string): string {
  const lines: string[] = [];
  const counts = { error: 0, warning: 0, info: 0 };
  let blocks = 0;
  const add = (finding: Finding, file: CheckedFile, blockName?: string) => {
    const where = locate(finding, file);
    counts[finding.severity]++;
    const properties = [
      `file=${escapeProperty(displayPath(where.file, cwd))}`,
      `line=${where.line}`,
      `col=${where.column}`,
      `endLine=${where.endLine}`,
      `endColumn=${where.endColumn}`,
      `title=${escapeProperty(`Tickmark ${finding.code}${blockName ? ` (${blockName})` : ''}`)}`,
    ];
    lines.push(`::${commands[finding.severity]} ${properties.join(',')}::${escapeData(finding.message)}`);
  };
  for (const file of checked) {
    for (const finding of file.analysis.findings) add(finding, file);
    for (const block of file.analysis.blocks) {
      blocks++;
      for (const finding of block.findings) add(finding, file, block.name);
    }
  }
  lines.push(`Tickmark: ${blocks} block${blocks === 1 ? '' : 's'}, ${counts.error} error${counts.error === 1 ? '' : 's'}, ${counts.warning} warning${counts.warning === 1 ? '' : 's'}, ${counts.info} note${counts.info === 1 ? '' : 's'}`);
  return lines.join('\n') + '\n';
}
