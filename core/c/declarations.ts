// Finds `enum` constants, `const`/`constexpr` variables and typedefs of arithmetic types in the token stream
// that survives preprocessing. Fed one token at a time, so each declaration lands in the #if layer it sits in.
import { keywordTypeName, TYPE_KEYWORDS, type CType, type TypeConflict } from './ctypes';
import type { Declaration, TypedefDef } from './scope';
import type { SourceToken } from './tokens';

export interface DeclarationSink {
  declare(d: Declaration): void;
  typedef(def: TypedefDef): void;
  /** A typedef name or a <stdint.h> name; a conflict for a typedef that undecided #if branches define apart. */
  typeNamed(name: string): CType | TypeConflict | undefined;
  /** Object-like macros in effect here expanded, so `#define ST uint32_t` / `typedef ST tick_t;` reads as the compiler does. */
  expandType(tokens: SourceToken[]): SourceToken[];
  lineOf(tok: SourceToken): number;
}

const STORAGE = new Set(['static', 'extern', 'register', 'inline', '_Thread_local', 'thread_local', 'constexpr', 'const', 'volatile', 'typedef', 'auto']);

/** The words without which a statement neither declares a constant or typedef nor opens an enum body. */
export const DECLARING = new Set(['enum', 'const', 'constexpr', 'typedef', 'extern']);

interface EnumState { depth: number; member: SourceToken[]; previous?: string; chainEpoch: number; memberEpoch: number; conditional: boolean }

export class DeclarationScanner {
  private statement: SourceToken[] = [];
  private enumState?: EnumState;

  constructor(private readonly sink: DeclarationSink) {}

  /**
   * Nothing pending can still declare: no enum body is open and the statement so far names no keyword that
   * starts a declaration. Code up to the next `;`, `{` or `}` without such a keyword then changes nothing.
   */
  quiet(): boolean {
    if (this.enumState) return false;
    for (const t of this.statement) if (t.kind === 'ident' && DECLARING.has(t.text)) return false;
    return true;
  }

  /** Nothing at all is pending: a header read from here reads the same wherever it is included. */
  idle(): boolean {
    return !this.enumState && this.statement.length === 0;
  }

  /** A statement boundary the caller skipped over while quiet. */
  boundary(): void {
    if (this.statement.length) this.statement = [];
  }

  /** `epoch` changes whenever an undecidable #if branch opens or closes. */
  push(tok: SourceToken, epoch: number): void {
    if (this.enumState) { this.enumToken(tok, epoch); return; }
    if (tok.kind !== 'punct') { this.statement.push(tok); return; }
    if (tok.text === ';') { this.declaration(this.statement); this.statement = []; return; }
    if (tok.text === '{') {
      if (this.statement.some((t) => t.text === 'enum' && t.kind === 'ident')) {
        this.enumState = { depth: 0, member: [], chainEpoch: epoch, memberEpoch: epoch, conditional: false };
      }
      this.statement = [];
      return;
    }
    if (tok.text === '}') { this.statement = []; return; }
    this.statement.push(tok);
  }

  private enumToken(tok: SourceToken, epoch: number): void {
    const e = this.enumState as EnumState;
    const open = tok.kind === 'punct' && (tok.text === '(' || tok.text === '[' || tok.text === '{');
    const close = tok.kind === 'punct' && (tok.text === ')' || tok.text === ']' || tok.text === '}');
    if (e.depth === 0 && tok.kind === 'punct' && (tok.text === ',' || tok.text === '}')) {
      this.member(e, epoch);
      e.member = [];
      if (tok.text === '}') this.enumState = undefined;
      return;
    }
    if (open) e.depth++;
    if (close) e.depth--;
    if (e.member.length === 0) e.memberEpoch = epoch;
    e.member.push(tok);
  }

