// Test helpers: analyse in-memory documents with an in-memory file system, no disk.
import * as path from 'node:path';
import { analyzeDocument, defaultAnalyzeOptions, type AnalyzeOptions } from '../../core/analyze';
import type { BlockAnalysis, DocumentAnalysis } from '../../core/types';

export const root = path.resolve('/virtual/workspace');

export function memoryOptions(files: Record<string, string> = {}, extra: Partial<AnalyzeOptions> = {}): AnalyzeOptions {
  const table = new Map(Object.entries(files).map(([name, text]) => [path.join(root, name), text]));
  return { ...defaultAnalyzeOptions, workspaceRoots: [root], read: (file) => table.get(path.resolve(file)), ...extra };
}

export function analyzeText(name: string, text: string, files: Record<string, string> = {}, extra: Partial<AnalyzeOptions> = {}): DocumentAnalysis {
  const languageId = name.endsWith('.md') ? 'markdown' : name.endsWith('.c') || name.endsWith('.h') ? 'c' : 'cpp';
  return analyzeDocument({ uri: path.join(root, name), text, languageId }, memoryOptions({ ...files, [name]: text }, extra));
}

/** The single block of a Markdown note made from `lines`. */
export function noteBlock(lines: string[], files: Record<string, string> = {}, extra: Partial<AnalyzeOptions> = {}): BlockAnalysis {
  const text = ['# note', '', '```timing probe', ...lines, '```', ''].join('\n');
  const analysis = analyzeText('notes/a.md', text, files, extra);
  if (analysis.blocks.length !== 1) throw new Error(`expected one block, got ${analysis.blocks.length}`);
  return analysis.blocks[0];
}

export function errors(block: BlockAnalysis): string[] {
  return block.findings.filter((f) => f.severity === 'error').map((f) => f.message);
}
