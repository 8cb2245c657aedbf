// `--sarif`: SARIF 2.1.0 (OASIS Standard) as code-scanning services take it: one run, the tool with its
// `informationUri`, a rule per diagnostic code with short and full descriptions, help text and a `helpUri`
// into docs/blocks.md, results with relative URIs against `%SRCROOT%` (the working folder) and a
// `partialFingerprints` entry that survives lines moving above the finding.
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Finding } from '../types';
import { codeInfo, codeTable } from '../codes';
import { homepage, referenceLink } from '../project';
import { locate } from './locate';
import type { CheckedFile } from './run';

const levels: Record<Finding['severity'], 'error' | 'warning' | 'note'> = { error: 'error', warning: 'warning', info: 'note' };
const srcRoot = '%SRCROOT%';

/** A rule's metadata from the one table of codes (core/codes.ts), with its section of docs/blocks.md. */
function rule(code: string) {
  const info = codeInfo(code);
  const helpUri = referenceLink(code);
  const short = info?.short ?? code;
  const full = info?.full ?? short;
  const help = info?.help ?? '';
  return {
    id: code,
    name: code.replace(/(^|-)([a-z])/g, (_m, _d, c: string) => c.toUpperCase()),
    shortDescription: { text: short },
    fullDescription: { text: full },
    help: {
      text: `${full}\n\n${help}\n\nReference: ${helpUri}`.replace(/\n\n\n\n/, '\n\n'),
      markdown: `${full}\n\n${help}\n\nSee [\`${code}\` in the block-language reference](${helpUri}).`.replace(/\n\n\n\n/, '\n\n'),
    },
    helpUri,
    ...(info ? { defaultConfiguration: { level: levels[info.severity] } } : {}),
    properties: { tags: code === 'caution' || code === 'safety-kept' ? ['timing', 'safety'] : ['timing', 'correctness'] },
  };
}

/** A stable identity for a finding: its code, file, block and the text it points at, not its line number. */
function fingerprint(parts: string[], seen: Map<string, number>): string {
  // Loaded on the first SARIF finding: every other command starts without Node's crypto module.
  const { createHash } = require('node:crypto') as typeof import('node:crypto');
  const base = createHash('sha256').update(parts.join('\0')).digest('hex').slice(0, 32);
  const n = seen.get(base) ?? 0;
  seen.set(base, n + 1);
  return `${base}:${n + 1}`;
}

/** `indent`: spaces per level for a reader at a terminal; none gives one line. */
export function sarifReport(checked: CheckedFile[], cwd: string, version: string, indent?: number): string {
  const ruleIds: string[] = codeTable.map((info) => info.id);
  const results: unknown[] = [];
  const seen = new Map<string, number>();
  const add = (finding: Finding, file: CheckedFile, blockName?: string) => {
    if (!ruleIds.includes(finding.code)) ruleIds.push(finding.code);
    const where = locate(finding, file);
    const relative = path.relative(cwd, where.file);
    const inside = relative !== '' && !relative.startsWith('..') && !path.isAbsolute(relative);
    const uri = inside ? relative.split(path.sep).join('/') : pathToFileURL(where.file).href;
    const inFile = where.file === file.file;
    // Numbers in a message change with every edit of a value; the text the finding points at does not.
    const anchor = inFile ? file.text.slice(finding.span.start, finding.span.end).trim().slice(0, 200) : finding.message.replace(/[\d.,]+/g, '#');
    results.push({
      ruleId: finding.code,
      ruleIndex: ruleIds.indexOf(finding.code),
      level: levels[finding.severity],
      message: { text: finding.message },
      locations: [
        {
          physicalLocation: {
            artifactLocation: inside ? { uri, uriBaseId: srcRoot } : { uri },
            region: { startLine: where.line, startColumn: where.column, endLine: where.endLine, endColumn: where.endColumn },
          },
        },
      ],
      partialFingerprints: { 'tickmarkFinding/v1': fingerprint([finding.code, uri, blockName ?? '', anchor], seen) },
      ...(blockName ? { properties: { block: blockName } } : {}),
    });
  };
  for (const file of checked) {
    for (const finding of file.analysis.findings) add(finding, file);
    for (const block of file.analysis.blocks) for (const finding of block.findings) add(finding, file, block.name);
  }
  const log = {
    $schema: 'https://json.schemastore.org/sarif-2.1.0.json',
    version: '2.1.0',
    runs: [
      {
        tool: {
          driver: {
            name: 'Tickmark',
            version,
            semanticVersion: version,
            informationUri: homepage,
            rules: ruleIds.map(rule),
          },
        },
        // Columns count UTF-16 code units, as the editor and the JSON report do.
        columnKind: 'utf16CodeUnits',
        originalUriBaseIds: { [srcRoot]: { uri: pathToFileURL(cwd.endsWith(path.sep) ? cwd : cwd + path.sep).href } },
        results,
      },
    ],
  };
  return JSON.stringify(log, null, indent) + '\n';
}
