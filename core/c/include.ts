// #include lookup in gcc's order (gcc manual, "Search Path", from memory): `"…"` searches the including file's
// folder, then -iquote, then -I; `<…>` searches -I, then -isystem. The include settings come last for both.
// A path is read only inside an allowed root: the workspace, plus the folders the build configuration names.
import * as path from '../paths';
import { isInside } from '../paths';

export interface IncludeEnv {
  /** Include folders from the settings or `--include`, searched for both forms after the build's own. */
  includeDirs: string[];
  workspaceRoots: string[];
  read: (uri: string) => string | undefined;
  /** When given, a symlink whose target leaves the allowed roots is not followed. */
  realpath?: (uri: string) => string | undefined;
}

/** The folders of one file's build configuration (absolute), in command-line order. */
export interface SearchDirs {
  quote: string[];
  include: string[];
  system: string[];
  /** Roots outside the workspace the configuration may read (its folders; only in a trusted workspace). */
  extraRoots: string[];
}

export const noSearchDirs: SearchDirs = { quote: [], include: [], system: [], extraRoots: [] };

export type IncludeResult =
  | { kind: 'found'; uri: string; text: string }
  | { kind: 'outside'; uri: string }
  | { kind: 'missing'; looked: string[] };

export function resolveInclude(fromUri: string, spelled: string, env: IncludeEnv, dirs: SearchDirs = noSearchDirs, angled = false): IncludeResult {
  const roots = [...env.workspaceRoots, ...dirs.extraRoots];
  const settings = env.includeDirs.map((d) => path.resolve(env.workspaceRoots[0] ?? path.dirname(fromUri), d));
  const folders = angled
    ? [...dirs.include, ...dirs.system, ...settings]
    : [path.dirname(fromUri), ...dirs.quote, ...dirs.include, ...settings];
  const looked: string[] = [];
  let outside: string | undefined;
  for (const folder of folders) {
    const candidate = path.resolve(folder, spelled);
    if (!roots.some((r) => isInside(candidate, r))) { outside ??= candidate; continue; }
    const real = env.realpath ? env.realpath(candidate) : candidate;
    if (real !== undefined && !roots.some((r) => isInside(real, r) || isInside(real, env.realpath?.(r) ?? r))) { outside ??= candidate; continue; }
    looked.push(candidate);
    const text = env.read(candidate);
    if (text !== undefined) return { kind: 'found', uri: candidate, text };
  }
  if (outside !== undefined) return { kind: 'outside', uri: outside };
  return { kind: 'missing', looked };
}
