// `npm run docs`: rewrites the README's circuit section from the parameter tables.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { withCircuits } from '../core/docs/circuits';

const readme = path.join(__dirname, '..', 'README.md');
const before = fs.readFileSync(readme, 'utf8');
const after = withCircuits(before);
if (after !== before) fs.writeFileSync(readme, after);
console.log(after === before ? 'README circuits section is current' : 'README circuits section rewritten');
