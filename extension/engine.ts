// The one seam between the editor glue and the core engine: every feature imports the engine from here.
// No timing math belongs in extension/; this file only re-exports core functions.
import { circuits } from '../core/circuits/registry';

export { analyzeDocument, type AnalyzeOptions } from '../core/analyze';
export { headline as formatHeadline } from '../core/present/values';
export { hoverMarkdown as blockHoverMarkdown } from '../core/present/hover';
export { waveformFor } from '../core/present/waveform';

/** Circuit ids for the insert command, from the core's registry. */
export function circuitNames(): string[] {
  return circuits.map((model) => model.id);
}
