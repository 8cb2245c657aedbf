// `tickmark check` and `tickmark wave`: the engine from a terminal or CI. Exit 0 clean, 1 findings, 2 usage.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { parseArgs, last, type ParsedArgs } from './args';
import { collectFiles, displayPath, isTimingHost } from './files';
import { wantsColor } from './color';
import { ProcessOutput } from './output';
import { checkFiles, cliOptions, rootsFor } from './run';
import { ansiPaint, humanReport, noPaint } from './human';
import { writeJsonReport } from './json';
import { sarifReport } from './sarif';
import { githubReport } from './github';
import { version } from '../project';
import { waveformFor, defaultCycles, maxCycles } from '../present/waveform';
import { renderWaveformSvg } from '../wave/svg';
import type { AnalyzeOptions, DataModelName } from '../analyze';
import { parseMacroFlag, type MacroFlag } from '../c';

export { version };

export interface Io {
  out: (text: string) => void;
  err: (text: string) => void;
  cwd: string;
  color: boolean;
  /** Standard output is a terminal: `--json` and `--sarif` are indented for reading there, one line otherwise. */
  terminal?: boolean;
  /** Standard input, read whole (for `check -`). */
  stdin?: () => string;
}

const usage = `usage: tickmark <command> [options]

commands:
  check   compute every timing block in notes and firmware, report claims that do not hold
  wave    write one block's waveform as SVG
  lsp     serve the same analysis to any editor over the Language Server Protocol (\`tickmark lsp --stdio\`)

run \`tickmark <command> --help\` for its options; \`tickmark --version\` prints the version
`;

const checkHelp = `usage: tickmark check [--format F | --json | --sarif] [--tolerance P] [--include DIR]... [--data-model M] [--series S] [--max-size-kb N] [--exclude GLOB]...
       [-D NAME[=VALUE]]... [-U NAME]... [-I DIR]... [--compile-commands FILE] [--max-header-kb N] PATH...

Scans Markdown notes and C/C++ files for timing blocks, computes each, and prints
\`file:line:col: severity: message\` per finding with a one-line summary per block.
A PATH is a file, a folder (walked, honouring .gitignore), a quoted glob ('notes/**/*.md'),
or - for standard input.

  --format F        human (default), json, sarif, or github (workflow annotations)
  --json            the same as --format json: one JSON object (SI base units, 1-based lines)
  --sarif           the same as --format sarif: SARIF 2.1.0 for code-scanning services
  --tolerance P     default tolerance of \`expect:\` in percent (default 1)
  --include DIR     extra folder for quoted #include (repeatable)
  --data-model M    integer widths for C constants: ilp32 (default), lp64, ip16
  --series S        default series for solved parts: E3 … E192 or none (default E24)
  --max-size-kb N   files above N KB are not read, with a warning (default 1024)
  --exclude GLOB    leave out files and folders matching GLOB, relative to the working folder
                    (repeatable; a GLOB without / matches names at any depth: --exclude vendor)
  --stdin-name PATH the path standard input stands for: its type and where relative includes
                    and firmware: files are found (default stdin.md, a note in the working folder)
  -D NAME[=VALUE]   define a macro for firmware files, as the compiler's -D (repeatable)
  -U NAME           undefine a macro, as the compiler's -U (repeatable)
  -I DIR            include folder for "…" and <…> includes (repeatable; same as --include)
  --compile-commands FILE
                    the build's compile_commands.json (default: found at each folder's root or build/)
  --max-header-kb N headers above N KB are skipped, with a warning at their #include (default 8192)

Colour: on a terminal, unless NO_COLOR is set or TERM=dumb; FORCE_COLOR=1 forces it, FORCE_COLOR=0 stops it.

exit status: 0 nothing wrong, 1 a block has a warning or error, 2 usage error or unreadable path
`;

