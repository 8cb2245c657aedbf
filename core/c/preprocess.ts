// Walks a translation unit: directives (#define, #undef, #include "…", conditionals) and, on live lines,
// the declaration scanner. Problems become findings with spans into the file they sit in; nothing throws.
import * as path from '../paths';
import { Code } from '../codes';
import type { Finding, Severity } from '../types';
import { isTooLarge } from '../size';
import { BUILTIN_URI_PREFIX, builtinHeader, BUILTIN_HEADERS, compilerPredefines } from './builtins';
import { decideDefined, decideIf, preprocessorTypes, type Decision } from './conditions';
import type { BuildConfig } from './config';
import type { TypeSystem } from './ctypes';
import { DeclarationScanner, type DeclarationSink } from './declarations';
import { noSearchDirs, resolveInclude, type IncludeEnv } from './include';
import { isError } from './evaluate';
import { DEFAULT_LIMITS, expandMacros, type ExpandLimits, type MacroDef } from './macros';
import { findEffect, storeEffect, type HeaderEffect, type HeaderMemo } from './memo';
import { conditionText, mergeBranches, PlainDefines, Scope, withPlainDefines } from './scope';
import { emptySkim, hasLoneCarriageReturn, nextSkimStop, skimLine } from './skim';
import { lineIndex, tokenizeSourceRange, type SourceToken } from './tokens';

export interface PreprocessOptions extends IncludeEnv {
  ts: TypeSystem;
  maxFileBytes: number;
  /** Headers above this are skipped with a warning at their #include (default: maxFileBytes). */
  maxHeaderBytes?: number;
  limits?: ExpandLimits;
  /**
   * The file's build configuration. With one, preprocessing follows C exactly: a name nothing defines is not
   * defined. Without one, a condition on such a name is undecided and both branches are tracked.
   */
  config?: BuildConfig;
  /** Headers already preprocessed, shared between tables (see memo.ts). */
  headerMemo?: HeaderMemo;
}

/** A header being read with its effect recorded for the memo. */
interface Recording {
  files: Map<string, string>;
  /** Something made this reading depend on where it happened (an include cycle, a limit): not stored. */
  spoiled: boolean;
}

export interface PreprocessResult {
  /** Macros, declarations and typedefs in effect at the end of the file. */
  root: Scope;
  findings: Array<Finding & { uri: string }>;
  dependencies: string[];
  /** Headers not found, as spelled (`<avr/io.h>`, `"board.h"`), for the message of a name left undefined. */
  missing: string[];
}

/** The command line's own macros stand in a file of this name, as gcc calls it. */
export const COMMAND_LINE_URI = '<command line>';

interface Frame {
  parentLive: boolean;
  base: Scope;
  branches: Scope[];
  taken: boolean;
  unknownSoFar: boolean;
  live: boolean;
  elseSeen: boolean;
  at: SourceToken;
  /** The first condition of the group this file could not decide, as written with its place. */
  undecided?: string;
}

