// Register keys read as C constant expressions (docs/blocks.md, "Values and units"): `reload: F_CPU / 64 / 1000 - 1` is what
// the compiler makes of it, in the block's data model, with the firmware's macros.
import { buildConstantTable, toNumber, tokenize, type ConstantTable, type DataModel } from '../c';
import { Code } from '../codes';
import { isRegisterKey, type QuantityParam } from '../circuits/model';
import type { BlockEntry, Finding, ResolvedIdentifier } from '../types';
import { parseValue } from '../value';
import type { DataModelName, ExpressionLookup, IdentifierSource } from './context';

/** A note without firmware still knows the <stdint.h> and <limits.h> limits of its data model. */
const STANDARD_ONLY = '#include <stdint.h>\n#include <limits.h>\n';
const standardTables = new Map<DataModelName, ConstantTable>();

function standardTable(dataModel: DataModelName): ConstantTable {
  let table = standardTables.get(dataModel);
  if (!table) {
    table = buildConstantTable('<note>', STANDARD_ONLY, { dataModel: dataModel as DataModel, includeDirs: [], workspaceRoots: [], read: () => undefined });
    standardTables.set(dataModel, table);
  }
  return table;
}

export function evaluateWithoutFirmware(exprText: string, dataModel: DataModelName): ExpressionLookup {
  return evaluateIn(standardTable(dataModel), exprText);
}

/** Evaluates `exprText` in `table`; the firmware names it read come back with where they are defined. */
export function evaluateIn(table: ConstantTable, exprText: string): ExpressionLookup {
  const r = table.evaluate(exprText);
  if (!r.ok) return { ok: false, message: r.message, code: r.code, span: r.span };
  const value = toNumber(r.value);
  if (!Number.isFinite(value)) return { ok: false, code: 'c-syntax', message: `\`${exprText}\` is not a finite number` };
  const identifiers: ResolvedIdentifier[] = [];
  const seen = new Set<string>();
  for (const t of tokenize(exprText)) {
    if (t.kind !== 'ident' || seen.has(t.text)) continue;
    seen.add(t.text);
    const found = table.lookup(t.text);
    // Function-like macros, type names and keywords are not values of their own.
    if (found.ok && !found.definition.uri.startsWith('<')) {
      identifiers.push({ name: t.text, value: toNumber(found.value), uri: found.definition.uri, line: found.definition.line });
    }
  }
  return { ok: true, value, identifiers };
}

const plainDecimal = /^\s*(?:0|[1-9]\d{0,8})\s*$/;

/** A tolerance or a `?` or block reference belongs to the value language; so does a lone name (it resolves the same). */
const VALUE_LANGUAGE = /[?@\u00b1]|\+-\s*[\d.]+\s*(?:%|ppm)\s*$|%\s*$/;

/**
 * A register key's value as C: the number and the firmware names it read, or a finding. Undefined when the value
 * is for the value language instead (a `?`, a tolerance, a block reference, a lone name or one of the block's
 * own keys), or when C cannot read it but the value language can (`4k7`, `1k`) and it names nothing.
 */
export function registerValue(
  spec: QuantityParam, entry: BlockEntry, blockKeys: ReadonlyMap<string, unknown>, source: IdentifierSource, dataModel: DataModelName,
): { value: number; identifiers: ResolvedIdentifier[] } | { finding: Finding } | undefined {
  if (!isRegisterKey(spec)) return undefined;
  const text = entry.valueText;
  if (VALUE_LANGUAGE.test(text) || /^\s*[A-Za-z_]\w*\s*$/.test(text)) return undefined;
  // A plain decimal number (no suffix, no leading zero, which C would read as octal) is that number in every data
  // model: C gives it the first of int, long, long long that holds it, never another value.
  if (plainDecimal.test(text)) return { value: Number(text), identifiers: [] };
  const tokens = tokenize(text);
  if (tokens.some((t) => t.kind === 'ident' && t.text.toLowerCase() !== spec.key && blockKeys.has(t.text.toLowerCase()))) return undefined;
  const r = source.evaluate(text, dataModel);
  if (r.ok) return { value: r.value, identifiers: r.identifiers };
  if (r.code === Code.cSyntax && !tokens.some((t) => t.kind === 'ident') && !parseValue(text, 0).findings.length) return undefined;
  const span = r.span ? { start: entry.valueSpan.start + r.span.start, end: entry.valueSpan.start + r.span.end } : entry.valueSpan;
  return { finding: { severity: 'error', code: r.code, message: `\`${entry.key}\`: ${r.message}`, span } };
}
