// The package as a user installs it, checked with npm itself: `npm pack` makes the tarball, `npm install -g
// --omit=dev` puts it in a throwaway prefix, `npm exec --package` runs it as npx does, and the installed
// `tickmark` prints its version and checks a note, with no dev dependency (tsx) and no TypeScript source there.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import * as vm from 'node:vm';
import Module from 'node:module';
import { spawnSync, type SpawnSyncOptions } from 'node:child_process';

const root = path.resolve(__dirname, '../..');
const npm = process.platform === 'win32' ? 'npm.cmd' : 'npm';

function sh(command: string, args: string[], options: SpawnSyncOptions = {}) {
  const result = spawnSync(command, args, { encoding: 'utf8', timeout: 240_000, ...options });
  const out = String(result.stdout ?? '');
  const err = String(result.stderr ?? '');
  return { status: result.status, out, err, text: `${out}\n${err}` };
}

describe('npm package', function () {
  this.timeout(600_000);
  let scratch = '';
  let tarball = '';
  // A clean environment: no NODE_PATH into the checkout's node_modules, npm's cache and config in the scratch.
  let env: NodeJS.ProcessEnv = {};

  before(() => {
    scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-pack-'));
    env = { ...process.env, NODE_PATH: '', npm_config_cache: path.join(scratch, 'cache'), npm_config_update_notifier: 'false', npm_config_fund: 'false', npm_config_audit: 'false' };
    for (const key of Object.keys(env)) if (key.startsWith('npm_package_') || key === 'npm_lifecycle_event') delete env[key];
    const build = sh(process.execPath, ['scripts/build.mjs', '--cli'], { cwd: root });
    assert.equal(build.status, 0, build.text);
    // --ignore-scripts: prepack's release build would clear out/ of this checkout; the bundles are built above.
    const packed = sh(npm, ['pack', '--ignore-scripts', '--json', '--pack-destination', scratch], { cwd: root, env });
    assert.equal(packed.status, 0, packed.text);
    const [info] = JSON.parse(packed.out);
    tarball = path.join(scratch, info.filename);
    const files: string[] = info.files.map((f: { path: string }) => f.path);
    for (const needed of ['package.json', 'bin/tickmark.js', 'out/cli.js', 'out/server.js', 'out/unit-math.js', 'README.md', 'LICENSE', 'CHANGELOG.md']) {
      assert.ok(files.includes(needed), `${needed} is not in the tarball: ${files.join(', ')}`);
    }
    assert.deepEqual(files.filter((f) => /\.ts$|\.map$|\.code-cache$|^core\/|^test\/|^node_modules\//.test(f)), []);
  });

  after(() => fs.rmSync(scratch, { recursive: true, force: true }));

  const note = ['```timing tick', 'circuit: timer', 'clock: 16 MHz', 'prescaler: 64', 'reload: 255', 'expect: 1 kHz', '```', ''].join('\n');

  it('installs globally with production dependencies only and runs from its bundle', () => {
    const prefix = path.join(scratch, 'prefix');
    const installed = sh(npm, ['install', '-g', '--prefix', prefix, '--omit=dev', tarball], { cwd: scratch, env });
    assert.equal(installed.status, 0, installed.text);
    const bin = process.platform === 'win32' ? path.join(prefix, 'tickmark.cmd') : path.join(prefix, 'bin', 'tickmark');
    const packageDir = process.platform === 'win32' ? path.join(prefix, 'node_modules', 'tickmark') : path.join(prefix, 'lib', 'node_modules', 'tickmark');
    assert.equal(fs.existsSync(path.join(packageDir, 'core')), false, 'TypeScript sources were installed');
    assert.equal(fs.existsSync(path.join(packageDir, 'node_modules', 'tsx')), false, 'a dev dependency was installed');
    const version = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8')).version;
    const work = path.join(scratch, 'work');
    fs.mkdirSync(work);
    fs.writeFileSync(path.join(work, 'tick.md'), note);
    const shown = sh(bin, ['--version'], { cwd: work, env });
    assert.equal(shown.status, 0, shown.text);
    assert.equal(shown.out, `${version}\n`);
    assert.equal(sh(bin, ['lsp', '--version'], { cwd: work, env }).out, `${version}\n`);
    // 16 MHz / 64 / 256 = 976.6 Hz against a 1 kHz claim (timer law): exit 1 and the positioned warning.
    const checked = sh(bin, ['check', '.'], { cwd: work, env: { ...env, NO_COLOR: '1' } });
    assert.equal(checked.status, 1, checked.text);
    assert.match(checked.out, /^tick\.md:6:9: warning: tick: computes 976\.6 Hz/m);
    const sarif = sh(bin, ['check', '--sarif', '.'], { cwd: work, env });
    assert.equal(JSON.parse(sarif.out).runs[0].tool.driver.version, version);
    // A clock written as the inverse of a period divides units: the bundle loads out/unit-math.js (mathjs) for it.
    // 1 / 62.5 ns = 16 MHz, the same timer law as above.
    const period = path.join(scratch, 'period');
    fs.mkdirSync(period);
    fs.writeFileSync(path.join(period, 'tick.md'), note.replace('clock: 16 MHz', 'clock: 1 / 62.5 ns'));
    const divided = sh(bin, ['check', '--json', '.'], { cwd: period, env });
    assert.equal(divided.status, 1, divided.text);
    const [block] = JSON.parse(divided.out).files[0].blocks;
    assert.ok(Math.abs(block.params.clock - 16e6) < 1e-3, divided.out);
    assert.ok(Math.abs(block.values.frequency - 16e6 / 64 / 256) < 1e-6, divided.out);
  });

  it('leaves a V8 code cache of the command line that this Node.js accepts, out of the tarball', () => {
    // V8's own check (vm.Script cachedDataRejected) decides whether the cache is usable; bin/tickmark.js loads the
    // bundle with it, and a check then prints exactly what a plain require of the bundle prints.
    const cache = fs.readFileSync(path.join(root, 'out', 'cli.code-cache'));
    const bundle = path.join(root, 'out', 'cli.js');
    const { size, mtimeMs } = fs.statSync(bundle);
    const newline = cache.indexOf(10);
    assert.equal(cache.toString('latin1', 0, newline), `${size} ${mtimeMs}`, 'the cache names the bundle it was made from');
    const script = new vm.Script(Module.wrap(fs.readFileSync(bundle, 'utf8')), { filename: bundle, cachedData: cache.subarray(newline + 1) });
    assert.equal(script.cachedDataRejected, false);
    const work = fs.mkdtempSync(path.join(scratch, 'cached-'));
    fs.writeFileSync(path.join(work, 'tick.md'), note);
    const cached = sh(process.execPath, [path.join(root, 'bin', 'tickmark.js'), 'check', '--json', '.'], { cwd: work, env });
    const plain = sh(process.execPath, ['-e', `process.exitCode = (m => m.main(process.argv.slice(1), m.processIo()))(require(${JSON.stringify(bundle)}))`, 'check', '--json', '.'], { cwd: work, env });
    assert.equal(cached.status, 1, cached.text);
    assert.equal(cached.out, plain.out);
    assert.equal(cached.err, plain.err);
  });

  it('runs from the tarball as npx does', () => {
    const work = path.join(scratch, 'npx');
    fs.mkdirSync(work);
    const ran = sh(npm, ['exec', '--yes', '--package', tarball, '--', 'tickmark', '--version'], { cwd: work, env });
    assert.equal(ran.status, 0, ran.text);
    assert.match(ran.out, /^\d+\.\d+\.\d+/);
  });
});
