// Reading firmware with its build configuration. The rules come from the C standard and the gcc manual
// (ISO C11 6.10.1: a name no one defines is not defined, and stands for 0 in #if; gcc "Preprocessor Options":
// -D NAME is NAME=1, -U, -I, -iquote, -isystem, -include; "Search Path": the order of folders); the database is
// the JSON Compilation Database format (Clang documentation, from memory). Values checked against the
// compilers are in test/reference/gcc-build.test.ts.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { analyzeDocument, defaultAnalyzeOptions, defaultFirmwareSettings, FirmwareCache, firmwareOptions, parseFirmwareSettings, type AnalyzeOptions } from '../../core/analyze';
import { buildConstantTable } from '../../core/c';
import { configFromArguments, parseCompileDatabase, splitCommand } from '../../core/c/config';
import { Code } from '../../core/codes';
import { valueOf } from './c-helpers';
import { runCli, tempWorkspace } from '../helpers/cli';

const folder = (files: Record<string, string>) => tempWorkspace(files, 'tickmark-build-');
const run = runCli;

const table = (files: Record<string, string>, entry: string, args?: string[], extra: Partial<Parameters<typeof buildConstantTable>[2]> = {}) =>
  buildConstantTable(entry, files[entry], {
    dataModel: 'ilp32', includeDirs: [], workspaceRoots: ['/ws'], read: (u) => files[u],
    config: args ? configFromArguments(['cc', ...args], '/ws', 'test') : undefined, ...extra,
  });

const configIdiom = '#ifdef CONF_DIV\n#define DIV CONF_DIV\n#else\n#define DIV 1\n#endif\n#if defined(CHIP_A) || defined(CHIP_B)\n#define CHIP_CLOCK 48\n#endif\n#if BOARD_REV >= 2\n#define LED_PIN 5\n#else\n#define LED_PIN 4\n#endif\n';

