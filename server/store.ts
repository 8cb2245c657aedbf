// The analyses of open documents: one core Analyzer per document (an edit re-evaluates only the blocks it
// touched), the last analysis by version, and the scheduler that analyses as soon as the server is idle.
//
// Scheduling: a change marks its document dirty. The analysis runs when one turn of the event loop has
// passed with no newer version of it arriving, so a burst of edits queued on the connection is read first
// and analysed once, at its last version (coalescing without a fixed delay). Every version analysed, by the
// scheduler or by a request that needed it first, gets its diagnostics published, also when they did not change.
import * as path from 'node:path';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Diagnostic } from 'vscode-languageserver';
import { FirmwareCache, firmwareOptions, WorkspaceAnalyzer, tooLargeAnalysis, type AnalyzeOptions, type CacheStats } from '../core/analyze';
import { collectFiles, languageOf } from '../core/cli/files';
import { Code } from '../core/codes';
import type { BlockAnalysis, DocumentAnalysis } from '../core/types';
import { corePathOf, FileReader, folderOf, isUriString, realpathOrUndefined, type OpenDocuments } from './files';
import { placedFindings, toDiagnostic, type DiagnosticPlace, type PlacedFinding } from './findings';
import type { ServerSettings } from './settings';

export interface Analysed {
  uri: string;
  version: number;
  /** The text analysed (spans in the analysis are offsets into it). */
  doc: TextDocument;
  analysis: DocumentAnalysis;
  placed: PlacedFinding[];
}

export interface StoreHost {
  documents: OpenDocuments;
  reader: FileReader;
  /** A file's settings (its workspace folder's); without one, the first folder's. */
  settings(file?: string): ServerSettings;
  roots(): string[];
  publish(uri: string, version: number | undefined, diagnostics: Diagnostic[]): void;
  log(message: string): void;
  /** After a document was analysed (also when a request asked first): features may refresh. */
  analysed?(entry: Analysed): void;
}

interface State {
  last?: Analysed;
  /** How long the last analysis of this document took, its workspace pass included (ms). */
  analysisMs?: number;
  /** Dropped by a change elsewhere (a header, the settings): re-analyse even at the same version. */
  stale: boolean;
}

export const timingLanguages: readonly string[] = ['markdown', 'c', 'cpp'];

export class AnalysisStore {
  private readonly states = new Map<string, State>();
  /**
   * Every timing document the analysis sees: open buffers and the workspace folders' notes and sources, so a
   * `@name` resolves across files and an edit upstream re-analyses its dependants in every open file.
   */
  private readonly workspace = new WorkspaceAnalyzer();
  /** Headers and compile databases, read and preprocessed once per version for every document. */
  private readonly firmwareCache = new FirmwareCache();
  /** Timing files in the workspace folders, found once and again when files come and go. */
  private files: string[] | undefined;
  private readonly dirty = new Map<string, number | undefined>();
  private timer: NodeJS.Immediate | undefined;

  constructor(private readonly host: StoreHost) {}

  /** Whether Tickmark reads this document (by language, else by extension, as the core decides). */
  isTiming(doc: TextDocument): boolean {
    return timingLanguages.includes(doc.languageId) || /\.(md|markdown|c|h|cc|cpp|cxx|hpp|hh)$/i.test(doc.uri);
  }

  opened(doc: TextDocument): void {
    if (!this.isTiming(doc)) return;
    if (!this.states.has(doc.uri)) this.states.set(doc.uri, { stale: false });
    this.schedule(doc.uri);
  }

  changed(doc: TextDocument): void {
    if (this.isTiming(doc)) this.schedule(doc.uri);
    this.refreshDependants(corePathOf(doc.uri));
  }

  closed(uri: string): void {
    this.states.delete(uri);
    this.dirty.delete(uri);
    // The file on disk counts again, if it is in the workspace.
    this.workspace.delete(corePathOf(uri));
  }

  /** Documents whose last analysis read `corePath` (a header, a note another block refers to). */
  dependantsOf(corePath: string): string[] {
    const found: string[] = [];
    for (const [uri, state] of this.states) if (state.last?.analysis.dependencies.includes(corePath)) found.push(uri);
    return found;
  }

  /** A file changed (open buffer, on disk, or a watched file): re-analyse what read it. */
  refreshDependants(corePath: string): void {
    this.workspace.fileChanged(corePath);
    if (this.files && !this.files.includes(corePath)) this.files = undefined;
    for (const uri of this.dependantsOf(corePath)) this.invalidate(uri);
    // Blocks elsewhere may read this file's blocks (`@name`). An open document's own analysis runs the workspace
    // pass, which refreshes every open dependant; for a file changed on disk, one document that references
    // blocks runs that pass.
    if (this.host.reader.openDocument(corePath)) return;
    for (const [uri, state] of this.states) {
      if (state.last?.analysis.blocks.some((b) => b.references?.length || b.findings.some((f) => f.code.startsWith('reference-')))) {
        this.invalidate(uri);
        return;
      }
    }
  }

