// Everything the editor takes from the core, in one module. esbuild bundles it as out/engine.js apart
// from out/extension.js, and extension/engine.ts loads it on the first analysis, so activation never
// pays for mathjs, the circuit models or the C evaluator. Only re-exports of core functions belong here.
import { circuitById, circuits } from '../core/circuits/registry';
import type { CircuitModel } from '../core/circuits/model';

export { Analyzer, analyzeDocument, tooLargeAnalysis, type AnalyzeOptions, type CacheStats } from '../core/analyze';
export { headline as formatHeadline } from '../core/present/values';
export { hoverMarkdown as blockHoverMarkdown } from '../core/present/hover';
export { waveformFor, defaultCycles } from '../core/present/waveform';
export { blockView } from '../core/present/view';
export { renderWaveformSvg, type WaveformSvgOptions } from '../core/wave/svg';
export { blockCompletions, type CompletionEntry } from '../core/present/completion';
export { blockTemplate, type TemplateLine } from '../core/present/template';

/** The model of a block's circuit: its title and result labels for the panel and preview. */
export function circuitModel(id: string | undefined): CircuitModel | undefined {
  return id ? circuitById(id) : undefined;
}

/** Circuit ids for the insert command, from the core's registry. */
export function circuitNames(): string[] {
  return circuits.map((model) => model.id);
}

/** Circuit ids with their titles and summaries, for the insert command's quick pick. */
export function circuitChoices(): Array<{ id: string; title: string; summary: string }> {
  return circuits.map(({ id, title, summary }) => ({ id, title, summary }));
}
