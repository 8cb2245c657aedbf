// Decides an #if / #elif / #ifdef condition as true, false, or unknown (it names a macro this scan cannot see,
// e.g. one set on the compiler's command line). Unknown branches are kept apart and merged, never guessed.
import { Code } from '../codes';
import type { TypeSystem } from './ctypes';
import { evaluate, isError } from './evaluate';
import { expandMacros, type ExpandLimits, type MacroDef } from './macros';
import { parseExpression } from './parse';
import type { Scope } from './scope';
import type { SourceToken } from './tokens';

export type Decision = 'true' | 'false' | 'unknown';

const UNKNOWN = 'unknown';

/** `exact`: the build configuration is known, so a name nothing defined is not defined (C11 6.10.1). */
export function decideDefined(scope: Scope, name: string, exact = false): Decision {
  const b = scope.macro(name);
  if (b?.kind === 'def') return 'true';
  if (b?.kind === 'undef') return 'false';
  if (b?.kind === 'conflict') return 'unknown';
  return exact ? 'false' : 'unknown';
}

/** In #if, integers act as intmax_t / uintmax_t (C11 6.10.1p4): int and unsigned int are widened to 64 bits. */
export function preprocessorTypes(ts: TypeSystem): TypeSystem {
  return { ...ts, int: { ...ts.llong, name: 'intmax_t' }, uint: { ...ts.ullong, name: 'uintmax_t' } };
}

export function decideIf(
  tokens: SourceToken[], scope: Scope, ppTypes: TypeSystem, limits: ExpandLimits, exact = false,
): { decision: Decision; problem?: { message: string; tok?: SourceToken; code?: string } } {
  if (tokens.some((t) => t.text === '__has_include' || t.text === '__has_include_next')) return { decision: 'unknown' };
  const replaced: SourceToken[] = [];
  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i];
    if (t.kind !== 'ident' || t.text !== 'defined') { replaced.push(t); continue; }
    const paren = tokens[i + 1]?.text === '(';
    const name = tokens[i + (paren ? 2 : 1)];
    if (!name || name.kind !== 'ident' || (paren && tokens[i + 3]?.text !== ')')) {
      return { decision: 'unknown', problem: { message: "'defined' needs a macro name", tok: t } };
    }
    i += paren ? 3 : 1;
    const d = decideDefined(scope, name.text, exact);
    if (d === 'unknown') return { decision: 'unknown' };
    replaced.push({ ...name, kind: 'number', text: d === 'true' ? '1' : '0' });
  }
  const lookup = (n: string): MacroDef | undefined => { const b = scope.macro(n); return b?.kind === 'def' ? b.def : undefined; };
  const expanded = expandMacros(replaced, lookup, limits);
  if (isError(expanded)) return { decision: 'unknown', problem: { message: expanded.err, tok: expanded.tok } };
  const node = parseExpression(expanded, () => undefined);
  if ('error' in node) return { decision: 'unknown', problem: { message: node.error, tok: node.tok } };
  // After expansion, an identifier left in #if is 0 (C11 6.10.1p4); without a configuration it may be a -D.
  const identifier = (tok: SourceToken) => {
    const b = scope.macro(tok.text);
    return exact && b?.kind !== 'conflict' ? { v: 0n, t: ppTypes.int } : { err: tok.text, code: UNKNOWN, tok };
  };
  const value = evaluate(node, { ts: ppTypes, pp: true, identifier });
  if (isError(value)) {
    if (value.code === UNKNOWN) return { decision: 'unknown' };
    return { decision: 'unknown', problem: { message: value.err, tok: value.tok, code: value.code === Code.cUndefined ? value.code : undefined } };
  }
  const nonzero = typeof value.v === 'bigint' ? value.v !== 0n : value.v !== 0;
  return { decision: nonzero ? 'true' : 'false' };
}
