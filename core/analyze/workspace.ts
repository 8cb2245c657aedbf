// The workspace pass: every document's blocks analysed in reference order, so `@name.result` reads a block that
// is already computed, in the same file first, then anywhere in the workspace (the CLI's PATHs, the editor's
// folders). A block's output carries its toleranced inputs up the chain, so a crystal's ppm reaches the UART.
import * as path from 'node:path';
import type { BlockAnalysis, DocumentAnalysis, TextDocumentLike } from '../types';
import { circuitById } from '../circuits/registry';
import { isTooLarge } from '../size';
import { analyzeBlock, type BlockContext } from './block';
import type { AnalyzeOptions } from './context';
import { AnalysisCache } from './cache';
import { prepareDocument, tooLargeAnalysis, type PreparedDocument } from './document';
import { buildGraph, type GraphBlock } from './graph';
import { lookupResult, type BlockOutput, type ReferenceSource } from './references';
import { computeAt } from './measure';
import { nested, ownTolerancedKeys, upstreamEpoch, type Offsets } from './evaluate';
import type { Plan } from './plan';

/** Analyses documents together; `cacheFor` gives a document's cache (the editor keeps one per open document). */
export function analyzeWorkspace(docs: readonly TextDocumentLike[], options: AnalyzeOptions, cacheFor?: (uri: string) => AnalysisCache | undefined): DocumentAnalysis[] {
  const prepared: Array<PreparedDocument | DocumentAnalysis> = docs.map((doc) => (isTooLarge(doc.text, options.maxFileBytes) ? tooLargeAnalysis(doc.uri, options) : prepareDocument(doc, options)));
  const graphBlocks: GraphBlock[] = [];
  const slots: Array<{ doc: number; block: number }> = [];
  prepared.forEach((p, d) => {
    if (!('finish' in p)) return;
    p.blocks.forEach((b, i) => {
      graphBlocks.push({ uri: p.uri, path: shownPath(p.uri, options), raw: b.raw, line: b.context.line });
      slots.push({ doc: d, block: i });
    });
  });
  const graph = buildGraph(graphBlocks);
  const outputs: Array<BlockOutput | undefined> = new Array(graphBlocks.length);
  const problems: Array<string | undefined> = new Array(graphBlocks.length);
  const analyses = prepared.map((p) => ('finish' in p ? new Array<BlockAnalysis>(p.blocks.length) : []));
  const caches = new Map<number, AnalysisCache | undefined>();
  prepared.forEach((p, d) => {
    const cache = 'finish' in p ? cacheFor?.(p.uri) : undefined;
    caches.set(d, cache);
    cache?.begin(options);
  });

  try {
    for (const v of graph.order) {
      const { doc, block } = slots[v];
      const p = prepared[doc] as PreparedDocument;
      const item = p.blocks[block];
      const resolutions = graph.resolutions[v];
      const references: ReferenceSource = {
        resolve(ref) {
          const resolution = resolutions.get(ref.block);
          if (!resolution) return lookupResult(ref, undefined, 'not found');
          if ('problem' in resolution) return { ok: false, ...resolution.problem };
          return lookupResult(ref, outputs[resolution.target], problems[resolution.target]);
        },
      };
      const context: BlockContext = {
        ...item.context,
        references,
        computed: (plan, overrides, values) => {
          if (item.raw.name !== undefined) outputs[v] = outputOf(plan, overrides, values, item.context, item.raw.name);
        },
      };
      const cache = caches.get(doc);
      const analysis = cache ? cache.analyzeBlock(item.raw, context) : analyzeBlock(item.raw, context);
      const output = outputs[v];
      if (output) output.fingerprint = fingerprintOf(analysis, output);
      else problems[v] = analysis.findings.some((f) => f.severity === 'error') ? 'it has errors' : 'its results could not be computed';
      const duplicate = graph.duplicates.get(v);
      if (duplicate) analysis.findings.unshift(duplicate);
      analyses[doc][block] = analysis;
    }
  } finally {
    for (const cache of caches.values()) cache?.end();
  }
  return prepared.map((p, d) => ('finish' in p ? p.finish(analyses[d]) : p));
}

