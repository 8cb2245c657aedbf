// The constant table of one translation unit: names resolve lazily, once, and a cycle is a finding.
// Lookups see the definitions in effect at the end of the file (after every #include and #undef).
import { Code } from '../codes';
import type { Finding, Span } from '../types';
import { convert, fits, typeSystem, type CType, type DataModel, type TypeConflict, type Val } from './ctypes';
import { evaluate, isError, type EvalContext, type EvalError, type EvalResult } from './evaluate';
import { bodyOf, expandMacros, plainDefineSpan, plainNameSpan, PlainObjectMacro, type MacroDef } from './macros';
import { parseChar, parseNumber } from './literals';
import { parseExpression } from './parse';
import type { BuildConfig } from './config';
import type { HeaderMemo } from './memo';
import { preprocess } from './preprocess';
import type { Binding, Declaration } from './scope';
import { tokenizeSource, type SourceToken } from './tokens';

export interface CValue { value: bigint | number; type: string }

export interface ConstantDefinition {
  name: string;
  uri: string;
  /** 1-based. */
  line: number;
  /** The whole definition: `#define …` to its end, or the declarator with its initialiser. */
  span: Span;
  nameSpan: Span;
  /** When the body is one literal (`#define TICK_TOP 255u`, `= 255;`): where it stands, for a quick fix. */
  literal?: { span: Span; text: string };
}

export type ConstantResolution =
  | { ok: true; value: CValue; definition: ConstantDefinition }
  | { ok: false; message: string; code: string; at?: { uri: string; span: Span }; definition?: ConstantDefinition; runtime?: string };

/** A lookup that did not resolve. */
type Unresolved = Extract<ConstantResolution, { ok: false }>;

export type ExpressionResult = { ok: true; value: CValue } | { ok: false; message: string; code: string; span?: Span };

export interface ConstantTable {
  lookup(name: string): ConstantResolution;
  /** A C constant expression using the table's names; a failure's span is 0-based into `exprText` when it lies there. */
  evaluate(exprText: string): ExpressionResult;
  dependencies: string[];
  findings: Array<Finding & { uri: string }>;
}

export interface ConstantTableOptions {
  dataModel: DataModel;
  includeDirs: string[];
  workspaceRoots: string[];
  read: (uri: string) => string | undefined;
  realpath?: (uri: string) => string | undefined;
  maxFileBytes?: number;
  /** Plain char signed (x86, AVR gcc) or unsigned (ARM, RISC-V); by default unsigned under ilp32 only. */
  charSigned?: boolean;
  /** Headers above this many bytes are skipped with a warning (default 8 MB). */
  maxHeaderBytes?: number;
  /** The file's build configuration (compile_commands.json, -D/-U/-I); without one, undecided #if is tracked both ways. */
  config?: BuildConfig;
  /** Preprocessed headers shared between tables, so an unchanged header is not read again. */
  headerMemo?: HeaderMemo;
  /** The table answers again after edits (an editor keeps it): every answer is kept. Without it, what is read twice. */
  reused?: boolean;
}

/** Vendor device headers run to 2 MB; 8 MB leaves room without reading anything unbounded. */
export const DEFAULT_MAX_HEADER_BYTES = 8 * 1024 * 1024;

