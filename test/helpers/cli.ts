// Test helpers for the command line: a throwaway workspace of files, and `tickmark` run in process.
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { main } from '../../core/cli/main';

const made: string[] = [];
after(() => made.splice(0).forEach((dir) => fs.rmSync(dir, { recursive: true, force: true })));

/** A temporary folder holding `files` (relative paths → text), removed after the run. */
export function tempWorkspace(files: Record<string, string>, prefix = 'tickmark-test-'): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), prefix));
  made.push(dir);
  for (const [name, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    fs.writeFileSync(path.join(dir, name), text);
  }
  return dir;
}

/** `tickmark argv…` in `cwd`, without colour: its exit code and what it printed. */
export function runCli(argv: string[], cwd: string): { code: number; out: string; err: string } {
  let out = '';
  let err = '';
  const code = main(argv, { out: (t) => (out += t), err: (t) => (err += t), cwd, color: false });
  return { code, out, err };
}
