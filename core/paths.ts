// File paths as the core handles them, without Node: the core runs in an editor, a language server, a worker or a
// browser alike. Paths are absolute file-system paths (POSIX `/a/b`, Windows `C:\a\b` or `\\server\share`);
// `/` and `\` both separate on Windows-style paths, only `/` on POSIX ones. Results keep the input's separator.

const drive = /^[A-Za-z]:[\\/]/;
const unc = /^\\\\[^\\/]+[\\/][^\\/]+/;

function isWindowsStyle(p: string): boolean {
  return drive.test(p) || unc.test(p) || (p.includes('\\') && !p.includes('/'));
}

function separatorOf(p: string): string {
  return isWindowsStyle(p) && !p.includes('/') ? '\\' : '/';
}

/** The root of an absolute path (`/`, `C:\`, `\\server\share\`), or '' for a relative one. */
function rootOf(p: string): string {
  const u = unc.exec(p);
  if (u) return u[0] + '\\';
  if (drive.test(p)) return p.slice(0, 3);
  if (p.startsWith('/') || (isWindowsStyle(p) && p.startsWith('\\'))) return p[0];
  return '';
}

function split(p: string, windows: boolean): string[] {
  return p.split(windows ? /[\\/]+/ : /\/+/).filter((s) => s !== '' && s !== '.');
}

export function isAbsolute(p: string): boolean {
  return rootOf(p) !== '';
}

/** `..` and `.` folded, separators collapsed, no trailing separator (except the root). */
export function normalize(p: string): string {
  const windows = isWindowsStyle(p);
  const root = rootOf(p);
  const parts: string[] = [];
  for (const part of split(p.slice(root.length), windows)) {
    if (part === '..') {
      if (parts.length && parts[parts.length - 1] !== '..') parts.pop();
      else if (!root) parts.push('..');
    } else parts.push(part);
  }
  const sep = separatorOf(p);
  const body = parts.join(sep);
  return root ? root + body : body || '.';
}

/** Like Node's `path.resolve` for the absolute paths the core works with: later absolute segments restart. */
export function resolve(...segments: string[]): string {
  let out = '';
  for (const segment of segments) {
    if (!segment) continue;
    if (isAbsolute(segment) || !out) out = segment;
    else out = out.replace(/[\\/]+$/, '') + separatorOf(out) + segment;
  }
  return normalize(out || '.');
}

/** Segments joined with the first one's separator and normalized (`build` + `compile_commands.json`). */
export function join(...segments: string[]): string {
  const parts = segments.filter(Boolean);
  if (!parts.length) return '.';
  return normalize(parts.join(separatorOf(parts[0])));
}

export function dirname(p: string): string {
  const root = rootOf(p);
  const rest = p.slice(root.length).replace(/[\\/]+$/, '');
  const windows = isWindowsStyle(p);
  const cut = windows ? Math.max(rest.lastIndexOf('/'), rest.lastIndexOf('\\')) : rest.lastIndexOf('/');
  if (cut < 0) return root || '.';
  return root + rest.slice(0, cut);
}

export function basename(p: string): string {
  const parts = split(p.slice(rootOf(p).length), isWindowsStyle(p));
  return parts[parts.length - 1] ?? '';
}

/** The path from `from` to `to`, both absolute, with `/` between its parts (it is shown, not opened). */
export function relative(from: string, to: string): string {
  const windows = isWindowsStyle(from) || isWindowsStyle(to);
  const a = normalize(from);
  const b = normalize(to);
  const same = (x: string, y: string) => (windows ? x.toLowerCase() === y.toLowerCase() : x === y);
  if (!same(rootOf(a), rootOf(b))) return b;
  const left = split(a.slice(rootOf(a).length), windows);
  const right = split(b.slice(rootOf(b).length), windows);
  let common = 0;
  while (common < left.length && common < right.length && same(left[common], right[common])) common++;
  return [...left.slice(common).map(() => '..'), ...right.slice(common)].join('/');
}

/** Whether `file` is `root` or lies below it. */
export function isInside(file: string, root: string): boolean {
  const rel = relative(resolve(root), resolve(file));
  return rel === '' || (!rel.startsWith('..') && !isAbsolute(rel));
}
