// Mocha runner for the tests that run inside a real editor host (code-server here, desktop VS Code with
// @vscode/test-electron elsewhere). All tests are registered first, then run once.
import Mocha from 'mocha';
import { activationTests } from './activation.test';
import { activationCacheTests } from './activationCache.test';
import { commandTests } from './commands.test';
import { completionTests } from './completion.test';
import { diagnosticsTests } from './diagnostics.test';
import { guardTests } from './guard.test';
import { hoverTests } from './hover.test';
import { hostileTests } from './hostile.test';
import { lensTests } from './lens.test';
import { optionsTests } from './options.test';
import { panelTests } from './panel.test';
import { panelHtmlTests } from './panelHtml.test';
import { previewTests } from './preview.test';
import { rangeTests } from './ranges.test';
import { referenceTests } from './references.test';

export function run(): Promise<void> {
  // TICKMARK_EDITOR_GREP on the editor host's environment runs only the matching tests (development).
  const mocha = new Mocha({ ui: 'bdd', color: false, reporter: 'spec', timeout: 30_000, grep: process.env.TICKMARK_EDITOR_GREP });
  mocha.suite.emit('pre-require', globalThis, 'tickmark-editor-suite', mocha);
  activationTests();
  activationCacheTests();
  rangeTests();
  guardTests();
  lensTests();
  hoverTests();
  referenceTests();
  diagnosticsTests();
  panelTests();
  panelHtmlTests();
  previewTests();
  completionTests();
  commandTests();
  optionsTests();
  hostileTests();
  return new Promise((resolve, reject) => {
    mocha.run((failures) => (failures > 0 ? reject(new Error(`${failures} editor test(s) failed`)) : resolve()));
  });
}
