// Definitions in effect, layered: each branch of an #if whose condition cannot be decided gets its own
// layer, and the layers merge at #endif. A name defined alike (or in one branch only) keeps that
// definition; defined differently in two branches, it becomes a conflict that lookups report, never a guess.
import type { CType, TypeConflict } from './ctypes';
import { PlainObjectMacro, type MacroDef } from './macros';
import type { SourceToken } from './tokens';
import type { Span } from '../types';

export type Binding<T> = { kind: 'def'; def: T } | { kind: 'undef' } | { kind: 'conflict'; defs: T[]; conditions: string[] };

/** An undecided directive as a finding names it: `#ifdef CONF_DIV` (config.h:2). */
export function conditionText(line: SourceToken[], lineNumber: number): string {
  let text = '';
  for (let k = 0; k < line.length; k++) {
    const t = line[k];
    if (t.kind === 'newline') break;
    const gap = k > 1 && t.start > line[k - 1].end ? ' ' : '';
    text += (k === 1 ? '' : gap) + t.text;
    if (text.length > 80) { text = text.slice(0, 77) + '…'; break; }
  }
  return `\`${text}\` (${line[0].uri.split(/[\\/]/).pop()}:${lineNumber})`;
}


/** An `enum` constant or a `const`/`constexpr` variable, kept unevaluated until looked up. */
export interface Declaration {
  name: string;
  /** `runtime`: an `extern` variable, whose value only the running firmware knows. */
  kind: 'enum' | 'const' | 'runtime';
  /** Declared type of a const variable; undefined for enum constants and `auto`. */
  type?: CType;
  /** Initialiser or explicit enum value; undefined for an implicit enum value. */
  init?: SourceToken[];
  /** Implicit enum value: the member before (undefined for the first, which is 0). */
  previous?: string;
  /** Set when an implicit enum value counts across members under #if. */
  conditional?: string;
  uri: string;
  nameSpan: Span;
  span: Span;
  line: number;
}

/** A typedef of an arithmetic type (`typedef uint16_t tick_t;`), with the type as spelled. */
export interface TypedefDef { name: string; type: CType | TypeConflict; spelled: string; uri: string; line: number }

const sameTokens = (a: SourceToken[] | undefined, b: SourceToken[] | undefined): boolean =>
  (a ?? []).length === (b ?? []).length && (a ?? []).every((t, i) => t.text === (b as SourceToken[])[i].text);

export const sameMacro = (a: MacroDef, b: MacroDef): boolean =>
  a === b || ((a.params ?? []).join(',') === (b.params ?? []).join(',') && !!a.params === !!b.params && sameTokens(a.body, b.body));

export const sameDeclaration = (a: Declaration, b: Declaration): boolean =>
  a === b || (a.kind === b.kind && a.type?.name === b.type?.name && a.previous === b.previous && sameTokens(a.init, b.init) && !a.conditional && !b.conditional);

const sameType = (a: CType | TypeConflict, b: CType | TypeConflict): boolean =>
  a.kind === 'int' && b.kind === 'int' ? a.bits === b.bits && a.signed === b.signed && a.rank === b.rank && (a.base ?? a.name) === (b.base ?? b.name)
    : a.kind === 'float' && b.kind === 'float' ? a.name === b.name : a === b;

export const sameTypedef = (a: TypedefDef, b: TypedefDef): boolean => a === b || sameType(a.type, b.type);

/**
 * The plain one-line #defines of one preprocessing run (see PlainObjectMacro), kept as a few numbers each: a scope
 * maps such a name to its number here, and a lookup makes the macro when it reads the name. A firmware file and its
 * headers define far more macros than a block reads.
 */
export class PlainDefines {
  private files: Array<{ uri: string; source: string }> = [];
  /** Per define: file, line start, name end, line end, line number, times read. */
  private records = new Int32Array(6 * 256);
  private count = 0;

  /** The number of a file whose defines follow (the last one asked for, when it is that again). */
  file(uri: string, source: string): number {
    const last = this.files.length - 1;
    if (last >= 0 && this.files[last].uri === uri && this.files[last].source === source) return last;
    this.files.push({ uri, source });
    return last + 1;
  }

  add(file: number, lineStart: number, nameEnd: number, end: number, line: number): number {
    let r = this.records;
    const at = this.count * 6;
    if (at + 6 > r.length) {
      r = new Int32Array(r.length * 2);
      r.set(this.records);
      this.records = r;
    }
    r[at] = file;
    r[at + 1] = lineStart;
    r[at + 2] = nameEnd;
    r[at + 3] = end;
    r[at + 4] = line;
    r[at + 5] = 0;
    return this.count++;
  }

  /**
   * Define `k`, named `name`, as a binding (the macro is its own), made anew at each reading until the scope keeps it
   * from its third reading on (a clock every timer reads): one read for its own value and inside one other constant
   * leaves nothing behind.
   */
  binding(name: string, k: number): Binding<MacroDef> {
    const r = this.records;
    const at = k * 6;
    const f = this.files[r[at]];
    return new PlainObjectMacro(name, f.uri, r[at + 4], f.source, r[at + 1], r[at + 2], r[at + 3]);
  }

  /** Counts a reading of define `k`: true from the third on (see binding). */
  readAgain(k: number): boolean {
    return ++this.records[k * 6 + 5] >= 3;
  }
}

