// Quoted #include: relative to the including file, then the include folders; never outside the workspace roots.
import * as path from 'node:path';

export interface IncludeEnv {
  includeDirs: string[];
  workspaceRoots: string[];
  read: (uri: string) => string | undefined;
  /** When given, a symlink whose target leaves the workspace is not followed. */
  realpath?: (uri: string) => string | undefined;
}

export type IncludeResult =
  | { kind: 'found'; uri: string; text: string }
  | { kind: 'outside'; uri: string }
  | { kind: 'missing'; looked: string[] };

export function isInside(file: string, root: string): boolean {
  const relative = path.relative(path.resolve(root), path.resolve(file));
  return relative === '' || (!relative.startsWith('..') && !path.isAbsolute(relative));
}

export function resolveInclude(fromUri: string, spelled: string, env: IncludeEnv): IncludeResult {
  const roots = env.workspaceRoots;
  const folders = [path.dirname(fromUri), ...env.includeDirs.map((d) => path.resolve(roots[0] ?? path.dirname(fromUri), d))];
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
