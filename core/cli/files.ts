// Which files a check reads: the paths given, folders walked for notes and C-family sources with `.gitignore`
// honoured as git reads it, quoted globs expanded, `--exclude` globs left out.
import * as fs from 'node:fs';
import * as path from 'node:path';
import ignore, { type Ignore } from 'ignore';
import picomatch from 'picomatch';
import { hostOfPath } from '../scan';

const skippedFolders = new Set(['node_modules', '.git', 'out', 'dist', 'build']);

export function isTimingHost(file: string): boolean {
  return hostOfPath(file) !== undefined;
}

export interface CollectOptions {
  /** Globs (picomatch) of files and folders to leave out, relative to the working folder. */
  exclude?: string[];
  /**
   * Globs relative to a folder of their own, for files under it: an editor's `files.exclude` of each workspace
   * folder (`**\/.git`, `build/**`). Matched against the path from that folder only.
   */
  excludeIn?: Array<{ folder: string; globs: string[] }>;
}

/** The patterns an editor's `files.exclude` setting turns on (`true`; a `when` condition is not a plain exclusion). */
export function enabledGlobs(setting: unknown): string[] {
  if (setting === null || typeof setting !== 'object') return [];
  return Object.entries(setting as Record<string, unknown>).filter(([, on]) => on === true).map(([glob]) => glob);
}

/** One folder's ignore rules: git reads `.gitignore` patterns relative to the folder that holds the file. */
interface IgnoreLevel {
  base: string;
  rules: Ignore;
}

function readIgnoreFile(file: string): Ignore | undefined {
  let text: string;
  try {
    text = fs.readFileSync(file, 'utf8');
  } catch {
    return undefined;
  }
  return ignore().add(text);
}

/**
 * The ignore levels above a folder that is walked: the repository's `.git/info/exclude` and the `.gitignore`
 * files from the repository root (the nearest folder holding `.git`) down to the folder's parent. The folder's
 * own `.gitignore` is read by the walk. Outside a repository there are none above it.
 */
function ancestorLevels(folder: string): IgnoreLevel[] {
  if (fs.existsSync(path.join(folder, '.git'))) return infoExclude(folder);
  const chain: string[] = [];
  for (let dir = path.dirname(folder); ; dir = path.dirname(dir)) {
    chain.unshift(dir);
    if (fs.existsSync(path.join(dir, '.git'))) {
      const levels = infoExclude(dir);
      for (const above of chain) {
        const rules = readIgnoreFile(path.join(above, '.gitignore'));
        if (rules) levels.push({ base: above, rules });
      }
      return levels;
    }
    if (path.dirname(dir) === dir) return [];
  }
}

function infoExclude(root: string): IgnoreLevel[] {
  const rules = readIgnoreFile(path.join(root, '.git', 'info', 'exclude'));
  return rules ? [{ base: root, rules }] : [];
}

/** Whether git would ignore `full`: the deepest level that says anything decides (`!pattern` re-includes). */
function ignoredBy(levels: IgnoreLevel[], full: string, isFolder: boolean): boolean {
  let ignored = false;
  for (const level of levels) {
    const relative = path.relative(level.base, full).split(path.sep).join('/');
    if (!relative || relative.startsWith('..')) continue;
    const verdict = level.rules.test(isFolder ? relative + '/' : relative);
    if (verdict.ignored) ignored = true;
    else if (verdict.unignored) ignored = false;
  }
  return ignored;
}

const globCharacters = /[*?[\]{}]/;

/** Whether a path argument is a glob to expand (quoted so the shell left it alone) rather than a name. */
function isGlob(given: string, cwd: string): boolean {
  return globCharacters.test(given) && !fs.existsSync(path.resolve(cwd, given));
}

