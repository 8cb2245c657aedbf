// A tree to a closure, built once and called many times (Monte Carlo spread re-evaluates per sample).
import type { ValueNode } from './ast';

export type CompiledValue = (env: Readonly<Record<string, number>>) => number;

/** Names read from `env`; a missing name gives NaN, which the caller reports rather than uses. */
export function compileValue(expr: ValueNode): CompiledValue {
  switch (expr.kind) {
    case 'number': {
      const value = expr.value;
      return () => value;
    }
    case 'ident': {
      const name = expr.name;
      return (env) => (Object.prototype.hasOwnProperty.call(env, name) ? env[name] : NaN);
    }
    case 'unary': {
      const arg = compileValue(expr.arg);
      return expr.op === '-' ? (env) => -arg(env) : arg;
    }
    case 'binary': {
      const left = compileValue(expr.left);
      const right = compileValue(expr.right);
      switch (expr.op) {
        case '+': return (env) => left(env) + right(env);
        case '-': return (env) => left(env) - right(env);
        case '*': return (env) => left(env) * right(env);
        case '/': return (env) => left(env) / right(env);
      }
    }
  }
}
