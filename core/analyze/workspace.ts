// The workspace pass: every document's blocks analysed in reference order, so `@name.result` reads a block that
// is already computed, in the same file first, then anywhere in the workspace (the CLI's PATHs, the editor's
// folders). A block's output carries its toleranced inputs up the chain, so a crystal's ppm reaches the UART.
import { basename, relative } from '../paths';
import type { BlockAnalysis, DocumentAnalysis, TextDocumentLike } from '../types';
import { isTooLarge } from '../size';
import { analyzeBlock } from './block';
import type { AnalyzeOptions, BlockContext, BlockOutput, ComputedBlock, Offsets, ReferenceSource } from './context';
import { AnalysisCache, type CacheStats } from './cache';
import { ConstantTableCache } from './tables';
import { prepareDocument, tooLargeAnalysis, type PreparedDocument } from './document';
import { buildGraph, type GraphBlock, type Resolution } from './graph';
import { lookupResult, unresolvedReferences } from './references';
import { nested, upstreamEpoch } from './evaluate';

/** Analyses documents together; `cacheFor` gives a document's cache (the editor keeps one per open document). */
export function analyzeWorkspace(
  docs: readonly TextDocumentLike[],
  options: AnalyzeOptions | ((uri: string) => AnalyzeOptions),
  cacheFor?: (uri: string) => AnalysisCache | undefined,
  prepare: (doc: TextDocumentLike, options: AnalyzeOptions) => PreparedDocument = prepareDocument,
): DocumentAnalysis[] {
  const optionsFor = typeof options === 'function' ? options : () => options;
  const prepared: Array<PreparedDocument | DocumentAnalysis> = docs.map((doc) => {
    const own = optionsFor(doc.uri);
    return isTooLarge(doc.text, own.maxFileBytes) ? tooLargeAnalysis(doc.uri, own) : prepare(doc, own);
  });
  // The prepared blocks themselves, every document's in turn.
  const graphBlocks: GraphBlock[] = [];
  const paths: Array<() => string> = [];
  // Where each graph block stands: its document, and its index there (two lists rather than a record per block).
  const docOf: number[] = [];
  const indexIn: number[] = [];
  for (let d = 0; d < prepared.length; d++) {
    const p = prepared[d];
    if (!('finish' in p) || p.blocks.length === 0) continue;
    // One document, one options object (prepareDocument): its shown path is worked out once, and only when a
    // message names it.
    paths[d] = () => shownPath(p.uri, p.blocks[0].context.options);
    for (let i = 0; i < p.blocks.length; i++) {
      graphBlocks.push(p.blocks[i]);
      docOf.push(d);
      indexIn.push(i);
    }
  }
  const graph = buildGraph(graphBlocks, (index) => paths[docOf[index]]());
  const outputs: Array<BlockOutput | undefined> = new Array(graphBlocks.length);
  const problems: Array<string | undefined> = new Array(graphBlocks.length);
  const analyses = prepared.map((p) => ('finish' in p ? new Array<BlockAnalysis>(p.blocks.length) : []));
  const caches = new Map<number, AnalysisCache | undefined>();
  prepared.forEach((p, d) => {
    const cache = 'finish' in p ? cacheFor?.(p.uri) : undefined;
    caches.set(d, cache);
    cache?.begin(optionsFor(p.uri));
  });

  try {
    const order = graph.order;
    for (let o = 0; o < order.length; o++) {
      const v = order[o];
      const doc = docOf[v];
      const p = prepared[doc] as PreparedDocument;
      const item = p.blocks[indexIn[v]];
      const resolutions = graph.resolutions[v];
      const name = item.raw.name;
      const referenced = graph.referenced.has(v);
      const handsOn = name !== undefined && referenced;
      // A block that names no other block and that none reads is analysed in its prepared context, whose
      // references find nothing (prepareDocument); the others get this pass's references and hand their results on.
      const context: BlockContext = resolutions.size === 0 && !handsOn && item.context.references === unresolvedReferences
        ? item.context
        : {
            uri: item.context.uri,
            line: item.context.line,
            options: item.context.options,
            source: item.context.source,
            references: resolutions.size === 0 ? unresolvedReferences : resolvedBy(resolutions, outputs, problems),
            // Results are handed on only where a reference reads them; a cache keeps them for later passes itself.
            computed: handsOn ? handOn(outputs, v, item.context, name) : undefined,
          };
      const cache = caches.get(doc);
      const analysis = cache ? cache.analyzeBlock(item.raw, context) : analyzeBlock(item.raw, context);
      const output = outputs[v];
      // Worked out when a dependant's cache first asks.
      if (output) output.fingerprint = fingerprintLater(analysis, output);
      else if (referenced) problems[v] = analysis.findings.some((f) => f.severity === 'error') ? 'it has errors' : 'its results could not be computed';
      const duplicate = graph.duplicates.get(v);
      if (duplicate) analysis.findings.unshift(duplicate);
      analyses[doc][indexIn[v]] = analysis;
    }
  } finally {
    for (const cache of caches.values()) cache?.end();
  }
  return prepared.map((p, d) => ('finish' in p ? p.finish(analyses[d]) : p));
}