const waveHelp = `usage: tickmark wave PATH --block NAME [--cycles N] [--out FILE.svg] [--include DIR]... [--data-model M] [--series S] [--tolerance P] [--max-size-kb N]
       [-D NAME[=VALUE]]... [-U NAME]... [-I DIR]... [--compile-commands FILE] [--max-header-kb N]

Writes the waveform of block NAME in file PATH as SVG: the timing node's voltage and the output
from power-up (a discharged capacitor) over N cycles (default ${defaultCycles}, at most ${maxCycles}), thresholds labelled.
Without --out the SVG goes to standard output. --include, --data-model, --series, --tolerance and
--max-size-kb work as for \`tickmark check\`, so a block draws with the constants it checks with.

exit status: 0 written, 1 the block has errors or no waveform, 2 usage error or unreadable path
`;

const dataModels: DataModelName[] = ['ilp32', 'lp64', 'ip16'];

/** Flags that steer the analysis, shared by `check` and `wave` so a block draws as it checks. */
const analysisFlags = {
  tolerance: { value: true },
  include: { value: true },
  'data-model': { value: true },
  series: { value: true },
  'max-size-kb': { value: true },
  D: { value: true },
  U: { value: true },
  I: { value: true },
  'compile-commands': { value: true },
  'max-header-kb': { value: true },
} as const;

/** Flags every command takes. */
const commonFlags = { help: { value: false }, h: { value: false }, version: { value: false } } as const;

const outputFormats = ['human', 'json', 'sarif', 'github'];

function printVersion(io: Io): number {
  io.out(`${version}\n`);
  return 0;
}

export function main(argv: string[], io: Io): number {
  const [command, ...rest] = argv;
  if (!command || command === '--help' || command === '-h' || command === 'help') {
    (command ? io.out : io.err)(usage);
    return command ? 0 : 2;
  }
  if (command === '--version' || command === '-V') return printVersion(io);
  if (command === 'check') return check(rest, io);
  if (command === 'wave') return wave(rest, io);
  io.err(`tickmark: unknown command \`${command}\`\n\n${usage}`);
  return 2;
}

function optionsFrom(args: ParsedArgs, io: Io, paths: string[]): ReturnType<typeof cliOptions> | string {
  const tolerance = last(args, 'tolerance');
  const percent = tolerance === undefined ? 1 : Number(tolerance.replace(/%$/, ''));
  if (!Number.isFinite(percent) || percent < 0 || percent > 100) return `--tolerance takes a percentage from 0 to 100, not ${tolerance}`;
  const dataModel = (last(args, 'data-model') ?? 'ilp32') as DataModelName;
  if (!dataModels.includes(dataModel)) return `--data-model takes ${dataModels.join(', ')}, not ${dataModel}`;
  const includeDirs = args.ordered.filter(([f]) => f === 'include' || f === 'I').map(([, d]) => path.resolve(io.cwd, d));
  for (const dir of includeDirs) if (!isFolder(dir)) return `--include ${dir}: no such folder`;
  const build = buildFlags(args, io);
  if (typeof build === 'string') return build;
  const maxSizeText = last(args, 'max-size-kb');
  const maxSizeKb = maxSizeText === undefined ? 1024 : Number(maxSizeText);
  if (!Number.isFinite(maxSizeKb) || maxSizeKb <= 0) return `--max-size-kb takes a size in KB greater than 0, not ${maxSizeText}`;
  const series = last(args, 'series') ?? 'E24';
  if (!/^(E(3|6|12|24|48|96|192)|none)$/i.test(series)) return `--series takes E3, E6, E12, E24, E48, E96, E192 or none, not ${series}`;
  return cliOptions({
    defaultTolerance: percent / 100,
    dataModel,
    includeDirs,
    defaultSeries: series.toUpperCase() === 'NONE' ? 'none' : series.toUpperCase(),
    workspaceRoots: rootsFor(paths, includeDirs, io.cwd),
    maxFileBytes: Math.round(maxSizeKb * 1024),
    ...build,
  });
}

