// `npm run bench`: the speed figures of the issue, each printed with its target. Figures, not assertions.
import { createRequire } from 'node:module';

const require = createRequire(import.meta.url);
// The core is TypeScript; tsx compiles it on load, as bin/tickmark.js does in a checkout.
require('tsx/cjs');
const { runBench } = require('./bench/main.ts');
process.exitCode = await runBench((line) => process.stdout.write(line + '\n'));
