// Macro expansion with hide sets, so a macro is never re-expanded inside its own expansion (ISO C11 6.10.3.4p2).
// Bounded: a token budget and a nesting depth, past which expansion stops with cExpansionLimit.
import { Code } from '../codes';
import type { Span } from '../types';
import type { EvalError } from './evaluate';
import { tokenize, tokenizePlainRange, tokenizeSourceRange, withHide, type SourceToken } from './tokens';

export interface MacroDef {
  name: string;
  /** Parameter names; undefined for an object-like macro. */
  params?: string[];
  variadic?: boolean;
  body: SourceToken[];
  uri: string;
  nameSpan: Span;
  /** From '#' to the end of the last body token. */
  span: Span;
  line: number;
}

/**
 * An object-like macro written on one plain line (no comment, literal or splice): kept as where it stands in the
 * text, its places and tokens made when read. A firmware file defines far more macros than a block reads.
 */
export class PlainObjectMacro implements MacroDef {
  // Fields are assigned in the constructor alone (declared, not defined): each defined class field costs a step of
  // its own while the code still runs in the interpreter.
  declare readonly params: undefined;
  declare readonly variadic: false;
  declare readonly name: string;
  declare readonly uri: string;
  declare readonly line: number;
  /** The file's text; the line's start, the name's end (where the replacement list begins) and the line's end. */
  declare readonly source: string;
  declare readonly lineStart: number;
  declare readonly from: number;
  declare readonly to: number;
  /** Kept from the second expansion on (null: read once); a body read for its own value alone is not kept. */
  declare private tokens: SourceToken[] | null | undefined;

  constructor(name: string, uri: string, line: number, source: string, lineStart: number, from: number, to: number) {
    this.name = name;
    this.uri = uri;
    this.line = line;
    this.source = source;
    this.lineStart = lineStart;
    this.from = from;
    this.to = to;
    this.params = undefined;
    this.variadic = false;
    this.tokens = undefined;
  }

  /** It is its own binding in a scope (core/c/scope.ts): one object per macro read. */
  get kind(): 'def' {
    return 'def';
  }

  get def(): PlainObjectMacro {
    return this;
  }

  get nameSpan(): Span {
    return plainNameSpan(this.name, this.from);
  }

  get span(): Span {
    return plainDefineSpan(this.source, this.lineStart, this.from, this.to);
  }

  get body(): SourceToken[] {
    if (this.tokens) return this.tokens;
    const tokens = this.readBody();
    this.tokens = this.tokens === null ? tokens : null;
    return tokens;
  }

  /** The replacement list tokenized afresh, not kept. */
  readBody(): SourceToken[] {
    return this.tokens || tokenizePlainRange(this.source, this.from, this.to, this.uri) || tokenizeSourceRange(this.source, this.from, this.to, this.uri, []);
  }
}

/** Where the name of a plain one-line #define stands: it ends where its replacement list begins. */
export const plainNameSpan = (name: string, nameEnd: number): Span => ({ start: nameEnd - name.length, end: nameEnd });

/** A plain one-line #define from '#' to the end of its last token: every character past the name that is not white space is in a token. */
export function plainDefineSpan(source: string, lineStart: number, nameEnd: number, end: number): Span {
  let last = end;
  while (last > nameEnd && isLineSpace(source.charCodeAt(last - 1))) last--;
  return { start: source.indexOf('#', lineStart), end: last };
}

/** A macro's replacement list for one reading that keeps nothing (a plain macro's tokens are made anew). */
export const bodyOf = (m: MacroDef): SourceToken[] => (m instanceof PlainObjectMacro ? m.readBody() : m.body);

const isLineSpace = (c: number): boolean => c === 32 || c === 9 || c === 13 || c === 12 || c === 11;

export interface ExpandLimits { maxTokens: number; maxDepth: number }
export const DEFAULT_LIMITS: ExpandLimits = { maxTokens: 10_000, maxDepth: 200 };

