// Reads one logical line of C source the way the tokenizer would (splices joined, comments as white space,
// C11 5.1.1.2 phases 2–3) without making tokens. The preprocessor tokenizes only the lines this marks as
// mattering: directives, and code near a keyword that can declare a constant.

export interface SkimmedLine {
  start: number;
  /** Offset of the newline token that ends the line, or the end of the text. */
  end: number;
  /** The first token is `#` (not `##`). */
  directive: boolean;
  /**
   * An identifier spelled `enum`, `const`, `constexpr`, `extern` or `typedef` may stand in the line. Erring towards
   * true is safe (the line is then tokenized); a keyword is never missed.
   */
  keyword: boolean;
  /** Offset just past the line's last `;`, `{` or `}` token; -1 when it has none. */
  boundaryEnd: number;
  /** Offset of a `/*` that is never closed (the line then runs to the end of the text); -1 otherwise. */
  unterminatedAt: number;
  /** Newlines inside the logical line (splices, block comments), so a caller can count lines without a second pass. */
  newlines: number;
}

export const emptySkim = (): SkimmedLine => ({ start: 0, end: 0, directive: false, keyword: false, boundaryEnd: -1, unterminatedAt: -1, newlines: 0 });

const WORD_REST = /[A-Za-z0-9_$]*/y;

const isIdentPart = (ch: number): boolean =>
  (ch >= 97 && ch <= 122) || (ch >= 65 && ch <= 90) || ch === 95 || ch === 36 || (ch >= 48 && ch <= 57);

function isKeyword(text: string, start: number, length: number): boolean {
  switch (length) {
    case 4: return text.startsWith('enum', start);
    case 5: return text.startsWith('const', start);
    case 6: return text.startsWith('extern', start);
    case 7: return text.startsWith('typedef', start);
    case 9: return text.startsWith('constexpr', start);
    default: return false;
  }
}

/** Backslash-newline (or backslash-CRLF) at `i`: its length, else 0 — as the tokenizer's spliceLength. */
function splice(text: string, i: number): number {
  if (text.charCodeAt(i + 1) === 10) return 2;
  if (text.charCodeAt(i + 1) === 13 && text.charCodeAt(i + 2) === 10) return 3;
  return 0;
}

// What makes a line need the skim: a directive, comment, literal, splice or division sign, or a word that may be a
// declaring keyword. `\b` also stops at `$const` or `1e+const`, which the skim reads as no keyword: erring towards a stop.
const NEEDS_SKIM = /[#\\/'"]|\b(?:enum|const|constexpr|extern|typedef)\b/g;

/**
 * Offset of the first character at or after `from` that needs the skim, else the text's length. Every whole line
 * before it skims as no directive and no keyword, with no splice or comment, each a logical line of its own.
 */
export function nextSkimStop(text: string, from: number): number {
  NEEDS_SKIM.lastIndex = from;
  // test() makes no match object: where the match began is read back from where it ended. A keyword match is
  // letters after a word boundary, so it begins where the letters before its end begin.
  if (!NEEDS_SKIM.test(text)) return text.length;
  let start = NEEDS_SKIM.lastIndex - 1;
  if (isLetter(text.charCodeAt(start))) while (start > from && isLetter(text.charCodeAt(start - 1))) start--;
  return start;
}

const isLetter = (ch: number): boolean => (ch >= 97 && ch <= 122) || (ch >= 65 && ch <= 90);

/** A `\r` that no `\n` follows: a line end to the editor that the skim, counting `\n` alone, does not count. */
export function hasLoneCarriageReturn(text: string): boolean {
  for (let i = text.indexOf('\r'); i >= 0; i = text.indexOf('\r', i + 1)) if (text.charCodeAt(i + 1) !== 10) return true;
  return false;
}

/** Skims the logical line starting at `from` (a line start) into `out`. */
export function skimLine(text: string, from: number, out: SkimmedLine): SkimmedLine {
  const n = text.length;
  out.start = from;
  out.directive = false;
  out.keyword = false;
  out.boundaryEnd = -1;
  out.unterminatedAt = -1;
  let newlines = 0;
  let first = true;
  let i = from;
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === 10) break;
    if (c === 32 || c === 9 || c === 13 || c === 12 || c === 11) { i++; continue; }
    if (c === 92) {
      const s = splice(text, i);
      if (s) { i += s; newlines++; continue; }
      first = false;
      i++;
      continue;
    }
    if (c === 47) {
      const next = text.charCodeAt(i + 1);
      if (next === 47) {
        // A line comment ends at the newline unless a splice carries it on.
        i += 2;
        while (i < n && text.charCodeAt(i) !== 10) {
          const s = text.charCodeAt(i) === 92 ? splice(text, i) : 0;
          if (s) newlines++;
          i += s || 1;
        }
        continue;
      }
      if (next === 42) {
        const close = text.indexOf('*/', i + 2);
        if (close < 0) {
          out.unterminatedAt = i;
          i = n;
          break;
        }
        for (let nl = text.indexOf('\n', i + 2); nl >= 0 && nl < close; nl = text.indexOf('\n', nl + 1)) newlines++;
        i = close + 2;
        continue;
      }
    }
    if (c === 39 || c === 34) {
      let j = i + 1;
      while (j < n) {
        const d = text.charCodeAt(j);
        if (d === c || d === 10) break;
        if (d !== 92) { j++; continue; }
        const s = splice(text, j);
        if (s) newlines++;
        j += s || 2;
      }
      i = j < n && text.charCodeAt(j) === c ? j + 1 : Math.min(j, n);
      first = false;
      continue;
    }
    if (isIdentPart(c)) {
      const start = i;
      // The rest of the word at once (the characters isIdentPart accepts), natively rather than one call a character.
      WORD_REST.lastIndex = i + 1;
      WORD_REST.test(text);
      i = WORD_REST.lastIndex;
      if (!out.keyword && isKeyword(text, start, i - start)) out.keyword = true;
      first = false;
      continue;
    }
    if (c === 59 || c === 123 || c === 125) out.boundaryEnd = i + 1;
    else if (c === 35 && first && text.charCodeAt(i + 1) !== 35) out.directive = true;
    first = false;
    i++;
  }
  out.end = i;
  out.newlines = newlines;
  return out;
}
