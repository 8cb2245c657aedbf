// Which files a check reads: the paths given, folders walked for notes and C-family sources.
import * as fs from 'node:fs';
import * as path from 'node:path';

const extensions = new Set(['.md', '.markdown', '.c', '.h', '.cc', '.cpp', '.cxx', '.hpp', '.hh']);
const skippedFolders = new Set(['node_modules', '.git', 'out', 'dist', 'build']);

export function isTimingHost(file: string): boolean {
  return extensions.has(path.extname(file).toLowerCase());
}

/** Files under the given paths, sorted; an unreadable path is returned as a problem (exit 2). */
export function collectFiles(paths: string[], cwd: string): { files: string[]; problems: string[] } {
  const files = new Set<string>();
  const problems: string[] = [];
  for (const given of paths) {
    const full = path.resolve(cwd, given);
    let stat: fs.Stats;
    try {
      stat = fs.statSync(full);
    } catch {
      problems.push(`cannot read ${given}: no such file or folder`);
      continue;
    }
    if (stat.isDirectory()) walk(full, files);
    else if (stat.isFile() && isTimingHost(full)) files.add(full);
    else if (stat.isFile()) problems.push(`cannot check ${given}: not a Markdown (.md .markdown) or C/C++ (.c .h .cc .cpp .cxx .hpp .hh) file`);
    else problems.push(`cannot read ${given}: not a file or folder`);
  }
  return { files: [...files].sort(), problems };
}

function walk(folder: string, into: Set<string>): void {
  let entries: fs.Dirent[];
  try {
    entries = fs.readdirSync(folder, { withFileTypes: true });
  } catch {
    return;
  }
  for (const entry of entries) {
    if (entry.name.startsWith('.') || skippedFolders.has(entry.name)) continue;
    const full = path.join(folder, entry.name);
    // Links are not followed: a link could lead out of the folder being checked.
    if (entry.isDirectory()) walk(full, into);
    else if (entry.isFile() && isTimingHost(entry.name)) into.add(path.resolve(full));
  }
}

/** Reads a file as UTF-8, or undefined when it cannot be read or exceeds the limit. */
export function readText(file: string, maxBytes: number): string | undefined {
  try {
    const stat = fs.statSync(file);
    if (!stat.isFile() || stat.size > maxBytes) return undefined;
    return fs.readFileSync(file, 'utf8');
  } catch {
    return undefined;
  }
}

/** Size in bytes, 0 when the file cannot be stat'ed (reading it then reports the problem). */
export function sizeOf(file: string): number {
  try {
    return fs.statSync(file).size;
  } catch {
    return 0;
  }
}

export function realPath(file: string): string | undefined {
  try {
    return fs.realpathSync(file);
  } catch {
    return undefined;
  }
}

export function languageOf(file: string): string {
  const ext = path.extname(file).toLowerCase();
  if (ext === '.md' || ext === '.markdown') return 'markdown';
  if (ext === '.c' || ext === '.h') return 'c';
  return 'cpp';
}

/** Paths as printed: relative to the working folder, with forward slashes. */
export function displayPath(file: string, cwd: string): string {
  const relative = path.relative(cwd, file);
  return (relative && !relative.startsWith('..') ? relative : file).split(path.sep).join('/');
}
