// Dimension check of a value tree. Physical units go through mathjs Unit objects built only from
// our own unit names (never from user text); percent and baud are handled here.
import type { Dim, Finding, Span } from '../types';
import { Code } from '../codes';
import type { ValueNode } from './ast';
import { shown } from './lexer';
import type { MathUnits } from './unit-math';

// A restricted instance (core/value/unit-math.ts), built on first use: most values are one quantity whose dimension is
// known without it. A plain require, so the release build can point it at out/unit-math.js (scripts/build.mjs).
let instance: MathUnits | undefined;
const math = (): MathUnits => (instance ??= (require('./unit-math') as typeof import('./unit-math')).createUnits());
type Unit = InstanceType<MathUnits['Unit']>;

type PhysicalDim = 'Ω' | 'F' | 'V' | 'Hz' | 's' | 'A';
const mathjsName: Readonly<Record<PhysicalDim, string>> = { 'Ω': 'ohm', F: 'F', V: 'V', Hz: 'Hz', s: 's', A: 'A' };
let baseUnits: ReadonlyArray<[PhysicalDim, Unit]> | undefined;
const base = () => (baseUnits ??= (Object.keys(mathjsName) as PhysicalDim[]).map((d) => [d, new (math().Unit)(1, mathjsName[d])]));

/** A unit state knows its named dimension, its mathjs Unit, or both; the other is made when needed. */
interface UnitState {
  kind: 'unit';
  dim?: PhysicalDim;
  unit?: Unit;
}

function unitOf(s: UnitState): Unit {
  return (s.unit ??= new (math().Unit)(1, mathjsName[s.dim!]));
}

function sameBase(a: UnitState, b: UnitState): boolean {
  if (a.dim && b.dim) return a.dim === b.dim;
  return unitOf(a).equalBase(unitOf(b));
}

type State =
  | { kind: 'plain' }
  | { kind: 'percent' }
  | { kind: 'baud' }
  | { kind: 'bitrate' }
  | { kind: 'other' }
  | UnitState;

const plain: State = { kind: 'plain' };

function stateOf(dim: Dim): State {
  switch (dim) {
    case '': return plain;
    case '%': return { kind: 'percent' };
    case 'baud': return { kind: 'baud' };
    case 'bit/s': return { kind: 'bitrate' };
    case 'other': return { kind: 'other' };
    default: return { kind: 'unit', dim };
  }
}

/** mathjs collapses a dimensionless product (Hz · s) to a plain number. */
function fromMathjs(result: unknown): State {
  if (typeof result === 'number') return plain;
  const unit = result as Unit;
  return unit.dimensions.every((d) => d === 0) ? plain : { kind: 'unit', unit };
}

function dimOfState(s: State): Dim {
  switch (s.kind) {
    case 'plain': return '';
    case 'percent': return '%';
    case 'baud': return 'baud';
    case 'bitrate': return 'bit/s';
    case 'other': return 'other';
    case 'unit': return s.dim ?? base().find(([, u]) => s.unit!.equalBase(u))?.[0] ?? 'other';
  }
}

function words(s: State): string {
  if (s.kind === 'plain') return 'a plain number';
  if (s.kind === 'percent') return 'a percentage';
  if (s.kind === 'baud') return 'a baud rate';
  if (s.kind === 'bitrate') return 'a bitrate';
  const d = dimOfState(s);
  return d === 'other' ? 'a compound unit' : d;
}

class Mismatch {
  constructor(readonly finding: Finding) {}
}

function fail(message: string, span: Span): never {
  throw new Mismatch({ severity: 'error', code: Code.valueUnit, message, span });
}

const isDimensionless = (s: State): boolean => s.kind === 'plain' || s.kind === 'percent';

function add(op: '+' | '-', a: State, b: State, span: Span): State {
  if (a.kind === 'other' || b.kind === 'other') return { kind: 'other' };
  if (a.kind === 'percent' && b.kind === 'percent') return a;
  if (isDimensionless(a) && isDimensionless(b)) return plain;
  if ((a.kind === 'baud' || a.kind === 'bitrate') && a.kind === b.kind) return a;
  if (a.kind === 'unit' && b.kind === 'unit' && sameBase(a, b)) return a;
  const verb = op === '+' ? `cannot add ${words(b)} to ${words(a)}` : `cannot subtract ${words(b)} from ${words(a)}`;
  const hint = a.kind === 'unit' && b.kind === 'plain' ? ` — give the number a unit (${dimOfState(a)})` : '';
  return fail(`\`${op}\`: ${verb}${hint}`, span);
}

function multiply(op: '*' | '/', a: State, b: State, span: Span): State {
  if (a.kind === 'other' || b.kind === 'other') return { kind: 'other' };
  // Baud and bit/s are counts per second of their own kind: scaled by plain numbers, or divided by their own kind.
  const rate = (s: State) => s.kind === 'baud' || s.kind === 'bitrate';
  if (rate(a) || rate(b)) {
    if (rate(a) && b.kind === 'plain') return a;
    if (op === '*' && a.kind === 'plain') return b;
    if (op === '/' && rate(a) && a.kind === b.kind) return plain;
    return fail(`\`${op}\`: ${words(rate(a) ? a : b)} may only be scaled by a plain number; use Hz for arithmetic with other units`, span);
  }
  if (b.kind === 'plain') return a;
  if (op === '*' && a.kind === 'plain') return b;
  if (a.kind === 'percent' && b.kind === 'percent') return plain;
  if (op === '*' && a.kind === 'percent') return b;
  if (b.kind === 'percent') return a.kind === 'percent' ? plain : a;
  const left = a.kind === 'unit' ? unitOf(a) : undefined;
  const right = unitOf(b as UnitState);
  if (op === '*') return left ? fromMathjs(left.multiply(right)) : b;
  return left ? fromMathjs(left.divide(right)) : fromMathjs((right as unknown as { pow(n: number): Unit }).pow(-1));
}

function walk(node: ValueNode, lookup: (name: string) => Dim | undefined): State {
  switch (node.kind) {
    case 'number': return stateOf(node.dim);
    case 'ident': {
      const dim = lookup(node.name);
      if (dim === undefined) {
        throw new Mismatch({ severity: 'error', code: Code.identifierUnknown, message: `unknown name \`${shown(node.name)}\``, span: node.span });
      }
      return stateOf(dim);
    }
    case 'unary': return walk(node.arg, lookup);
    case 'binary': {
      const a = walk(node.left, lookup);
      const b = walk(node.right, lookup);
      return node.op === '+' || node.op === '-' ? add(node.op, a, b, node.opSpan) : multiply(node.op, a, b, node.opSpan);
    }
  }
}

/** The dimension of a tree (47 kΩ * 100 nF → 's', 1 / (50 Hz) → 's'), or a finding at the offending operator or name. */
export function dimOf(expr: ValueNode, lookup: (name: string) => Dim | undefined): { dim: Dim } | { finding: Finding } {
  // One quantity or one name, as most values are: its dimension is the one written or looked up.
  if (expr.kind === 'number') return { dim: expr.dim };
  if (expr.kind === 'ident') {
    const dim = lookup(expr.name);
    if (dim !== undefined) return { dim };
    return { finding: { severity: 'error', code: Code.identifierUnknown, message: `unknown name \`${shown(expr.name)}\``, span: expr.span } };
  }
  try {
    return { dim: dimOfState(walk(expr, lookup)) };
  } catch (e) {
    if (e instanceof Mismatch) return { finding: e.finding };
    throw e;
  }
}
