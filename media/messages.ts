// Messages across the waveform panel's webview boundary, imported with `import type` on both sides.
import type { Waveform } from '../core/circuits/model';
import type { Severity } from '../core/types';

/** One result as the panel lists it: already formatted by the core, so it reads as on the lens. */
export interface PanelResult {
  key: string;
  label: string;
  text: string;
}

export interface PanelBlock {
  /** Document the block is in (an editor URI string). */
  uri: string;
  name: string;
  circuit?: string;
  /** Circuit title in words ("Schmitt-trigger RC oscillator"). */
  title?: string;
  /** 1-based line of the block's header. */
  line: number;
  headline: string;
  /** Results in SI base units, as in the CLI's JSON. */
  values: Record<string, number>;
  results: PanelResult[];
  findings: Array<{ severity: Severity; message: string }>;
}

/** Host → webview. */
export type HostMessage =
  | { type: 'show'; block: PanelBlock; waveform?: Waveform; cycles: number }
  | { type: 'empty'; reason: string };

/** Webview → host. */
export type PanelMessage =
  | { type: 'ready' }
  | { type: 'export' }
  /** Sent after a redraw: which block is on screen and how much of it was drawn. */
  | { type: 'drawn'; block: string; traces: number; points: number };

/** What the webview keeps across a window reload, handed back to the panel serializer. */
export interface PanelState {
  uri: string;
  block: string;
}