/** Files under the given paths, sorted; an unreadable path is returned as a problem (exit 2). */
export function collectFiles(paths: string[], cwd: string, options: CollectOptions = {}): { files: string[]; problems: string[] } {
  const files = new Set<string>();
  const problems: string[] = [];
  const byArgument = excluder(options.exclude ?? [], cwd);
  const byFolder = (options.excludeIn ?? []).filter((e) => e.globs.length).map((e) => ({ folder: e.folder, match: picomatch(e.globs, { dot: true }) }));
  const isExcluded = (full: string) =>
    byArgument(full) ||
    byFolder.some(({ folder, match }) => {
      const relative = path.relative(folder, full);
      return relative !== '' && !relative.startsWith('..') && !path.isAbsolute(relative) && match(relative.split(path.sep).join('/'));
    });
  const walker = new Walker(files, isExcluded);
  for (const given of paths) {
    if (isGlob(given, cwd)) {
      const before = files.size;
      expandGlob(given, cwd, walker);
      if (files.size === before) problems.push(`no Markdown or C/C++ file matches ${given}`);
      continue;
    }
    const full = path.resolve(cwd, given);
    let stat: fs.Stats;
    try {
      stat = fs.statSync(full);
    } catch {
      problems.push(`cannot read ${given}: no such file or folder`);
      continue;
    }
    // A path named on the command line is read even when git ignores it; --exclude still applies.
    if (stat.isDirectory()) walker.walk(full, ancestorLevels(full));
    else if (stat.isFile() && isTimingHost(full)) {
      if (!isExcluded(full)) files.add(full);
    } else if (stat.isFile()) problems.push(`cannot check ${given}: not a Markdown (.md .markdown) or C/C++ (.c .h .cc .cpp .cxx .hpp .hh) file`);
    else problems.push(`cannot read ${given}: not a file or folder`);
  }
  return { files: [...files].sort(), problems };
}

/**
 * `--exclude` globs: one with a `/` matches the path relative to the working folder; one without matches a
 * file or folder name at any depth (`vendor`, `*.gen.h`), as a `.gitignore` line does.
 */
function excluder(globs: string[], cwd: string): (full: string) => boolean {
  if (globs.length === 0) return () => false;
  const byPath = globs.filter((g) => g.includes('/')).map((g) => g.replace(/^\.\//, ''));
  const byName = globs.filter((g) => !g.includes('/'));
  const pathMatch = byPath.length ? picomatch(byPath, { dot: true }) : () => false;
  const nameMatch = byName.length ? picomatch(byName, { dot: true }) : () => false;
  return (full) => {
    const relative = path.relative(cwd, full).split(path.sep).join('/');
    return relative !== '' && (pathMatch(relative) || nameMatch(path.basename(full)));
  };
}

/** A quoted glob: the folder before its first wildcard is walked, and the files the glob matches are kept. */
function expandGlob(glob: string, cwd: string, walker: Walker): void {
  const pattern = glob.split(path.sep).join('/');
  const { base } = picomatch.scan(pattern);
  const folder = path.resolve(cwd, base || '.');
  if (!isFolder(folder)) return;
  const matches = picomatch(pattern, { dot: false });
  const absolute = path.isAbsolute(pattern);
  walker.walk(folder, ancestorLevels(folder), (full) => matches(absolute ? full.split(path.sep).join('/') : path.relative(cwd, full).split(path.sep).join('/')));
}

function isFolder(dir: string): boolean {
  try {
    return fs.statSync(dir).isDirectory();
  } catch {
    return false;
  }
}

class Walker {
  constructor(
    private readonly into: Set<string>,
    private readonly excluded: (full: string) => boolean,
  ) {}

  walk(folder: string, levels: IgnoreLevel[], keep: (full: string) => boolean = () => true): void {
    let entries: fs.Dirent[];
    try {
      entries = fs.readdirSync(folder, { withFileTypes: true });
    } catch {
      return;
    }
    const own = readIgnoreFile(path.join(folder, '.gitignore'));
    const here = own ? [...levels, { base: folder, rules: own }] : levels;
    for (const entry of entries) {
      if (entry.name.startsWith('.') || skippedFolders.has(entry.name)) continue;
      const full = path.join(folder, entry.name);
      // Links are not followed: a link could lead out of the folder being checked.
      if (entry.isDirectory()) {
        if (ignoredBy(here, full, true) || this.excluded(full)) continue;
        this.walk(full, here, keep);
      } else if (entry.isFile() && isTimingHost(entry.name)) {
        if (ignoredBy(here, full, false) || this.excluded(full) || !keep(full)) continue;
        this.into.add(path.resolve(full));
      }
    }
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
