// What firmware reading shares between documents and passes: files read once per version, the compile
// database, and each file's build configuration (its own entry, or that of a translation unit including it).
import * as path from '../paths';
import type { BuildConfig, CompileDatabase, MacroFlag } from '../c/config';
import { parseCompileDatabase } from '../c/config';
import { isInside } from '../paths';
import type { HeaderMemo } from '../c/memo';

/** The settings the build configuration is read with: a part of AnalyzeOptions (core/analyze/context.ts). */
export interface FirmwareOptions {
  read: (path: string) => string | undefined;
  version?: (path: string) => string | undefined;
  workspaceRoots: string[];
  compileCommands?: string[];
  macros?: MacroFlag[];
  macrosOrigin?: string;
  trusted?: boolean;
}

/** Where compile_commands.json is looked for in each workspace folder when none is named. */
export const DATABASE_PLACES = ['compile_commands.json', path.join('build', 'compile_commands.json')];

const MAX_INDEXED_FILES = 5000;
const INCLUDE_LINE = /^[ \t]*#[ \t]*include[ \t]*([<"])([^>"\n]+)[>"]/gm;

interface CachedText { version: string | undefined; text: string | undefined }

/**
 * Kept by the editor, the language server or a CLI run for as long as files may be asked for again. Without
 * `version` in the options a file is read once for the cache's life (a CLI run).
 */
export class FirmwareCache {
  private texts = new Map<string, CachedText>();
  private databases = new Map<string, { text: string; db: CompileDatabase }>();
  private includers?: { key: string; map: Map<string, BuildConfig> };
  /** Preprocessed headers (core/c/memo.ts), shared by every table built through this cache. */
  readonly headers: HeaderMemo = new Map();

  /** Reads through the cache: a file whose version is unchanged is not read again. */
  read(uri: string, options: Pick<FirmwareOptions, 'read' | 'version'>): string | undefined {
    const version = options.version?.(uri);
    const known = this.texts.get(uri);
    if (known && (options.version === undefined || (version !== undefined && known.version === version))) return known.text;
    const text = options.read(uri);
    this.texts.set(uri, { version, text });
    return text;
  }

  /** The compile databases in effect: those named, else those found at each workspace folder's root or build/. */
  private loadDatabases(options: FirmwareOptions): { dbs: CompileDatabase[]; problems: string[] } {
    const named = options.compileCommands ?? [];
    const candidates = named.length ? named : options.workspaceRoots.flatMap((root) => DATABASE_PLACES.map((p) => path.join(root, p)));
    const dbs: CompileDatabase[] = [];
    const problems: string[] = [];
    for (const file of candidates) {
      const text = this.read(file, options);
      if (text === undefined) {
        if (named.length) problems.push(`cannot read the compile database ${file}`);
        continue;
      }
      let known = this.databases.get(file);
      if (!known || known.text !== text) {
        known = { text, db: parseCompileDatabase(text, file, shortPath(file, options.workspaceRoots)) };
        this.databases.set(file, known);
      }
      dbs.push(known.db);
      problems.push(...known.db.problems);
    }
    return { dbs, problems };
  }

  /**
   * The build configuration of `file`: its compile database entry, else the entry of a translation unit that
   * includes it; -D / -U from the command line or settings on top. Undefined when neither applies.
   */
  configFor(file: string, options: FirmwareOptions): { config?: BuildConfig; problems: string[] } {
    const { dbs, problems } = this.loadDatabases(options);
    let base: BuildConfig | undefined;
    for (const db of dbs) {
      base = db.entries.get(path.resolve(file));
      if (base) break;
    }
    if (!base && dbs.some((db) => db.entries.size)) base = this.includerConfig(file, dbs, options);
    const macros: MacroFlag[] = options.macros ?? [];
    if (!base && macros.length === 0) return { problems };
    const config: BuildConfig = base
      ? { ...base, macros: [...base.macros, ...macros], origin: macros.length ? `${base.origin} and ${macroOrigin(options)}` : base.origin }
      : { macros, dirs: { quote: [], include: [], system: [], extraRoots: [] }, forcedIncludes: [], origin: macroOrigin(options) };
    // Folders outside the workspace are read only where the workspace is trusted (the CLI always is).
    if (options.trusted === false) config.dirs = { ...config.dirs, extraRoots: [] };
    return { config, problems };
  }

  /** Header → the configuration of the first translation unit (in database order) whose includes reach it. */
  private includerConfig(file: string, dbs: CompileDatabase[], options: FirmwareOptions): BuildConfig | undefined {
    const key = dbs.map((db) => [...db.entries.keys()].join('\n')).join('\n\n');
    if (this.includers?.key !== key) {
      const map = new Map<string, BuildConfig>();
      let budget = MAX_INDEXED_FILES;
      for (const db of dbs) {
        for (const [unit, config] of db.entries) {
          const queue = [unit];
          const seen = new Set(queue);
          while (queue.length && budget-- > 0) {
            const current = queue.shift() as string;
            const text = this.read(current, options);
            if (text === undefined) continue;
            for (const m of text.matchAll(INCLUDE_LINE)) {
              const spelled = m[2].trim();
              const folders = m[1] === '<' ? [...config.dirs.include, ...config.dirs.system] : [path.dirname(current), ...config.dirs.quote, ...config.dirs.include];
              for (const folder of folders) {
                const candidate = path.resolve(folder, spelled);
                if (seen.has(candidate)) break;
                const roots = options.trusted === false ? options.workspaceRoots : [...options.workspaceRoots, ...config.dirs.extraRoots];
                if (!roots.some((r) => isInside(candidate, r))) continue;
                if (this.read(candidate, options) === undefined) continue;
                seen.add(candidate);
                queue.push(candidate);
                if (!map.has(candidate)) map.set(candidate, config);
                break;
              }
            }
          }
        }
      }
      this.includers = { key, map };
    }
    return this.includers.map.get(path.resolve(file));
  }
}

function macroOrigin(options: FirmwareOptions): string {
  return options.macrosOrigin ?? '-D / -U';
}

function shortPath(file: string, roots: string[]): string {
  for (const root of roots) {
    const relative = path.relative(root, file);
    if (relative && !relative.startsWith('..') && !path.isAbsolute(relative)) return relative;
  }
  return file;
}
