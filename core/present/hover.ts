// The hover of a block as Markdown: every result, the spread, solved parts, where constants come from, the
// working with its sources, assumptions and cautions. All text from the document is escaped.
import type { BlockAnalysis } from '../types';
import { basename, relative } from '../paths';
import { blockView, cautionMark, severityMark, type BlockView } from './view';
import { referenceLink } from '../project';

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
  /** A link target for a line of a file (the editor's file URI with its line), for references to other blocks. */
  linkTo?: (uri: string, line: number) => string | undefined;
}

export function hoverMarkdown(analysis: BlockAnalysis, options: HoverOptions = {}): string {
  return viewMarkdown(blockView(analysis), options);
}

/** The presented block as Markdown (core/present/view.ts): the editor's hover and the language server's. */
export function viewMarkdown(view: BlockView, options: HoverOptions = {}): string {
  const out: string[] = [];
  out.push(`**${escapeMarkdown(view.name)}** — ${escapeMarkdown(view.title)}`);
  // Each finding links its code's section of the block-language reference (docs/blocks.md).
  for (const f of view.problems) out.push(`${severityMark[f.severity]} ${messageMarkdown(f.message)} [${code(f.code)}](${referenceLink(f.code)})`);
  // Cautions stand near the top: a hazardous voltage or a watchdog matters more than the third decimal.
  for (const caution of view.cautions) out.push(`${cautionMark} **Caution:** ${messageMarkdown(caution)}`);
  if (!view.modelled) return out.join('\n\n');

  if (view.results.length) {
    // Spread columns only when some result has one; left-aligned like the rest of a hover.
    const header = ['result', 'value'];
    if (view.hasWorstCase) header.push('worst case');
    if (view.hasPercentiles) header.push('1–99 % of samples');
    const rows = [`| ${header.join(' | ')} |`, `|${header.map(() => ':--').join('|')}|`];
    for (const row of view.results) {
      const cells = [escapeMarkdown(row.label), row.value];
      if (view.hasWorstCase) cells.push(row.worstCase);
      if (view.hasPercentiles) cells.push(row.percentiles);
      rows.push(`| ${cells.join(' | ')} |`);
    }
    out.push(rows.join('\n'));
  }
  if (view.shares) {
    out.push(`**spread of ${escapeMarkdown(view.shares.result)} comes from** ` + view.shares.parts.map((p) => `${code(p.key)} ${p.percent} %`).join(', '));
  }
  for (const row of view.solved) {
    out.push(`**solved** ${code(row.key)}: ${row.exact !== undefined ? `exact ${row.exact}; ` : ''}use ${row.value}${row.fromTarget ? ` (${row.fromTarget})` : ''}`);
  }
  if (view.identifiers.length) {
    const lines = view.identifiers.map((id) => {
      const where = options.relativeTo ? relative(options.relativeTo, id.uri) : basename(id.uri);
      return `- ${code(id.name)} = ${id.value} — ${escapeMarkdown(where)}:${id.line}`;
    });
    out.push('**firmware constants**\n' + lines.join('\n'));
  }
  if (view.references.length) {
    const lines = view.references.map((ref) => {
      const where = `${escapeMarkdown(options.relativeTo ? relative(options.relativeTo, ref.uri) : basename(ref.uri))}:${ref.line}`;
      const target = options.linkTo?.(ref.uri, ref.line);
      // The link text is escaped; the target is the editor's own file URI, parentheses and spaces encoded.
      const link = target ? `[${where}](${target.replace(/[()\s]/g, (c) => encodeURIComponent(c))})` : where;
      return `- ${code(ref.label)} = ${ref.value} — ${link}`;
    });
    out.push('**from other blocks**\n' + lines.join('\n'));
  }
  if (view.working.length) {
    out.push('**working**\n' + view.working.map((w) => `- ${code(w.formula)}  \n  ${code(w.substituted)}  \n  *${escapeMarkdown(w.source)}*`).join('\n'));
  }
  // Assumptions are the model's own text (ours, with inline code), not the document's: listed as written.
  if (view.assumptions.length) out.push('**assumes**\n' + view.assumptions.map((a) => `- ${a}`).join('\n'));
  for (const f of view.notes) out.push(`${severityMark.info} ${messageMarkdown(f.message)} [${code(f.code)}](${referenceLink(f.code)})`);
  out.push(`[block language reference](${referenceLink('keys')})`);
  return out.join('\n\n');
}
