// The tolerance written after a value: `±5%`, `+-5%`, `± 0.1 V`, `+80% -20%`.
import type { Dim, Finding, Span, Tolerance } from '../types';
import { Code } from '../codes';
import { error, shown, type Token } from './lexer';

export interface ToleranceSplit {
  body: Token[];
  tolerance?: Tolerance;
  toleranceSpan?: Span;
  toleranceDim?: Dim;
  findings: Finding[];
}

type Num = Extract<Token, { t: 'num' }>;

const glued = (a: Token, b: Token): boolean => a.span.end === b.span.start;

function depthZeroIndexes(tokens: readonly Token[], pick: (t: Token) => boolean): number[] {
  const out: number[] = [];
  let depth = 0;
  tokens.forEach((t, i) => {
    if (t.t === 'op' && t.op === '(') depth++;
    else if (t.t === 'op' && t.op === ')') depth--;
    else if (depth === 0 && pick(t)) out.push(i);
  });
  return out;
}

/** `+80% -20%` at the end: each sign glued to a number that carries a unit, after a space. */
function asymmetricStart(tokens: readonly Token[]): number | undefined {
  const n = tokens.length;
  if (n < 5) return undefined;
  const [s1, n1, s2, n2] = tokens.slice(n - 4);
  const signOf = (t: Token): string | undefined => (t.t === 'op' && (t.op === '+' || t.op === '-') ? t.op : undefined);
  const a = signOf(s1);
  const b = signOf(s2);
  if (!a || !b || a === b) return undefined;
  if (n1.t !== 'num' || n2.t !== 'num' || n1.dim === '' || n2.dim === '') return undefined;
  if (!glued(s1, n1) || !glued(s2, n2) || glued(tokens[n - 5], s1) || glued(n1, s2)) return undefined;
  return n - 4;
}

function kindOf(dim: Dim): 'relative' | 'absolute' {
  return dim === '%' ? 'relative' : 'absolute';
}

function symmetric(pm: Token, rest: Token[], findings: Finding[]): Omit<ToleranceSplit, 'body' | 'findings'> {
  const toleranceSpan = { start: pm.span.start, end: (rest[rest.length - 1] ?? pm).span.end };
  const first = rest[0];
  if (!first) {
    findings.push(error(Code.valueTolerance, 'tolerance without a number: write e.g. `±5%` or `±0.1 V`', pm.span));
    return { toleranceSpan };
  }
  if (first.t === 'op' && first.op === '-') {
    findings.push(error(Code.valueTolerance, 'negative tolerance: a `±` tolerance is a size, write it without a sign', toleranceSpan));
    return { toleranceSpan };
  }
  if (first.t !== 'num') {
    findings.push(error(Code.valueTolerance, 'tolerance without a number: write e.g. `±5%` or `±0.1 V`', first.span));
    return { toleranceSpan };
  }
  if (rest.length > 1) {
    const extra = { start: rest[1].span.start, end: toleranceSpan.end };
    findings.push(error(Code.valueTolerance, 'unexpected text after the tolerance', extra));
    return { toleranceSpan };
  }
  if (first.dim === '') {
    findings.push(error(Code.valueTolerance,
      `tolerance \`${shown(first.text)}\` needs a unit: \`${shown(first.text)}%\` for relative, or an absolute amount such as \`${shown(first.text)} V\``, first.span));
    return { toleranceSpan };
  }
  return { tolerance: { kind: kindOf(first.dim), plus: first.value, minus: first.value }, toleranceSpan, toleranceDim: first.dim };
}

function asymmetric(parts: Token[], findings: Finding[]): Omit<ToleranceSplit, 'body' | 'findings'> {
  const toleranceSpan = { start: parts[0].span.start, end: parts[3].span.end };
  const [s1, n1, , n2] = parts as [Token, Num, Token, Num];
  if (kindOf(n1.dim) !== kindOf(n2.dim) || (n1.dim !== '%' && n1.dim !== n2.dim)) {
    findings.push(error(Code.valueTolerance, 'the `+` and `−` tolerances must both be percent or both the same unit', toleranceSpan));
    return { toleranceSpan };
  }
  const plusFirst = s1.t === 'op' && s1.op === '+';
  const plus = plusFirst ? n1.value : n2.value;
  const minus = plusFirst ? n2.value : n1.value;
  return { tolerance: { kind: kindOf(n1.dim), plus, minus }, toleranceSpan, toleranceDim: n1.dim };
}

/** Separates the value's own tokens from a trailing tolerance and checks the tolerance. */
export function splitTolerance(tokens: Token[]): ToleranceSplit {
  const findings: Finding[] = [];
  const pms = depthZeroIndexes(tokens, (t) => t.t === 'pm');
  let body = tokens;
  let parts: Omit<ToleranceSplit, 'body' | 'findings'> = {};
  if (pms.length > 0) {
    body = tokens.slice(0, pms[0]);
    parts = symmetric(tokens[pms[0]], tokens.slice(pms[0] + 1), findings);
  } else {
    const start = asymmetricStart(tokens);
    if (start !== undefined) {
      body = tokens.slice(0, start);
      parts = asymmetric(tokens.slice(start), findings);
    }
  }
  const t = parts.tolerance;
  if (t && t.kind === 'relative' && t.minus > 1) {
    findings.push(error(Code.valueTolerance, 'a tolerance below −100 % would make the value negative', parts.toleranceSpan!));
    parts = { toleranceSpan: parts.toleranceSpan };
  }
  // Spelled out rather than spread: this runs for every value of every block.
  const split: ToleranceSplit = { body, findings };
  if (parts.tolerance) split.tolerance = parts.tolerance;
  if (parts.toleranceSpan) split.toleranceSpan = parts.toleranceSpan;
  if (parts.toleranceDim) split.toleranceDim = parts.toleranceDim;
  return split;
}
