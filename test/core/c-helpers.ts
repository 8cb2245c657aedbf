// In-memory workspace for the C constant tests.
import * as path from 'node:path';
import { buildConstantTable, type ConstantResolution, type ConstantTable, type DataModel } from '../../core/c';

export function workspace(files: Record<string, string>, options: { includeDirs?: string[]; dataModel?: DataModel; links?: Record<string, string> } = {}): {
  table: (entry: string) => ConstantTable;
  reads: string[];
} {
  const reads: string[] = [];
  const table = (entry: string): ConstantTable => buildConstantTable(entry, files[entry], {
    dataModel: options.dataModel ?? 'ilp32',
    includeDirs: options.includeDirs ?? [],
    workspaceRoots: ['/ws'],
    read: (uri) => { reads.push(uri); return files[path.resolve(uri)]; },
    realpath: (uri) => options.links?.[uri] ?? uri,
  });
  return { table, reads };
}

export const valueOf = (t: ConstantTable, name: string): bigint | number | string => {
  const r = t.lookup(name);
  return r.ok ? r.value.value : `${r.code}: ${r.message}`;
};

/** A lookup as plain data, its value and every place of its definition read (both made when asked). */
export const resolutionData = (r: ConstantResolution): unknown => {
  const d = r.definition;
  const definition = d && { name: d.name, uri: d.uri, line: d.line, span: d.span, nameSpan: d.nameSpan, literal: d.literal };
  // A resolved lookup makes its value when read: named fields, not a spread.
  if (r.ok) return { ok: true, value: r.value, definition };
  return d ? { ...r, definition } : r;
};
