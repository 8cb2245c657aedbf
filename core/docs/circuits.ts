// The README's circuit list, written from the parameter tables so the docs cannot drift from the code.
import { circuits } from '../circuits/registry';
import type { ParamSpec } from '../circuits/model';
import { blockKeysMarkdown } from '../block-keys';

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

export const blockKeysStart = '<!-- block keys: written by `npm run docs` from core/block-keys.ts; do not edit by hand -->';
export const blockKeysEnd = '<!-- end of block keys -->';

function replaceBetween(text: string, startMark: string, endMark: string, body: string): string {
  const start = text.indexOf(startMark);
  const end = text.indexOf(endMark);
  if (start < 0 || end < start) return text;
  return text.slice(0, start + startMark.length) + '\n' + body + '\n' + text.slice(end);
}

/** The README with its circuit and block-key sections replaced by the current ones. */
export function withCircuits(readme: string): string {
  return replaceBetween(replaceBetween(readme, circuitsStart, circuitsEnd, circuitsMarkdown()), blockKeysStart, blockKeysEnd, blockKeysMarkdown());
}