/** -D / -U in order, --compile-commands and --max-header-kb: how the build configures its firmware. */
function buildFlags(args: ParsedArgs, io: Io): Partial<AnalyzeOptions> | string {
  const macros: MacroFlag[] = [];
  for (const [flag, value] of args.ordered) {
    if (flag !== 'D' && flag !== 'U') continue;
    const m = parseMacroFlag(value, flag === 'D' ? 'define' : 'undef');
    if (typeof m === 'string') return `-${flag}: ${m}`;
    macros.push(m);
  }
  const compileCommands = (args.flags.get('compile-commands') ?? []).map((f) => path.resolve(io.cwd, f));
  for (const file of compileCommands) if (!fs.existsSync(file)) return `--compile-commands ${file}: no such file`;
  const headerText = last(args, 'max-header-kb');
  const headerKb = headerText === undefined ? 8192 : Number(headerText);
  if (!Number.isFinite(headerKb) || headerKb <= 0) return `--max-header-kb takes a size in KB greater than 0, not ${headerText}`;
  return { macros, macrosOrigin: '-D/-U on the command line', compileCommands, maxHeaderBytes: Math.round(headerKb * 1024) };
}

function isFolder(dir: string): boolean {
  try {
    return fs.statSync(dir).isDirectory();
  } catch {
    return false;
  }
}

function check(argv: string[], io: Io): number {
  const args = parseArgs(argv, { json: { value: false }, sarif: { value: false }, format: { value: true }, exclude: { value: true }, 'stdin-name': { value: true }, ...analysisFlags, ...commonFlags });
  if (args.flags.has('help') || args.flags.has('h')) {
    io.out(checkHelp);
    return 0;
  }
  if (args.flags.has('version')) return printVersion(io);
  const problems = [...args.problems];
  const formats = [...(args.flags.get('format') ?? []), ...(args.flags.has('json') ? ['json'] : []), ...(args.flags.has('sarif') ? ['sarif'] : [])];
  const format = formats[0] ?? 'human';
  if (new Set(formats).size > 1) problems.push(`choose one output format, not ${[...new Set(formats)].join(' and ')}`);
  if (!outputFormats.includes(format)) problems.push(`--format takes ${outputFormats.join(', ')}, not ${format}`);
  if (args.positional.length === 0) problems.push('no PATH given');
  // Standard input stands for a file: its extension picks the scanner, its folder anchors relative paths.
  const stdinName = last(args, 'stdin-name');
  const stdinFile = path.resolve(io.cwd, stdinName ?? 'stdin.md');
  const readsStdin = args.positional.includes('-');
  if (args.positional.filter((p) => p === '-').length > 1) problems.push('- (standard input) can be given once');
  if (stdinName !== undefined && !readsStdin) problems.push('--stdin-name names standard input; give - among the paths');
  if (readsStdin && !isTimingHost(stdinFile)) problems.push(`--stdin-name ${stdinName}: not a Markdown (.md .markdown) or C/C++ (.c .h .cc .cpp .cxx .hpp .hh) file`);
  const paths = args.positional.map((p) => (p === '-' ? path.dirname(stdinFile) : path.resolve(io.cwd, p)));
  const options = optionsFrom(args, io, paths);
  if (typeof options === 'string') problems.push(options);
  if (problems.length || typeof options === 'string') {
    io.err(problems.map((p) => `tickmark check: ${p}\n`).join('') + '\n' + checkHelp);
    return 2;
  }
  const exclude = args.flags.get('exclude') ?? [];
  const { files, problems: unreadable } = collectFiles(args.positional.filter((p) => p !== '-'), io.cwd, { exclude });
  const given = new Map<string, string>();
  if (readsStdin) {
    try {
      given.set(stdinFile, (io.stdin ?? readStandardInput)());
    } catch (err) {
      unreadable.push(`cannot read standard input: ${(err as Error).message}`);
    }
    if (!files.includes(stdinFile)) files.push(stdinFile);
  }
  if (unreadable.length) {
    io.err(unreadable.map((p) => `tickmark check: ${p}\n`).join(''));
    return 2;
  }
  const checked = checkFiles(files, options, (file) => displayPath(file, io.cwd), given);
  // A file or a pipe gets the report on one line (half the bytes); a terminal gets it indented.
  const indent = io.terminal ? 2 : undefined;
  if (format === 'json') writeJsonReport(checked, io.cwd, io.out, indent);
  else if (format === 'sarif') io.out(sarifReport(checked, io.cwd, version, indent));
  else if (format === 'github') io.out(githubReport(checked, io.cwd));
  else io.out(humanReport(checked, io.cwd, io.color ? ansiPaint : noPaint));
  const serious = (findings: { severity: string }[]) => findings.some((f) => f.severity !== 'info');
  const failing = checked.some((file) => serious(file.analysis.findings) || file.analysis.blocks.some((b) => serious(b.findings)));
  return failing ? 1 : 0;
}

