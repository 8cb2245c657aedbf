// Walks a translation unit: directives (#define, #undef, #include "…", conditionals) and, on live lines,
// the declaration scanner. Problems become findings with spans into the file they sit in; nothing throws.
import { Code } from '../codes';
import type { Finding, Severity } from '../types';
import { decideDefined, decideIf, preprocessorTypes, type Decision } from './conditions';
import type { TypeSystem } from './ctypes';
import { DeclarationScanner } from './declarations';
import { resolveInclude, type IncludeEnv } from './include';
import { DEFAULT_LIMITS, type ExpandLimits, type MacroDef } from './macros';
import { mergeBranches, Scope } from './scope';
import { emptySkim, skimLine } from './skim';
import { lineIndex, tokenizeSourceRange, type SourceToken } from './tokens';

export interface PreprocessOptions extends IncludeEnv {
  ts: TypeSystem;
  maxFileBytes: number;
  limits?: ExpandLimits;
}

export interface PreprocessResult {
  /** Macros, declarations and typedefs in effect at the end of the file. */
  root: Scope;
  findings: Array<Finding & { uri: string }>;
  dependencies: string[];
}

interface Frame {
  parentLive: boolean;
  base: Scope;
  branches: Scope[];
  taken: boolean;
  unknownSoFar: boolean;
  live: boolean;
  elseSeen: boolean;
  at: SourceToken;
}

const MAX_INCLUDE_DEPTH = 200;
const MAX_INCLUDES = 2000;

export function preprocess(entryUri: string, text: string, options: PreprocessOptions): PreprocessResult {
  const limits = options.limits ?? DEFAULT_LIMITS;
  const ppTypes = preprocessorTypes(options.ts);
  const root = new Scope();
  const findings: Array<Finding & { uri: string }> = [];
  const dependencies = new Set<string>();
  const lineOfFile = new Map<string, (offset: number) => number>();
  let current = root;
  let epoch = 0;
  let includes = 0;

  const report = (tok: SourceToken | { uri: string; start: number; end: number }, code: string, message: string, severity: Severity = 'warning'): void => {
    findings.push({ severity, code, message, uri: tok.uri, span: { start: tok.start, end: tok.end } });
  };
  const scanner = new DeclarationScanner({
    declare: (d) => current.decls.set(d.name, { kind: 'def', def: d }),
    typedef: (def) => current.typedefs.set(def.name, { kind: 'def', def }),
    typeNamed: (name) => current.typeNamed(name) ?? options.ts.named.get(name),
    lineOf: (tok) => lineOfFile.get(tok.uri)?.(tok.start) ?? 1,
  });

  const processFile = (uri: string, source: string, stack: string[]): void => {
    dependencies.add(uri);
    lineOfFile.set(uri, lineIndex(source));
    const frames: Frame[] = [];
    const live = (): boolean => frames.length === 0 || frames[frames.length - 1].live;

    const enterBranch = (f: Frame, d: Decision): void => {
      if (!f.parentLive || f.taken || d === 'false') { f.live = false; current = f.base; }
      else if (d === 'true' && !f.unknownSoFar) { f.live = true; f.taken = true; current = f.base; }
      else {
        f.live = true;
        current = new Scope(f.base);
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
        const d = decideDefined(current, args[0].text);
        return directive === 'ifdef' || d === 'unknown' ? d : d === 'true' ? 'false' : 'true';
      }
      if (args.length === 0) { report(hash, Code.cSyntax, `#${directive} needs a condition`); return 'unknown'; }
      const r = decideIf(args, current, ppTypes, limits);
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
    // 1-based line of the current logical line's start, counted here so #define needs no pass of its own.
    let lineNumber = 0;
    let nextLine = 1;
    for (let pos = 0; pos <= source.length;) {
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
        enterBranch(f, d);
      } else if (name === 'elif' || name === 'else') {
        if (!top) { report(hash, Code.cSyntax, `#${name} without #if`); continue; }
        if (top.elseSeen) { report(hash, Code.cSyntax, `#${name} after #else`); continue; }
        if (name === 'else') top.elseSeen = true;
        // Each later branch is decided in the state before the group: the branches before it were not taken.
        current = top.base;
        const d = name === 'else' ? (top.parentLive && !top.taken ? 'true' : 'false') : decide(top, line, hash);
        enterBranch(top, d);
      } else if (name === 'endif') {
        if (!top) { report(hash, Code.cSyntax, '#endif without #if'); continue; }
        frames.pop();
        closeFrame(top);
      } else if (!live()) {
        continue;
      } else if (name === 'define') {
        define(line, uri, at.newlines === 0 && at.unterminatedAt < 0 ? lineNumber : undefined);
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

  const include = (line: SourceToken[], uri: string, stack: string[]): void => {
    const target = line[2];
    if (!target || target.text.startsWith('<') || target.text === '<') return; // <system> headers are not followed
    if (target.kind !== 'string' || !target.text.startsWith('"') || target.error) {
      report(target, Code.cInclude, 'computed #include is not followed', 'info');
      return;
    }
    const spelled = target.text.slice(1, -1);
    const found = resolveInclude(uri, spelled, options);
    if (found.kind === 'outside') { report(target, Code.cInclude, `"${spelled}" resolves outside the workspace (${found.uri}); not read`); return; }
    if (found.kind === 'missing') { report(target, Code.cInclude, `cannot find or read "${spelled}" (looked in ${found.looked.join(', ') || 'no folder inside the workspace'}; files above the size limit are not read)`, 'info'); return; }
    // One re-entry is allowed so an include guard can end it quietly; a second means the cycle is unguarded.
    if (stack.filter((u) => u === found.uri).length >= 2) { report(target, Code.cInclude, `"${spelled}" includes itself (${[...stack, found.uri].join(' → ')}); not followed again`); return; }
    if (stack.length >= MAX_INCLUDE_DEPTH || ++includes > MAX_INCLUDES) { report(target, Code.cExpansionLimit, `too many nested or repeated includes; "${spelled}" not read`); return; }
    if (found.text.length > options.maxFileBytes) { report(target, Code.fileTooLarge, `"${spelled}" is larger than ${options.maxFileBytes} bytes; not read`); return; }
    processFile(found.uri, found.text, [...stack, found.uri]);
  };

  if (text.length > options.maxFileBytes) {
    findings.push({ severity: 'warning', code: Code.fileTooLarge, message: `file is larger than ${options.maxFileBytes} bytes; constants not read`, uri: entryUri, span: { start: 0, end: 0 } });
    dependencies.add(entryUri);
  } else {
    processFile(entryUri, text, [entryUri]);
  }
  return { root, findings, dependencies: [...dependencies] };
}
