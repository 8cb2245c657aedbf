// A file's build configuration: the -D, -U, -I, -iquote, -isystem, -include and -std flags the compiler gets,
// read from a compile_commands.json entry (the JSON Compilation Database format CMake, Bear and PlatformIO
// write) and from the command line or settings on top.
import * as path from '../paths';
import type { SearchDirs } from './include';

export type MacroFlag = { kind: 'define'; name: string; value: string } | { kind: 'undef'; name: string };

export interface BuildConfig {
  /** -D and -U in command-line order (a later one wins, as in gcc). */
  macros: MacroFlag[];
  dirs: SearchDirs;
  /** -include / -imacros files, read before the file itself. */
  forcedIncludes: string[];
  std?: string;
  /** Where the configuration came from, for messages (`build/compile_commands.json`, `-D on the command line`). */
  origin: string;
}

const NAME = /^[A-Za-z_$][\w$]*$/;

/** `NAME`, `NAME=VALUE` (a -D) or `NAME` (a -U); a problem text when the name is not an identifier. */
export function parseMacroFlag(text: string, kind: 'define' | 'undef'): MacroFlag | string {
  const eq = text.indexOf('=');
  const name = kind === 'define' && eq >= 0 ? text.slice(0, eq) : text;
  // gcc reads `-D NAME(args)=body` as a function-like macro; the name is what comes before '('.
  const bare = name.replace(/\(.*$/, '');
  if (!NAME.test(bare)) return `\`${text}\` is not a macro name${kind === 'define' ? ' (NAME or NAME=VALUE)' : ''}`;
  if (kind === 'undef') return { kind, name };
  // -D NAME alone defines it as 1 (gcc manual, "Preprocessor Options").
  return { kind, name, value: eq >= 0 ? text.slice(eq + 1) : '1' };
}

/** Splits a command line as a POSIX shell would for plain words, quotes and backslashes (no expansion). */
export function splitCommand(command: string): string[] {
  const words: string[] = [];
  let word = '';
  let started = false;
  let quote: '"' | "'" | undefined;
  for (let i = 0; i < command.length; i++) {
    const c = command[i];
    if (quote === "'") { if (c === "'") quote = undefined; else word += c; continue; }
    if (quote === '"') {
      if (c === '"') quote = undefined;
      else if (c === '\\' && i + 1 < command.length && '"\\$`'.includes(command[i + 1])) word += command[++i];
      else word += c;
      continue;
    }
    if (c === '"' || c === "'") { quote = c; started = true; continue; }
    if (c === '\\' && i + 1 < command.length) { word += command[++i]; started = true; continue; }
    if (c === ' ' || c === '\t' || c === '\n' || c === '\r') {
      if (started) words.push(word);
      word = '';
      started = false;
      continue;
    }
    word += c;
    started = true;
  }
  if (started) words.push(word);
  return words;
}

/** The preprocessor flags of one compiler invocation; paths resolve against `directory`. */
export function configFromArguments(args: string[], directory: string, origin: string): BuildConfig {
  const config: BuildConfig = { macros: [], dirs: { quote: [], include: [], system: [], extraRoots: [] }, forcedIncludes: [], origin };
  const dir = (p: string) => path.resolve(directory, p);
  // Flags that take a value, attached (`-DX`, `-Idir`) or as the next word (`-D X`, `-isystem dir`).
  const withValue: Array<[string, (v: string) => void]> = [
    ['-isystem', (v) => config.dirs.system.push(dir(v))],
    ['-iquote', (v) => config.dirs.quote.push(dir(v))],
    ['-imacros', (v) => config.forcedIncludes.push(dir(v))],
    ['-include', (v) => config.forcedIncludes.push(dir(v))],
    ['-D', (v) => { const m = parseMacroFlag(v, 'define'); if (typeof m !== 'string') config.macros.push(m); }],
    ['-U', (v) => { const m = parseMacroFlag(v, 'undef'); if (typeof m !== 'string') config.macros.push(m); }],
    ['-I', (v) => config.dirs.include.push(dir(v))],
  ];
  for (let i = 1; i < args.length; i++) {
    const a = args[i];
    if (a.startsWith('-std=')) { config.std = a.slice(5); continue; }
    if (a === '--include' && i + 1 < args.length) { config.forcedIncludes.push(dir(args[++i])); continue; }
    for (const [flag, take] of withValue) {
      if (!a.startsWith(flag)) continue;
      if (a.length > flag.length) take(a.slice(flag.length));
      else if (i + 1 < args.length) take(args[++i]);
      break;
    }
  }
  const all = [...config.dirs.quote, ...config.dirs.include, ...config.dirs.system, ...config.forcedIncludes.map((f) => path.dirname(f))];
  config.dirs.extraRoots = [...new Set(all)];
  return config;
}

export interface CompileDatabase {
  /** Absolute source path → its configuration. The first entry for a file wins (a file built twice). */
  entries: Map<string, BuildConfig>;
  /** Entries that could not be read, as messages. */
  problems: string[];
}

/** Parses compile_commands.json text; never throws. */
export function parseCompileDatabase(text: string, databasePath: string, displayPath = databasePath): CompileDatabase {
  const db: CompileDatabase = { entries: new Map(), problems: [] };
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    db.problems.push(`${displayPath} is not valid JSON (${(e as Error).message})`);
    return db;
  }
  if (!Array.isArray(parsed)) {
    db.problems.push(`${displayPath} must hold a JSON array of compile commands`);
    return db;
  }
  const base = path.dirname(databasePath);
  parsed.forEach((entry: unknown, index) => {
    const e = entry as { directory?: unknown; file?: unknown; command?: unknown; arguments?: unknown };
    const args = Array.isArray(e?.arguments) && e.arguments.every((a) => typeof a === 'string') ? (e.arguments as string[])
      : typeof e?.command === 'string' ? splitCommand(e.command) : undefined;
    if (typeof e?.file !== 'string' || !args) {
      db.problems.push(`${displayPath}: entry ${index + 1} needs "file" and "command" or "arguments"`);
      return;
    }
    const directory = path.resolve(base, typeof e.directory === 'string' ? e.directory : '.');
    const file = path.resolve(directory, e.file);
    if (!db.entries.has(file)) db.entries.set(file, configFromArguments(args, directory, displayPath));
  });
  return db;
}