/** The options `wave` takes; its usage line lists each (test/core/cli.test.ts). */
export const waveFlags = { block: { value: true }, cycles: { value: true }, out: { value: true }, ...analysisFlags } as const;

function wave(argv: string[], io: Io): number {
  const args = parseArgs(argv, { ...waveFlags, ...commonFlags });
  if (args.flags.has('help') || args.flags.has('h')) {
    io.out(waveHelp);
    return 0;
  }
  if (args.flags.has('version')) return printVersion(io);
  const problems = [...args.problems];
  const blockName = last(args, 'block');
  if (args.positional.length !== 1) problems.push('give exactly one PATH');
  if (!blockName) problems.push('--block NAME is required');
  const cyclesText = last(args, 'cycles');
  const cycles = cyclesText === undefined ? defaultCycles : Number(cyclesText);
  if (!Number.isInteger(cycles) || cycles < 1 || cycles > maxCycles) problems.push(`--cycles takes a whole number from 1 to ${maxCycles}`);
  if (problems.length) {
    io.err(problems.map((p) => `tickmark wave: ${p}\n`).join('') + '\n' + waveHelp);
    return 2;
  }
  const file = path.resolve(io.cwd, args.positional[0]);
  const options = optionsFrom(args, io, [path.dirname(file)]);
  const { files, problems: unreadable } = collectFiles([args.positional[0]], io.cwd);
  if (unreadable.length || typeof options === 'string') {
    io.err(`tickmark wave: ${unreadable[0] ?? options}\n`);
    return 2;
  }
  const [checked] = checkFiles(files, options, (f) => displayPath(f, io.cwd));
  const blocks = checked?.analysis.blocks ?? [];
  const block = blocks.find((b) => b.name === blockName);
  if (!block) {
    const names = blocks.map((b) => b.name);
    io.err(`tickmark wave: no block \`${blockName}\` in ${args.positional[0]}${names.length ? ` (blocks: ${names.join(', ')})` : ' (it has no timing blocks)'}\n`);
    return 2;
  }
  const waveform = waveformFor(block, cycles);
  if (!waveform) {
    const error = block.findings.find((f) => f.severity === 'error');
    io.err(`tickmark wave: ${block.name} has ${error ? `an error: ${error.message}` : `no waveform (${block.circuit})`}\n`);
    return 1;
  }
  const svg = renderWaveformSvg(waveform, { title: `${block.name} (${block.circuit})` });
  const out = last(args, 'out');
  if (!out) {
    io.out(svg);
    return 0;
  }
  try {
    fs.writeFileSync(path.resolve(io.cwd, out), svg);
  } catch (err) {
    io.err(`tickmark wave: cannot write ${out}: ${(err as Error).message}\n`);
    return 2;
  }
  io.out(`wrote ${out}\n`);
  return 0;
}

function readStandardInput(): string {
  return fs.readFileSync(0, 'utf8');
}

/** The process's own streams and environment: what `main` gets when it runs as the command (`run`). */
export function processIo(output = { out: new ProcessOutput(1), err: new ProcessOutput(2) }): Io {
  const terminal = output.out.terminal;
  return {
    out: (t) => output.out.write(t),
    err: (t) => output.err.write(t),
    cwd: process.cwd(),
    color: wantsColor(process.env, terminal),
    terminal,
    stdin: readStandardInput,
  };
}

/**
 * The command: `main` on the process's arguments and streams. A reader that stops early (`tickmark check --json |
 * head`) closes the pipe: the report ends there, quietly, with the exit code the check had, as other command-line
 * tools do. With its output all written, the process ends as soon as `main` returns.
 */
export function run(argv: string[]): void {
  const output = { out: new ProcessOutput(1), err: new ProcessOutput(2) };
  const code = main(argv, processIo(output));
  if (output.out.flushed && output.err.flushed) process.exit(code);
  process.exitCode = code;
}

if (require.main === module) run(process.argv.slice(2));
