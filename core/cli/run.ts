// A check over files: each read once, analysed with the same engine the editor uses.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { analyzeWorkspace, defaultAnalyzeOptions, FirmwareCache, tooLargeAnalysis, type AnalyzeOptions } from '../analyze';
import { DEFAULT_MAX_HEADER_BYTES } from '../c';
import type { DocumentAnalysis, TextDocumentLike } from '../types';
import { lineStarts } from '../scan/lines';
import { languageOf, readText, realPath, sizeOf } from './files';

export interface CheckedFile {
  file: string;
  display: string;
  text: string;
  starts: number[];
  analysis: DocumentAnalysis;
}

export function cliOptions(overrides: Partial<AnalyzeOptions>): AnalyzeOptions {
  const base: AnalyzeOptions = { ...defaultAnalyzeOptions, read: () => undefined, ...overrides };
  // Headers have their own limit; the preprocessor says which one a file broke, at its #include.
  const readLimit = Math.max(base.maxFileBytes, base.maxHeaderBytes ?? DEFAULT_MAX_HEADER_BYTES);
  // One cache for the run: a header shared by many files is read and preprocessed once.
  return { ...base, read: overrides.read ?? ((file) => readText(file, readLimit)), realpath: overrides.realpath ?? realPath, firmware: overrides.firmware ?? new FirmwareCache() };
}

/**
 * Every file read first, then analysed together: `@name` references resolve across all of them. `given`: texts
 * already in hand (standard input under its `--stdin-name`), read instead of the disk.
 */
export function checkFiles(files: string[], options: AnalyzeOptions, display: (file: string) => string, given?: ReadonlyMap<string, string>): CheckedFile[] {
  const readable: TextDocumentLike[] = [];
  const tooLarge = new Set<string>();
  for (const file of files) {
    const held = given?.get(file);
    // A file above the size setting is not read at all: one notice, as the editor gives.
    if ((held === undefined ? sizeOf(file) : Buffer.byteLength(held)) > options.maxFileBytes) tooLarge.add(file);
    else readable.push({ uri: file, text: held ?? readText(file, options.maxFileBytes) ?? '', languageId: languageOf(file) });
  }
  const analyses = new Map(analyzeWorkspace(readable, options).map((a) => [a.uri, a]));
  const texts = new Map(readable.map((d) => [d.uri, d.text]));
  const checked: CheckedFile[] = [];
  for (const file of files) {
    if (tooLarge.has(file)) {
      checked.push({ file, display: display(file), text: '', starts: [0], analysis: tooLargeAnalysis(file, options) });
      continue;
    }
    const analysis = analyses.get(file)!;
    const text = texts.get(file) ?? '';
    if (analysis.blocks.length === 0 && analysis.findings.length === 0) continue;
    // Line starts only for a file with something to locate: a clean file is never walked twice.
    let starts: number[] | undefined;
    checked.push({ file, display: display(file), text, get starts() { return (starts ??= lineStarts(text)); }, analysis });
  }
  return checked;
}

/** Workspace roots for a CLI run: the working folder and every folder named on the command line. */
export function rootsFor(paths: string[], includeDirs: string[], cwd: string): string[] {
  // A file given by itself brings its folder: the header beside it is part of the same project.
  const folders = paths.map((p) => (isFile(p) ? path.dirname(path.resolve(p)) : path.resolve(p)));
  return [...new Set([cwd, ...folders, ...includeDirs.map((d) => path.resolve(d))])];
}

function isFile(file: string): boolean {
  try {
    return fs.statSync(file).isFile();
  } catch {
    return false;
  }
}
