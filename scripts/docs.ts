// `npm run docs`: rewrites the generated sections of the README (circuits) and of docs/blocks.md (circuits and
// diagnostic codes) from the parameter tables and the codes table.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { withCircuits } from '../core/docs/circuits';
import { withCodes } from '../core/docs/codes';

for (const [file, rewrite] of [
  ['README.md', withCircuits],
  [path.join('docs', 'blocks.md'), (text: string) => withCodes(withCircuits(text))],
] as const) {
  const full = path.join(__dirname, '..', file);
  const before = fs.readFileSync(full, 'utf8');
  const after = rewrite(before);
  if (after !== before) fs.writeFileSync(full, after);
  console.log(after === before ? `${file}: generated sections are current` : `${file}: generated sections rewritten`);
}