/** The references of a block that names others, read from the outputs of the blocks analysed before it. */
function resolvedBy(resolutions: Map<string, Resolution>, outputs: Array<BlockOutput | undefined>, problems: Array<string | undefined>): ReferenceSource {
  return {
    resolve(ref) {
      const resolution = resolutions.get(ref.block);
      if (!resolution) return lookupResult(ref, undefined, 'not found');
      if ('problem' in resolution) return { ok: false, ...resolution.problem };
      return lookupResult(ref, outputs[resolution.target], problems[resolution.target]);
    },
  };
}

/** Where a referenced block's computed results are kept for its dependants. */
function handOn(outputs: Array<BlockOutput | undefined>, v: number, context: BlockContext, name: string): NonNullable<BlockContext['computed']> {
  return (computed, values) => (outputs[v] = outputOf(computed, values, context, name));
}

function shownPath(uri: string, options: AnalyzeOptions): string {
  const root = options.workspaceRoots[0];
  if (!root) return basename(uri);
  const shown = relative(root, uri);
  return shown && !shown.startsWith('..') ? shown : uri;
}

/**
 * A computed block as a source for its dependants. Its own toleranced keys become inputs with ids unique in the
 * workspace (file and name), so every dependant varies the same crystal as one input.
 */
function outputOf(block: ComputedBlock, values: Readonly<Record<string, number>>, context: BlockContext, name: string): BlockOutput {
  const own = block.tolerancedKeys.map((key) => ({ key, id: `${context.uri}#${name}.${key}`, label: `@${name}.${key}` }));
  const inputs = [...own.map(({ id, label }) => ({ id, label }))];
  for (const input of block.upstreamInputs) if (!inputs.some((i) => i.id === input.id)) inputs.push(input);
  let memoEpoch = -1;
  let memo: Readonly<Record<string, number>> | undefined;
  return {
    uri: context.uri,
    name,
    line: context.line,
    circuit: block.model.id,
    values,
    results: block.model.results,
    inputs,
    fingerprint: () => '',
    at(offsets: Offsets) {
      // Within one outermost evaluation the offsets do not change: a block reached by two paths answers once.
      const epoch = upstreamEpoch();
      if (epoch === memoEpoch) return memo;
      const local: Record<string, number> = {};
      for (const { key, id } of own) local[key] = offsets[id] ?? 0;
      memo = nested(() => block.at(local, offsets));
      memoEpoch = epoch;
      return memo;
    },
  };
}

function once<T>(compute: () => T): () => T {
  let done = false;
  let value: T;
  return () => {
    if (!done) {
      value = compute();
      done = true;
    }
    return value;
  };
}

function fingerprintLater(analysis: BlockAnalysis, output: BlockOutput): () => string {
  return once(() => fingerprintOf(analysis, output));
}

/** Everything a dependant's numbers rest on: the results, their spread, the inputs and their tolerances. */
function fingerprintOf(analysis: BlockAnalysis, output: BlockOutput): string {
  return JSON.stringify([output.uri, output.name, output.line, analysis.params, analysis.choices, analysis.values, analysis.spread ?? null, output.inputs.map((i) => i.id)]);
}

/**
 * The editor's side of the workspace pass: the documents it knows (open buffers and workspace files), each with
 * its cache and its prepared blocks (firmware tables built once per text), so an edit re-analyses the blocks it
 * touched and their dependants in every file, and nothing else.
 */
export class WorkspaceAnalyzer {
  private readonly docs = new Map<string, TextDocumentLike>();
  private readonly caches = new Map<string, AnalysisCache>();
  private readonly prepared = new Map<string, { text: string; optionsKey: string; prepared: PreparedDocument; dependencies: string[] }>();
  /** Firmware constant tables per document, kept while only its comments (timing blocks) change. */
  private readonly tables = new Map<string, ConstantTableCache>();
  private last = new Map<string, DocumentAnalysis>();

  /** Adds or replaces a document (the caller decides whether the open buffer or the file on disk counts). */
  set(doc: TextDocumentLike): void {
    this.docs.set(doc.uri, doc);
  }

  delete(uri: string): void {
    this.docs.delete(uri);
    this.caches.delete(uri);
    this.tables.delete(uri);
    this.prepared.delete(uri);
    this.last.delete(uri);
  }