class Stop { constructor(readonly error: EvalError) {} }

/**
 * `inside`: the input is the replacement list of this macro, so each input identifier without a hide set of its own
 * has the set of this name (made only where an identifier is kept or carries it on, not copied onto every one).
 */
export function expandMacros(
  input: SourceToken[],
  lookup: (name: string) => MacroDef | undefined,
  limits: ExpandLimits = DEFAULT_LIMITS,
  inside?: string,
): SourceToken[] | EvalError {
  // Only an identifier can be replaced, or take the hide set of `inside`: without one the input is the result.
  let k = 0;
  while (k < input.length && input[k].kind !== 'ident') k++;
  if (k === input.length) return input;
  const expander = new Expander(lookup, limits, inside);
  try {
    return expander.run(input, 0);
  } catch (e) {
    if (e instanceof Stop) return e.error;
    throw e;
  }
}

/** One expansion: its budget and context, as fields of one object rather than closures made per call. */
class Expander {
  // Assigned in the constructor, not defined as class fields (a step each per expansion in the interpreter).
  declare private produced: number;
  declare private readonly lookup: (name: string) => MacroDef | undefined;
  declare private readonly limits: ExpandLimits;
  declare private readonly inside: string | undefined;
  /** The hide set of `inside`, once an identifier needs it as a set. */
  declare private insideSet: Set<string> | undefined;

  constructor(lookup: (name: string) => MacroDef | undefined, limits: ExpandLimits, inside: string | undefined) {
    this.produced = 0;
    this.lookup = lookup;
    this.limits = limits;
    this.inside = inside;
    this.insideSet = undefined;
  }

  private insideHide(): Set<string> {
    if (!this.insideSet) { this.insideSet = new Set<string>(); this.insideSet.add(this.inside as string); }
    return this.insideSet;
  }

  private limit(tok: SourceToken, what: string): never {
    throw new Stop({ err: `macro expansion ${what} (at '${tok.text}')`, code: Code.cExpansionLimit, tok });
  }

  run(tokens: SourceToken[], depth: number): SourceToken[] {
    const { limits, inside } = this;
    if (depth > limits.maxDepth) this.limit(tokens[0], `nests deeper than ${limits.maxDepth}`);
    const out: SourceToken[] = [];
    const stack = tokens.slice().reverse();
    while (stack.length) {
      const t = stack.pop() as SourceToken;
      if (t.kind !== 'ident') { out.push(t); continue; }
      // t's hide set: its own, else (an identifier of the input) the one of `inside`, read here by name alone.
      const own = t.hide;
      const m = this.lookup(t.text);
      if (!m || (own ? own.has(m.name) : m.name === inside) || (m.params && stack[stack.length - 1]?.text !== '(')) {
        out.push(own || inside === undefined ? t : withHide(t, this.insideHide()));
        continue;
      }
      const args = m.params ? collectArgs(stack, m, t) : undefined;
      // The hide set is t's with m added (t's does not hold m); made only once an identifier needs it.
      if ((own ? own.size : inside === undefined ? 0 : 1) + 1 > limits.maxDepth) this.limit(t, `nests deeper than ${limits.maxDepth}`);
      // An object-like macro without `##` is replaced by its body as it stands.
      const replaced = args || hasPaste(m.body) ? substitute(m, args, (arg) => this.run(arg, depth + 1)) : m.body;
      this.produced += replaced.length;
      if (this.produced > limits.maxTokens) this.limit(t, `produced more than ${limits.maxTokens} tokens`);
      let hide: Set<string> | undefined;
      for (let i = replaced.length - 1; i >= 0; i--) {
        const r = replaced[i];
        // Only an identifier can be expanded or reported as self-referring, so only it carries the hide set.
        if (r.kind !== 'ident') { stack.push(r); continue; }
        if (!hide) { hide = own ? new Set(own) : inside === undefined ? new Set<string>() : new Set(this.insideHide()); hide.add(m.name); }
        stack.push(withHide(r, r.hide && r.hide.size ? new Set([...r.hide, ...hide]) : hide));
      }
    }
    return out;
  }
}

