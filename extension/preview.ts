// The built-in Markdown preview shows each ```timing fence as a table of its computed results, its findings
// and a small waveform, with the block's own text folded underneath. Everything from the note is escaped.
import type MarkdownItConstructor = require('markdown-it');
import * as vscode from 'vscode';
import { firmwareEntry } from '../core/analyze/keys';
import type { BlockAnalysis } from '../core/types';
import type { AnalysisStore } from './analysisStore';
import { analyzeDocument, blockView, renderWaveformSvg, waveformFor } from './engine';
import { cautionMark, severityMark, severityWord } from '../core/present/marks';
import { readSettings } from './settings';

// The typings export the constructor only; the instance type is what it builds.
export type MarkdownIt = InstanceType<typeof MarkdownItConstructor>;
type RenderRule = NonNullable<MarkdownIt['renderer']['rules']['fence']>;

/** The fence as the preview sees it, and where it came from when the preview knows the note. */
export interface TimingFence {
  info: string;
  content: string;
  /** 0-based line of the opening fence in the note. */
  line?: number;
  document?: vscode.TextDocument;
}

export interface PreviewBlock {
  analysis?: BlockAnalysis;
  /** Said in the table when the answer is partial (no note to resolve `firmware:` against). */
  note?: string;
}

export function isTimingInfo(info: string): boolean {
  return /^timing(\s|$)/.test(info.trim());
}

/**
 * The fence's block from the note's own analysis (the numbers lens and hover show). Without the note (text
 * rendered on its own) the fence is analysed alone, and a `firmware:` file cannot be read.
 */
