// Re-analysis after an edit: a block whose text and firmware answers are unchanged keeps its last analysis,
// moved by the offset delta when only text above it changed. Kept per document by the editor.
import type { BlockAnalysis, Finding, RawBlock, Span } from '../types';
import type { BlockRef } from '../value';
import { analyzeBlock } from './block';
import type { AnalyzeOptions, BlockContext, ComputedBlock, DataModelName, IdentifierLookup, IdentifierSource, ReferenceLookup, ReferenceSource } from './context';

interface Entry {
  /** Where the block stood when analysed; spans inside it move with it. */
  span: Span;
  uri: string;
  analysis: BlockAnalysis;
  /** Every identifier the analysis asked for, with the answer it got. */
  lookups: Array<{ name: string; dataModel: DataModelName; answer: string; expression?: boolean }>;
  /** Every block reference it resolved, with the upstream block's fingerprint (or the problem) it got. */
  references: Array<{ ref: BlockRef; answer: ReferenceAnswer }>;
  /** The computed block its results came from, handed to the workspace again when the analysis is reused. */
  computed?: [ComputedBlock, Readonly<Record<string, number>>];
  generation: number;
}

export interface CacheStats {
  blocks: number;
  /** Blocks analysed afresh in the last pass (the rest were reused). */
  evaluated: number;
}

export class AnalysisCache {
  private entries = new Map<string, Entry>();
  private optionsKey = '';
  private generation = 0;
  readonly stats: CacheStats = { blocks: 0, evaluated: 0 };

  /** Starts a pass over one document; settings that differ from the last pass drop everything. */
  begin(options: AnalyzeOptions): void {
    const key = optionsSignature(options);
    if (key !== this.optionsKey) {
      this.entries.clear();
      this.optionsKey = key;
    }
    this.generation++;
    this.stats.blocks = 0;
    this.stats.evaluated = 0;
  }

  /** Ends a pass: blocks that no longer exist are forgotten, so the cache is as large as the document. */
  end(): void {
    for (const [key, entry] of this.entries) if (entry.generation !== this.generation) this.entries.delete(key);
  }

  analyzeBlock(raw: RawBlock, context: BlockContext): BlockAnalysis {
    this.stats.blocks++;
    const key = blockSignature(raw, context);
    const entry = this.entries.get(key);
    if (entry && entry.uri === context.uri && answersHold(entry, context.source) && referencesHold(entry, context.references)) {
      entry.generation = this.generation;
      if (entry.computed) context.computed?.(...entry.computed);
      const moved = movedAnalysis(entry, raw, context);
      entry.span = raw.span;
      entry.analysis = moved;
      return cloneForCaller(moved);
    }
    this.stats.evaluated++;
    const recorder = recordingSource(context.source);
    const references: Entry['references'] = [];
    let computed: Entry['computed'];
    const analysis = analyzeBlock(raw, {
      ...context,
      source: recorder.source,
      references: context.references && {
        resolve(ref) {
          const found = context.references!.resolve(ref);
          references.push({ ref, answer: referenceAnswer(found) });
          return found;
        },
      },
      computed: (block, values) => {
        computed = [block, values];
        context.computed?.(block, values);
      },
    });
    this.entries.set(key, { span: raw.span, uri: context.uri, analysis, lookups: recorder.lookups, references, computed, generation: this.generation });
    return cloneForCaller(analysis);
  }
}

function optionsSignature(options: AnalyzeOptions): string {
  const { defaultTolerance, defaultSeries, dataModel, includeDirs, workspaceRoots, maxFileBytes, maxHeaderBytes, macros, compileCommands, trusted } = options;
  return JSON.stringify([defaultTolerance, defaultSeries, dataModel, includeDirs, workspaceRoots, maxFileBytes, maxHeaderBytes, macros, compileCommands, trusted]);
}

/**
 * The block as the analysis sees it, with offsets relative to its start: two blocks with one signature
 * analyse alike. An unnamed block is named after its line, so the line joins its signature.
 */
function blockSignature(raw: RawBlock, context: BlockContext): string {
  // A prepared document keeps its scanned blocks while its text stands: their signatures are worked out once.
  const known = signatures.get(raw);
  if (known && known.line === context.line) return known.signature;
  const signature = signatureOf(raw, context);
  signatures.set(raw, { line: context.line, signature });
  return signature;
}