  uris(): string[] {
    return [...this.docs.keys()];
  }

  /** A file changed (a header, a firmware file a note names): documents that read it are prepared afresh. */
  fileChanged(file: string): void {
    for (const [uri, entry] of this.prepared) if (uri === file || entry.dependencies.includes(file)) this.prepared.delete(uri);
  }

  /** Forgets every prepared document (settings or folders changed). */
  reset(): void {
    this.prepared.clear();
  }

  /** Analyses every document; returns the analyses by uri and the uris whose analysis differs from the last pass. */
  analyze(optionsFor: (uri: string) => AnalyzeOptions): { analyses: Map<string, DocumentAnalysis>; changed: string[] } {
    const docs = [...this.docs.values()];
    const fresh = new Set<string>();
    const results = analyzeWorkspace(
      docs,
      optionsFor,
      (uri) => {
        let cache = this.caches.get(uri);
        if (!cache) this.caches.set(uri, (cache = new AnalysisCache()));
        return cache;
      },
      (doc, options) => {
        const optionsKey = JSON.stringify([options.defaultTolerance, options.defaultSeries, options.dataModel, options.includeDirs, options.workspaceRoots, options.maxFileBytes]);
        const known = this.prepared.get(doc.uri);
        if (known && known.text === doc.text && known.optionsKey === optionsKey) return known.prepared;
        let tables = this.tables.get(doc.uri);
        if (!tables) this.tables.set(doc.uri, (tables = new ConstantTableCache()));
        const prepared = prepareDocument(doc, { ...options, tables });
        fresh.add(doc.uri);
        this.prepared.set(doc.uri, { text: doc.text, optionsKey, prepared, dependencies: [] });
        return prepared;
      },
    );
    const analyses = new Map(results.map((a) => [a.uri, a]));
    for (const analysis of results) {
      const entry = this.prepared.get(analysis.uri);
      if (entry) entry.dependencies = analysis.dependencies;
    }
    // A document whose text was prepared before and whose blocks all came from its cache reads as it did.
    const changed = results
      .filter((a) => fresh.has(a.uri) || !this.last.has(a.uri) || (this.caches.get(a.uri)?.stats.evaluated ?? 1) > 0 || a.blocks.length === 0)
      .filter((a) => !readsAlike(this.last.get(a.uri), a))
      .map((a) => a.uri);
    this.last = analyses;
    return { analyses, changed };
  }

  /** How often the document's constant tables were built and kept. */
  tableCounts(uri: string): { built: number; reused: number } | undefined {
    const tables = this.tables.get(uri);
    return tables && { ...tables.counts };
  }

  /** Blocks of the document in the last pass, and how many were analysed afresh. */
  stats(uri: string): CacheStats | undefined {
    const cache = this.caches.get(uri);
    return cache ? { ...cache.stats } : undefined;
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

/**
 * Whether a document reads as it did: the same findings and, block by block, the same name, line, numbers,
 * spread, findings and references. Compared as their JSON would be (an absent and an undefined property alike,
 * NaN and infinities alike, key order aside), without writing the JSON.
 */
function readsAlike(before: DocumentAnalysis | undefined, after: DocumentAnalysis): boolean {
  if (!before || before.blocks.length !== after.blocks.length || !sameData(before.findings, after.findings)) return false;
  for (let i = 0; i < after.blocks.length; i++) {
    const a = before.blocks[i];
    const b = after.blocks[i];
    if (a.name !== b.name || a.line !== b.line || !sameData(a.params, b.params) || !sameData(a.values, b.values)) return false;
    if (!sameData(a.spread, b.spread) || !sameData(a.findings, b.findings) || !sameData(a.references, b.references)) return false;
  }
  return true;
}

function sameData(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  // JSON writes NaN and the infinities as null, and leaves undefined out.
  const absent = (x: unknown) => x === undefined || x === null || (typeof x === 'number' && !Number.isFinite(x));
  if (absent(a) || absent(b)) return absent(a) && absent(b);
  if (typeof a !== 'object' || typeof b !== 'object') return false;
  if (Array.isArray(a) || Array.isArray(b)) {
    if (!Array.isArray(a) || !Array.isArray(b) || a.length !== b.length) return false;
    for (let i = 0; i < a.length; i++) if (!sameData(a[i], b[i])) return false;
    return true;
  }
  const x = a as Record<string, unknown>;
  const y = b as Record<string, unknown>;
  let count = 0;
  for (const key in x) {
    if (x[key] === undefined || typeof x[key] === 'function') continue;
    count++;
    if (!sameData(x[key], y[key])) return false;
  }
  for (const key in y) if (y[key] !== undefined && typeof y[key] !== 'function') count--;
  return count === 0;
}
