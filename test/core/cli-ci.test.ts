// Output for CI: SARIF validated against the official SARIF 2.1.0 JSON schema (OASIS, as shipped in npm by
// @microsoft/jest-sarif; loaded, never copied) with ajv, plus the fields GitHub code scanning reads; GitHub
// Actions workflow commands; the JSON report's version and relative paths.
import { strict as assert } from 'assert';
import * as fs from 'node:fs';
import * as path from 'node:path';
import Ajv from 'ajv';
import addFormats from 'ajv-formats';
import { spawnSync } from 'node:child_process';
import { main } from '../../core/cli/main';
import { wantsColor } from '../../core/cli/color';
import { codeTable } from '../../core/codes';
import { runCli, tempWorkspace } from '../helpers/cli';

const workspace = (files: Record<string, string>) => tempWorkspace(files, 'tickmark-ci-');
const run = runCli;

/** The SARIF 2.1.0 schema from npm. It is draft-04 JSON Schema; its only draft-04 keyword is the root `id`. */
function sarifValidator() {
  const file = require.resolve('@microsoft/jest-sarif/lib/schemas/sarif-2.1.0-rtm.5.json');
  const { $schema: _draft, id, ...schema } = JSON.parse(fs.readFileSync(file, 'utf8'));
  // Its language-tag pattern is not valid with the `u` flag; ajv then compiles patterns without it.
  const ajv = new Ajv({ allErrors: true, strict: false, unicodeRegExp: false });
  addFormats(ajv);
  return ajv.compile({ ...schema, $id: id });
}

// 16 MHz / 64 / 256 = 976.6 Hz against a 1 kHz claim (timer law): a warning on line 8.
const staleNote = ['# tick', '', '```timing tick', 'circuit: timer', 'clock: 16 MHz', 'prescaler: 64', 'reload: 255', 'expect: 1 kHz', '```', ''].join('\n');
const files = {
  'notes/stale.md': staleNote,
  'notes/even.md': '```timing ring3\ncircuit: ring\nstages: 4\ntpd: 1n\n```\n',
  'fw/tick.c': '#include "board.h"\n// @timing t\n// circuit: timer\n// clock: CLK\n// prescaler: 64\n// reload: 249\n// expect: 1 kHz\n',
  // A quoted include that is not there: a note located in the header.
  'fw/board.h': '#include "missing.h"\n#define CLK 16000000u\n',
};

