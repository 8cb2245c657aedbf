// The one seam between the editor glue and the core engine: every feature imports the engine from here.
//
// TEMPORARY until core/analyze.ts lands: this module answers every document with no blocks. The lead
// points it at the core by replacing the three bodies below with re-exports, e.g.
//   export { analyzeDocument } from '../core/analyze';
//   export { formatHeadline, formatResult } from '../core/format';
//   export { circuitNames } from '../core/circuits/registry';
// No timing math belongs in extension/.
import type { AnalyzeOptions } from '../core/analyze/context';
import type { BlockAnalysis, DocumentAnalysis, TextDocumentLike } from '../core/types';

export type { AnalyzeOptions };

export function analyzeDocument(doc: TextDocumentLike, _options: AnalyzeOptions): DocumentAnalysis {
  return { uri: doc.uri, blocks: [], findings: [], dependencies: [] };
}

/** One line of headline numbers for the code lens. */
export function formatHeadline(block: BlockAnalysis): string {
  const shown = Object.entries(block.values).slice(0, 3);
  return shown.length === 0 ? block.name : shown.map(([key, value]) => `${key} ${formatResult(key, value)}`).join(' · ');
}

/** A result in engineering notation with its unit. */
export function formatResult(_key: string, value: number): string {
  return value.toPrecision(4);
}

/** Circuit keys for the insert command, from the core's registry once it lands. */
export function circuitNames(): string[] {
  return [];
}