  /** Re-analyse documents (all when none named), e.g. after the settings changed. */
  invalidate(uri?: string): void {
    if (uri === undefined) {
      this.workspace.reset();
      this.files = undefined;
    }
    const uris = uri === undefined ? [...this.states.keys()] : [uri];
    for (const u of uris) {
      const state = this.states.get(u);
      if (!state) continue;
      state.stale = true;
      this.schedule(u);
    }
  }

  openUris(): string[] {
    return [...this.states.keys()];
  }

  cacheStats(uri: string): (CacheStats & { analysisMs?: number; tables?: { built: number; reused: number } }) | undefined {
    const state = this.states.get(uri);
    const stats = state && this.workspace.stats(corePathOf(uri));
    return stats && { ...stats, analysisMs: state!.analysisMs, tables: this.workspace.tableCounts(corePathOf(uri)) };
  }

  /** The last analyses of every document the workspace pass saw (open or not), for references across files. */
  workspaceAnalyses(): DocumentAnalysis[] {
    return this.workspace.all();
  }

  /** The analysis of the document's current version, computed now if the scheduler has not got to it. */
  current(uri: string): Analysed | undefined {
    const doc = this.host.documents.get(uri);
    const state = this.states.get(uri);
    if (!doc || !state) return undefined;
    if (state.last && state.last.version === doc.version && !state.stale) return state.last;
    return this.analyse(doc, state);
  }

  blockAt(uri: string, offset: number): { entry: Analysed; block: BlockAnalysis } | undefined {
    const entry = this.current(uri);
    const block = entry?.analysis.blocks.find((b) => offset >= b.block.span.start && offset <= b.block.span.end);
    return entry && block ? { entry, block } : undefined;
  }

  /** The core's options for a file: settings, workspace roots, and the reader that serves open buffers first. */
  optionsFor(corePath: string): AnalyzeOptions {
    const settings = this.host.settings(corePath);
    const roots = this.host.roots();
    const base = folderOf(corePath, roots);
    const maxFileBytes = settings.maxSizeKB * 1024;
    const firmware = firmwareOptions(settings.firmware, base);
    const readLimit = Math.max(maxFileBytes, firmware.maxHeaderBytes ?? 0);
    return {
      ...firmware,
      firmware: this.firmwareCache,
      version: (file) => this.host.reader.versionOf(file),
      defaultTolerance: settings.defaultTolerancePercent / 100,
      defaultSeries: settings.defaultSeries,
      dataModel: settings.dataModel,
      includeDirs: settings.includeFolders.map((dir) => (path.isAbsolute(dir) || base === undefined ? dir : path.join(base, dir))),
      workspaceRoots: roots,
      read: (file) => this.host.reader.read(file, readLimit),
      realpath: realpathOrUndefined,
      maxFileBytes,
    };
  }

  /** A file that is not open (the workspace check): analysed once, not kept. */
  analyseText(corePath: string, text: string, languageId: string): DocumentAnalysis {
    const options = this.optionsFor(corePath);
    return this.guarded(corePath, () => tooLarge(corePath, text, options) ?? this.analyseWorkspace({ uri: corePath, text, languageId }).analyses.get(corePath)!);
  }

  /**
   * One workspace pass with `doc` at its given text: open buffers first, then the workspace's timing files from
   * disk. Blocks whose text and inputs did not change are reused from their document's cache.
   */
  private analyseWorkspace(doc: { uri: string; text: string; languageId: string }): { analyses: Map<string, DocumentAnalysis>; changed: string[] } {
    const seen = new Set<string>([doc.uri]);
    this.workspace.set(doc);
    for (const open of this.host.documents.all()) {
      const file = corePathOf(open.uri);
      if (seen.has(file) || !this.isTiming(open)) continue;
      seen.add(file);
      this.workspace.set({ uri: file, text: open.getText(), languageId: open.languageId });
    }
    for (const file of this.workspaceFiles()) {
      if (seen.has(file)) continue;
      // Read under the file's own folder's size limit, as its analysis will be (optionsFor).
      const text = this.host.reader.read(file, this.host.settings(file).maxSizeKB * 1024);
      // Files without a timing block cannot be referenced: they stay out of the pass.
      if (text === undefined || !text.includes('timing')) {
        this.workspace.delete(file);
        continue;
      }
      seen.add(file);
      this.workspace.set({ uri: file, text, languageId: languageOf(file) });
    }
    for (const known of this.workspace.uris()) if (!seen.has(known)) this.workspace.delete(known);
    return this.workspace.analyze((file) => this.optionsFor(file));
  }

