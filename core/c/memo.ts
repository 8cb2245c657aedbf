// Preprocessed headers, kept between tables: a header's effect (the macros, declarations and typedefs it leaves,
// its findings) is replayed instead of read again when its text, the headers it reached and every outside name
// it consulted are as they were. A keystroke in a C file therefore re-reads none of its unchanged headers.
import type { Finding } from '../types';
import { BUILTIN_URI_PREFIX } from './builtins';
import type { MacroDef } from './macros';
import { sameDeclaration, sameMacro, sameTypedef, type Binding, type Declaration, type TypedefDef } from './scope';

export interface HeaderEffect {
  /** The setting under which it was read (data model, search folders, exact or cautious, quiet branch). */
  context: string;
  text: string;
  /** Every file it reached (itself and nested headers) with the text it had. */
  files: Array<[string, string]>;
  macroReads: Map<string, Binding<MacroDef> | undefined>;
  declReads: Map<string, Binding<Declaration> | undefined>;
  typedefReads: Map<string, Binding<TypedefDef> | undefined>;
  macros: Map<string, Binding<MacroDef>>;
  decls: Map<string, Binding<Declaration>>;
  typedefs: Map<string, Binding<TypedefDef>>;
  findings: Array<Finding & { uri: string }>;
  missing: string[];
  includes: number;
}

/** Per header path, the few variants seen (an include guard's second visit reads differently from its first). */
export type HeaderMemo = Map<string, HeaderEffect[]>;

const MAX_VARIANTS = 4;

const sameBinding = <T>(a: Binding<T> | undefined, b: Binding<T> | undefined, same: (x: T, y: T) => boolean): boolean => {
  if (a === b) return true;
  if (!a || !b || a.kind !== b.kind) return false;
  if (a.kind === 'undef') return true;
  if (a.kind === 'def') return same(a.def, (b as typeof a).def);
  const other = b as typeof a;
  return a.defs.length === other.defs.length && a.defs.every((d, i) => same(d, other.defs[i]));
};

export interface MemoLookups {
  macro(name: string): Binding<MacroDef> | undefined;
  decl(name: string): Binding<Declaration> | undefined;
  typedef(name: string): Binding<TypedefDef> | undefined;
  read(uri: string): string | undefined;
}

/** The stored effect that applies here, or undefined when the header must be read. */
export function findEffect(memo: HeaderMemo, uri: string, text: string, context: string, here: MemoLookups): HeaderEffect | undefined {
  for (const e of memo.get(uri) ?? []) {
    if (e.context !== context || e.text !== text) continue;
    // Built-in headers depend on the data model alone, which the context holds.
    if (!e.files.every(([file, was]) => file === uri || file.startsWith(BUILTIN_URI_PREFIX) || here.read(file) === was)) continue;
    let holds = true;
    for (const [name, was] of e.macroReads) if (!sameBinding(here.macro(name), was, sameMacro)) { holds = false; break; }
    if (holds) for (const [name, was] of e.declReads) if (!sameBinding(here.decl(name), was, sameDeclaration)) { holds = false; break; }
    if (holds) for (const [name, was] of e.typedefReads) if (!sameBinding(here.typedef(name), was, sameTypedef)) { holds = false; break; }
    if (holds) return e;
  }
  return undefined;
}

export function storeEffect(memo: HeaderMemo, uri: string, effect: HeaderEffect): void {
  const list = (memo.get(uri) ?? []).filter((e) => e.text === effect.text);
  list.unshift(effect);
  memo.set(uri, list.slice(0, MAX_VARIANTS));
}