const signatures = new WeakMap<RawBlock, { line: number; signature: string }>();

function signatureOf(raw: RawBlock, context: BlockContext): string {
  const base = raw.span.start;
  const rel = (s: Span | undefined) => (s ? [s.start - base, s.end - base] : null);
  return JSON.stringify([
    raw.host,
    raw.name ?? context.line,
    rel(raw.nameSpan),
    rel(raw.headerSpan),
    rel(raw.span),
    raw.entries.map((e) => [e.key, e.valueText, rel(e.keySpan), rel(e.valueSpan)]),
    raw.findings.map((f) => [f.severity, f.code, f.message, f.uri ?? null, rel(f.span)]),
  ]);
}

function answerOf(found: IdentifierLookup): string {
  if (!found.ok) return JSON.stringify([found.code, found.message]);
  return JSON.stringify([found.value, found.identifier, found.literal ?? null]);
}

function recordingSource(inner: IdentifierSource): { source: IdentifierSource; lookups: Entry['lookups'] } {
  const lookups: Entry['lookups'] = [];
  const source: IdentifierSource = {
    lookup(name, dataModel) {
      const found = inner.lookup(name, dataModel);
      lookups.push({ name, dataModel, answer: answerOf(found) });
      return found;
    },
    evaluate(exprText, dataModel) {
      const found = inner.evaluate(exprText, dataModel);
      lookups.push({ name: exprText, dataModel, answer: JSON.stringify(found), expression: true });
      return found;
    },
    dependencies: () => inner.dependencies(),
    findings: () => inner.findings(),
  };
  return { source, lookups };
}

/** What a reference resolved to, compared field by field: an upstream fingerprint is long, and copying it costs. */
type ReferenceAnswer = { fingerprint: string; result: string } | { code: string; message: string };

function referenceAnswer(found: ReferenceLookup): ReferenceAnswer {
  if (!found.ok) return { code: found.code, message: found.message };
  return { fingerprint: found.output.fingerprint(), result: found.result };
}

function sameAnswer(a: ReferenceAnswer, b: ReferenceAnswer): boolean {
  if ('fingerprint' in a) return 'fingerprint' in b && a.result === b.result && a.fingerprint === b.fingerprint;
  return 'code' in b && a.code === b.code && a.message === b.message;
}

function referencesHold(entry: Entry, source: ReferenceSource | undefined): boolean {
  if (!source) return entry.references.length === 0;
  return entry.references.every((r) => sameAnswer(referenceAnswer(source.resolve(r.ref)), r.answer));
}

function answersHold(entry: Entry, source: IdentifierSource): boolean {
  return entry.lookups.every((l) => (l.expression ? JSON.stringify(source.evaluate(l.name, l.dataModel)) : answerOf(source.lookup(l.name, l.dataModel))) === l.answer);
}

/** The cached analysis at the block's new place: spans inside the old block move by the delta. */
function movedAnalysis(entry: Entry, raw: RawBlock, context: BlockContext): BlockAnalysis {
  const delta = raw.span.start - entry.span.start;
  const old = entry.span;
  const own = (uri: string | undefined) => uri === undefined || uri === context.uri;
  const move = (span: Span, uri: string | undefined): Span =>
    delta !== 0 && own(uri) && span.start >= old.start && span.end <= old.end ? { start: span.start + delta, end: span.end + delta } : span;
  const findings: Finding[] = entry.analysis.findings.map((f) => ({
    ...f,
    span: move(f.span, f.uri),
    fixes: f.fixes?.map((fix) => ({ ...fix, edits: fix.edits.map((e) => ({ ...e, span: move(e.span, e.uri) })) })),
  }));
  for (const f of findings) if (f.fixes === undefined) delete f.fixes;
  const moved: BlockAnalysis = { ...entry.analysis, line: context.line, block: raw, findings };
  if (entry.analysis.references) moved.references = entry.analysis.references.map((r) => ({ ...r, span: move(r.span, undefined) }));
  return moved;
}

/** The caller may add findings to its copy; the cached one stays as analysed. */
function cloneForCaller(analysis: BlockAnalysis): BlockAnalysis {
  return { ...analysis, findings: [...analysis.findings] };
}
