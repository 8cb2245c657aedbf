// Builds the core's options for one document: settings, workspace roots, and a reader that serves
// unsaved editor buffers before the disk, so a header edit counts before it is saved.
import * as fs from 'node:fs';
import * as path from 'node:path';
import * as vscode from 'vscode';
import type { AnalyzeOptions } from './engine';
import { findOpenDocument } from './documents';
import type { TickmarkSettings } from './settings';
import { FirmwareCache } from '../core/analyze/firmware';
import { firmwareOptions } from '../core/analyze/settings';

/** `target` is the document (open or read from disk by the workspace check) or its uri. */
export function analyzeOptionsFor(target: vscode.Uri | { readonly uri: vscode.Uri }, settings: TickmarkSettings): AnalyzeOptions {
  const uri = target instanceof vscode.Uri ? target : target.uri;
  const roots = (vscode.workspace.workspaceFolders ?? []).filter((f) => f.uri.scheme === 'file').map((f) => f.uri.fsPath);
  const ownRoot = vscode.workspace.getWorkspaceFolder(uri);
  const base = ownRoot?.uri.scheme === 'file' ? ownRoot.uri.fsPath : roots[0];
  const maxFileBytes = settings.maxSizeKB * 1024;
  const firmware = firmwareOptions(settings.firmware, base);
  // Headers have their own limit; the core says which limit a file broke, at its #include.
  const readLimit = Math.max(maxFileBytes, firmware.maxHeaderBytes ?? 0);
  return {
    ...firmware,
    firmware: firmwareCache,
    version: fileVersion,
    defaultTolerance: settings.defaultTolerancePercent / 100,
    defaultSeries: settings.defaultSeries,
    dataModel: settings.dataModel,
    includeDirs: settings.includeFolders.map((dir) => (path.isAbsolute(dir) || base === undefined ? dir : path.join(base, dir))),
    workspaceRoots: roots,
    read: (file) => readServingBuffers(file, readLimit),
    realpath: (file) => {
      try {
        return fs.realpathSync(file);
      } catch {
        return undefined;
      }
    },
    maxFileBytes,
  };
}

/** One cache for the window: a header shared by documents is read and preprocessed once per version. */
const firmwareCache = new FirmwareCache();

/** An open buffer's version, else the file's size and time on disk: a header unchanged since is not read again. */
function fileVersion(file: string): string | undefined {
  const open = findOpenDocument(file);
  if (open) return `open:${open.version}`;
  try {
    const stat = fs.statSync(file);
    return `${stat.size}:${stat.mtimeMs}`;
  } catch {
    return undefined;
  }
}

function readServingBuffers(file: string, maxFileBytes: number): string | undefined {
  const open = findOpenDocument(file);
  if (open) {
    // tickmark.files.maxSizeKB holds for an unsaved buffer as for the file on disk: the limit is in bytes.
    const text = open.getText();
    return Buffer.byteLength(text, 'utf8') > maxFileBytes ? undefined : text;
  }
  try {
    if (fs.statSync(file).size > maxFileBytes) return undefined;
    return fs.readFileSync(file, 'utf8');
  } catch {
    return undefined;
  }
}
