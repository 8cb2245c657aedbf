// What a block needs from outside itself: settings, and where its identifiers come from.
import type { Dim, Finding, ResolvedIdentifier } from '../types';
import type { CircuitModel, ResultSpec } from '../circuits/model';
import type { BlockRef } from '../value';
import type { MacroFlag } from '../c/config';
import type { FirmwareCache } from './firmware';
import type { ConstantTableCache } from './tables';

export type DataModelName = 'ilp32' | 'lp64' | 'ip16';

export interface AnalyzeOptions {
  /** Default `expect:` tolerance as a fraction (0.01 for 1 %). */
  defaultTolerance: number;
  /** Default series for solved parts. */
  defaultSeries: string;
  dataModel: DataModelName;
  /** Extra include folders for quoted #include (absolute paths). */
  includeDirs: string[];
  /** Header lookup never leaves these (absolute paths). Empty: the document's own folder. */
  workspaceRoots: string[];
  /** Reads a file by absolute path; the editor serves unsaved buffers first. Undefined when unreadable. */
  read: (path: string) => string | undefined;
  /** Resolves symbolic links so a link out of the workspace is refused; optional. */
  realpath?: (path: string) => string | undefined;
  /** Files above this size are not read (bytes). */
  maxFileBytes: number;
  /** Headers above this size are skipped with a warning at their #include (bytes; default 8 MB). */
  maxHeaderBytes?: number;
  /** -D / -U from the command line or `tickmark.c.defines`, on top of the compile database; any makes a configuration. */
  macros?: MacroFlag[];
  /** Where `macros` came from, for messages (`-D on the command line`, `tickmark.c.defines`). */
  macrosOrigin?: string;
  /** compile_commands.json files named by `--compile-commands` / `tickmark.c.compileCommands`; none: auto-detect. */
  compileCommands?: string[];
  /** Folders the build configuration names outside the workspace are read only when trusted (default true). */
  trusted?: boolean;
  /** A file's version (editor buffer version, or disk mtime and size), so an unchanged header is not read again. */
  version?: (path: string) => string | undefined;
  /** Shared between documents and passes: files, compile databases and preprocessed headers. */
  firmware?: FirmwareCache;
  /** Constant tables kept across edits of one document (its Analyzer's); none for a one-off analysis. */
  tables?: ConstantTableCache;
}

export const defaultAnalyzeOptions: Omit<AnalyzeOptions, 'read'> = {
  defaultTolerance: 0.01,
  defaultSeries: 'E24',
  dataModel: 'ilp32',
  includeDirs: [],
  workspaceRoots: [],
  // 1024 KB, the editor setting's default (tickmark.files.maxSizeKB), so the CLI and the editor agree.
  maxFileBytes: 1024 * 1024,
};

/** An outside identifier as the block sees it: a plain number and where it was defined. */
export type IdentifierLookup =
  | { ok: true; value: number; identifier: ResolvedIdentifier; literal?: { uri: string; start: number; end: number; text: string } }
  | { ok: false; message: string; code: string };

/** A register key's value read as a C constant expression; a failure's span is 0-based into the text. */
export type ExpressionLookup =
  | { ok: true; value: number; identifiers: ResolvedIdentifier[] }
  | { ok: false; message: string; code: string; span?: { start: number; end: number } };

/** Where a block's identifiers resolve from (firmware constants), per data model. */
export interface IdentifierSource {
  lookup(name: string, dataModel: DataModelName): IdentifierLookup;
  /** A C constant expression over the source's names, with C's rules in the data model. */
  evaluate(exprText: string, dataModel: DataModelName): ExpressionLookup;
  /** Files this source read (for refreshing dependants). */
  dependencies(): string[];
  /** Problems found while reading the source (include errors), reported once per document. */
  findings(): Finding[];
}

/** Tolerance offsets: u in [−1, 1] per toleranced key (or upstream input id), +1 at the top of its tolerance. */
export type Offsets = Readonly<Record<string, number>>;

/**
 * A toleranced input somewhere up the chain (a crystal's `frequency ±20 ppm`). Its id is the same in every
 * block that reaches it, so two references that share a source move together in the worst case and in
 * Monte Carlo: shared sources stay correlated, independent ones vary independently.
 */
export interface UpstreamInput {
  id: string;
  /** `@xtal.frequency`, for shares in the hover. */
  label: string;
}

/** What an analysed block offers the blocks that reference it. */
export interface BlockOutput {
  uri: string;
  name: string;
  /** 1-based line of the block's header. */
  line: number;
  circuit: string;
  /** Nominal results, as the block's analysis reports them. */
  values: Readonly<Record<string, number>>;
  results: readonly ResultSpec[];
  /** Toleranced inputs, its own and those upstream of it, that move its results. */
  inputs: readonly UpstreamInput[];
  /** Results with the inputs at the given offsets (keyed by input id, absent = nominal); undefined when they break the model. */
  at(offsets: Offsets): Readonly<Record<string, number>> | undefined;
  /** Changes whenever anything its results depend on changes: caches of dependants compare it. */
  fingerprint(): string;
}

export type ReferenceLookup = { ok: true; output: BlockOutput; result: string; dim: Dim } | { ok: false; code: string; message: string };

/** Where a block's `@name` references resolve from. */
export interface ReferenceSource {
  resolve(ref: BlockRef): ReferenceLookup;
}

/** A block whose results are computed, as the workspace pass hands it to the blocks that reference it. */
export interface ComputedBlock {
  model: CircuitModel;
  /** Its own keys with a tolerance. */
  tolerancedKeys: readonly string[];
  /** Toleranced inputs upstream of its own references. */
  upstreamInputs: readonly UpstreamInput[];
  /** Its results with its own keys at `local` offsets and its references' inputs at `upstream` ones. */
  at(local: Offsets, upstream: Offsets): Record<string, number> | undefined;
}

/** Everything one block's analysis needs from outside the block. */
export interface BlockContext {
  uri: string;
  /** 1-based line of the header. */
  line: number;
  options: AnalyzeOptions;
  /** Identifier source for a data model and the block's `firmware:` (already resolved by the document). */
  source: IdentifierSource;
  /** Where `@name` references resolve (the workspace pass); none when absent. */
  references?: ReferenceSource;
  /** Told once the block's results are computed, so dependants can evaluate it at their offsets. */
  computed?: (block: ComputedBlock, values: Readonly<Record<string, number>>) => void;
}