function shownPath(uri: string, options: AnalyzeOptions): string {
  const root = options.workspaceRoots[0];
  if (!root) return path.basename(uri);
  const relative = path.relative(root, uri);
  return (relative && !relative.startsWith('..') ? relative : uri).split(path.sep).join('/');
}

/**
 * A computed block as a source for its dependants. Its own toleranced keys become inputs with ids unique in the
 * workspace (file and name), so every dependant varies the same crystal as one input.
 */
function outputOf(plan: Plan, overrides: Readonly<Record<string, number>>, values: Readonly<Record<string, number>>, context: BlockContext, name: string): BlockOutput {
  const own = ownTolerancedKeys(plan).map((key) => ({ key, id: `${context.uri}#${name}.${key}`, label: `@${name}.${key}` }));
  const inputs = [...own.map(({ id, label }) => ({ id, label }))];
  for (const input of plan.upstreamInputs) if (!inputs.some((i) => i.id === input.id)) inputs.push(input);
  let memoEpoch = -1;
  let memo: Readonly<Record<string, number>> | undefined;
  return {
    uri: context.uri,
    name,
    line: context.line,
    circuit: plan.model.id,
    values,
    results: circuitById(plan.model.id)?.results ?? plan.model.results,
    inputs,
    fingerprint: '',
    at(offsets: Offsets) {
      // Within one outermost evaluation the offsets do not change: a block reached by two paths answers once.
      const epoch = upstreamEpoch();
      if (epoch === memoEpoch) return memo;
      const local: Record<string, number> = {};
      for (const { key, id } of own) local[key] = offsets[id] ?? 0;
      memo = nested(() => computeAt(plan, local, overrides, offsets));
      memoEpoch = epoch;
      return memo;
    },
  };
}

/** Everything a dependant's numbers rest on: the results, their spread, the inputs and their tolerances. */
function fingerprintOf(analysis: BlockAnalysis, output: BlockOutput): string {
  return JSON.stringify([output.uri, output.name, output.line, analysis.params, analysis.choices, analysis.values, analysis.spread ?? null, output.inputs.map((i) => i.id)]);
}

/**
 * The editor's side of the workspace pass: the documents it knows (open buffers and workspace files), each with
 * its cache, so an edit re-analyses the blocks it touched and their dependants in every file, and nothing else.
 */
export class WorkspaceAnalyzer {
  private readonly docs = new Map<string, TextDocumentLike>();
  private readonly caches = new Map<string, AnalysisCache>();
  private last = new Map<string, DocumentAnalysis>();

  /** Adds or replaces a document (an open buffer wins over the file on disk: the caller decides). */
  set(doc: TextDocumentLike): void {
    this.docs.set(doc.uri, doc);
  }

  delete(uri: string): void {
    this.docs.delete(uri);
    this.caches.delete(uri);
    this.last.delete(uri);
  }

  has(uri: string): boolean {
    return this.docs.has(uri);
  }

  /** Analyses every document; returns the analyses by uri and the uris whose analysis differs from the last pass. */
  analyze(options: AnalyzeOptions): { analyses: Map<string, DocumentAnalysis>; changed: string[] } {
    const docs = [...this.docs.values()];
    const results = analyzeWorkspace(docs, options, (uri) => {
      let cache = this.caches.get(uri);
      if (!cache) this.caches.set(uri, (cache = new AnalysisCache()));
      return cache;
    });
    const analyses = new Map(results.map((a) => [a.uri, a]));
    const changed = results.filter((a) => summary(this.last.get(a.uri)) !== summary(a)).map((a) => a.uri);
    this.last = analyses;
    return { analyses, changed };
  }

  /** The last pass's analysis of a document. */
  analysisOf(uri: string): DocumentAnalysis | undefined {
    return this.last.get(uri);
  }

  /** Every analysis of the last pass (for go-to-definition, find-references and completion across files). */
  all(): DocumentAnalysis[] {
    return [...this.last.values()];
  }
}

function summary(analysis: DocumentAnalysis | undefined): string {
  if (!analysis) return '';
  return JSON.stringify([analysis.findings, analysis.blocks.map((b) => [b.name, b.line, b.values, b.spread ?? null, b.findings, b.references ?? null])]);
}
