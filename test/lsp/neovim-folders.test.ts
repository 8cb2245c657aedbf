// Per-folder settings through a real outside client: Neovim 0.7's LSP client with two workspace folders whose
// `tickmark.c.defines` differ, answering workspace/configuration per folder as a multi-root editor does.
import { strict as assert } from 'assert';
import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { skipUnlessCi } from '../helpers/reference';

const root = path.resolve(__dirname, '..', '..');
const nvim = '/usr/bin/nvim';

// The same timer in both folders: F_CPU / 8 / (999 + 1). 8 MHz gives 1 kHz (the claim); 16 MHz gives 2 kHz.
const tick = ['/* @timing tick', ' * circuit: timer', ' * clock: F_CPU', ' * prescaler: 8', ' * reload: 999', ' * expect: 1 kHz', ' */', ''].join('\n');

describe('language server in Neovim with two workspace folders', function () {
  this.timeout(120_000);

  it('analyses each folder\'s files with that folder\'s settings (workspace/configuration per scopeUri)', function () {
    if (!fs.existsSync(nvim)) skipUnlessCi(this, `${nvim} is not installed (apt-get install neovim)`);
    const temp = fs.mkdtempSync(path.join(os.tmpdir(), 'tickmark-nvim-folders-'));
    try {
      const ws = path.join(temp, 'ws');
      for (const folder of ['a', 'b']) {
        fs.mkdirSync(path.join(ws, folder), { recursive: true });
        fs.writeFileSync(path.join(ws, folder, 'tick.c'), tick);
      }
      const home = path.join(temp, 'home');
      const out = path.join(temp, 'seen.json');
      const env = {
        ...process.env, HOME: home, XDG_CONFIG_HOME: path.join(home, 'config'), XDG_DATA_HOME: path.join(home, 'data'),
        XDG_STATE_HOME: path.join(home, 'state'), XDG_CACHE_HOME: path.join(home, 'cache'), ROOT: root, WS: ws, OUT: out,
      };
      const run = spawnSync(nvim, ['--headless', '-n', '-u', 'NONE', '-i', 'NONE', '-c', `luafile ${path.join(root, 'test', 'lsp', 'neovim', 'folders.lua')}`, '-c', 'cquit 9'], {
        cwd: temp, env, encoding: 'utf8', timeout: 100_000, killSignal: 'SIGKILL',
      });
      assert.ok(fs.existsSync(out), `Neovim wrote nothing: ${run.error?.message ?? ''}\n${run.stdout}\n${run.stderr}`);
      const seen = JSON.parse(fs.readFileSync(out, 'utf8'));
      assert.deepEqual(seen.errors, [], `${seen.errors.join('\n')}\n${run.stderr}`);
      assert.equal(seen.done, true);
      // The server asked once per folder, naming it.
      const scopes = seen.asked.filter((a: { section: string }) => a.section === 'tickmark').map((a: { scopeUri: string }) => path.basename(new URL(a.scopeUri).pathname));
      assert.ok(scopes.includes('a') && scopes.includes('b'), `asked for ${JSON.stringify(seen.asked)}`);
      // 8 MHz / 8 / 1000 = 1 kHz meets the claim in `a`; 16 MHz / 8 / 1000 = 2 kHz does not in `b`.
      assert.match(seen.steps.aLens[0], /^1 kHz/);
      assert.match(seen.steps.bLens[0], /^2 kHz/);
      assert.ok(!seen.steps.aCodes.includes('expect-mismatch'), `a: ${seen.steps.aCodes}`);
      assert.ok(seen.steps.bCodes.includes('expect-mismatch'), `b: ${seen.steps.bCodes}`);
    } finally {
      fs.rmSync(temp, { recursive: true, force: true });
    }
  });
});