// `#define ` up to the name; the name, followed by white space or the line's end (else the macro is function-like,
// or the line is not so plain); then a replacement list free of `\`, quotes and comments to the line's end. A line
// all three match is one logical line whose tokens are its text with white space between.
const PLAIN_DEFINE_LEAD = /[ \t\f\v\r]*#[ \t\f\v\r]*define[ \t\f\v\r]+/y;
const PLAIN_DEFINE_NAME = /[A-Za-z_$][\w$]*(?=[ \t\f\v\r\n]|(?![\s\S]))/y;
const PLAIN_REPLACEMENT = /(?:[ \t\f\v\r][^\n\\'"/]*(?:\/(?![/*])[^\n\\'"/]*)*)?(?=\n|(?![\s\S]))/y;

const MAX_INCLUDE_DEPTH = 200;
const MAX_INCLUDES = 2000;

export function preprocess(entryUri: string, text: string, options: PreprocessOptions): PreprocessResult {
  const limits = options.limits ?? DEFAULT_LIMITS;
  const ppTypes = preprocessorTypes(options.ts);
  const root = new Scope();
  const plain = (root.plain = new PlainDefines());
  const findings: Array<Finding & { uri: string }> = [];
  const dependencies = new Set<string>();
  const missing: string[] = [];
  const exact = options.config !== undefined;
  const maxHeaderBytes = options.maxHeaderBytes ?? options.maxFileBytes;
  const lineOfFile = new Map<string, (offset: number) => number>();
  let current = root;
  let epoch = 0;
  let includes = 0;
  const recordings: Recording[] = [];
  const memo = options.headerMemo;
  // Everything besides the header's text and the names it reads that shapes how it reads.
  const memoContext = memo ? JSON.stringify([
    options.ts.model, options.ts.named.get('char')?.kind === 'int' && (options.ts.named.get('char') as { signed: boolean }).signed,
    exact, options.config?.dirs, options.includeDirs, options.workspaceRoots, options.maxFileBytes, maxHeaderBytes, limits,
  ]) : '';

  const report = (tok: SourceToken | { uri: string; start: number; end: number }, code: string, message: string, severity: Severity = 'warning'): void => {
    findings.push({ severity, code, message, uri: tok.uri, span: { start: tok.start, end: tok.end } });
  };
  const scannerSink: DeclarationSink = {
    declare: (d) => current.decls.set(d.name, { kind: 'def', def: d }),
    typedef: (def) => current.typedefs.set(def.name, { kind: 'def', def }),
    typeNamed: (name) => current.typeNamed(name) ?? options.ts.named.get(name),
    expandType: (tokens) => {
      const lookup = (n: string): MacroDef | undefined => { const b = current.macro(n); return b?.kind === 'def' && !b.def.params ? b.def : undefined; };
      if (!tokens.some((t) => lookup(t.text))) return tokens;
      const expanded = expandMacros(tokens, lookup, limits);
      return isError(expanded) ? tokens : expanded;
    },
    lineOf: (tok) => lineOfFile.get(tok.uri)?.(tok.start) ?? 1,
  };
  const scanner = new DeclarationScanner(scannerSink);

  const processFile = (uri: string, source: string, stack: string[]): void => {
    dependencies.add(uri);
    for (const r of recordings) r.files.set(uri, source);
    lineOfFile.set(uri, lineIndex(source));
    const plainFile = plain.file(uri, source);
    const frames: Frame[] = [];
    const live = (): boolean => frames.length === 0 || frames[frames.length - 1].live;

    const enterBranch = (f: Frame, d: Decision, line: SourceToken[]): void => {
      if (d === 'unknown' && f.undecided === undefined) f.undecided = conditionText(line, lineOfFile.get(uri)?.(line[0].start) ?? 1);
      if (!f.parentLive || f.taken || d === 'false') { f.live = false; current = f.base; }
      else if (d === 'true' && !f.unknownSoFar) { f.live = true; f.taken = true; current = f.base; }
      else {
        f.live = true;
        current = new Scope(f.base, f.undecided);
        f.branches.push(current);
        if (d === 'true') f.taken = true;
        epoch++;
      }
      if (d === 'unknown') f.unknownSoFar = true;
    };
    const closeFrame = (f: Frame): void => {
      if (f.branches.length) { mergeBranches(f.base, f.branches, !f.taken); epoch++; }
      current = f.base;
    };
    const decide = (f: Frame | undefined, line: SourceToken[], hash: SourceToken): Decision => {
      const directive = line[1].text;
      const args = line.slice(2);
      if (f && (!f.parentLive || f.taken)) return 'false';
      if (!f && !live()) return 'false';
      if (directive === 'ifdef' || directive === 'ifndef') {
        if (args[0]?.kind !== 'ident') { report(hash, Code.cSyntax, `#${directive} needs a macro name`); return 'unknown'; }
        const d = decideDefined(current, args[0].text, exact);
        return directive === 'ifdef' || d === 'unknown' ? d : d === 'true' ? 'false' : 'true';
      }
      if (args.length === 0) { report(hash, Code.cSyntax, `#${directive} needs a condition`); return 'unknown'; }
      const r = decideIf(args, current, ppTypes, limits, exact);
      if (r.problem) report(r.problem.tok?.uri === uri ? r.problem.tok : line[1], r.problem.code ?? Code.cSyntax, `#${directive}: ${r.problem.message}`);
      return r.decision;
    };

    // Live code lines since the last statement boundary, skimmed but not yet given to the scanner.
    const pending: number[] = [];
    let pendingLength = 0;
    let tokenMode = !scanner.quiet();
    const feed = (from: number, to: number): void => {
      for (const t of tokenizeSourceRange(source, from, to, uri, [])) {
        if (t.error === 'unterminated comment') report(t, Code.cSyntax, 'unterminated /* comment');
        scanner.push(t, epoch);
      }
    };
    const flush = (): void => {
      for (let k = 0; k < pendingLength; k += 2) feed(pending[k], pending[k + 1]);
      pendingLength = 0;
    };

    const skimmed = emptySkim();
    // 1-based line of the current logical line's start, counted here so #define needs no pass of its own. The
    // skim counts \n alone; a file with a lone \r (a line end to the editor) asks the one line table instead.
    const skimCountsLines = !hasLoneCarriageReturn(source);
    let lineNumber = 0;
    let nextLine = 1;
    /** Whole plain lines [from, to) (see nextSkimStop), as the loop below would take them one by one. */
    const passPlainLines = (from: number, to: number, isLive: boolean): void => {
      let lineStart = from;
      if (isLive) {
        // Only the last `;`, `{` or `}` counts: each one before it only ended a statement nothing declared.
        let boundary = to - 1;
        for (let c = 0; boundary >= from; boundary--) {
          c = source.charCodeAt(boundary);
          if (c === 59 || c === 123 || c === 125) break;
        }
        if (boundary >= from) {
          scanner.boundary();
          lineStart = source.indexOf('\n', boundary) + 1;
          pending[0] = boundary + 1;
          pending[1] = lineStart - 1;
          pendingLength = 2;
        }
      }
      for (let nl = source.indexOf('\n', from); nl >= 0 && nl < to; nl = source.indexOf('\n', nl + 1)) {
        nextLine++;
        if (isLive && nl >= lineStart) {
          pending[pendingLength++] = lineStart;
          pending[pendingLength++] = nl;
          lineStart = nl + 1;
        }
      }
    };
    let stop = -1;
    for (let pos = 0; pos <= source.length;) {
      const isLive = live();
      if (!isLive || !tokenMode) {
        if (stop < pos) stop = nextSkimStop(source, pos);
        const plainEnd = stop > pos ? source.lastIndexOf('\n', stop - 1) + 1 : pos;
        if (plainEnd > pos) {
          passPlainLines(pos, plainEnd, isLive);
          pos = plainEnd;
        }
      }
      if (isLive) {
        const end = definePlain(source, pos, uri, plainFile, skimCountsLines ? nextLine : undefined);
        if (end >= 0) {
          lineNumber = nextLine++;
          pos = end + 1;
          continue;
        }
      }
      const at = skimLine(source, pos, skimmed);
      pos = at.end + 1;
      lineNumber = nextLine;
      nextLine += 1 + at.newlines;
      if (!at.directive) {
        if (!live()) continue;
        if (tokenMode || at.keyword || at.unterminatedAt >= 0) {
          // Exact from here on: the tokens since the statement began, then this line, until nothing is pending.
          flush();
          feed(at.start, at.end);
          tokenMode = !scanner.quiet();
        } else {
          // A keyword-free stretch of code only ends statements that could not declare anything.
          if (at.boundaryEnd >= 0) {
            scanner.boundary();
            pending[0] = at.boundaryEnd;
            pending[1] = at.end;
            pendingLength = 2;
          } else {
            pending[pendingLength++] = at.start;
            pending[pendingLength++] = at.end;
          }
        }
        continue;
      }
      const line = tokenizeSourceRange(source, at.start, at.end, uri, []);
      const hash = line[0];
      const name = line[1]?.text ?? '';
      const top = frames[frames.length - 1];
      if (name === 'if' || name === 'ifdef' || name === 'ifndef') {
        const f: Frame = { parentLive: live(), base: current, branches: [], taken: false, unknownSoFar: false, live: false, elseSeen: false, at: hash };
        const d = decide(undefined, line, hash);
        frames.push(f);
        enterBranch(f, d, line);
      } else if (name === 'elif' || name === 'else') {
        if (!top) { report(hash, Code.cSyntax, `#${name} without #if`); continue; }
        if (top.elseSeen) { report(hash, Code.cSyntax, `#${name} after #else`); continue; }
        if (name === 'else') top.elseSeen = true;
        // Each later branch is decided in the state before the group: the branches before it were not taken.
        current = top.base;
        const d = name === 'else' ? (top.parentLive && !top.taken ? 'true' : 'false') : decide(top, line, hash);
        enterBranch(top, d, line);
      } else if (name === 'endif') {
        if (!top) { report(hash, Code.cSyntax, '#endif without #if'); continue; }
        frames.pop();
        closeFrame(top);
      } else if (!live()) {
        continue;
      } else if (name === 'define') {
        define(line, uri, skimCountsLines && at.newlines === 0 && at.unterminatedAt < 0 ? lineNumber : undefined);
      } else if (name === 'undef') {
        if (line[2]?.kind === 'ident') current.macros.set(line[2].text, { kind: 'undef' });
        else report(hash, Code.cSyntax, '#undef needs a macro name');
      } else if (name === 'include') {
        // The header's code follows this file's code so far, into the same scanner.
        flush();
        include(line, uri, stack);
        tokenMode = !scanner.quiet();
      }
    }
    flush();
    while (frames.length) {
      const f = frames.pop() as Frame;
      report(f.at, Code.cSyntax, '#if without #endif in this file');
      closeFrame(f);
    }
  };

  /** `lineNumber`: the line the whole directive stands on, when it is one physical line. */
  const define = (line: SourceToken[], uri: string, lineNumber: number | undefined): void => {
    const nameTok = line[2];
    if (!nameTok || nameTok.kind !== 'ident') { report(line[0], Code.cSyntax, '#define needs a macro name'); return; }
    let k = 3;
    let params: string[] | undefined;
    let variadic = false;
    if (line[3]?.text === '(' && line[3].start === nameTok.end) {
      params = [];
      for (k = 4; ; k++) {
        const t = line[k];
        if (!t) { report(nameTok, Code.cSyntax, `unterminated parameter list of macro ${nameTok.text}`); return; }
        if (t.text === ')') { k++; break; }
        if (t.text === ',') continue;
        if (t.text === '...') variadic = true;
        else if (t.kind === 'ident') params.push(t.text);
        else { report(t, Code.cSyntax, `'${t.text}' in the parameters of macro ${nameTok.text}`); return; }
      }
    }
    const body = line.slice(k);
    const last = line[line.length - 1];
    const def: MacroDef = {
      name: nameTok.text, params, variadic, body, uri,
      nameSpan: { start: nameTok.start, end: nameTok.end }, span: { start: line[0].start, end: last.end },
      line: lineNumber ?? lineOfFile.get(uri)?.(nameTok.start) ?? 1,
    };
    current.macros.set(def.name, { kind: 'def', def });
  };

  /**
   * `#define NAME replacement` on one line with no comment, literal or splice, starting at `start` (a line start):
   * the macro without skimming or tokenizing the line (see PlainObjectMacro), and the line's end. -1, having done
   * nothing, for any other line.
   */
  const definePlain = (source: string, start: number, uri: string, file: number, lineNumber: number | undefined): number => {
    // Each part's end read from where its match ended: test() makes no match object.
    PLAIN_DEFINE_LEAD.lastIndex = start;
    if (!PLAIN_DEFINE_LEAD.test(source)) return -1;
    const nameStart = PLAIN_DEFINE_LEAD.lastIndex;
    PLAIN_DEFINE_NAME.lastIndex = nameStart;
    if (!PLAIN_DEFINE_NAME.test(source)) return -1;
    const nameEnd = PLAIN_DEFINE_NAME.lastIndex;
    PLAIN_REPLACEMENT.lastIndex = nameEnd;
    if (!PLAIN_REPLACEMENT.test(source)) return -1;
    const end = PLAIN_REPLACEMENT.lastIndex;
    const name = source.slice(nameStart, nameEnd);
    const line = lineNumber ?? lineOfFile.get(uri)?.(nameStart) ?? 1;
    current.macros.set(name, plain.add(file, start, nameEnd, end, line));
    return end;
  };

  const inUndecidedBranch = (): boolean => {
    for (let s: Scope | undefined = current; s; s = s.parent) if (s.condition !== undefined) return true;
    return false;
  };

  /** The header a directive names: `"…"`, `<…>`, or a macro that expands to either (C11 6.10.2p4). */
  const includeTarget = (line: SourceToken[]): { spelled: string; angled: boolean } | undefined => {
    let tokens = line.slice(2);
    if (tokens[0]?.kind === 'ident') {
      const lookup = (n: string): MacroDef | undefined => { const b = current.macro(n); return b?.kind === 'def' ? b.def : undefined; };
      const expanded = expandMacros(tokens, lookup, limits);
      if (isError(expanded)) return undefined;
      tokens = expanded;
    }
    const first = tokens[0];
    if (first?.kind === 'string' && first.text.startsWith('"') && !first.error) return { spelled: first.text.slice(1, -1), angled: false };
    if (first?.text !== '<') return undefined;
    const close = tokens.findIndex((t) => t.text === '>');
    if (close < 0) return undefined;
    // Spelled as written: the tokens of `<avr/io.h>` joined back where they stand side by side.
    let spelled = '';
    for (let k = 1; k < close; k++) spelled += (k > 1 && tokens[k].start > tokens[k - 1].end && tokens[k].uri === tokens[k - 1].uri ? ' ' : '') + tokens[k].text;
    return { spelled, angled: true };
  };

  const include = (line: SourceToken[], uri: string, stack: string[]): void => {
    const target = line[2];
    if (!target) { report(line[0], Code.cSyntax, '#include needs a header name'); return; }
    const named = includeTarget(line);
    // An #include in a branch this file cannot decide may be another platform's: a problem there stays quiet.
    const quiet = inUndecidedBranch();
    if (!named) {
      if (!quiet) report(target, Code.cInclude, 'computed #include is not followed', 'info');
      return;
    }
    const { spelled, angled } = named;
    const shown = angled ? `<${spelled}>` : `"${spelled}"`;
    const at = { uri, start: target.start, end: line[line.length - 1].end };
    const dirs = options.config?.dirs ?? noSearchDirs;
    const found = BUILTIN_HEADERS.has(spelled) && angled ? undefined : resolveInclude(uri, spelled, options, dirs, angled);
    if (!found || (found.kind === 'missing' && BUILTIN_HEADERS.has(spelled))) {
      const builtin = builtinHeader(spelled, options.ts) as string;
      if (!stack.includes(BUILTIN_URI_PREFIX + spelled)) processFile(BUILTIN_URI_PREFIX + spelled, builtin, [...stack, BUILTIN_URI_PREFIX + spelled]);
      return;
    }
    if (found.kind === 'outside') {
      if (!quiet) report(at, Code.cInclude, `${shown} resolves outside the workspace and the folders the build names (${found.uri}); not read`);
      return;
    }
    if (found.kind === 'missing') {
      missing.push(shown);
      if (quiet) return;
      const where = found.looked.length ? `looked in ${found.looked.map((f) => path.dirname(f)).join(', ')}` : 'no include folder is configured';
      // A system header not on the search path is normal (the C library); a project header that is missing is not.
      if (angled) report(at, Code.cInclude, `${shown} not found (${where}); give its folder with -I, -isystem or compile_commands.json to read it`, 'info');
      else report(at, Code.cInclude, `cannot find ${shown} (${where}); its constants are not read`);
      return;
    }
    // One re-entry is allowed so an include guard can end it quietly; a second means the cycle is unguarded.
    if (stack.filter((u) => u === found.uri).length >= 2) { spoil(); report(at, Code.cInclude, `${shown} includes itself (${[...stack, found.uri].join(' → ')}); not followed again`); return; }
    if (stack.length >= MAX_INCLUDE_DEPTH || ++includes > MAX_INCLUDES) { spoil(); report(at, Code.cExpansionLimit, `too many nested or repeated includes; ${shown} not read`); return; }
    if (isTooLarge(found.text, maxHeaderBytes)) {
      report(at, Code.fileTooLarge, `${shown} is larger than the header size limit of ${Math.round(maxHeaderBytes / 1024)} KB (tickmark.c.maxHeaderSizeKB, --max-header-kb); not read`);
      return;
    }
    if (memo && scanner.idle()) readRecorded(found.uri, found.text, [...stack, found.uri], quiet);
    else processFile(found.uri, found.text, [...stack, found.uri]);
  };

  const spoil = (): void => { for (const r of recordings) r.spoiled = true; };

  /** Reads a header through the memo: its stored effect when every name it read is unchanged, else afresh. */
  const readRecorded = (uri: string, source: string, stack: string[], quiet: boolean): void => {
    const memoMap = memo as HeaderMemo;
    const context = memoContext + (quiet ? '|quiet' : '');
    const here = {
      macro: (n: string) => current.macro(n),
      decl: (n: string) => current.decl(n),
      typedef: (n: string) => current.typedef(n),
      read: options.read,
    };
    const stored = findEffect(memoMap, uri, source, context, here);
    if (stored) { replay(stored); return; }
    const outer = current;
    const layer = new Scope(outer);
    layer.reads = { macros: new Map(), decls: new Map(), typedefs: new Map() };
    const recording: Recording = { files: new Map(), spoiled: false };
    const before = { findings: findings.length, missing: missing.length, includes };
    recordings.push(recording);
    current = layer;
    try {
      processFile(uri, source, stack);
    } finally {
      recordings.pop();
      current = outer;
    }
    for (const [n, b] of layer.macros) outer.macros.set(n, b);
    for (const [n, b] of layer.decls) outer.decls.set(n, b);
    for (const [n, b] of layer.typedefs) outer.typedefs.set(n, b);
    if (recording.spoiled || !scanner.idle()) { spoil(); return; }
    storeEffect(memoMap, uri, {
      context, text: source, files: [...recording.files],
      macroReads: layer.reads.macros, declReads: layer.reads.decls, typedefReads: layer.reads.typedefs,
      macros: withPlainDefines(layer, layer.macros), decls: layer.decls, typedefs: layer.typedefs,
      findings: findings.slice(before.findings), missing: missing.slice(before.missing), includes: includes - before.includes,
    });
  };

  const replay = (e: HeaderEffect): void => {
    for (const [file, text] of e.files) { dependencies.add(file); for (const r of recordings) r.files.set(file, text); }
    for (const [n, b] of e.macros) current.macros.set(n, b);
    for (const [n, b] of e.decls) current.decls.set(n, b);
    for (const [n, b] of e.typedefs) current.typedefs.set(n, b);
    findings.push(...e.findings);
    missing.push(...e.missing);
    includes += e.includes;
    if (e.decls.size) epoch++;
  };

  /** The compiler's own macros, then -D / -U in order, then -include files: what gcc reads before the file. */
  const prelude = (): void => {
    processFile(BUILTIN_URI_PREFIX + 'predefined', compilerPredefines(options.ts), []);
    const config = options.config;
    if (!config) return;
    for (const m of config.macros) {
      if (m.kind === 'undef') { current.macros.set(m.name, { kind: 'undef' }); continue; }
      // `-D NAME=VALUE` is `#define NAME VALUE` (gcc manual); the text is tokenized as a line of its own.
      const lineText = `#define ${m.name} ${m.value}`;
      define(tokenizeSourceRange(lineText, 0, lineText.length, COMMAND_LINE_URI, []), COMMAND_LINE_URI, 1);
    }
    for (const file of config.forcedIncludes) {
      const text = options.read(file);
      if (text === undefined) { findings.push({ severity: 'warning', code: Code.cInclude, message: `cannot read ${file}, named by -include in ${config.origin}`, uri: entryUri, span: { start: 0, end: 0 } }); continue; }
      if (text.length > maxHeaderBytes) { findings.push({ severity: 'warning', code: Code.fileTooLarge, message: `${file} (-include) is larger than the header size limit; not read`, uri: entryUri, span: { start: 0, end: 0 } }); continue; }
      processFile(file, text, [file]);
    }
  };

  if (text.length > options.maxFileBytes) {
    findings.push({ severity: 'warning', code: Code.fileTooLarge, message: `file is larger than ${options.maxFileBytes} bytes; constants not read`, uri: entryUri, span: { start: 0, end: 0 } });
    dependencies.add(entryUri);
  } else {
    prelude();
    processFile(entryUri, text, [entryUri]);
  }
  for (const d of [...dependencies]) if (d.startsWith(BUILTIN_URI_PREFIX) || d === COMMAND_LINE_URI) dependencies.delete(d);
  return { root, findings, dependencies: [...dependencies], missing };
}
