// The README's circuit list, written from the parameter tables so the docs cannot drift from the code.
import { circuits } from '../circuits/registry';
import type { ParamSpec } from '../circuits/model';

function keyText(spec: ParamSpec): string {
  if (spec.kind === 'choice') return `\`${spec.key}\` (${spec.options.join(' / ')}, default ${spec.default})`;
  if (spec.kind === 'list') return `\`${spec.key}\`${spec.defaultText ? ` (default ${spec.defaultText})` : ''}`;
  if (spec.kind === 'range') return `\`${spec.key}\` [${spec.dim} .. ${spec.dim}] (optional)`;
  const unit = spec.dim && spec.dim !== '%' ? ` ${spec.dim}` : '';
  const dflt = spec.defaultText ?? (typeof spec.default === 'number' ? String(spec.default) : undefined);
  return `\`${spec.key}\`${unit ? ` [${unit.trim()}]` : ''}${dflt !== undefined ? ` (default ${dflt})` : ''}`;
}

export function circuitsMarkdown(): string {
  const lines: string[] = [];
  for (const model of circuits) {
    lines.push(`- **\`${model.id}\`** — ${model.summary}`);
    lines.push(`  Keys: ${model.params.map(keyText).join(', ')}.`);
    lines.push(`  Results: ${model.results.map((r) => `\`${r.key}\``).join(', ')}.`);
  }
  return lines.join('\n');
}

export const circuitsStart = '<!-- circuits: written by `npm run docs` from core/circuits; do not edit by hand -->';
export const circuitsEnd = '<!-- end of circuits -->';

/** The README with its circuit section replaced by the current one. */
export function withCircuits(readme: string): string {
  const start = readme.indexOf(circuitsStart);
  const end = readme.indexOf(circuitsEnd);
  if (start < 0 || end < start) return readme;
  return readme.slice(0, start + circuitsStart.length) + '\n' + circuitsMarkdown() + '\n' + readme.slice(end);
}