describe('the build configuration', () => {
  it('splits a compile command as a shell would and reads its preprocessor flags in order', () => {
    assert.deepEqual(splitCommand(`cc -DNAME="a b" -D 'Q=1' -I inc\\ dir -c x.c`), ['cc', '-DNAME=a b', '-D', 'Q=1', '-I', 'inc dir', '-c', 'x.c']);
    const c = configFromArguments(splitCommand('avr-gcc -DF_CPU=16000000UL -DFAST -UFAST -Iinc -I /abs -isystem sdk -iquote q -include pre.h -std=gnu11 -c main.c'), '/p', 'db');
    assert.deepEqual(c.macros, [{ kind: 'define', name: 'F_CPU', value: '16000000UL' }, { kind: 'define', name: 'FAST', value: '1' }, { kind: 'undef', name: 'FAST' }]);
    assert.deepEqual(c.dirs.include, ['/p/inc', '/abs']);
    assert.deepEqual(c.dirs.system, ['/p/sdk']);
    assert.deepEqual(c.dirs.quote, ['/p/q']);
    assert.deepEqual(c.forcedIncludes, ['/p/pre.h']);
    assert.equal(c.std, 'gnu11');
  });

  it('reads a compile database with "command" or "arguments", paths relative to "directory"; a broken one is a problem, not a throw', () => {
    const db = parseCompileDatabase(JSON.stringify([
      { directory: '/p/build', file: '../src/a.c', command: 'cc -DA=1 -c ../src/a.c' },
      { directory: '/p/build', file: '/p/src/b.c', arguments: ['cc', '-DB=2', '-c', '/p/src/b.c'] },
      { directory: '/p', command: 'cc' },
    ]), '/p/build/compile_commands.json');
    assert.deepEqual([...db.entries.keys()], ['/p/src/a.c', '/p/src/b.c']);
    assert.equal(db.problems.length, 1);
    assert.match(parseCompileDatabase('{', '/x.json').problems[0], /not valid JSON/);
  });

  it('without a configuration keeps both branches and names the undecided condition and how to settle it', () => {
    const t = table({ '/ws/a.c': configIdiom }, '/ws/a.c');
    const r = t.lookup('DIV');
    assert.ok(!r.ok && r.code === Code.cConditional);
    assert.match(r.message, /`#ifdef CONF_DIV` \(a\.c:1\)/);
    assert.match(r.message, /-D CONF_DIV=… .*compile_commands\.json/);
    assert.match(String(valueOf(t, 'LED_PIN')), /`#if BOARD_REV >= 2` \(a\.c:9\)/);
  });

  it('with a configuration follows C exactly: an undefined name is not defined, and 0 in #if (C11 6.10.1p4)', () => {
    const t = table({ '/ws/a.c': configIdiom }, '/ws/a.c', ['-DUNRELATED']);
    assert.equal(valueOf(t, 'DIV'), 1n);
    assert.match(String(valueOf(t, 'CHIP_CLOCK')), /^c-unknown/);
    assert.equal(valueOf(t, 'LED_PIN'), 4n);
    const b = table({ '/ws/a.c': configIdiom }, '/ws/a.c', ['-DCONF_DIV=8', '-DCHIP_B', '-DBOARD_REV=3']);
    assert.equal(valueOf(b, 'DIV'), 8n);
    assert.equal(valueOf(b, 'CHIP_CLOCK'), 48n);
    assert.equal(valueOf(b, 'LED_PIN'), 5n);
    // gcc applies -D and -U in command-line order: the last one wins.
    assert.equal(valueOf(table({ '/ws/a.c': configIdiom }, '/ws/a.c', ['-DCONF_DIV=8', '-UCONF_DIV']), 'DIV'), 1n);
  });

  it('follows <…> into -I and -isystem folders outside the workspace; an escaping path stays refused', () => {
    const files = {
      '/ws/main.c': '#include <dev/regs.h>\n#include <sys_clock.h>\n#include "../../etc/secret.h"\n',
      '/sdk/include/dev/regs.h': '#define TIMER_BASE 0x40000000u\n#define TICK_DIV (1u << 6)\n',
      '/sdk/sys/sys_clock.h': '#define SYS_HZ 48000000u\n',
      '/etc/secret.h': '#define KEY 1\n',
    };
    const reads: string[] = [];
    const t = table(files, '/ws/main.c', ['-I/sdk/include', '-isystem', '/sdk/sys'], { read: (u) => { reads.push(u); return (files as Record<string, string>)[u]; } });
    assert.equal(valueOf(t, 'TIMER_BASE'), 0x40000000n);
    assert.equal(valueOf(t, 'TICK_DIV'), 64n);
    assert.equal(valueOf(t, 'SYS_HZ'), 48000000n);
    assert.ok(!reads.some((r) => r.startsWith('/etc')), 'a path out of every allowed folder is never read');
    assert.ok(t.findings.some((f) => f.code === Code.cInclude && /outside the workspace/.test(f.message)));
    // Without the configuration the SDK is not searched, and the name says which header was missing.
    assert.match(String(valueOf(table(files, '/ws/main.c'), 'SYS_HZ')), /headers not found: <dev\/regs\.h>, <sys_clock\.h>/);
  });

  it('a missing #include in a branch for another platform that is never taken, or is undecided, stays silent', () => {
    const text = '#ifdef PORT_OTHER\n#include "../../Source/portable/other/port.h"\n#include <other_sdk.h>\n#endif\n#define TICK 1000\n';
    assert.deepEqual(table({ '/ws/a.c': text }, '/ws/a.c').findings, []);
    assert.deepEqual(table({ '/ws/a.c': text }, '/ws/a.c', ['-DPORT_MINE']).findings, []);
    const taken = table({ '/ws/a.c': text }, '/ws/a.c', ['-DPORT_OTHER']);
    assert.equal(taken.findings.filter((f) => f.code === Code.cInclude).length, 2, 'a taken branch reports its missing headers');
  });

  it('expands a computed #include, and a -include file comes first', () => {
    const files = { '/ws/main.c': '#define DEVICE_HEADER "dev_a.h"\n#include DEVICE_HEADER\n#define BOTH (FROM_PRE + DEV)\n', '/ws/dev_a.h': '#define DEV 2\n', '/ws/pre.h': '#define FROM_PRE 40\n' };
    assert.equal(valueOf(table(files, '/ws/main.c', ['-include', '/ws/pre.h']), 'BOTH'), 42n);
  });

  it('names a run-time value as such, with the macro and its line', () => {
    const text = '#include <stdint.h>\nextern uint32_t SystemClockHz;\n#define CPU_HZ SystemClockHz\n#define TICKS (CPU_HZ / 1000u)\n#define BUS_HZ read_bus_clock()\n';
    const t = table({ '/ws/clock.h': text }, '/ws/clock.h');
    const tick = t.lookup('TICKS');
    assert.ok(!tick.ok && tick.code === Code.cRuntime);
    assert.match(tick.message, /^TICKS \(clock\.h:4\) is only known at run time: it reads SystemClockHz, which is an extern variable \(clock\.h:2\)/);
    const bus = t.lookup('BUS_HZ');
    assert.ok(!bus.ok && bus.code === Code.cRuntime);
    assert.equal(bus.message, 'BUS_HZ (clock.h:5) is only known at run time: it calls read_bus_clock()');
  });

  it('reads a typedef spelled through a macro', () => {
    const t = table({ '/ws/port.h': '#include <stdint.h>\n#define PORT_STACK_TYPE uint16_t\ntypedef PORT_STACK_TYPE StackType_t;\n#define STACK_MAX ((StackType_t)-1)\n' }, '/ws/port.h');
    // C11 6.3.1.3p2: -1 converted to a 16-bit unsigned type is 65535.
    assert.equal(valueOf(t, 'STACK_MAX'), 65535n);
  });
});

