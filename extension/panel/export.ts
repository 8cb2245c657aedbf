// Export of the panel's waveform as a standalone SVG file: the one write, to a path the user picks.
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { BlockAnalysis } from '../../core/types';
import { circuitModel, defaultCycles, renderWaveformSvg, waveformFor } from '../engine';

/** A saved file has no editor around it, so it takes a fixed palette matching the current theme. */
function fileTheme(): 'light' | 'dark' {
  const kind = vscode.window.activeColorTheme.kind;
  return kind === vscode.ColorThemeKind.Dark || kind === vscode.ColorThemeKind.HighContrast ? 'dark' : 'light';
}

export function waveformSvgFor(analysis: BlockAnalysis, theme: 'light' | 'dark', cycles = defaultCycles): string | undefined {
  const wave = waveformFor(analysis, cycles);
  if (!wave) return undefined;
  const title = circuitModel(analysis.circuit)?.title;
  return renderWaveformSvg(wave, { title: title ? `${analysis.name} — ${title}` : analysis.name, theme });
}

/** A file name from a block name: path separators and characters file systems refuse become '-'. */
export function svgFileName(blockName: string): string {
  const safe = blockName.replace(/[\\/:*?"<>|\u0000-\u001f]+/g, '-').replace(/^[.\s-]+|[.\s]+$/g, '');
  return `${safe || 'waveform'}.svg`;
}

export async function exportWaveformSvg(doc: vscode.TextDocument, analysis: BlockAnalysis): Promise<vscode.Uri | undefined> {
  const svg = waveformSvgFor(analysis, fileTheme());
  if (!svg) {
    void vscode.window.showWarningMessage(`Tickmark: ${analysis.name} has no waveform to export.`);
    return undefined;
  }
  const folder = doc.uri.scheme === 'file' ? vscode.Uri.file(path.dirname(doc.uri.fsPath)) : undefined;
  const target = await vscode.window.showSaveDialog({
    title: `Export the waveform of ${analysis.name}`,
    defaultUri: folder ? vscode.Uri.joinPath(folder, svgFileName(analysis.name)) : undefined,
    filters: { 'SVG image': ['svg'] },
    saveLabel: 'Export',
  });
  if (!target) return undefined;
  await vscode.workspace.fs.writeFile(target, new TextEncoder().encode(svg + '\n'));
  return target;
}