  private member(e: EnumState, epoch: number): void {
    const [name, eq] = e.member;
    if (!name || name.kind !== 'ident') return;
    const explicit = eq?.text === '=';
    // An implicit value counts from the last explicit one; a #if in between makes the count configuration-dependent.
    if (e.memberEpoch !== e.chainEpoch) e.conditional = true;
    const last = e.member[e.member.length - 1];
    const d: Declaration = {
      name: name.text, kind: 'enum', uri: name.uri, line: this.sink.lineOf(name),
      nameSpan: { start: name.start, end: name.end }, span: { start: name.start, end: last.end },
    };
    if (explicit) { d.init = e.member.slice(2); e.chainEpoch = epoch; e.conditional = false; }
    else {
      d.previous = e.previous;
      if (e.conditional) d.conditional = `the value of ${name.text} counts on from enum members under #if, so it depends on the build configuration`;
    }
    e.previous = name.text;
    this.sink.declare(d);
  }

  private declaration(statement: SourceToken[]): void {
    let lead = 0;
    while (lead < statement.length && statement[lead].kind === 'ident') lead++;
    const tokens = lead ? [...this.sink.expandType(statement.slice(0, lead)), ...statement.slice(lead)] : statement;
    let i = 0;
    const words: string[] = [];
    const typeWords: string[] = [];
    let named: CType | TypeConflict | undefined;
    for (; i < tokens.length && tokens[i].kind === 'ident'; i++) {
      const w = tokens[i].text;
      if (STORAGE.has(w)) { words.push(w); continue; }
      if (TYPE_KEYWORDS.has(w)) { typeWords.push(w); continue; }
      if (!named && typeWords.length === 0) {
        const t = this.sink.typeNamed(w);
        if (t) { named = t; continue; }
      }
      break;
    }
    const keywordType = typeWords.length ? keywordTypeName(typeWords) : undefined;
    const found = named ?? (keywordType ? this.sink.typeNamed(keywordType) : undefined);
    if (words.includes('typedef')) {
      const name = tokens[i];
      if (found && name?.kind === 'ident' && i === tokens.length - 1) {
        const spelled = tokens.slice(0, i).filter((t) => t.text !== 'typedef').map((t) => t.text).join(' ');
        const type = found.kind === 'int' ? { ...found, name: name.text, base: found.base ?? found.name } : found;
        this.sink.typedef({ name: name.text, type, spelled, uri: name.uri, line: this.sink.lineOf(name) });
      }
      return;
    }
    const conflict = found?.kind === 'conflict' ? found.message : undefined;
    const type = found?.kind === 'conflict' ? undefined : found;
    if (words.includes('extern') && !words.includes('constexpr') && type) {
      // `extern uint32_t clock_hz;`: a name the firmware reads at run time, never a constant here.
      for (; i < tokens.length; i++) {
        const name = tokens[i];
        if (name.kind !== 'ident' || (tokens[i + 1] && tokens[i + 1].text !== ',')) return;
        this.sink.declare({ name: name.text, kind: 'runtime', type, uri: name.uri, line: this.sink.lineOf(name), nameSpan: { start: name.start, end: name.end }, span: { start: tokens[0].start, end: name.end } });
        i++;
      }
      return;
    }
    const isAuto = words.includes('auto') && !type && typeWords.length === 0;
    if (!(words.includes('const') || words.includes('constexpr')) || (!type && !isAuto && !conflict)) return;
    // Declarators: NAME = initialiser, separated by commas at depth 0; pointers, arrays and functions are skipped.
    while (i < tokens.length) {
      const name = tokens[i];
      if (name.kind !== 'ident' || tokens[i + 1]?.text !== '=') return;
      let j = i + 2;
      let depth = 0;
      for (; j < tokens.length; j++) {
        const t = tokens[j].text;
        if (t === '(' || t === '[') depth++;
        else if (t === ')' || t === ']') depth--;
        else if (t === ',' && depth === 0) break;
      }
      const init = tokens.slice(i + 2, j);
      if (init.length) {
        this.sink.declare({
          name: name.text, kind: 'const', type, init, conditional: conflict, uri: name.uri, line: this.sink.lineOf(name),
          nameSpan: { start: name.start, end: name.end }, span: { start: tokens[0].start, end: init[init.length - 1].end },
        });
      }
      i = j + 1;
    }
  }
}