describe('compile_commands.json and -D in the analysis', () => {
  const timerBlock = (clock: string) => [`/* @timing tick`, ' * circuit: timer', ` * clock: ${clock}`, ' * prescaler: 64', ' * reload: F_CPU / 64 / 1000 - 1', ' * expect: 1 kHz', ' */', ''].join('\n');

  it('is found at a folder root or in build/; a header takes the flags of a translation unit that includes it', () => {
    const dir = folder({
      'src/main.c': '#include "tick.h"\n',
      'src/tick.h': timerBlock('F_CPU'),
      'sdk/board.h': '#define BOARD 1\n',
    });
    fs.mkdirSync(path.join(dir, 'build'));
    fs.writeFileSync(path.join(dir, 'build', 'compile_commands.json'), JSON.stringify([{ directory: path.join(dir, 'build'), file: '../src/main.c', command: 'avr-gcc -DF_CPU=16000000UL -c ../src/main.c' }]));
    const r = run(['check', '--json', 'src'], dir);
    const block = JSON.parse(r.out).files.find((f: { path: string }) => f.path === 'src/tick.h').blocks[0];
    // (16000000 / 64 / 1000) - 1 = 249 in C's integer arithmetic; 16 MHz / 64 / 250 = 1 kHz.
    assert.equal(block.params.reload, 249);
    assert.equal(block.values.frequency, 1000);
    assert.equal(r.code, 0, r.out);
  });

  it('takes -D / -U / -I on the command line, on top of the database', () => {
    const dir = folder({ 'fw/tick.c': timerBlock('F_CPU') });
    assert.equal(run(['check', 'fw'], dir).code, 1, 'without F_CPU the block cannot compute');
    const r = run(['check', '--json', '-DF_CPU=16000000UL', 'fw'], dir);
    assert.equal(JSON.parse(r.out).files[0].blocks[0].params.reload, 249);
    assert.equal(r.code, 0);
    const undone = run(['check', '-D', 'F_CPU=16000000UL', '-UF_CPU', 'fw'], dir);
    assert.equal(undone.code, 1);
    assert.match(run(['check', '-D', '9X', 'fw'], dir).err, /-D: `9X` is not a macro name/);
    assert.match(run(['check', '--compile-commands', 'nope.json', 'fw'], dir).err, /no such file/);
  });

  it('skips a header above --max-header-kb with a warning at its #include; the file limit is separate', () => {
    const big = '#define F_CPU 16000000UL\n' + '#define FILLER_REG 0x0u\n'.repeat(3000);
    const dir = folder({ 'fw/tick.c': '#include "device.h"\n' + timerBlock('F_CPU'), 'fw/device.h': big });
    const within = run(['check', '--max-size-kb', '8', 'fw/tick.c'], dir);
    assert.equal(within.code, 0, 'a 70 KB header reads under an 8 KB file limit');
    const skipped = run(['check', '--max-header-kb', '8', 'fw/tick.c'], dir);
    assert.equal(skipped.code, 1);
    assert.match(skipped.out, /^fw\/tick\.c:1:10: warning: "device\.h" is larger than the header size limit of 8 KB/m);
  });
});