function hasPaste(body: SourceToken[]): boolean {
  for (let i = 0; i < body.length; i++) if (body[i].kind === 'punct' && body[i].text === '##') return true;
  return false;
}

/** Pops `( a, b )` off the stack (top = next token); commas inside nested parentheses stay in the argument. */
function collectArgs(stack: SourceToken[], m: MacroDef, at: SourceToken): SourceToken[][] {
  stack.pop();
  const params = m.params as string[];
  const args: SourceToken[][] = [[]];
  let depth = 1;
  for (;;) {
    const u = stack.pop();
    if (!u) throw new Stop({ err: `unterminated call of macro ${m.name}`, code: Code.cSyntax, tok: at });
    if (u.kind === 'punct' && u.text === '(') depth++;
    else if (u.kind === 'punct' && u.text === ')' && --depth === 0) break;
    else if (u.kind === 'punct' && u.text === ',' && depth === 1 && !(m.variadic && args.length > params.length)) { args.push([]); continue; }
    args[args.length - 1].push(u);
  }
  const wanted = params.length + (m.variadic ? 1 : 0);
  if (params.length === 0 && !m.variadic && args.length === 1 && args[0].length === 0) return [];
  if (m.variadic && args.length === params.length) args.push([]);
  if (args.length !== wanted) {
    throw new Stop({ err: `macro ${m.name} takes ${params.length} argument${params.length === 1 ? '' : 's'}, given ${args.length}`, code: Code.cSyntax, tok: at });
  }
  return args;
}

function substitute(m: MacroDef, args: SourceToken[][] | undefined, expand: (a: SourceToken[]) => SourceToken[]): SourceToken[] {
  const params = m.params ?? [];
  const argOf = (tok: SourceToken | undefined): SourceToken[] | undefined => {
    if (!tok || tok.kind !== 'ident' || !args) return undefined;
    if (tok.text === '__VA_ARGS__' && m.variadic) return args[params.length];
    const i = params.indexOf(tok.text);
    return i >= 0 ? args[i] : undefined;
  };
  const expanded = new Map<SourceToken[], SourceToken[]>();
  const result: SourceToken[] = [];
  const body = m.body;
  for (let i = 0; i < body.length; i++) {
    const b = body[i];
    if (b.kind === 'punct' && b.text === '#' && m.params) {
      throw new Stop({ err: `'#' (stringizing) in macro ${m.name} is not supported`, code: Code.cSyntax, tok: b });
    }
    if (b.kind === 'punct' && b.text === '##') {
      const next = body[++i];
      if (!next) throw new Stop({ err: `'##' at the end of macro ${m.name}`, code: Code.cSyntax, tok: b });
      const right = argOf(next) ?? [next];
      const left = result.pop();
      if (!left || right.length === 0) { if (left) result.push(left); result.push(...right); continue; }
      const pasted = tokenize(left.text + right[0].text);
      if (pasted.length !== 1 || pasted[0].error) {
        throw new Stop({ err: `pasting '${left.text}' and '${right[0].text}' in macro ${m.name} does not give one token`, code: Code.cSyntax, tok: b });
      }
      result.push({ ...left, kind: pasted[0].kind, text: pasted[0].text }, ...right.slice(1));
      continue;
    }
    const arg = argOf(b);
    if (!arg) { result.push(b); continue; }
    // An argument next to ## is pasted as written; elsewhere it is fully expanded first (C11 6.10.3.1).
    if (body[i + 1]?.text === '##') { result.push(...arg); continue; }
    let full = expanded.get(arg);
    if (!full) { full = expand(arg); expanded.set(arg, full); }
    result.push(...full);
  }
  return result;
}