  private workspaceFiles(): string[] {
    if (!this.files) {
      const roots = this.host.roots().filter((root) => !isUriString(root));
      this.files = roots.length ? collectFiles(roots, roots[0]).files : [];
    }
    return this.files;
  }

  /** Diagnostics of an analysis, each carrying its version and index for the quick fixes. */
  diagnosticsOf(doc: Pick<TextDocument, 'positionAt'>, corePath: string, placed: PlacedFinding[], version: number | undefined): Diagnostic[] {
    const place: DiagnosticPlace = {
      doc,
      path: corePath,
      elsewhere: (other) => {
        const mapper = this.host.reader.mapperOf(other);
        return mapper ? { mapper, uri: this.host.reader.uriOf(other) } : undefined;
      },
    };
    return placed.map((p, index) => toDiagnostic(place, p, version === undefined ? undefined : { version, index }));
  }

  private schedule(uri: string): void {
    // The version seen now; the analysis waits while newer ones keep arriving.
    this.dirty.set(uri, this.host.documents.get(uri)?.version);
    this.timer ??= setImmediate(() => this.run());
  }

  private run(): void {
    this.timer = undefined;
    let ready: string | undefined;
    for (const [uri, seen] of this.dirty) {
      const version = this.host.documents.get(uri)?.version;
      if (version === undefined) this.dirty.delete(uri);
      else if (version !== seen) this.dirty.set(uri, version);
      else ready ??= uri;
    }
    if (ready !== undefined) {
      this.dirty.delete(ready);
      try {
        this.current(ready);
      } catch (cause) {
        this.host.log(`analysis of ${ready} failed: ${cause instanceof Error ? (cause.stack ?? cause.message) : String(cause)}`);
      }
    }
    if (this.dirty.size > 0) this.timer = setImmediate(() => this.run());
  }

  private analyse(doc: TextDocument, state: State): Analysed {
    const corePath = corePathOf(doc.uri);
    const options = this.optionsFor(corePath);
    const text = doc.getText();
    let others: Array<[TextDocument, DocumentAnalysis]> = [];
    const start = performance.now();
    const analysis = this.guarded(corePath, () => {
      const own = tooLarge(corePath, text, options);
      if (own) return own;
      const pass = this.analyseWorkspace({ uri: corePath, text, languageId: doc.languageId });
      // Dependants in other open documents whose numbers moved get their new analysis now, not on their next edit.
      const changed = new Set(pass.changed);
      others = this.host.documents.all().flatMap((other): Array<[TextDocument, DocumentAnalysis]> => {
        const file = corePathOf(other.uri);
        const state = this.states.get(other.uri);
        const found = pass.analyses.get(file);
        if (other.uri === doc.uri || !state || !found || (!changed.has(file) && state.last?.version === other.version && !state.stale)) return [];
        return [[other, found]];
      });
      return pass.analyses.get(corePath)!;
    });
    state.analysisMs = performance.now() - start;
    const entry = this.record(doc, state, analysis);
    for (const [other, found] of others) this.record(other, this.states.get(other.uri)!, found);
    return entry;
  }

  private record(doc: TextDocument, state: State, analysis: DocumentAnalysis): Analysed {
    const entry: Analysed = { uri: doc.uri, version: doc.version, doc, analysis, placed: placedFindings(analysis) };
    state.last = entry;
    state.stale = false;
    this.dirty.delete(doc.uri);
    this.host.publish(doc.uri, doc.version, this.diagnosticsOf(doc, corePathOf(doc.uri), entry.placed, doc.version));
    this.host.analysed?.(entry);
    return entry;
  }

  private guarded(corePath: string, analyse: () => DocumentAnalysis): DocumentAnalysis {
    try {
      return analyse();
    } catch (cause) {
      // The core promises findings, not exceptions; if one escapes, say so at the top of the file.
      this.host.log(`analysis of ${corePath} failed: ${cause instanceof Error ? (cause.stack ?? cause.message) : String(cause)}`);
      const message = `Tickmark could not analyse this file (${cause instanceof Error ? cause.message : String(cause)}); details in the server's log.`;
      return { uri: corePath, blocks: [], dependencies: [], findings: [{ severity: 'error', code: Code.fileUnreadable, message, span: { start: 0, end: 0 } }] };
    }
  }
}

/** The size setting counts bytes on disk (UTF-8), as the CLI's stat does, not UTF-16 characters. */
function tooLarge(corePath: string, text: string, options: AnalyzeOptions): DocumentAnalysis | undefined {
  return Buffer.byteLength(text, 'utf8') > options.maxFileBytes ? tooLargeAnalysis(corePath, options) : undefined;
}