describe('headers shared between tables', () => {
  const options = (files: Record<string, string>, reads: string[], firmware: FirmwareCache, version: (u: string) => string): AnalyzeOptions => ({
    ...defaultAnalyzeOptions, workspaceRoots: ['/ws'], firmware, version,
    read: (u) => { reads.push(u); return files[u]; },
  });

  it('a keystroke re-reads and re-preprocesses no unchanged header', () => {
    const files: Record<string, string> = { '/ws/dev.h': '#ifndef DEV_H\n#define DEV_H\n#define SYS_HZ 8000000u\nenum { SLOT = 3 };\n#endif\n' };
    const text = (n: number) => `#include "dev.h"\n#include "dev.h"\n// @timing t\n// circuit: timer\n// clock: SYS_HZ\n// prescaler: 8\n// reload: ${n}\n`;
    const reads: string[] = [];
    const cache = new FirmwareCache();
    const opts = options(files, reads, cache, () => 'v1');
    const first = analyzeDocument({ uri: '/ws/a.c', text: text(999), languageId: 'c' }, opts);
    assert.equal(first.blocks[0].values.frequency, 1000);
    assert.equal(reads.filter((r) => r === '/ws/dev.h').length, 1);
    const second = analyzeDocument({ uri: '/ws/a.c', text: text(499), languageId: 'c' }, opts);
    assert.equal(second.blocks[0].values.frequency, 2000);
    assert.equal(reads.filter((r) => r === '/ws/dev.h').length, 1, 'not read again');
    // The same definition objects: the header's effect was replayed, not preprocessed again.
    const entry = cache.headers.get('/ws/dev.h');
    assert.ok(entry && entry.length >= 1);
    const before = entry[entry.length - 1];
    analyzeDocument({ uri: '/ws/a.c', text: text(249), languageId: 'c' }, opts);
    assert.ok(cache.headers.get('/ws/dev.h')!.includes(before));
    // A new version is read and preprocessed again.
    files['/ws/dev.h'] = files['/ws/dev.h'].replace('8000000u', '16000000u');
    const changed = analyzeDocument({ uri: '/ws/a.c', text: text(999), languageId: 'c' }, options(files, reads, cache, () => 'v2'));
    assert.equal(changed.blocks[0].values.frequency, 2000);
  });

  it('replays a header only where the names it reads are the same', () => {
    const files: Record<string, string> = { '/ws/cfg.h': '#ifdef FAST\n#define DIV 2\n#else\n#define DIV 8\n#endif\n' };
    const cache = new FirmwareCache();
    const read = (u: string) => files[u];
    const build = (text: string) => buildConstantTable('/ws/x.c', text, { dataModel: 'ilp32', includeDirs: [], workspaceRoots: ['/ws'], read, headerMemo: cache.headers, config: configFromArguments(['cc'], '/ws', 't') });
    assert.equal(valueOf(build('#include "cfg.h"\n'), 'DIV'), 8n);
    assert.equal(valueOf(build('#define FAST\n#include "cfg.h"\n'), 'DIV'), 2n);
    assert.equal(valueOf(build('#include "cfg.h"\n'), 'DIV'), 8n);
  });
});

describe('the tickmark.c.* settings', () => {
  it('are read alike from the extension and the language server, and become the core\'s options', () => {
    const raw: Record<string, unknown> = { 'c.defines': ['F_CPU=16000000UL', '-DFAST', '-UFAST', '9BAD', 3], 'c.compileCommands': 'out/compile_commands.json', 'c.maxHeaderSizeKB': 2048, workspaceTrusted: false };
    const settings = parseFirmwareSettings((key) => raw[key]);
    const options = firmwareOptions(settings, '/ws');
    assert.deepEqual(options.macros, [{ kind: 'define', name: 'F_CPU', value: '16000000UL' }, { kind: 'define', name: 'FAST', value: '1' }, { kind: 'undef', name: 'FAST' }]);
    assert.deepEqual(options.compileCommands, ['/ws/out/compile_commands.json']);
    assert.equal(options.maxHeaderBytes, 2048 * 1024);
    assert.equal(options.trusted, false);
    // Wrong types fall back to the defaults of package.json.
    assert.deepEqual(parseFirmwareSettings((key) => ({ 'c.maxHeaderSizeKB': -1, 'c.defines': 'X' } as Record<string, unknown>)[key]), defaultFirmwareSettings);
  });

  it('in a workspace not trusted, a folder outside it that the build names is not read', () => {
    const dir = folder({ 'ws/main.c': '// @timing t\n// circuit: timer\n// clock: SDK_HZ\n// prescaler: 1\n// reload: 999\n#include <clock.h>\n', 'sdk/clock.h': '#define SDK_HZ 1000000u\n' });
    const ws = path.join(dir, 'ws');
    fs.writeFileSync(path.join(ws, 'compile_commands.json'), JSON.stringify([{ directory: ws, file: 'main.c', arguments: ['cc', '-I../sdk', '-c', 'main.c'] }]));
    const analyse = (trusted: boolean) => analyzeDocument({ uri: path.join(ws, 'main.c'), text: fs.readFileSync(path.join(ws, 'main.c'), 'utf8'), languageId: 'c' }, {
      ...defaultAnalyzeOptions, workspaceRoots: [ws], trusted, read: (u) => (fs.existsSync(u) ? fs.readFileSync(u, 'utf8') : undefined),
    });
    assert.equal(analyse(true).blocks[0].values.frequency, 1000);
    const untrusted = analyse(false);
    assert.equal(untrusted.blocks[0].values.frequency, undefined);
    assert.ok(untrusted.findings.some((f) => f.code === Code.cInclude && /outside the workspace/.test(f.message)));
  });
});
