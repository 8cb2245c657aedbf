// A block's waveform from its analysis: the same picture for the CLI, the panel and the preview.
import type { BlockAnalysis } from '../types';
import type { Waveform } from '../circuits/model';
import { circuitById } from '../circuits/registry';

export const defaultCycles = 3;
/** Bounds so a typed `cycles` value cannot make the panel draw millions of segments. */
export const maxCycles = 50;

export function waveformFor(analysis: BlockAnalysis, cycles = defaultCycles): Waveform | undefined {
  if (analysis.findings.some((f) => f.severity === 'error')) return undefined;
  const model = analysis.circuit ? circuitById(analysis.circuit) : undefined;
  if (!model?.waveform || Object.keys(analysis.values).length === 0) return undefined;
  const count = Math.min(Math.max(1, Math.round(cycles)), maxCycles);
  try {
    return model.waveform({ values: analysis.params, choices: analysis.choices, lists: analysis.lists, ranges: analysis.ranges, tolerances: analysis.tolerances, name: analysis.block.name }, count);
  } catch {
    return undefined;
  }
}