describe('tickmark check for CI', () => {
  it('writes SARIF that the official 2.1.0 schema accepts, with what code scanning reads', () => {
    const dir = workspace(files);
    const r = run(['check', '--format', 'sarif', '.'], dir);
    assert.equal(r.code, 1, r.err);
    const log = JSON.parse(r.out);
    const validate = sarifValidator();
    // The validator can say no: a run without its tool is not SARIF.
    assert.equal(validate({ version: '2.1.0', runs: [{ results: [] }] }), false);
    // Validated as a fresh parse: the validator is a type guard and would narrow `log` to `unknown`.
    const valid = validate(JSON.parse(r.out));
    assert.ok(valid, JSON.stringify(validate.errors, null, 2));
    const [sarifRun] = log.runs;
    const driver = sarifRun.tool.driver;
    assert.match(driver.informationUri, /^https:\/\//);
    assert.match(driver.version, /^\d+\.\d+\.\d+/);
    // Every code has its rule, each with descriptions, help in text and Markdown, and a link into docs/.
    for (const { id: code } of codeTable) {
      const rule = driver.rules.find((x: { id: string }) => x.id === code);
      assert.ok(rule, code);
      assert.ok(rule.shortDescription.text && rule.fullDescription.text && rule.help.text && rule.help.markdown, code);
      assert.equal(rule.helpUri, `${driver.informationUri}/blob/main/docs/blocks.md#${code}`);
    }
    assert.ok(sarifRun.results.length >= 2);
    const base = sarifRun.originalUriBaseIds['%SRCROOT%'].uri;
    assert.match(base, /^file:\/\/.*\/$/);
    for (const result of sarifRun.results) {
      const location = result.locations[0].physicalLocation;
      // Relative to the working folder, against %SRCROOT%, as code scanning maps results onto the repository.
      assert.equal(location.artifactLocation.uriBaseId, '%SRCROOT%');
      assert.doesNotMatch(location.artifactLocation.uri, /^(\/|file:)/);
      assert.ok(fs.existsSync(new URL(location.artifactLocation.uri, base)), location.artifactLocation.uri);
      assert.equal(driver.rules[result.ruleIndex].id, result.ruleId);
      assert.match(result.partialFingerprints['tickmarkFinding/v1'], /^[0-9a-f]{32}:\d+$/);
    }
    const header = sarifRun.results.find((x: { ruleId: string }) => x.ruleId === 'c-include');
    assert.equal(header.locations[0].physicalLocation.artifactLocation.uri, 'fw/board.h');
  });

  it('keeps a finding\'s fingerprint when lines are added above it', () => {
    const dir = workspace({ 'stale.md': staleNote });
    const before = JSON.parse(run(['check', '--sarif', 'stale.md'], dir).out).runs[0].results[0];
    fs.writeFileSync(path.join(dir, 'stale.md'), 'A new paragraph.\n\n' + staleNote);
    const after = JSON.parse(run(['check', '--sarif', 'stale.md'], dir).out).runs[0].results[0];
    assert.equal(after.locations[0].physicalLocation.region.startLine, before.locations[0].physicalLocation.region.startLine + 2);
    assert.deepEqual(after.partialFingerprints, before.partialFingerprints);
  });

  it('writes GitHub Actions workflow commands with file, line and column', () => {
    const dir = workspace({ 'notes/stale.md': staleNote });
    const r = run(['check', '--format', 'github', 'notes'], dir);
    assert.equal(r.code, 1);
    const [annotation, summary] = r.out.trimEnd().split('\n');
    // GitHub Actions workflow commands: `::warning file=…,line=…,col=…::message`, `:` and `,` escaped in values.
    assert.match(annotation, /^::warning file=notes\/stale\.md,line=8,col=9,endLine=8,endColumn=\d+,title=Tickmark expect-mismatch \(tick\)::tick: computes 976\.6 Hz/);
    assert.match(summary, /^Tickmark: 1 block, 0 errors, 1 warning, 0 notes$/);
  });

  it('escapes newlines and percent signs in workflow commands', () => {
    const dir = workspace({ 'a%b.md': '```timing x\ncircuit: nothing-like-this\n```\n' });
    const r = run(['check', '--format', 'github', '.'], dir);
    assert.match(r.out, /file=a%25b\.md,/);
    for (const line of r.out.trimEnd().split('\n')) assert.doesNotMatch(line, /\r/);
  });

  it('writes JSON with its version and paths relative to the working folder, headers included', () => {
    const dir = workspace(files);
    const json = JSON.parse(run(['check', '--json', '.'], dir).out);
    assert.equal(json.version, 1);
    assert.deepEqual(json.files.map((f: { path: string }) => f.path).sort(), ['fw/tick.c', 'notes/even.md', 'notes/stale.md']);
    const tick = json.files.find((f: { path: string }) => f.path === 'fw/tick.c');
    const inHeader = [...tick.diagnostics, ...tick.blocks[0].diagnostics].find((d: { file?: string }) => d.file);
    assert.equal(inHeader.file, 'fw/board.h');
    // The constant a block read, with its defining file shown as `path` shows files (its absolute `uri` beside it).
    const [clock] = tick.blocks[0].identifiers;
    assert.deepEqual([clock.name, clock.value, clock.file, clock.line], ['CLK', 16e6, 'fw/board.h', 2]);
    assert.equal(clock.uri, path.join(dir, 'fw', 'board.h'));
  });

  it('takes one output format and names a wrong one', () => {
    const dir = workspace({ 'notes/stale.md': staleNote });
    assert.equal(run(['check', '--format', 'xml', 'notes'], dir).code, 2);
    assert.equal(run(['check', '--format', 'json', '--sarif', 'notes'], dir).code, 2);
    assert.equal(JSON.parse(run(['check', '--format', 'json', '--json', 'notes'], dir).out).version, 1);
  });

  it('prints the version from every command', () => {
    const dir = workspace({});
    const version = JSON.parse(fs.readFileSync(path.join(__dirname, '../../package.json'), 'utf8')).version;
    for (const argv of [['--version'], ['check', '--version'], ['wave', '--version']]) {
      const r = run(argv, dir);
      assert.equal(r.code, 0);
      assert.equal(r.out, `${version}\n`);
    }
  });
});

describe('tickmark check: what it reads', () => {
  const note = (name: string) => ['```timing ' + name, 'circuit: timer', 'clock: 16 MHz', 'prescaler: 64', 'reload: 249', 'expect: 1 kHz', '```', ''].join('\n');
  const names = (cwd: string, argv: string[]) => {
    const json = JSON.parse(run(['check', '--json', ...argv], cwd).out);
    return json.files.map((f: { path: string }) => f.path).sort();
  };

  it('honours .gitignore as git reads it: nested files, folder patterns, negation, the repository root above', () => {
    const dir = workspace({
      '.git/info/exclude': 'scratch.md\n',
      '.gitignore': 'vendor/\n*.gen.h\n',
      'scratch.md': note('scratch'),
      'a.md': note('a'),
      'vendor/sdk.h': '// @timing sdk\n// circuit: ring\n// stages: 4\n',
      'fw/regs.gen.h': '// @timing gen\n// circuit: ring\n// stages: 4\n',
      'fw/main.c': '// @timing main\n// circuit: timer\n// clock: 16 MHz\n// prescaler: 64\n// reload: 249\n',
      'notes/.gitignore': 'draft-*.md\n!draft-keep.md\n',
      'notes/draft-1.md': note('d1'),
      'notes/draft-keep.md': note('dk'),
    });
    assert.deepEqual(names(dir, ['.']), ['a.md', 'fw/main.c', 'notes/draft-keep.md']);
    // Walking a sub-folder still reads the .gitignore files above it, up to the repository root.
    assert.deepEqual(names(path.join(dir, 'fw'), ['.']), ['main.c']);
    // A file named on the command line is read even when git ignores it.
    assert.deepEqual(names(dir, ['vendor/sdk.h']), ['vendor/sdk.h']);
  });

  it('leaves out --exclude globs, by path or by name at any depth', () => {
    const dir = workspace({ 'a.md': note('a'), 'third_party/lib/x.h': '// @timing x\n// circuit: ring\n// stages: 4\n', 'notes/old/b.md': note('b'), 'notes/c.md': note('c') });
    assert.deepEqual(names(dir, ['--exclude', 'third_party', '.']), ['a.md', 'notes/c.md', 'notes/old/b.md']);
    assert.deepEqual(names(dir, ['--exclude', 'notes/old/**', '--exclude', '**/*.h', '.']), ['a.md', 'notes/c.md']);
  });

  it('expands a quoted glob, and says so when it matches nothing', () => {
    const dir = workspace({ 'a.md': note('a'), 'notes/b.md': note('b'), 'notes/deep/c.md': note('c'), 'notes/d.c': '' });
    assert.deepEqual(names(dir, ['notes/**/*.md']), ['notes/b.md', 'notes/deep/c.md']);
    assert.deepEqual(names(dir, ['*.md']), ['a.md']);
    const none = run(['check', 'nothing/**/*.md'], dir);
    assert.equal(none.code, 2);
    assert.match(none.err, /no Markdown or C\/C\+\+ file matches nothing\/\*\*\/\*\.md/);
  });

  it('reads standard input with -, typed and anchored by --stdin-name', () => {
    const dir = workspace({ 'fw/board.h': '#define CLK 16000000u\n#define TOP 255u\n' });
    const c = '#include "board.h"\n// @timing t\n// circuit: timer\n// clock: CLK\n// prescaler: 64\n// reload: TOP\n// expect: 1 kHz\n';
    const r = (argv: string[], input: string) => {
      let out = '';
      let err = '';
      const code = main(argv, { out: (t) => (out += t), err: (t) => (err += t), cwd: dir, color: false, stdin: () => input });
      return { code, out, err };
    };
    // The include is found beside the name standard input stands for; 16 MHz / 64 / 256 misses 1 kHz.
    const checked = r(['check', '--stdin-name', 'fw/tick.c', '-'], c);
    assert.equal(checked.code, 1, checked.err);
    assert.match(checked.out, /^fw\/tick\.c:7:\d+: warning: t: computes 976\.6 Hz/m);
    // Without a name it is a note.
    const md = r(['check', '--json', '-'], note('piped'));
    assert.equal(md.code, 0, md.err);
    assert.equal(JSON.parse(md.out).files[0].path, 'stdin.md');
    assert.equal(r(['check', '--stdin-name', 'x.txt', '-'], '').code, 2);
    assert.equal(r(['check', '--stdin-name', 'x.md', 'a.md'], '').code, 2);
  });
});

describe('tickmark colour', () => {
  // Node's documented order for terminal colour (tty getColorDepth): FORCE_COLOR, then NO_COLOR, then TERM=dumb.
  it('follows FORCE_COLOR, NO_COLOR and TERM=dumb', () => {
    assert.equal(wantsColor({}, true), true);
    assert.equal(wantsColor({}, false), false);
    assert.equal(wantsColor({ NO_COLOR: '1' }, true), false);
    assert.equal(wantsColor({ NO_COLOR: '' }, true), true);
    assert.equal(wantsColor({ TERM: 'dumb' }, true), false);
    assert.equal(wantsColor({ FORCE_COLOR: '1' }, false), true);
    assert.equal(wantsColor({ FORCE_COLOR: '1', NO_COLOR: '1', TERM: 'dumb' }, false), true);
    assert.equal(wantsColor({ FORCE_COLOR: '0' }, true), false);
  });

  it('colours a pipe when the installed command is forced to', () => {
    const dir = workspace({ 'stale.md': staleNote });
    const bin = path.resolve(__dirname, '../../bin/tickmark.js');
    const env: NodeJS.ProcessEnv = { ...process.env, FORCE_COLOR: '1' };
    delete env.NO_COLOR;
    const forced = spawnSync(process.execPath, [bin, 'check', 'stale.md'], { cwd: dir, encoding: 'utf8', env });
    assert.match(forced.stdout, /\x1b\[33mwarning/);
    const dumb = spawnSync(process.execPath, [bin, 'check', 'stale.md'], { cwd: dir, encoding: 'utf8', env: { ...env, FORCE_COLOR: '0' } });
    assert.doesNotMatch(dumb.stdout, /\x1b\[/);
  });

  it('writes --json and --sarif on one line to a file or pipe, indented at a terminal, the same object either way', () => {
    const dir = workspace({ 'stale.md': staleNote });
    for (const flag of ['--json', '--sarif']) {
      const piped = run(['check', flag, 'stale.md'], dir).out;
      let terminal = '';
      main(['check', flag, 'stale.md'], { out: (t) => (terminal += t), err: () => undefined, cwd: dir, color: false, terminal: true });
      assert.equal(piped.split('\n').length, 2, `${flag}: one line and its newline`);
      assert.match(terminal, /\n {2}"version"/, `${flag}: indented by two spaces at a terminal`);
      assert.deepEqual(JSON.parse(piped), JSON.parse(terminal));
    }
  });

  it('writes a long one-line report in pieces that make exactly the JSON of the whole', () => {
    // ECMA-262 JSON.stringify of the whole report (the terminal's, parsed) is the reference: the pieces joined are
    // that text, byte for byte.
    const blocks = Array.from({ length: 400 }, (_, i) => staleNote.replace('timing tick', `timing tick-${i}`)).join('\n');
    const dir = workspace({ 'stale.md': blocks });
    const pieces: string[] = [];
    main(['check', '--json', 'stale.md'], { out: (t) => pieces.push(t), err: () => undefined, cwd: dir, color: false, terminal: false });
    // The whole report, made at once as a terminal gets it (indented by JSON.stringify of the one object).
    let whole = '';
    main(['check', '--json', 'stale.md'], { out: (t) => (whole += t), err: () => undefined, cwd: dir, color: false, terminal: true });
    const text = pieces.join('');
    assert.ok(pieces.length > 1, 'more than one piece');
    assert.equal(text, JSON.stringify(JSON.parse(whole)) + '\n');
    assert.equal(JSON.parse(text).files[0].blocks.length, 400);
  });

  it('stops quietly when the reader closes the pipe early, keeping the exit code', () => {
    // Common practice of command-line tools: `tool | head` ends the tool without an error of its own. The reader
    // is the shell's `head` (coreutils), a real early-closing pipe; the report is large enough to outrun it.
    const blocks = Array.from({ length: 400 }, (_, i) => staleNote.replace('timing tick', `timing tick-${i}`)).join('\n');
    const dir = workspace({ 'stale.md': blocks });
    const bin = path.resolve(__dirname, '../../bin/tickmark.js');
    const full = spawnSync(process.execPath, [bin, 'check', '--json', 'stale.md'], { cwd: dir, encoding: 'utf8', maxBuffer: 1 << 26 });
    assert.ok(full.stdout.length > 1 << 16, 'the report is longer than a pipe buffer');
    const code = spawnSync('/bin/bash', ['-c', `"${process.execPath}" "${bin}" check --json stale.md | head -c 100 >/dev/null; exit \${PIPESTATUS[0]}`], { cwd: dir, encoding: 'utf8' });
    assert.equal(code.stderr, '', 'no error or stack trace from the closed pipe');
    assert.equal(code.status, full.status, 'the exit code is the check\'s, as without the early close');
  });
});

describe('command output to a file or pipe', () => {
  it('writes a long report piece by piece with every character whole', () => {
    // RFC 3629: a character beyond U+FFFF is one four-byte sequence (never two three-byte halves); Node's
    // Buffer.from is the reference encoding. The pair straddles the first piece boundary, others follow it. A child
    // process writes through its standard output, which is the file.
    const text = 'a'.repeat(16383) + '\u{1F552}' + '±'.repeat(20000) + '\u{10FFFF}x\n';
    const dir = workspace({});
    const file = path.join(dir, 'out.txt');
    const fd = fs.openSync(file, 'w');
    const script = `require('tsx/cjs'); const { ProcessOutput } = require(${JSON.stringify(path.resolve(__dirname, '../../core/cli/output.ts'))});
      const out = new ProcessOutput(1); out.write(process.argv[1]); out.write(''); out.write('end\\n'); if (!out.flushed) process.exit(3);`;
    try {
      const run = spawnSync(process.execPath, ['-e', script, text], { stdio: ['ignore', fd, 'pipe'], encoding: 'utf8' });
      assert.equal(run.status, 0, run.stderr);
    } finally {
      fs.closeSync(fd);
    }
    assert.ok(fs.readFileSync(file).equals(Buffer.from(text + 'end\n', 'utf8')));
  });
});

describe('VS Code problem matcher $tickmark', () => {
  it('reads every finding line of the human report, as --json places it', () => {
    const pkg = JSON.parse(fs.readFileSync(path.join(__dirname, '../../package.json'), 'utf8'));
    const matcher = pkg.contributes.problemMatchers.find((m: { name: string }) => m.name === 'tickmark');
    const pattern = new RegExp(matcher.pattern.regexp);
    const dir = workspace(files);
    const human = run(['check', '.'], dir).out.split('\n');
    const json = JSON.parse(run(['check', '--json', '.'], dir).out);
    const expected: string[] = [];
    for (const file of json.files) {
      for (const d of [...file.diagnostics, ...file.blocks.flatMap((b: { diagnostics: unknown[] }) => b.diagnostics)]) {
        expected.push(`${d.file ?? file.path}:${d.line}:${d.column}:${d.severity === 'info' ? 'note' : d.severity}`);
      }
    }
    const matched = human.map((line) => pattern.exec(line)).filter((m): m is RegExpExecArray => m !== null);
    const p = matcher.pattern;
    assert.deepEqual(matched.map((m) => `${m[p.file]}:${m[p.line]}:${m[p.column]}:${m[p.severity]}`).sort(), expected.sort());
    assert.ok(expected.length >= 3);
    // Block summary lines are not findings.
    assert.ok(human.some((line) => /\(timer\)/.test(line) && !pattern.test(line)));
  });
});
