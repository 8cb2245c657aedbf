// The one seam between the editor glue and the core engine: every feature imports the engine from here.
// The core (extension/engineCore.ts) is required on first use, not at activation: the release build
// turns that require into a load of out/engine.js, a bundle of its own. No timing math belongs here.
import type * as Engine from './engineCore';

export type { AnalyzeOptions, CacheStats, CompletionEntry, TemplateLine, WaveformSvgOptions } from './engineCore';
export type Analyzer = Engine.Analyzer;

let engine: typeof Engine | undefined;
let loadMs: number | undefined;

function core(): typeof Engine {
  if (engine === undefined) {
    const start = performance.now();
    // A plain require so esbuild can point it at out/engine.js (scripts/build.mjs); tsx and the test bundle resolve the source.
    engine = require('./engineCore') as typeof Engine;
    loadMs = performance.now() - start;
  }
  return engine;
}

/** Whether the core has been loaded, and how long its first load took (ms). */
export function engineLoadState(): { loaded: boolean; loadMs?: number } {
  return { loaded: engine !== undefined, loadMs };
}

export function createAnalyzer(): Analyzer {
  return new (core().Analyzer)();
}

export const analyzeDocument: typeof Engine.analyzeDocument = (...args) => core().analyzeDocument(...args);
export const tooLargeAnalysis: typeof Engine.tooLargeAnalysis = (...args) => core().tooLargeAnalysis(...args);
export const formatHeadline: typeof Engine.formatHeadline = (...args) => core().formatHeadline(...args);
export const blockHoverMarkdown: typeof Engine.blockHoverMarkdown = (...args) => core().blockHoverMarkdown(...args);
export const waveformFor: typeof Engine.waveformFor = (...args) => core().waveformFor(...args);
export const blockView: typeof Engine.blockView = (...args) => core().blockView(...args);
export const renderWaveformSvg: typeof Engine.renderWaveformSvg = (...args) => core().renderWaveformSvg(...args);
export const blockCompletions: typeof Engine.blockCompletions = (...args) => core().blockCompletions(...args);
export const blockTemplate: typeof Engine.blockTemplate = (...args) => core().blockTemplate(...args);
export const circuitModel: typeof Engine.circuitModel = (...args) => core().circuitModel(...args);
export const circuitNames: typeof Engine.circuitNames = (...args) => core().circuitNames(...args);
export const circuitChoices: typeof Engine.circuitChoices = (...args) => core().circuitChoices(...args);

// The core's literal type makes tsc fail here if the two ever differ; a constant cannot wait for the lazy load.
export const defaultCycles: typeof Engine.defaultCycles = 3;
