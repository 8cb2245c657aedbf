// A tree to a closure, built once and called many times (Monte Carlo spread re-evaluates per sample).
import type { ValueNode } from './ast';

export type CompiledValue = (env: Readonly<Record<string, number>>) => number;

/**
 * Names read from `env`; a missing name gives NaN, which the caller reports rather than uses. A name `constant`
 * gives a number for is compiled in as that number (a firmware constant, fixed for the block).
 */
export function compileValue(expr: ValueNode, constant?: (name: string) => number | undefined): CompiledValue {
  switch (expr.kind) {
    case 'number': {
      const value = expr.value;
      return () => value;
    }
    case 'ident': {
      const name = expr.name;
      const fixed = constant?.(name);
      if (fixed !== undefined) return () => fixed;
      return (env) => (Object.prototype.hasOwnProperty.call(env, name) ? env[name] : NaN);
    }
    case 'unary': {
      const arg = compileValue(expr.arg, constant);
      return expr.op === '-' ? (env) => -arg(env) : arg;
    }
    case 'binary': {
      const left = compileValue(expr.left, constant);
      const right = compileValue(expr.right, constant);
      switch (expr.op) {
        case '+': return (env) => left(env) + right(env);
        case '-': return (env) => left(env) - right(env);
        case '*': return (env) => left(env) * right(env);
        case '/': return (env) => left(env) / right(env);
      }
    }
  }
}
