// `npm run package`: a release build, then a .vsix by @vscode/vsce (no node_modules: esbuild bundles
// everything). `--verify` also installs it into a throwaway code-server extensions folder and checks it
// is listed there, proving the package installs into a real editor.
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { codeServerEntry, projectRoot } from './prepare-editor-host.mjs';

const pkg = JSON.parse(readFileSync(path.join(projectRoot, 'package.json'), 'utf8'));
const vsix = path.join(projectRoot, `${pkg.name}-${pkg.version}.vsix`);
const run = (command, args, options = {}) => execFileSync(command, args, { cwd: projectRoot, stdio: 'inherit', ...options });

run(process.execPath, ['scripts/build.mjs', '--release']);
// What ships is package.json `files` (the npm tarball and the .vsix alike; vsce takes no .vscodeignore beside
// it). The Marketplace and Open VSX page is MARKETPLACE.md, a user-facing README. Its image paths stay relative
// and the images ship in the .vsix, so the page loads them from the installed extension: the `repository` URL is
// not published yet, and links rewritten under it would not load (DEVELOPERS.md).
try {
  run(process.execPath, [path.join(projectRoot, 'node_modules', '@vscode', 'vsce', 'vsce'), 'package', '--no-dependencies',
    '--readme-path', 'MARKETPLACE.md', '--no-rewrite-relative-links', '--out', vsix]);
} catch {
  process.exit(1);
}

if (process.argv.includes('--verify')) {
  const entry = codeServerEntry();
  const scratch = mkdtempSync(path.join(os.tmpdir(), 'tickmark-vsix-'));
  const env = { ...process.env, EXTENSIONS_GALLERY: '{}', XDG_CONFIG_HOME: path.join(scratch, 'config'), XDG_DATA_HOME: path.join(scratch, 'data'), XDG_CACHE_HOME: path.join(scratch, 'cache') };
  const common = ['--user-data-dir', path.join(scratch, 'user-data'), '--extensions-dir', path.join(scratch, 'extensions')];
  try {
    run(process.execPath, [entry, ...common, '--install-extension', vsix], { env });
    const listed = execFileSync(process.execPath, [entry, ...common, '--list-extensions', '--show-versions'], { cwd: projectRoot, env, encoding: 'utf8' });
    const wanted = `${pkg.publisher}.${pkg.name}@${pkg.version}`;
    if (!listed.split(/\r?\n/).includes(wanted)) {
      process.stderr.write(`${wanted} is not listed after installing:\n${listed}\n`);
      process.exitCode = 1;
    } else {
      process.stdout.write(`installed into code-server: ${wanted}\n`);
    }
  } finally {
    rmSync(scratch, { recursive: true, force: true });
  }
}
