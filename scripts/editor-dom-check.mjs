// What a person sees: opens the demo in code-server with this project as a development extension, opens a
// note, reads the code lens text and a hover from the DOM, and saves screenshots into artifacts/.
// Exit 0 when the lens shows the RC delay and the hover shows its result, the waveform panel draws with a
// readout and the Markdown preview shows the block's table, 1 otherwise.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { launchBrowser, log, restoreChanged, runFolder, snapshotFiles, startCodeServer, stopAll, workbenchUrl } from './editor-host.mjs';
import { projectRoot } from './prepare-editor-host.mjs';

const RUN_LIMIT_MS = 3 * 60_000;
const workspace = path.join(projectRoot, 'demo');
const artifacts = path.join(projectRoot, 'artifacts');
// RC charging to 0.7 of the supply: t = RC·ln(1/0.3) = 100 kΩ · 1 µF · 1.20397 = 120.4 ms (por-delay in the demo).
const expectedDelay = /120\.4\s*ms/;

/** Screen centre of the first occurrence of `word` in the visible editor text. */
async function pointOfWord(page, word) {
  return page.evaluate((wanted) => {
    const lines = document.querySelector('.editor-instance .monaco-editor .view-lines');
    if (!lines) return undefined;
    const walker = document.createTreeWalker(lines, NodeFilter.SHOW_TEXT);
    for (let node = walker.nextNode(); node; node = walker.nextNode()) {
      const at = (node.textContent ?? '').indexOf(wanted);
      if (at < 0) continue;
      const range = document.createRange();
      range.setStart(node, at);
      range.setEnd(node, at + wanted.length);
      const box = range.getBoundingClientRect();
      return { x: box.left + box.width / 2, y: box.top + box.height / 2 };
    }
    return undefined;
  }, word);
}

/** Runs a command from the palette by its title. */
async function runCommand(page, title) {
  await page.keyboard.press('F1');
  const input = page.locator('.quick-input-widget input');
  await input.waitFor({ state: 'visible', timeout: 10_000 });
  await input.fill(`>${title}`);
  await page.waitForTimeout(400);
  await page.keyboard.press('Enter');
}

/** The webview frame (panels render in nested iframes) that holds `selector`. */
async function frameWith(page, selector, timeout = 20_000) {
  const until = Date.now() + timeout;
  while (Date.now() < until) {
    for (const frame of page.frames()) {
      if (await frame.locator(selector).count().catch(() => 0)) return frame;
    }
    await page.waitForTimeout(250);
  }
  throw new Error(`no webview shows ${selector}`);
}

// Waveform panel from a code lens click, with the readout under the mouse; then the Markdown preview.
async function checkPanelAndPreview(page) {
  const problems = [];
  await page.getByRole('treeitem', { name: 'heartbeat.md' }).dblclick({ timeout: 30_000 });
  const lens = page.locator('.monaco-editor .codelens-decoration a').filter({ hasText: 'Hz' }).first();
  await lens.waitFor({ state: 'visible', timeout: 30_000 });
  await lens.click();
  const panel = await frameWith(page, '#chart svg polyline');
  const plot = panel.locator('#chart svg');
  // The panel may redraw once more after opening; move over the plot until the readout follows the mouse.
  let readout = '';
  for (let attempt = 0; attempt < 6; attempt++) {
    const box = await plot.boundingBox();
    if (box) await plot.hover({ position: { x: box.width * (0.5 + attempt * 0.02), y: box.height * 0.4 } });
    await page.waitForTimeout(500);
    readout = await panel.locator('#readout').innerText();
    if (readout.startsWith('t = ')) break;
  }
  const heading = await panel.locator('#block-name').innerText();
  log(`panel: ${JSON.stringify(heading)}, readout ${JSON.stringify(readout)}`);
  await page.screenshot({ path: path.join(artifacts, 'editor-panel.png') });
  if (heading !== 'heartbeat') problems.push(`the panel shows ${JSON.stringify(heading)}, not heartbeat`);
  if (!/^t = .*s · timing node .*V · output .*V$/.test(readout)) problems.push(`the readout reads ${JSON.stringify(readout)}`);
  await runCommand(page, 'View: Close All Editors');
  await page.getByRole('treeitem', { name: 'power-and-clock.md' }).dblclick({ timeout: 30_000 });
  await page.waitForSelector('.monaco-editor .codelens-decoration', { timeout: 30_000 });
  await runCommand(page, 'Markdown: Open Preview to the Side');
  const preview = await frameWith(page, '.tickmark-block table');
  await page.waitForTimeout(800);
  const table = await preview.locator('.tickmark-block table').first().innerText();
  log(`preview table: ${JSON.stringify(table.slice(0, 200))}`);
  await page.screenshot({ path: path.join(artifacts, 'editor-preview.png') });
  if (!expectedDelay.test(table)) problems.push('the preview table does not show 120.4 ms');
  return problems;
}

