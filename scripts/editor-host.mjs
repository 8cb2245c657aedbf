// Shared plumbing for the real-editor runs: a loopback-only code-server with fresh state, and a headless
// Debian chromium that may talk to nothing but that server. Both are stopped by their own handles.
import { spawn } from 'node:child_process';
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import http from 'node:http';
import net from 'node:net';
import path from 'node:path';
import { chromium } from 'playwright-core';
import { chromiumPath, prepareEditorHost, projectRoot } from './prepare-editor-host.mjs';

const loopbackHosts = new Set(['127.0.0.1', 'localhost', '[::1]', '::1']);

export function log(message) {
  process.stderr.write(`[editor] ${message}\n`);
}

export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

function healthy(port) {
  return new Promise((resolve) => {
    const request = http.get({ host: '127.0.0.1', port, path: '/healthz', timeout: 1000 }, (response) => {
      response.resume();
      resolve(response.statusCode === 200);
    });
    request.on('error', () => resolve(false));
    request.on('timeout', () => request.destroy());
  });
}

/** A fresh run folder under .cache/editor-run/, removed by stop(). */
export function runFolder(label) {
  const dir = path.join(projectRoot, '.cache', 'editor-run', `${label}-${process.pid}`);
  rmSync(dir, { recursive: true, force: true });
  mkdirSync(dir, { recursive: true });
  return dir;
}

// Tests edit demo files in memory only. VS Code saves files touched by an extension's WorkspaceEdit
// unless files.refactoring.autoSave is off, so the run's user settings turn every save path off.
const userSettings = {
  'files.refactoring.autoSave': false,
  'files.autoSave': 'off',
  'files.hotExit': 'off',
  'workbench.startupEditor': 'none',
  'security.workspace.trust.enabled': false,
  'extensions.autoCheckUpdates': false,
  'extensions.autoUpdate': false,
  'telemetry.telemetryLevel': 'off',
  'git.openRepositoryInParentFolders': 'never',
};

export async function startCodeServer(runDir, extraEnv = {}) {
  const entry = prepareEditorHost();
  const port = await freePort();
  const userData = path.join(runDir, 'user-data');
  const extensions = path.join(runDir, 'extensions');
  mkdirSync(extensions, { recursive: true });
  mkdirSync(path.join(userData, 'User'), { recursive: true });
  writeFileSync(path.join(userData, 'User', 'settings.json'), JSON.stringify(userSettings, null, 2));
  const env = {
    ...process.env,
    ...extraEnv,
    EXTENSIONS_GALLERY: '{}',
    XDG_CONFIG_HOME: path.join(userData, 'xdg-config'),
    XDG_DATA_HOME: path.join(userData, 'xdg-data'),
    XDG_CACHE_HOME: path.join(userData, 'xdg-cache'),
  };
  const args = [entry, '--auth', 'none', '--bind-addr', `127.0.0.1:${port}`, '--disable-telemetry', '--disable-update-check',
    '--disable-workspace-trust', '--disable-getting-started-override', '--user-data-dir', userData, '--extensions-dir', extensions];
  const child = spawn(process.execPath, args, { env, stdio: ['ignore', 'pipe', 'pipe'] });
  const output = [];
  const keep = (chunk) => {
    output.push(chunk.toString());
    if (output.length > 200) output.shift();
  };
  child.stdout.on('data', keep);
  child.stderr.on('data', keep);
  const until = Date.now() + 60_000;
  while (!(await healthy(port))) {
    if (child.exitCode !== null) throw new Error(`code-server exited (${child.exitCode}):\n${output.join('')}`);
    if (Date.now() > until) {
      stopProcess(child);
      throw new Error(`code-server did not answer /healthz within 60 s:\n${output.join('')}`);
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  return { port, child, output };
}

export function stopProcess(child) {
  if (!child || child.exitCode !== null || child.signalCode !== null) return;
  child.kill('SIGTERM');
  const force = setTimeout(() => child.exitCode === null && child.kill('SIGKILL'), 5000);
  force.unref();
}

export async function launchBrowser(runDir) {
  const browserDir = path.join(runDir, 'browser');
  mkdirSync(browserDir, { recursive: true });
  const context = await chromium.launchPersistentContext(browserDir, {
    executablePath: chromiumPath,
    headless: true,
    viewport: { width: 1400, height: 900 },
    env: { ...process.env, XDG_CONFIG_HOME: path.join(browserDir, 'xdg-config'), XDG_CACHE_HOME: path.join(browserDir, 'xdg-cache') },
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking',
      '--disable-component-update', '--disable-sync'],
  });
  await context.route('**/*', (route) => {
    let host = '';
    try {
      host = new URL(route.request().url()).hostname;
    } catch {
      // data:, blob: and the like have no host and stay inside the page.
      return route.continue();
    }
    const url = route.request().url();
    if (!/^(https?|wss?):/.test(url) || loopbackHosts.has(host)) return route.continue();
    return route.abort();
  });
  return context;
}

/** The workbench URL that loads this project as a development extension (and optionally its tests). */
export function workbenchUrl(port, { folder, testsPath }) {
  const remote = (p) => `vscode-remote://127.0.0.1:${port}${p}`;
  const payload = [['extensionDevelopmentPath', remote(projectRoot)], ['skipWelcome', 'true']];
  if (testsPath) payload.push(['extensionTestsPath', remote(testsPath)]);
  return `http://127.0.0.1:${port}/?folder=${encodeURIComponent(folder)}&payload=${encodeURIComponent(JSON.stringify(payload))}`;
}

/** Stops everything started for a run, in reverse order, and removes the run folder. */
export async function stopAll({ browser, server, runDir }) {
  if (browser) await browser.close().catch(() => {});
  if (server) stopProcess(server.child);
  if (server?.child && server.child.exitCode === null) {
    await new Promise((resolve) => {
      const timer = setTimeout(resolve, 6000);
      server.child.once('exit', () => {
        clearTimeout(timer);
        resolve();
      });
    });
  }
  if (runDir) rmSync(runDir, { recursive: true, force: true });
}

/** Contents of every file under `folders`, to prove afterwards that a run left them as they were. */
export function snapshotFiles(folders) {
  const files = new Map();
  const walk = (dir) => {
    for (const entry of readdirSync(dir, { withFileTypes: true })) {
      const full = path.join(dir, entry.name);
      if (entry.isDirectory()) walk(full);
      else if (entry.isFile()) files.set(full, readFileSync(full));
    }
  };
  for (const folder of folders) walk(folder);
  return files;
}

/** Puts back any file a run changed or removed; returns the paths it had to restore. */
export function restoreChanged(snapshot) {
  const restored = [];
  for (const [file, content] of snapshot) {
    let now;
    try {
      now = readFileSync(file);
    } catch {
      now = undefined;
    }
    if (!now || !now.equals(content)) {
      writeFileSync(file, content);
      restored.push(file);
    }
  }
  return restored;
}