export class Scope {
  /** A number stands for a define in the run's PlainDefines. */
  readonly macros = new Map<string, Binding<MacroDef> | number>();
  readonly decls = new Map<string, Binding<Declaration>>();
  readonly typedefs = new Map<string, Binding<TypedefDef>>();
  /** `condition`: for a branch of an undecided #if, the directive that opened its group. */
  constructor(readonly parent?: Scope, readonly condition?: string) {}
  /** Set on a header's own layer: every name it looks up beyond itself, with the answer it got (core/c/memo.ts). */
  reads?: ScopeReads;
  /** Set on the root scope of a run. */
  plain?: PlainDefines;

  typedef(name: string): Binding<TypedefDef> | undefined {
    return this.find(name, 'typedefs');
  }

  /** A typedef name in effect here; a conflict when undecided #if branches typedef it differently. */
  typeNamed(name: string): CType | TypeConflict | undefined {
    const b = this.typedef(name);
    if (b?.kind === 'def') return b.def.type;
    if (b?.kind !== 'conflict') return undefined;
    const each = b.defs.map((d) => `${d.spelled} at ${d.uri.split(/[\\/]/).pop()}:${d.line}`).join(', ');
    return { kind: 'conflict', message: `${name} is a typedef chosen under #if branches this file does not decide (${each}); its type depends on the build configuration` };
  }

  macro(name: string): Binding<MacroDef> | undefined {
    return this.find(name, 'macros');
  }

  decl(name: string): Binding<Declaration> | undefined {
    return this.find(name, 'decls');
  }

  /** Plain define `k` of the run, which this scope's map holds for `name`, as a binding. */
  plainDefine(name: string, k: number): Binding<MacroDef> {
    let root: Scope = this;
    while (root.parent) root = root.parent;
    const plain = root.plain as PlainDefines;
    const binding = plain.binding(name, k);
    if (plain.readAgain(k)) this.macros.set(name, binding);
    return binding;
  }

  private find<K extends keyof ScopeReads>(name: string, kind: K): ReturnType<ScopeReads[K]['get']> {
    type B = ReturnType<ScopeReads[K]['get']>;
    for (let s: Scope | undefined = this; s; s = s.parent) {
      // Each map by its own name (one shape of access), not s[kind].
      const b = (kind === 'macros' ? s.macros : kind === 'decls' ? s.decls : s.typedefs as Map<string, unknown>).get(name);
      if (typeof b === 'number') return s.plainDefine(name, b) as B;
      if (b) return b as B;
      if (s.reads) {
        const outer = s.parent?.find(name, kind) as B;
        const reads = s.reads[kind] as Map<string, unknown>;
        if (!reads.has(name)) reads.set(name, outer);
        return outer;
      }
    }
    return undefined as B;
  }
}

/** Every plain define of `map` as the binding it stands for (for a header's effect, replayed in other runs). */
export function withPlainDefines(scope: Scope, map: Map<string, Binding<MacroDef> | number>): Map<string, Binding<MacroDef>> {
  for (const [name, b] of map) if (typeof b === 'number') map.set(name, scope.plainDefine(name, b));
  return map as Map<string, Binding<MacroDef>>;
}

export interface ScopeReads {
  macros: Map<string, Binding<MacroDef> | undefined>;
  decls: Map<string, Binding<Declaration> | undefined>;
  typedefs: Map<string, Binding<TypedefDef> | undefined>;
}

/** Merges branch layers into their base. `fallThrough`: no branch need be taken, so the base state is a path too. */
export function mergeBranches(base: Scope, branches: Scope[], fallThrough: boolean): void {
  mergeMap(base, branches, fallThrough, (s) => s.macros, (s, n) => s.macro(n), sameMacro);
  mergeMap(base, branches, fallThrough, (s) => s.decls, (s, n) => s.decl(n), sameDeclaration);
  mergeMap(base, branches, fallThrough, (s) => s.typedefs, (s, n) => s.typedef(n), sameTypedef);
}

function mergeMap<T>(
  base: Scope, branches: Scope[], fallThrough: boolean,
  own: (s: Scope) => Map<string, Binding<T> | number>, find: (s: Scope, name: string) => Binding<T> | undefined, same: (a: T, b: T) => boolean,
): void {
  const names = new Set<string>();
  for (const b of branches) for (const n of own(b).keys()) names.add(n);
  for (const name of names) {
    const paths = branches.map((b) => find(b, name));
    if (fallThrough) paths.push(find(base, name));
    const defs: T[] = [];
    const conditions = new Set<string>();
    for (const b of branches) if (b.condition) conditions.add(b.condition);
    const add = (d: T): void => { if (!defs.some((x) => same(x, d))) defs.push(d); };
    let undef = false;
    for (const p of paths) {
      if (p?.kind === 'def') add(p.def);
      else if (p?.kind === 'conflict') { p.defs.forEach(add); p.conditions.forEach((c) => conditions.add(c)); }
      else if (p?.kind === 'undef') undef = true;
    }
    if (defs.length > 1) own(base).set(name, { kind: 'conflict', defs, conditions: [...conditions] });
    else if (defs.length === 1) own(base).set(name, { kind: 'def', def: defs[0] });
    else if (undef) own(base).set(name, { kind: 'undef' });
  }
}
