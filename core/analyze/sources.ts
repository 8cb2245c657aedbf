// Firmware constants as identifier sources: the C file a block sits in, or the file a note's `from:` names.
import * as path from '../paths';
import { isInside } from '../paths';
import type { Finding } from '../types';
import { Code } from '../codes';
import { isTooLarge } from '../size';
import { buildConstantTable, toNumber, type ConstantTable, type DataModel } from '../c';
import type { AnalyzeOptions, DataModelName, IdentifierLookup, IdentifierSource } from './context';
import { FirmwareCache } from './firmware';
import { evaluateIn, evaluateWithoutFirmware } from './registers';

/** Constants of one C file, built once per data model on first use, with the file's build configuration. */
export function cFileSource(filePath: string, text: string, options: AnalyzeOptions): IdentifierSource {
  const tables = new Map<DataModelName, ConstantTable>();
  const roots = options.workspaceRoots.length ? options.workspaceRoots : [path.dirname(filePath)];
  const cache = options.firmware ?? new FirmwareCache();
  let configProblems: Finding[] = [];
  const table = (dataModel: DataModelName): ConstantTable => {
    let found = tables.get(dataModel);
    if (!found) {
      const { config, problems } = cache.configFor(filePath, { ...options, workspaceRoots: roots });
      configProblems = problems.map((message) => ({ severity: 'warning', code: Code.cInclude, message, span: { start: 0, end: 0 } }));
      const read = (uri: string) => cache.read(uri, options);
      const build = (reader: typeof read) => buildConstantTable(filePath, text, {
        dataModel: dataModel as DataModel,
        includeDirs: options.includeDirs,
        workspaceRoots: roots,
        read: reader,
        realpath: options.realpath,
        maxFileBytes: options.maxFileBytes,
        maxHeaderBytes: options.maxHeaderBytes,
        config,
        headerMemo: cache.headers,
        reused: options.tables !== undefined,
      });
      // An open document's tables are kept across edits that leave its code, its configuration and its headers as they were.
      const key = JSON.stringify([dataModel, options.includeDirs, roots, options.maxFileBytes, options.maxHeaderBytes ?? null, config ?? null]);
      found = options.tables ? options.tables.table(filePath, text, key, read, build) : build(read);
      tables.set(dataModel, found);
    }
    return found;
  };
  return {
    evaluate: (exprText, dataModel) => evaluateIn(table(dataModel), exprText),
    lookup(name, dataModel): IdentifierLookup {
      const resolution = table(dataModel).lookup(name);
      if (!resolution.ok) return { ok: false, message: resolution.message, code: resolution.code || Code.cUnknown };
      const value = toNumber(resolution.value);
      if (!Number.isFinite(value)) return { ok: false, code: Code.cSyntax, message: `\`${name}\` is not a finite number` };
      const d = resolution.definition;
      const literal = d.literal;
      return {
        ok: true,
        value,
        identifier: { name, value, uri: d.uri, line: d.line },
        literal: literal ? { uri: d.uri, start: literal.span.start, end: literal.span.end, text: literal.text } : undefined,
      };
    },
    dependencies: () => [...new Set([...tables.values()].flatMap((t) => t.dependencies))],
    findings: () => {
      const first = tables.values().next().value as ConstantTable | undefined;
      return [...configProblems, ...(first?.findings ?? []).map((f) => ({ ...f }))];
    },
  };
}

/** The source a Markdown block's `from:` names, relative to the note and inside the workspace. */
export function fromFileSource(notePath: string, spelled: string, options: AnalyzeOptions): { source?: IdentifierSource; problem?: string } {
  const target = path.resolve(path.dirname(notePath), spelled);
  const roots = options.workspaceRoots.length ? options.workspaceRoots : [path.dirname(notePath)];
  const real = options.realpath ? options.realpath(target) ?? target : target;
  if (!roots.some((root) => isInside(real, root))) return { problem: `\`${spelled}\` is outside the workspace; Tickmark reads firmware only inside it` };
  const text = options.read(target);
  if (text === undefined) return { problem: `cannot read \`${spelled}\` (looked for ${target})` };
  if (isTooLarge(text, options.maxFileBytes)) return { problem: `\`${spelled}\` is larger than the size limit (${Math.round(options.maxFileBytes / 1024)} KB)` };
  return { source: cFileSource(target, text, options) };
}

/** A note's block without `firmware:`: names are its own keys only. */
export const noIdentifiers: IdentifierSource = {
  lookup: (name) => ({ ok: false, code: Code.identifierUnknown, message: `\`${name}\` is not a key of this block, and no firmware file is named (add \`firmware: path/to/file.h\`)` }),
  evaluate: (exprText, dataModel) => evaluateWithoutFirmware(exprText, dataModel),
  dependencies: () => [],
  findings: () => [],
};
