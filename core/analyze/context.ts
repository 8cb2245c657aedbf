// What a block needs from outside itself: settings, and where its identifiers come from.
import type { Finding, ResolvedIdentifier } from '../types';
import { Code } from '../codes';
import type { MacroFlag } from '../c/config';
import type { FirmwareCache } from './firmware';
import type { ConstantTableCache } from './tables';
import { evaluateWithoutFirmware } from './registers';

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

export const noIdentifiers: IdentifierSource = {
  lookup: (name) => ({ ok: false, code: Code.identifierUnknown, message: `\`${name}\` is not a key of this block, and no firmware file is named (add \`firmware: path/to/file.h\`)` }),
  evaluate: (exprText, dataModel) => evaluateWithoutFirmware(exprText, dataModel),
  dependencies: () => [],
  findings: () => [],
};
