// The same editor suite in desktop VS Code via @vscode/test-electron, for machines with internet access
// (it downloads VS Code). On machines that only reach the npm registry use `npm run test:editor`.
import path from 'node:path';
import { runTests } from '@vscode/test-electron';
import { projectRoot } from './prepare-editor-host.mjs';

const workspace = path.join(projectRoot, process.env.TICKMARK_TEST_WORKSPACE ?? 'demo');

try {
  await runTests({
    version: '1.100.3',
    extensionDevelopmentPath: projectRoot,
    extensionTestsPath: path.join(projectRoot, 'out', 'test', 'suite', 'index.js'),
    launchArgs: [workspace, '--disable-extensions', '--disable-workspace-trust', '--skip-welcome'],
    extensionTestsEnv: { TICKMARK_EDITOR_TEST: '1' },
  });
} catch (error) {
  process.stderr.write(`[desktop] ${error instanceof Error ? error.message : String(error)}\n`);
  process.exit(1);
}
