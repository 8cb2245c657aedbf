// What the panel is told about one block: formatted results from the core and the sampled waveform.
import type { BlockAnalysis } from '../../core/types';
import type { HostMessage, PanelBlock } from '../../media/messages';
import { circuitModel, defaultCycles, formatHeadline, formatResult, waveformFor } from '../engine';

export function panelBlock(uri: string, analysis: BlockAnalysis): PanelBlock {
  const model = circuitModel(analysis.circuit);
  const results = model
    ? model.results
        .filter((spec) => analysis.values[spec.key] !== undefined)
        .map((spec) => ({ key: spec.key, label: spec.label, text: formatResult(model, spec.key, analysis.values[spec.key]) }))
    : [];
  return {
    uri,
    name: analysis.name,
    circuit: analysis.circuit,
    title: model?.title,
    line: analysis.line,
    headline: formatHeadline(analysis),
    values: { ...analysis.values },
    results,
    findings: analysis.findings.map((f) => ({ severity: f.severity, message: f.message })),
  };
}

export function showMessage(uri: string, analysis: BlockAnalysis, cycles = defaultCycles): HostMessage {
  return { type: 'show', block: panelBlock(uri, analysis), waveform: waveformFor(analysis, cycles), cycles };
}
