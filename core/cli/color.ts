// Whether the human report is coloured. The order is Node's own for its terminal colours (documented with
// `tty.WriteStream.getColorDepth()`): FORCE_COLOR wins (`0` or `false` turns colour off), then NO_COLOR
// (no-color.org: present and not empty), then TERM=dumb; otherwise colour only on a terminal.
export function wantsColor(env: Record<string, string | undefined>, isTTY: boolean): boolean {
  const force = env.FORCE_COLOR;
  if (force !== undefined) return !(force === '0' || force.toLowerCase() === 'false');
  if (env.NO_COLOR) return false;
  if (env.TERM === 'dumb') return false;
  return isTTY;
}
