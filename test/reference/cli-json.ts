// The engine the way users run it: files in a temporary folder, `tickmark check --json` in-process, the report parsed.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { main } from '../../core/cli/main';

export interface JsonRange { min: number; max: number }
export interface JsonDiagnostic { severity: 'error' | 'warning' | 'info'; code: string; line: number; message: string }
export interface JsonBlock {
  name: string;
  line: number;
  circuit: string | null;
  params: Record<string, number | string>;
  values: Record<string, number>;
  spread?: Record<string, JsonRange>;
  solved?: Record<string, { value: number; exact?: number; series?: string }>;
  diagnostics: JsonDiagnostic[];
}
export interface JsonReport { files: Array<{ path: string; blocks: JsonBlock[]; diagnostics: JsonDiagnostic[] }> }

export function workspace(files: Record<string, string>): string {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-e2e-'));
  for (const [name, text] of Object.entries(files)) {
    fs.mkdirSync(path.dirname(path.join(dir, name)), { recursive: true });
    fs.writeFileSync(path.join(dir, name), text);
  }
  return dir;
}

/** Runs `tickmark check --json ...args` with `dir` as the working folder; stderr must stay empty. */
export function checkJson(dir: string, args: string[]): { code: number; report: JsonReport } {
  let out = '';
  let err = '';
  const code = main(['check', '--json', ...args], { out: (t) => (out += t), err: (t) => (err += t), cwd: dir, color: false });
  assert.equal(err, '', 'tickmark check wrote to stderr');
  return { code, report: JSON.parse(out) as JsonReport };
}

/** The named block of the report, which must have computed without an error or a warning. */
export function cleanBlock(report: JsonReport, name: string): JsonBlock {
  const found = report.files.flatMap((f) => f.blocks).find((b) => b.name === name);
  assert.ok(found, `no block ${name} in the report`);
  const serious = found.diagnostics.filter((d) => d.severity !== 'info');
  assert.deepEqual(serious, [], `${name} has findings`);
  return found;
}

export function markdownBlock(name: string, lines: string[]): string {
  return ['```timing ' + name, ...lines, '```', ''].join('\n');
}

/** Relative agreement; NaN, a missing value or an infinity fails. */
export function near(actual: number | undefined, expected: number, relative: number, what: string): void {
  assert.ok(typeof actual === 'number' && Number.isFinite(actual), `${what}: ${actual} is not a finite number`);
  assert.ok(Math.abs(actual - expected) <= relative * Math.abs(expected), `${what}: ${actual} is not within ${relative * 100} % of ${expected} (${((actual / expected - 1) * 100).toFixed(4)} %)`);
}
