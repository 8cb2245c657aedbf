// What a block needs from outside itself: settings, and where its identifiers come from.
import type { Finding, ResolvedIdentifier } from '../types';
import { Code } from '../codes';

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

/** Where a block's identifiers resolve from (firmware constants), per data model. */
export interface IdentifierSource {
  lookup(name: string, dataModel: DataModelName): IdentifierLookup;
  /** Files this source read (for refreshing dependants). */
  dependencies(): string[];
  /** Problems found while reading the source (include errors), reported once per document. */
  findings(): Finding[];
}

export const noIdentifiers: IdentifierSource = {
  lookup: (name) => ({ ok: false, code: Code.identifierUnknown, message: `\`${name}\` is not a key of this block, and no firmware file is named (add \`firmware: path/to/file.h\`)` }),
  dependencies: () => [],
  findings: () => [],
};