export function previewBlockOf(store: AnalysisStore, fence: TimingFence): PreviewBlock {
  const name = fence.info.trim().slice('timing'.length).trim().split(/\s+/)[0] || undefined;
  if (fence.document) {
    const blocks = store.analysisOf(fence.document).blocks;
    const sameName = (b: BlockAnalysis) => name === undefined || b.name === name;
    const found = blocks.find((b) => b.line === (fence.line ?? -2) + 1 && sameName(b)) ?? (name ? blocks.find((b) => b.name === name) : undefined);
    if (found) return { analysis: found };
  }
  // A fence longer than any backtick run inside, so the block's own text cannot close it early.
  const marker = '`'.repeat(Math.max(3, ...(fence.content.match(/`+/g) ?? []).map((run) => run.length + 1)));
  const text = marker + fence.info + '\n' + fence.content + (fence.content.endsWith('\n') ? '' : '\n') + marker + '\n';
  const settings = readSettings();
  const analysis = analyzeDocument({ uri: 'untitled:preview.md', text, languageId: 'markdown' }, {
    defaultTolerance: settings.defaultTolerancePercent / 100,
    defaultSeries: settings.defaultSeries,
    dataModel: settings.dataModel,
    includeDirs: [],
    workspaceRoots: [],
    read: () => undefined,
    maxFileBytes: settings.maxSizeKB * 1024,
  }).blocks[0];
  const usesFirmware = firmwareEntry(analysis.block.entries) !== undefined;
  return { analysis, note: usesFirmware ? 'Rendered without its note: the firmware file named by firmware: is not read here.' : undefined };
}

export function renderTimingBlock(md: MarkdownIt, block: PreviewBlock, fence: TimingFence): string {
  const esc = md.utils.escapeHtml;
  const analysis = block.analysis;
  // The presented block (core/present/view.ts), the same the hover and the panel show.
  const view = analysis ? blockView(analysis) : undefined;
  const out: string[] = ['<div class="tickmark-block">'];
  const title = view?.modelled ? ` — ${esc(view.title)}` : '';
  out.push(`<table class="tickmark-results"><caption><strong>${esc(view?.name ?? 'timing block')}</strong>${title}</caption>`);
  if (view && (view.results.length > 0 || view.solved.length > 0 || view.references.length > 0)) {
    const header = ['result', 'value', 'worst case', ...(view.hasPercentiles ? ['1–99 % of samples'] : [])];
    out.push(`<thead><tr>${header.map((h) => `<th>${esc(h)}</th>`).join('')}</tr></thead><tbody>`);
    const cells = (texts: string[]) => `<tr>${texts.map((t) => `<td>${esc(t)}</td>`).join('')}</tr>`;
    for (const row of view.results) out.push(cells([row.label, row.value, row.worstCase, ...(view.hasPercentiles ? [row.percentiles] : [])]));
    for (const row of view.solved) out.push(cells([`solved ${row.key}`, row.value, '', ...(view.hasPercentiles ? [''] : [])]));
    // Values read from other blocks, as values, with the block they come from.
    for (const ref of view.references) out.push(cells([`from ${ref.label}`, ref.value, '', ...(view.hasPercentiles ? [''] : [])]));
    out.push('</tbody>');
  }
  out.push('</table>');
  if (view && (view.problems.length || view.cautions.length || view.notes.length)) {
    out.push('<ul class="tickmark-findings">');
    // Cautions lead, as in the hover: a hazardous voltage or a watchdog matters more than the third decimal.
    for (const caution of view.cautions) out.push(`<li>${cautionMark} Caution: ${esc(caution)}</li>`);
    for (const f of [...view.problems, ...view.notes]) out.push(`<li>${severityMark[f.severity]} ${esc(severityWord[f.severity])}: ${esc(f.message)}</li>`);
    out.push('</ul>');
  }
  if (!analysis) out.push('<p><em>No timing block could be read from this fence.</em></p>');
  if (block.note) out.push(`<p><em>${esc(block.note)}</em></p>`);
  const wave = analysis ? waveformFor(analysis) : undefined;
  // The core's SVG escapes every text it carries and holds no script or outside reference.
  if (wave && analysis) out.push(`<div class="tickmark-wave">${fluid(renderWaveformSvg(wave, { title: analysis.name, theme: 'currentColor', width: 520, height: 260 }))}</div>`);
  out.push(`<details><summary>block text</summary><pre><code>${esc('```' + fence.info + '\n' + fence.content + '```')}</code></pre></details>`);
  out.push('</div>');
  return out.join('\n');
}

/** The preview column may be narrower than the drawing: scale it to the width, keeping its aspect (viewBox). */
function fluid(svg: string): string {
  return svg.replace(/^<svg ([^>]*?)width="\d+" height="\d+"/, '<svg $1width="100%"');
}

/** The note being previewed: VS Code's preview puts its URI in markdown-it's env as `currentDocument`. */
function documentOf(env: unknown): vscode.TextDocument | undefined {
  const current = (env as { currentDocument?: unknown } | undefined)?.currentDocument;
  if (!(current instanceof vscode.Uri)) return undefined;
  return vscode.workspace.textDocuments.find((doc) => doc.uri.toString() === current.toString());
}

/** Installs the fence rule; other fences keep the renderer they had. */
export function timingPreviewPlugin(md: MarkdownIt, store: AnalysisStore): MarkdownIt {
  const fallback: RenderRule = md.renderer.rules.fence ?? ((tokens, idx, options, env, self) => self.renderToken(tokens, idx, options));
  md.renderer.rules.fence = (tokens, idx, options, env, self) => {
    const token = tokens[idx];
    if (!isTimingInfo(token.info)) return fallback(tokens, idx, options, env, self);
    const fence: TimingFence = { info: token.info.trim(), content: token.content, line: token.map?.[0], document: documentOf(env) };
    let html: string;
    try {
      html = renderTimingBlock(md, previewBlockOf(store, fence), fence);
    } catch (cause) {
      // A preview must still render: show the block as written, with the reason.
      html = `<p><em>Tickmark could not compute this block: ${md.utils.escapeHtml(cause instanceof Error ? cause.message : String(cause))}</em></p>${fallback(tokens, idx, options, env, self)}`;
    }
    // The preview's own attributes (data-line for scroll sync) stay on the outer element.
    return `<div${self.renderAttrs(token)}>${html}</div>\n`;
  };
  return md;
}
