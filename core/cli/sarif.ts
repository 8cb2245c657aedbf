// `--sarif`: SARIF 2.1.0 (OASIS Standard), one run, a rule per diagnostic code, physical locations.
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Finding } from '../types';
import { codeInfo } from '../codes';
import { locate } from './locate';
import type { CheckedFile } from './run';

const levels: Record<Finding['severity'], 'error' | 'warning' | 'note'> = { error: 'error', warning: 'warning', info: 'note' };

/** A rule's metadata from the one table of codes (core/codes.ts). */
function rule(id: string) {
  const info = codeInfo(id);
  if (!info) return { id, shortDescription: { text: id } };
  return {
    id,
    shortDescription: { text: info.short },
    fullDescription: { text: info.full },
    help: { text: info.help },
    defaultConfiguration: { level: levels[info.severity] },
  };
}

export function sarifReport(checked: CheckedFile[], cwd: string, version: string): string {
  const ruleIds: string[] = [];
  const results: unknown[] = [];
  const add = (finding: Finding, file: CheckedFile, blockName?: string) => {
    if (!ruleIds.includes(finding.code)) ruleIds.push(finding.code);
    const where = locate(finding, file);
    const relative = path.relative(cwd, where.file);
    const inside = relative && !relative.startsWith('..') && !path.isAbsolute(relative);
    results.push({
      ruleId: finding.code,
      ruleIndex: ruleIds.indexOf(finding.code),
      level: levels[finding.severity],
      message: { text: finding.message },
      locations: [
        {
          physicalLocation: {
            artifactLocation: inside ? { uri: relative.split(path.sep).join('/'), uriBaseId: 'SRCROOT' } : { uri: pathToFileURL(where.file).href },
            region: { startLine: where.line, startColumn: where.column, endLine: where.endLine, endColumn: where.endColumn },
          },
        },
      ],
      ...(blockName ? { properties: { block: blockName } } : {}),
    });
  };
  for (const file of checked) {
    for (const finding of file.analysis.findings) add(finding, file);
    for (const block of file.analysis.blocks) for (const finding of block.findings) add(finding, file, block.name);
  }
  const log = {
    version: '2.1.0',
    $schema: 'https://json.schemastore.org/sarif-2.1.0.json',
    runs: [
      {
        tool: {
          driver: {
            name: 'Tickmark',
            version,
            rules: ruleIds.map(rule),
          },
        },
        originalUriBaseIds: { SRCROOT: { uri: pathToFileURL(cwd + path.sep).href } },
        results,
      },
    ],
  };
  return JSON.stringify(log, null, 2) + '\n';
}