// The planted firmware mismatch: squiggle, Problems list and the quick fix offered (shown, never applied).
async function checkFirmware(page) {
  const problems = [];
  await runCommand(page, 'View: Close All Editors');
  await page.getByRole('treeitem', { name: 'firmware' }).first().click();
  await page.getByRole('treeitem', { name: 'src' }).first().click();
  await page.getByRole('treeitem', { name: 'valve_pwm.c' }).dblclick({ timeout: 30_000 });
  await page.waitForSelector('.monaco-editor .squiggly-warning', { timeout: 30_000 });
  await runCommand(page, 'View: Focus Problems (Errors, Warnings, Infos)');
  const row = page.locator('.markers-panel .monaco-list-row').filter({ hasText: 'computes 16 kHz' }).first();
  await row.waitFor({ state: 'visible', timeout: 15_000 });
  const rowText = await row.innerText();
  log(`problems: ${JSON.stringify(rowText)}`);
  if (!/expect says 20 kHz/.test(rowText)) problems.push('the Problems list does not show the valve-pwm claim');
  await row.dblclick();
  await page.waitForTimeout(800);
  await runCommand(page, 'Quick Fix...');
  const menu = page.locator('.action-widget').first();
  await menu.waitFor({ state: 'visible', timeout: 15_000 });
  await page.waitForTimeout(500);
  const fixes = await menu.innerText();
  log(`quick fixes: ${JSON.stringify(fixes)}`);
  await page.screenshot({ path: path.join(artifacts, 'editor-quickfix.png') });
  if (!/VALVE_PWM_TOP.*799/.test(fixes)) problems.push('the quick fix to set VALVE_PWM_TOP to 799 is not offered');
  await page.keyboard.press('Escape');
  return problems;
}

async function check(page) {
  await page.waitForSelector('.monaco-workbench', { timeout: 60_000 });
  await page.getByRole('treeitem', { name: 'notes' }).first().click();
  await page.getByRole('treeitem', { name: 'power-and-clock.md' }).dblclick({ timeout: 30_000 });
  await page.waitForSelector('.monaco-editor .codelens-decoration', { timeout: 30_000 });
  await page.waitForTimeout(2500);
  const lenses = await page.locator('.monaco-editor .codelens-decoration').allInnerTexts();
  await page.screenshot({ path: path.join(artifacts, 'editor-lens.png') });
  log(`code lens text: ${JSON.stringify(lenses)}`);

  const point = await pointOfWord(page, '100k');
  if (!point) throw new Error('the word 100k is not visible in the editor');
  await page.mouse.move(point.x, point.y);
  const hover = page.locator('.monaco-hover').filter({ hasText: 'por-delay' }).first();
  await hover.waitFor({ state: 'visible', timeout: 15_000 });
  await page.waitForTimeout(600);
  const hoverText = await hover.innerText();
  await page.screenshot({ path: path.join(artifacts, 'editor-hover.png') });
  log(`hover text: ${JSON.stringify(hoverText.slice(0, 300))}`);

  const problems = [];
  if (!lenses.some((t) => expectedDelay.test(t))) problems.push('no code lens shows 120.4 ms');
  if (!expectedDelay.test(hoverText)) problems.push('the hover does not show 120.4 ms');
  problems.push(...(await checkPanelAndPreview(page)));
  problems.push(...(await checkFirmware(page)));
  return problems;
}

async function main() {
  mkdirSync(artifacts, { recursive: true });
  const run = { runDir: runFolder('dom') };
  const guarded = snapshotFiles([workspace]);
  let limitTimer;
  let code = 1;
  try {
    run.server = await startCodeServer(run.runDir);
    run.browser = await launchBrowser(run.runDir);
    const page = await run.browser.newPage();
    const limit = new Promise((_, reject) => {
      limitTimer = setTimeout(() => reject(new Error(`DOM check did not finish within ${RUN_LIMIT_MS / 60_000} min`)), RUN_LIMIT_MS);
    });
    await page.goto(workbenchUrl(run.server.port, { folder: workspace }));
    const problems = await Promise.race([check(page), limit]);
    for (const problem of problems) log(`FAIL ${problem}`);
    code = problems.length === 0 ? 0 : 1;
    if (code === 0) log(`DOM check passed; screenshots in ${path.relative(projectRoot, artifacts)}/`);
  } catch (error) {
    log(error instanceof Error ? error.message : String(error));
    const page = run.browser?.pages()[0];
    if (page) await page.screenshot({ path: path.join(artifacts, 'editor-failure.png') }).catch(() => {});
  } finally {
    clearTimeout(limitTimer);
    await stopAll(run);
  }
  if (restoreChanged(guarded).length > 0) {
    log('the DOM check changed demo files (restored)');
    code = 1;
  }
  return code;
}

process.exitCode = await main();
