// The hover's text for one block: every result, its spread, solved parts, where constants came from,
// and the block's findings. Numbers are formatted by the core; nothing is computed here.
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { BlockAnalysis } from '../core/types';
import { formatResult } from './engine';

export function hoverMarkdown(block: BlockAnalysis): vscode.MarkdownString {
  const md = new vscode.MarkdownString(undefined, true);
  md.appendMarkdown(`**${escape(block.name)}**${block.circuit ? ` — \`${escape(block.circuit)}\`` : ''}\n\n`);

  const results = Object.entries(block.values);
  if (results.length > 0) {
    md.appendMarkdown('| result | value | spread |\n|---|---|---|\n');
    for (const [key, value] of results) {
      const spread = block.spread?.[key];
      const range = spread ? `${formatResult(key, spread.min)} … ${formatResult(key, spread.max)}` : '';
      md.appendMarkdown(`| ${escape(key)} | ${escape(formatResult(key, value))} | ${escape(range)} |\n`);
    }
    md.appendMarkdown('\n');
  }

  for (const [key, part] of Object.entries(block.solved ?? {})) {
    const exact = part.exact === undefined ? '' : ` (exact ${formatResult(key, part.exact)})`;
    md.appendMarkdown(`- solved \`${escape(key)}\` = ${escape(formatResult(key, part.value))}${part.series ? ` ${part.series}` : ''}${exact}\n`);
  }
  for (const id of block.identifiers) {
    md.appendMarkdown(`- \`${escape(id.name)}\` = ${id.value} from ${escape(path.basename(id.uri))}:${id.line}\n`);
  }
  for (const finding of block.findings) {
    md.appendMarkdown(`- ${finding.severity}: ${escape(finding.message)}\n`);
  }
  return md;
}

function escape(text: string): string {
  return text.replace(/[\\`*_{}[\]()#+\-!|<>]/g, (ch) => `\\${ch}`);
}
