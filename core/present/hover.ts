// The hover of a block as Markdown: every result, the spread, solved parts, where constants come from, the
// working with its sources, assumptions and cautions. All text from the document is escaped.
import * as path from 'node:path';
import type { BlockAnalysis } from '../types';
import type { CircuitModel } from '../circuits/model';
import { circuitById } from '../circuits/registry';
import { Code } from '../codes';
import { formatQuantity, formatSignedPercent } from '../format';
import { formatConstant, formatResult, spreadText } from './values';

/** Escapes text for Markdown so a block name or value cannot become markup, a link or HTML. */
export function escapeMarkdown(text: string): string {
  return text.replace(/[\\`*_{}[\]()#+\-.!|<>&~"']/g, (ch) => (ch === '<' ? '&lt;' : ch === '>' ? '&gt;' : ch === '&' ? '&amp;' : '\\' + ch));
}

function code(text: string): string {
  // Inline code cannot carry markup; a backtick inside is replaced so the span cannot be closed early.
  return '`' + text.replace(/`/g, 'ʹ').replace(/\r?\n/g, ' ') + '`';
}

/**
 * A finding's message: its `code spans` stay code (nothing inside one renders), the rest is escaped. A message
 * with an odd number of backticks is escaped whole.
 */
export function messageMarkdown(message: string): string {
  const parts = message.split('`');
  if (parts.length % 2 === 0) return escapeMarkdown(message);
  return parts.map((part, i) => (i % 2 ? code(part) : escapeMarkdown(part))).join('');
}

export interface HoverOptions {
  /** Folder that identifier locations are shown relative to. */
  relativeTo?: string;
}

export function hoverMarkdown(analysis: BlockAnalysis, options: HoverOptions = {}): string {
  const model = analysis.circuit ? circuitById(analysis.circuit) : undefined;
  const out: string[] = [];
  out.push(`**${escapeMarkdown(analysis.name)}** — ${model ? escapeMarkdown(model.title) : 'timing block'}`);
  const errors = analysis.findings.filter((f) => f.severity !== 'info');
  for (const f of errors) out.push(`${f.severity === 'error' ? '⛔' : '⚠️'} ${messageMarkdown(f.message)}`);
  // Cautions stand near the top: a hazardous voltage or a watchdog matters more than the third decimal.
  for (const f of analysis.findings.filter((f) => f.code === Code.caution)) out.push(`⚠️ **Caution:** ${messageMarkdown(f.message)}`);
  if (!model) return out.join('\n\n');

  const shown = model.results.filter((spec) => analysis.values[spec.key] !== undefined);
  if (shown.length) {
    const bands = shown.map((spec) => spreadText(model, spec.key, analysis.spread?.[spec.key]));
    // The worst-case column only when some result has a spread; left-aligned like the rest of a hover.
    const withSpread = bands.some(Boolean);
    const rows = withSpread ? ['| result | value | worst case |', '|:--|:--|:--|'] : ['| result | value |', '|:--|:--|'];
    shown.forEach((spec, i) => {
      const cells = [escapeMarkdown(spec.label), formatResult(model, spec.key, analysis.values[spec.key])];
      if (withSpread) cells.push(bands[i]);
      rows.push(`| ${cells.join(' | ')} |`);
    });
    out.push(rows.join('\n'));
  }
  const shares = sharesLine(analysis, model);
  if (shares) out.push(shares);
  for (const [key, part] of Object.entries(analysis.solved ?? {})) {
    const dim = paramDim(model, key);
    const show = (value: number) => (dim ? formatQuantity(value, dim) : formatConstant(value));
    const exact = part.exact !== undefined ? `exact ${show(part.exact)}; ` : '';
    const error = part.error !== undefined ? ` (${part.error === 0 ? 'exact' : formatSignedPercent(part.error) + ' from the target'})` : '';
    out.push(`**solved** ${code(key)}: ${exact}use ${show(part.value)}${part.series ? ` (${part.series})` : ''}${error}`);
  }
  if (analysis.identifiers.length) {
    const lines = analysis.identifiers.map((id) => {
      const where = options.relativeTo ? path.relative(options.relativeTo, id.uri) : path.basename(id.uri);
      return `- ${code(id.name)} = ${formatConstant(id.value)} — ${escapeMarkdown(where.split(path.sep).join('/'))}:${id.line}`;
    });
    out.push('**firmware constants**\n' + lines.join('\n'));
  }
  const working = safeWorking(model, analysis);
  if (working.length) {
    out.push('**working**\n' + working.map((w) => `- ${code(w.formula)}  \n  ${code(w.substituted)}  \n  *${escapeMarkdown(w.source)}*`).join('\n'));
  }
  // Assumptions are the model's own text (ours, with inline code), not the document's: listed as written.
  const assumptions = model.assumptions.filter((a) => assumptionApplies(model, analysis.choices, a));
  if (assumptions.length) out.push('**assumes**\n' + assumptions.map((a) => `- ${a}`).join('\n'));
  for (const f of analysis.findings.filter((f) => f.severity === 'info' && f.code !== Code.caution)) out.push(`ℹ️ ${messageMarkdown(f.message)}`);
  return out.join('\n\n');
}

/** An assumption written `mode up-down: …` speaks of that choice only, and is shown only when it is chosen. */
function assumptionApplies(model: CircuitModel, choices: Readonly<Record<string, string>>, assumption: string): boolean {
  const match = /^([a-z][\w-]*) ([\w-]+): /.exec(assumption);
  const spec = match && model.params.find((p) => p.key === match[1]);
  if (!match || !spec || spec.kind !== 'choice') return true;
  return (choices[spec.key] ?? spec.default) === match[2];
}

function sharesLine(analysis: BlockAnalysis, model: CircuitModel): string | undefined {
  const first = model.headline.find((k) => analysis.spread?.[k]?.shares);
  const shares = first ? analysis.spread![first].shares! : undefined;
  if (!shares) return undefined;
  const sorted = Object.entries(shares).filter(([, s]) => s > 0.005).sort((a, b) => b[1] - a[1]);
  if (!sorted.length) return undefined;
  return `**spread of ${escapeMarkdown(first!)} comes from** ` + sorted.map(([k, s]) => `${code(k)} ${Math.round(s * 100)} %`).join(', ');
}

function paramDim(model: CircuitModel, key: string) {
  const spec = model.params.find((p) => p.key === key);
  return spec && spec.kind === 'quantity' ? spec.dim : '';
}

function safeWorking(model: CircuitModel, analysis: BlockAnalysis) {
  if (!Object.keys(analysis.values).length) return [];
  try {
    return model.working({ values: analysis.params, choices: analysis.choices, lists: {}, name: analysis.block.name }, analysis.values);
  } catch {
    return [];
  }
}

