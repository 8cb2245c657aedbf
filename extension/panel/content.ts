// What the panel is told about one block: the presented block from the core (core/present/view.ts) and the
// sampled waveform.
import type { BlockAnalysis } from '../../core/types';
import type { HostMessage, PanelBlock } from '../../media/messages';
import { blockView, defaultCycles, waveformFor } from '../engine';

export function panelBlock(uri: string, analysis: BlockAnalysis): PanelBlock {
  const view = blockView(analysis);
  return {
    uri,
    name: view.name,
    circuit: view.circuit,
    title: view.modelled ? view.title : undefined,
    line: view.line,
    headline: view.headline,
    values: { ...analysis.values },
    // Values read from other blocks (`clock: @slow-bus`) show as values too, named by their reference.
    results: [
      ...view.results.map((row) => ({ key: row.key, label: row.label, text: row.value })),
      ...view.references.map((ref) => ({ key: ref.label, label: `from ${ref.label}`, text: ref.value })),
    ],
    findings: analysis.findings.map((f) => ({ severity: f.severity, message: f.message })),
  };
}

export function showMessage(uri: string, analysis: BlockAnalysis, cycles = defaultCycles): HostMessage {
  return { type: 'show', block: panelBlock(uri, analysis), waveform: waveformFor(analysis, cycles), cycles };
}