/** How to settle what the file alone cannot decide, named in every c-conditional finding about it. */
function undecidedNote(conditions: string[]): string {
  if (conditions.length === 0) return 'the value depends on the build configuration';
  const names = new Set<string>();
  for (const c of conditions) for (const m of /`[^`]*`/.exec(c)?.[0].matchAll(/\b(?!defined\b|if\b|ifdef\b|ifndef\b|elif\b)[A-Za-z_]\w*/g) ?? []) names.add(m[0]);
  const example = [...names].slice(0, 2).map((n) => `-D ${n}=…`).join(' ');
  return `it depends on ${conditions.slice(0, 3).join(', ')}, which this file does not decide: give ${example || '-D'} (tickmark.c.defines in the editor) or a compile_commands.json`;
}

const MAX_NAME_DEPTH = 100;
const EXPRESSION_URI = '<expression>';

export const toNumber = (v: CValue): number => Number(v.value);
const toCValue = (x: Val): CValue => ({ value: x.v, type: x.t.name });

/** The one number or character constant a macro body or initializer is, maybe parenthesised; else undefined. */
function soleLiteral(body: SourceToken[]): SourceToken | undefined {
  const t = body.length === 1 ? body[0] : body.length === 3 && body[0].text === '(' && body[2].text === ')' ? body[1] : undefined;
  return t && (t.kind === 'number' || t.kind === 'char') ? t : undefined;
}

/**
 * The definition of a plain one-line macro: its places are made when asked (see PlainObjectMacro); most lookups
 * want the value, the file and the line alone. It keeps where the macro stands, not the macro.
 */
class PlainDefinition implements ConstantDefinition {
  declare readonly name: string;
  declare readonly uri: string;
  declare readonly line: number;
  declare private readonly source: string;
  declare private readonly lineStart: number;
  declare private readonly nameEnd: number;
  declare private readonly end: number;
  /** Where the sole literal of the body stands; -1 when it has none. */
  declare private readonly literalStart: number;
  declare private readonly literalEnd: number;

  constructor(macro: PlainObjectMacro, sole: SourceToken | undefined) {
    this.name = macro.name;
    this.uri = macro.uri;
    this.line = macro.line;
    this.source = macro.source;
    this.lineStart = macro.lineStart;
    this.nameEnd = macro.from;
    this.end = macro.to;
    this.literalStart = sole ? sole.start : -1;
    this.literalEnd = sole ? sole.end : -1;
  }

  get span(): Span { return plainDefineSpan(this.source, this.lineStart, this.nameEnd, this.end); }
  get nameSpan(): Span { return plainNameSpan(this.name, this.nameEnd); }
  // A plain line holds no splice: the literal's text is the text where it stands.
  get literal(): ConstantDefinition['literal'] {
    return this.literalStart < 0 ? undefined : { span: { start: this.literalStart, end: this.literalEnd }, text: this.source.slice(this.literalStart, this.literalEnd) };
  }
}

/**
 * A constant that resolved: its value as C evaluated it (what the constants that read it take) and its definition;
 * the reported value is made when read. One object per name looked up, where a firmware file's blocks read
 * thousands of names and each kept object is copied through V8's young generation on a cold start.
 */
class Resolved {
  declare readonly ok: true;
  declare readonly val: Val;
  declare readonly definition: ConstantDefinition;
  /** Read from a body that is one number or character constant: as quick to read again as to keep (see kept). */
  declare readonly literal: boolean;

  constructor(val: Val, definition: ConstantDefinition, literal: boolean) {
    this.ok = true;
    this.val = val;
    this.definition = definition;
    this.literal = literal;
  }

  get value(): CValue {
    return toCValue(this.val);
  }
}

/** `sole`: the body's sole literal, when the caller has found it already (null: it has none). */
function definitionOf(d: MacroDef | Declaration, sole?: SourceToken | null): ConstantDefinition {
  if (sole === undefined) {
    const body = 'body' in d ? bodyOf(d) : d.init;
    sole = body ? soleLiteral(body) : undefined;
  }
  if (d instanceof PlainObjectMacro) return new PlainDefinition(d, sole ?? undefined);
  return { name: d.name, uri: d.uri, line: d.line, span: d.span, nameSpan: d.nameSpan, literal: sole ? { span: { start: sole.start, end: sole.end }, text: sole.text } : undefined };
}

const where = (d: MacroDef | Declaration): string => `${d.uri.split(/[\\/]/).pop()}:${d.line}`;

export function buildConstantTable(entryUri: string, text: string, options: ConstantTableOptions): ConstantTable {
  const ts = typeSystem(options.dataModel, options.charSigned);
  const pre = preprocess(entryUri, text, { ...options, ts, maxFileBytes: options.maxFileBytes ?? 1_000_000, maxHeaderBytes: options.maxHeaderBytes ?? DEFAULT_MAX_HEADER_BYTES });
  const { root } = pre;
  const memo = new Map<string, Unresolved | Resolved>();
  /** Macros computed once and not kept yet (see kept). */
  const readOnce = new Set<string>();
  const active: string[] = [];
  const typeNamed = (n: string): CType | TypeConflict | undefined => root.typeNamed(n) ?? ts.named.get(n);
  const macro = (n: string): MacroDef | undefined => { const b = root.macro(n); return b?.kind === 'def' ? b.def : undefined; };

  const fail = (e: EvalError): Unresolved => ({
    ok: false, message: e.err, code: e.code, at: e.tok ? { uri: e.tok.uri, span: { start: e.tok.start, end: e.tok.end } } : undefined, runtime: e.runtime,
  });

  /** Expands, parses and evaluates tokens; identifiers left after expansion resolve through the table. */
  const evalTokens = (tokens: SourceToken[], inside?: string): EvalResult => {
    const expanded = expandMacros(tokens, macro, undefined, inside);
    if (isError(expanded)) return expanded;
    const node = parseExpression(expanded, typeNamed);
    if ('error' in node) return { err: node.error, code: node.code ?? Code.cSyntax, tok: node.tok };
    return evaluate(node, evalContext);
  };

  const identifier = (tok: SourceToken): EvalResult => {
    const name = tok.text;
    const b = root.macro(name);
    if (b?.kind === 'def' && tok.hide?.has(name)) {
      return { err: `${name} refers to itself through macros (${[...tok.hide, name].join(' → ')})`, code: Code.cCycle, tok };
    }
    if (b?.kind === 'def' && b.def.params) return { err: `${name} is a function-like macro; it needs arguments`, code: Code.cSyntax, tok };
    const r = lookup(name);
    if (r.ok) return r.val;
    const runtime = r.code === Code.cRuntime ? `reads ${name}, which ${r.runtime}` : undefined;
    return { err: r.message, code: r.code, named: true, runtime, tok: r.at ? { ...tok, uri: r.at.uri, start: r.at.span.start, end: r.at.span.end } : tok };
  };

  const evalContext: EvalContext = { ts, identifier };

  const finish = (name: string, x: EvalResult, def: MacroDef | Declaration, sole?: SourceToken | null, literal = false): Unresolved | Resolved => {
    // Undefined behaviour names the constant it sits in, once: outer constants pass the message on as it is.
    if (isError(x) && x.code === Code.cRuntime) {
      // Named with its line, and what makes it a run-time value: the variable or the call it reaches.
      const own = 'body' in def || def.kind !== 'runtime';
      if (!own) return { ok: false, code: x.code, message: x.err, runtime: x.runtime, definition: definitionOf(def, sole) };
      return { ok: false, code: x.code, message: `${name} (${where(def)}) is only known at run time: it ${x.runtime}`, runtime: `${x.runtime}`, definition: definitionOf(def, sole) };
    }
    if (isError(x)) return { ...fail(x.code === Code.cUndefined && !x.named ? { ...x, err: `${name}: ${x.err}` } : x), definition: definitionOf(def, sole) };
    return new Resolved(x, definitionOf(def, sole), literal);
  };

  /** A body that is one number or character constant, maybe parenthesised: what evaluating it gives, read directly. */
  const literalValue = (t: SourceToken | undefined): EvalResult | undefined => {
    if (!t || t.error) return undefined;
    const r = t.kind === 'number' ? parseNumber(t.text, ts) : parseChar(t.text, ts);
    return typeof r === 'string' ? { err: r, code: Code.cSyntax, tok: t } : r;
  };

  const resolveDeclaration = (d: Declaration): EvalResult => {
    if (d.conditional) return { err: d.conditional, code: Code.cConditional };
    if (d.kind === 'runtime') {
      return { err: `${d.name} is an extern ${d.type?.name ?? ''} variable (${where(d)}): its value is only known at run time`.replace('  ', ' '), code: Code.cRuntime, runtime: `is an extern variable (${where(d)})` };
    }
    if (d.kind === 'const') {
      const x = evalTokens(d.init as SourceToken[]);
      if (isError(x) || !d.type) return x;
      const c = convert(x, d.type);
      return typeof c === 'string' ? { err: `${d.name}: ${c}`, code: Code.cUndefined, named: true } : c;
    }
    let x: EvalResult;
    if (d.init) x = evalTokens(d.init);
    else if (d.previous === undefined) x = { v: 0n, t: ts.int };
    else {
      const p = lookup(d.previous);
      if (!p.ok) return { err: p.message, code: p.code };
      const before = p.val;
      x = { v: (before.v as bigint) + 1n, t: before.t };
    }
    if (isError(x)) return x;
    if (typeof x.v !== 'bigint') return { err: `enum constant ${d.name} must be an integer, not ${x.t.name}`, code: Code.cSyntax };
    // Enum constants have type int (C11 6.7.2.2p2); gcc keeps a wider type for values beyond it.
    return fits(x.v, ts.int) ? { v: x.v, t: ts.int } : x;
  };

  const compute = (name: string, mb: Binding<MacroDef> | undefined): Unresolved | Resolved => {
    if (mb?.kind === 'conflict') {
      return { ok: false, code: Code.cConditional, message: `${name} is defined differently under #if branches (${mb.defs.map(where).join(', ')}); ${undecidedNote(mb.conditions)}` };
    }
    if (mb?.kind === 'def') {
      const m = mb.def;
      if (m.params) return { ok: false, code: Code.cSyntax, message: `${name} is a function-like macro; it needs arguments`, definition: definitionOf(m) };
      const body = bodyOf(m);
      const sole = soleLiteral(body) ?? null;
      const literal = literalValue(sole ?? undefined);
      if (literal) return finish(name, literal, m, sole, true);
      // The body's identifiers are hidden from the macro itself (C11 6.10.3.4p2).
      return finish(name, evalTokens(body, name), m, sole);
    }
    const db = root.decl(name);
    if (db?.kind === 'conflict') {
      return { ok: false, code: Code.cConditional, message: `${name} is declared differently under #if branches (${db.defs.map(where).join(', ')}); ${undecidedNote(db.conditions)}` };
    }
    if (db?.kind === 'def') return finish(name, resolveDeclaration(db.def), db.def);
    const undefNote = mb?.kind === 'undef' ? ' (it is #undef-ed)' : '';
    const missing = pre.missing.length ? ` (headers not found: ${[...new Set(pre.missing)].slice(0, 4).join(', ')})` : '';
    return { ok: false, code: Code.cUnknown, message: `${name} is not defined in this file or the headers it includes${undefNote}${missing}` };
  };

  const lookup = (name: string): Unresolved | Resolved => {
    const known = memo.get(name);
    if (known) return known;
    const at = active.indexOf(name);
    if (at >= 0) return { ok: false, code: Code.cCycle, message: `${name} depends on itself: ${[...active.slice(at), name].join(' → ')}` };
    if (active.length >= MAX_NAME_DEPTH) return { ok: false, code: Code.cExpansionLimit, message: `constants refer to each other more than ${MAX_NAME_DEPTH} deep at ${name}` };
    const mb = root.macro(name);
    if (active.length === 0 && !mb) warmEnumChain(name);
    active.push(name);
    let r: Unresolved | Resolved;
    try {
      r = compute(name, mb);
    } catch (e) {
      // A hostile chain of nested constants can still exhaust the stack; that is a finding, not a crash.
      if (!(e instanceof RangeError)) throw e;
      r = { ok: false, code: Code.cExpansionLimit, message: `${name} nests too deeply to evaluate` };
    } finally { active.pop(); }
    if (!(r instanceof Resolved) || kept(name, mb, r)) memo.set(name, r);
    return r;
  };

  /**
   * Whether a macro's value is kept for the next lookup. A table an editor keeps across edits keeps every answer: its
   * blocks' answers are checked again after each edit. A table for one check keeps what is read again: its blocks
   * read thousands of macros once each, and a kept answer outlives the analysis step that asked (copied through V8's
   * young generation on a cold start). There a value read straight from a literal body is never kept (reading it
   * again costs no more), a computed one from its second reading on (a clock every timer reads). Declarations are
   * always kept: warmEnumChain keeps a long enum's recursion one member deep by finding the earlier members kept.
   */
  const kept = (name: string, mb: Binding<MacroDef> | undefined, r: Resolved): boolean => {
    if (options.reused || mb?.kind !== 'def') return true;
    if (r.literal) return false;
    if (readOnce.delete(name)) return true;
    readOnce.add(name);
    return false;
  };

  /** Resolves a long run of implicit enum values oldest first, so the recursion stays one member deep. */
  const warmEnumChain = (name: string): void => {
    const chain: string[] = [];
    const seen = new Set<string>();
    for (let n: string | undefined = name; n !== undefined && !memo.has(n) && !seen.has(n) && !root.macro(n);) {
      const b = root.decl(n);
      if (b?.kind !== 'def' || b.def.kind !== 'enum' || b.def.init || b.def.previous === undefined) break;
      seen.add(n);
      chain.push(n);
      n = b.def.previous;
    }
    for (let i = chain.length - 1; i > 0; i--) lookup(chain[i]);
  };

  const evaluateText = (exprText: string): ExpressionResult => {
    const tokens = tokenizeSource(exprText, EXPRESSION_URI).filter((t) => t.kind !== 'newline');
    const x = evalTokens(tokens);
    if (isError(x)) {
      const span = x.tok?.uri === EXPRESSION_URI ? { start: x.tok.start, end: x.tok.end } : undefined;
      return { ok: false, message: x.err, code: x.code, span };
    }
    return { ok: true, value: toCValue(x) };
  };

  return { lookup, evaluate: evaluateText, dependencies: pre.dependencies, findings: pre.findings };
}
