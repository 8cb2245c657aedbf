// Include resolution follows the search order gcc documents for quoted includes: the including file's folder,
// then -I folders (gcc manual, "Search Path", from memory); the workspace bound is this project's own rule.
import { strict as assert } from 'assert';
import { Code } from '../../core/codes';
import { valueOf, workspace } from './c-helpers';

describe('C #include "…"', () => {
  it('follows a header relative to the including file, and nested headers relative to themselves', () => {
    const { table } = workspace({
      '/ws/src/main.c': '#include "board/clock.h"\n',
      '/ws/src/board/clock.h': '#include "pll.h"\n#define SYS_CLOCK_HZ (PLL_MUL * 8000000UL)\n',
      '/ws/src/board/pll.h': '#define PLL_MUL 9\n',
    });
    const t = table('/ws/src/main.c');
    assert.equal(valueOf(t, 'SYS_CLOCK_HZ'), 72000000n);
    assert.deepEqual(t.dependencies.sort(), ['/ws/src/board/clock.h', '/ws/src/board/pll.h', '/ws/src/main.c']);
    const def = t.lookup('PLL_MUL');
    assert.ok(def.ok && def.definition.uri === '/ws/src/board/pll.h' && def.definition.line === 1);
  });

  it('falls back to the include folders, in order, after the file\'s own folder', () => {
    const { table } = workspace({
      '/ws/app/main.c': '#include "cfg.h"\n',
      '/ws/first/cfg.h': '#define TICK_TOP 249\n',
      '/ws/second/cfg.h': '#define TICK_TOP 999\n',
    }, { includeDirs: ['/ws/first', 'second'] });
    assert.equal(valueOf(table('/ws/app/main.c'), 'TICK_TOP'), 249n);
  });

  it('does not read a path that escapes the workspace, and says so at the #include', () => {
    const text = '#include "../../etc/secret.h"\n';
    const { table, reads } = workspace({ '/ws/main.c': text, '/etc/secret.h': '#define KEY 1\n' });
    const t = table('/ws/main.c');
    assert.ok(!reads.some((r) => r.startsWith('/etc')));
    const f = t.findings.find((x) => x.code === Code.cInclude);
    assert.ok(f, 'expected an include finding');
    assert.equal(text.slice(f.span.start, f.span.end), '"../../etc/secret.h"');
    assert.match(f.message, /outside the workspace/);
    assert.equal(valueOf(t, 'KEY').toString().startsWith(Code.cUnknown), true);
  });

  it('does not follow a symlink whose target leaves the workspace', () => {
    const { table, reads } = workspace(
      { '/ws/main.c': '#include "link.h"\n', '/ws/link.h': '#define KEY 1\n' },
      { links: { '/ws/link.h': '/outside/real.h' } },
    );
    const t = table('/ws/main.c');
    assert.ok(!reads.includes('/ws/link.h'));
    assert.ok(t.findings.some((f) => f.code === Code.cInclude && /outside/.test(f.message)));
  });

  it('is safe on include cycles: guarded headers are read once, unguarded ones are cut with a finding', () => {
    const guarded = workspace({
      '/ws/a.h': '#ifndef A_H\n#define A_H\n#include "b.h"\n#define FROM_A 1\n#endif\n',
      '/ws/b.h': '#ifndef B_H\n#define B_H\n#include "a.h"\n#define FROM_B (FROM_A + 1)\n#endif\n',
    });
    const g = guarded.table('/ws/a.h');
    assert.equal(valueOf(g, 'FROM_B'), 2n);
    assert.deepEqual(g.findings, []);

    const loop = workspace({ '/ws/a.h': '#include "b.h"\n#define X 1\n', '/ws/b.h': '#include "a.h"\n' });
    const l = loop.table('/ws/a.h');
    assert.equal(valueOf(l, 'X'), 1n);
    assert.ok(l.findings.some((f) => f.code === Code.cInclude && /includes itself/.test(f.message)));
  });

  it('serves <stdint.h> itself and reports a missing quoted header as a warning at its #include', () => {
    const text = '#include <stdint.h>\n#include "missing.h"\n#define OK 1\n';
    const { table, reads } = workspace({ '/ws/main.c': text });
    const t = table('/ws/main.c');
    assert.ok(!reads.some((r) => r.endsWith('stdint.h')));
    const missing = t.findings.filter((f) => f.code === Code.cInclude);
    assert.equal(missing.length, 1);
    assert.equal(missing[0].severity, 'warning');
    assert.equal(text.slice(missing[0].span.start, missing[0].span.end), '"missing.h"');
    assert.equal(valueOf(t, 'OK'), 1n);
    assert.match(String(valueOf(t, 'NOT_HERE')), /headers not found: "missing.h"/);
  });
});
