// Installs the browser-served VS Code build (code-server) into .cache/editor-host/, outside the project's
// node_modules, so the extension's tests can run in a real extension host on machines without VS Code.
// Idempotent: a matching installed version is left alone.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

export const CODE_SERVER_VERSION = '4.100.3';
export const projectRoot = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
export const hostCache = path.join(projectRoot, '.cache', 'editor-host');
export const chromiumPath = '/usr/bin/chromium';
const ripgrepPath = '/usr/bin/rg';

// @vscode/ripgrep 1.15.11 (pulled in by code-server) looks for this asset in $TMPDIR before downloading.
const RIPGREP_CACHE_DIR = 'vscode-ripgrep-cache-1.15.11';
const RIPGREP_ASSET = 'ripgrep-v13.0.0-10-x86_64-unknown-linux-musl.tar.gz';

const DEBIAN_PACKAGES = [
  { name: 'libkrb5-dev', present: () => existsSync('/usr/include/gssapi/gssapi.h') },
  { name: 'ripgrep', present: () => existsSync(ripgrepPath) },
  { name: 'chromium', present: () => existsSync(chromiumPath) },
];

function log(message) {
  process.stderr.write(`[editor-host] ${message}\n`);
}

export function codeServerEntry() {
  return path.join(hostCache, 'node_modules', 'code-server', 'out', 'node', 'entry.js');
}

function installedVersion() {
  const manifest = path.join(hostCache, 'node_modules', 'code-server', 'package.json');
  if (!existsSync(manifest) || !existsSync(codeServerEntry())) return undefined;
  try {
    return JSON.parse(readFileSync(manifest, 'utf8')).version;
  } catch {
    return undefined;
  }
}

function ensureDebianPackages() {
  const missing = DEBIAN_PACKAGES.filter((p) => !p.present()).map((p) => p.name);
  if (missing.length === 0) return;
  const command = `apt-get install -y ${missing.join(' ')}`;
  if (typeof process.getuid !== 'function' || process.getuid() !== 0) {
    throw new Error(`missing Debian packages: ${missing.join(', ')}. Run as root: ${command}`);
  }
  log(`installing ${missing.join(' ')} with apt-get`);
  const result = spawnSync('apt-get', ['install', '-y', ...missing], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  if (result.status !== 0) throw new Error(`apt-get failed (exit ${result.status}); run: ${command}`);
}

/** Places Debian's rg where @vscode/ripgrep's postinstall looks first, so it never downloads. */
function seedRipgrepCache(tmpDir) {
  const dir = path.join(tmpDir, RIPGREP_CACHE_DIR);
  mkdirSync(dir, { recursive: true });
  const asset = path.join(dir, RIPGREP_ASSET);
  if (!existsSync(asset)) execFileSync('tar', ['czf', asset, '-C', path.dirname(ripgrepPath), 'rg']);
}

/** Returns the path of code-server's entry script, installing it first when needed. */
export function prepareEditorHost() {
  ensureDebianPackages();
  if (installedVersion() === CODE_SERVER_VERSION) return codeServerEntry();

  mkdirSync(hostCache, { recursive: true });
  // Without its own package.json npm would walk up and install into the project's node_modules.
  const manifest = path.join(hostCache, 'package.json');
  if (!existsSync(manifest)) {
    writeFileSync(manifest, JSON.stringify({ name: 'tickmark-editor-host', private: true }, null, 2) + '\n');
  }
  const tmpDir = path.join(hostCache, 'tmp');
  seedRipgrepCache(tmpDir);

  log(`installing code-server@${CODE_SERVER_VERSION} into ${path.relative(projectRoot, hostCache)} (about a minute)`);
  const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';
  const result = spawnSync(
    npm,
    ['install', `code-server@${CODE_SERVER_VERSION}`, '--unsafe-perm', '--no-audit', '--no-fund'],
    {
      cwd: hostCache,
      stdio: 'inherit',
      // The machine's npmrc sets yes=false, and a postinstall runs `npx node-gyp`.
      env: { ...process.env, TMPDIR: tmpDir, npm_config_yes: 'true' },
    },
  );
  if (result.status !== 0) throw new Error(`npm install code-server@${CODE_SERVER_VERSION} failed (exit ${result.status})`);
  if (installedVersion() !== CODE_SERVER_VERSION) throw new Error(`code-server ${CODE_SERVER_VERSION} not found after install`);
  return codeServerEntry();
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  try {
    const entry = prepareEditorHost();
    log(`ready: ${path.relative(projectRoot, entry)}`);
  } catch (error) {
    log(error instanceof Error ? error.message : String(error));
    process.exit(1);
  }
}
