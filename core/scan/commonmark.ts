// Where CommonMark 0.31.2 sees fenced code blocks: the block-structure pass of the specification (Appendix A,
// "phase 1"), reduced to what decides a fence. Containers (block quotes §5.1, list items §5.2) are matched line
// by line with tabs expanded to stops of 4 (§2.2); the open leaf (paragraph, fenced code §4.5, indented code
// §4.4, HTML block §4.6) decides whether a line may open a fence, continues a paragraph lazily, or is swallowed.
// Headings, thematic breaks and setext underlines are recognised only as far as they close a paragraph.
// Inline content, link reference definitions and list tightness play no part in where a fence stands.

/** Receives every fenced code block, in order. Offsets index the text as given. */
export interface FenceVisitor {
  /**
   * A fence opens: `at` is its first fence character, `lineEnd` the end of its line, `infoAt` where the info
   * string starts (after the fence and its blanks). Returns whether the content lines are wanted.
   */
  open(at: number, lineEnd: number, infoAt: number, char: number, length: number): boolean;
  /** A content line of a wanted fence: text[from, to), container markers and the fence's indent removed. */
  line(from: number, to: number): void;
  /**
   * The fence ends. `closing` is the closing fence line's [start, end) when it has one; `next` is where the
   * first line after the fence starts; `atEnd` says an unclosed fence ran to the end of the document rather
   * than ending with its block quote or list item.
   */
  close(closing: { start: number; end: number } | undefined, next: number, atEnd: boolean): void;
}

const TAB = 9;
const SPACE = 32;
const BACKTICK = 96;
const TILDE = 126;
const GREATER = 62;
const LESS = 60;

const enum Leaf {
  None,
  Paragraph,
  Fence,
  Indented,
  Html,
}

interface Container {
  quote: boolean;
  /** List items: columns of marker offset plus padding, the indent that continues the item. */
  width: number;
  /** List items: whether the item holds any block yet (a blank line after an empty item ends it, §5.2). */
  hasChild: boolean;
}

// §4.6, start conditions 1–7 (case-insensitive), tested on the text from the line's first non-blank.
const htmlStart: RegExp[] = [
  /^<(?:script|pre|textarea|style)(?:[ \t>]|$)/i,
  /^<!--/,
  /^<\?/,
  /^<![A-Za-z]/,
  /^<!\[CDATA\[/,
  /^<\/?(?:address|article|aside|base|basefont|blockquote|body|caption|center|col|colgroup|dd|details|dialog|dir|div|dl|dt|fieldset|figcaption|figure|footer|form|frame|frameset|h[1-6]|head|header|hr|html|iframe|legend|li|link|main|menu|menuitem|nav|noframes|ol|optgroup|option|p|param|search|section|summary|table|tbody|td|tfoot|th|thead|title|tr|track|ul)(?:[ \t>]|\/>|$)/i,
  // §6.6 raw HTML: an open tag (not pre, script, style or textarea) or a closing tag, then only blanks.
  /^(?:<(?!(?:pre|script|style|textarea)(?![A-Za-z0-9-]))[A-Za-z][A-Za-z0-9-]*(?:[ \t]+[A-Za-z_:][A-Za-z0-9_.:-]*(?:[ \t]*=[ \t]*(?:[^ \t"'=<>`\x00-\x20]+|'[^']*'|"[^"]*"))?)*[ \t]*\/?>|<\/[A-Za-z][A-Za-z0-9-]*[ \t]*>)[ \t]*$/i,
];
// §4.6, end conditions 1–5; 6 and 7 end at a blank line.
const htmlEnd: RegExp[] = [/<\/(?:script|pre|textarea|style)>/i, /-->/, /\?>/, />/, /\]\]>/];

function isSpaceOrTab(ch: number): boolean {
  return ch === SPACE || ch === TAB;
}

/** The cursor over one line: offset and column (tabs to stops of 4, §2.2), as the specification's parser keeps. */
class Cursor {
  text = '';
  start = 0;
  end = 0;
  offset = 0;
  column = 0;
  partialTab = false;
  next = 0;
  nextColumn = 0;
  indent = 0;
  blank = false;

  reset(text: string, start: number, end: number): void {
    this.text = text;
    this.start = start;
    this.end = end;
    this.offset = start;
    this.column = 0;
    this.partialTab = false;
  }

  findNextNonspace(): void {
    const text = this.text;
    let i = this.offset;
    let column = this.column;
    while (i < this.end) {
      const ch = text.charCodeAt(i);
      if (ch === SPACE) column++;
      else if (ch === TAB) column += 4 - (column % 4);
      else break;
      i++;
    }
    this.blank = i >= this.end;
    this.next = i;
    this.nextColumn = column;
    this.indent = column - this.column;
  }

  get indented(): boolean {
    return this.indent >= 4;
  }

  /** Advances `count` characters, or `count` columns when `columns` (a tab may then be consumed in part). */
  advance(count: number, columns: boolean): void {
    const text = this.text;
    while (count > 0 && this.offset < this.end) {
      if (text.charCodeAt(this.offset) === TAB) {
        const toTab = 4 - (this.column % 4);
        if (columns) {
          this.partialTab = toTab > count;
          const step = toTab > count ? count : toTab;
          this.column += step;
          if (!this.partialTab) this.offset++;
          count -= step;
        } else {
          this.partialTab = false;
          this.column += toTab;
          this.offset++;
          count--;
        }
      } else {
        this.partialTab = false;
        this.offset++;
        this.column++;
        count--;
      }
    }
  }

  advanceToNext(): void {
    this.offset = this.next;
    this.column = this.nextColumn;
    this.partialTab = false;
  }

  charAt(offset: number): number {
    return offset < this.end ? this.text.charCodeAt(offset) : -1;
  }
}

/** §4.5: an opening fence at `at`; its length, or 0. A backtick fence's info string holds no backtick. */
function openingFence(text: string, at: number, end: number): number {
  const ch = text.charCodeAt(at);
  if (ch !== BACKTICK && ch !== TILDE) return 0;
  let i = at;
  while (i < end && text.charCodeAt(i) === ch) i++;
  const length = i - at;
  if (length < 3) return 0;
  if (ch === BACKTICK) {
    for (; i < end; i++) if (text.charCodeAt(i) === BACKTICK) return 0;
  }
  return length;
}

/** §4.5: a closing fence at `at`: the same character, at least as long, then only spaces and tabs. */
function closesFence(text: string, at: number, end: number, char: number, length: number): boolean {
  let i = at;
  while (i < end && text.charCodeAt(i) === char) i++;
  if (i - at < length) return false;
  for (; i < end; i++) if (!isSpaceOrTab(text.charCodeAt(i))) return false;
  return true;
}

/** §4.2: up to three spaces (already skipped), then 3+ of one of `* - _`, spaces and tabs between. */
function isThematicBreak(text: string, at: number, end: number): boolean {
  const ch = text.charCodeAt(at);
  let count = 0;
  for (let i = at; i < end; i++) {
    const c = text.charCodeAt(i);
    if (c === ch) count++;
    else if (!isSpaceOrTab(c)) return false;
  }
  return count >= 3;
}

/** §4.3: a setext underline, `=`s or `-`s, then only spaces and tabs. */
function isSetextUnderline(text: string, at: number, end: number): boolean {
  const ch = text.charCodeAt(at);
  let i = at;
  while (i < end && text.charCodeAt(i) === ch) i++;
  for (; i < end; i++) if (!isSpaceOrTab(text.charCodeAt(i))) return false;
  return true;
}

/** §4.2: 1–6 `#`, then a space, tab or the end of the line. */
function isAtxHeading(text: string, at: number, end: number): boolean {
  let i = at;
  while (i < end && text.charCodeAt(i) === 35) i++;
  const count = i - at;
  return count >= 1 && count <= 6 && (i === end || isSpaceOrTab(text.charCodeAt(i)));
}

/** Characters that may start a block other than a paragraph (the parser's shortcut for plain text lines). */
function maybeSpecial(ch: number): boolean {
  return (
    ch === 35 || ch === BACKTICK || ch === TILDE || ch === 42 || ch === 43 || ch === 95 || ch === 61 ||
    ch === LESS || ch === GREATER || ch === 45 || (ch >= 48 && ch <= 57)
  );
}

/** Walks the block structure of `text` and reports each fenced code block to `visitor`. */
export function walkFences(text: string, visitor: FenceVisitor): void {
  const containers: Container[] = [];
  let leaf = Leaf.None;
  let htmlType = 0;
  let fenceChar = 0;
  let fenceLength = 0;
  let fenceIndent = 0;
  let wanted = false;
  const cursor = new Cursor();

  const markChild = () => {
    const parent = containers[containers.length - 1];
    if (parent) parent.hasChild = true;
  };
  /** Closes containers past `keep` and the leaf inside them; a fence closes unterminated before `lineStart`. */
  const closeUnmatched = (keep: number, lineStart: number) => {
    if (keep >= containers.length) return;
    containers.length = keep;
    if (leaf === Leaf.Fence) visitor.close(undefined, lineStart, false);
    leaf = Leaf.None;
  };

  // Most notes hold no carriage return: then the native search finds each line's end.
  const carriageReturns = text.indexOf('\r') >= 0;
  let pos = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  while (pos < text.length) {
    // One line: CommonMark §2.1 ends it at \n, \r\n or \r.
    const start = pos;
    let end: number;
    if (carriageReturns) {
      end = start;
      while (end < text.length) {
        const ch = text.charCodeAt(end);
        if (ch === 10 || ch === 13) break;
        end++;
      }
    } else {
      end = text.indexOf('\n', start);
      if (end < 0) end = text.length;
    }
    pos = end >= text.length ? end : text.charCodeAt(end) === 13 && text.charCodeAt(end + 1) === 10 ? end + 2 : end + 1;
    // The common case in a note: a line of prose outside any container, which opens or continues a paragraph.
    if (containers.length === 0 && (leaf === Leaf.None || leaf === Leaf.Paragraph) && start < end) {
      const first = text.charCodeAt(start);
      if (first !== SPACE && first !== TAB && !maybeSpecial(first)) {
        leaf = Leaf.Paragraph;
        continue;
      }
    }
    cursor.reset(text, start, end);

    // 1. Which open containers the line continues.
    let matched = 0;
    for (; matched < containers.length; matched++) {
      const container = containers[matched];
      cursor.findNextNonspace();
      if (container.quote) {
        if (cursor.indented || cursor.charAt(cursor.next) !== GREATER) break;
        cursor.advanceToNext();
        cursor.advance(1, false);
        if (isSpaceOrTab(cursor.charAt(cursor.offset))) cursor.advance(1, true);
      } else if (cursor.blank) {
        if (!container.hasChild) break;
        cursor.advanceToNext();
      } else if (cursor.indent >= container.width) {
        cursor.advance(container.width, true);
      } else {
        break;
      }
    }
    let allMatched = matched === containers.length;
    cursor.findNextNonspace();

    // 2. The open leaf: a fence, indented code or HTML block takes the line when every container goes on.
    if (!allMatched && leaf !== Leaf.Paragraph) {
      closeUnmatched(matched, start);
      allMatched = true;
    } else if (allMatched && leaf === Leaf.Fence) {
      if (cursor.indent <= 3 && closesFence(text, cursor.next, end, fenceChar, fenceLength)) {
        leaf = Leaf.None;
        visitor.close({ start: cursor.next, end }, pos, false);
        continue;
      }
      if (wanted) {
        for (let i = fenceIndent; i > 0 && isSpaceOrTab(cursor.charAt(cursor.offset)); i--) cursor.advance(1, true);
        visitor.line(cursor.offset, end);
      }
      continue;
    } else if (allMatched && leaf === Leaf.Indented) {
      if (cursor.indented || cursor.blank) continue;
      leaf = Leaf.None;
    } else if (allMatched && leaf === Leaf.Html) {
      if (cursor.blank && htmlType >= 6) {
        leaf = Leaf.None;
      } else {
        if (htmlType <= 5 && htmlEnd[htmlType - 1].test(text.slice(cursor.offset, end))) leaf = Leaf.None;
        continue;
      }
    } else if (allMatched && leaf === Leaf.Paragraph && cursor.blank) {
      leaf = Leaf.None;
    }

    // 3. New blocks, innermost last. `inParagraph`: the line would continue an open paragraph (it may only
    // be interrupted by some blocks); `lazy`: it would do so lazily, past containers it does not continue.
    let inParagraph = allMatched && leaf === Leaf.Paragraph;
    let lazy = !allMatched && leaf === Leaf.Paragraph && !cursor.blank;
    let done = false;
    // The cursor has not moved since it last looked for the next non-blank.
    for (let first = true; ; first = false) {
      if (!first) cursor.findNextNonspace();
      const at = cursor.next;
      const ch = cursor.charAt(at);
      if (cursor.indented) {
        // §4.4: indented code, which cannot interrupt a paragraph (lazy or not).
        if (leaf !== Leaf.Paragraph && !cursor.blank) {
          closeUnmatched(matched, start);
          markChild();
          leaf = Leaf.Indented;
          done = true;
        }
        break;
      }
      if (!maybeSpecial(ch)) break;
      if (ch === GREATER) {
        // §5.1: a block quote marker, then an optional space.
        closeUnmatched(matched, start);
        cursor.advanceToNext();
        cursor.advance(1, false);
        if (isSpaceOrTab(cursor.charAt(cursor.offset))) cursor.advance(1, true);
        markChild();
        leaf = Leaf.None;
        containers.push({ quote: true, width: 0, hasChild: false });
        matched = containers.length;
        inParagraph = lazy = false;
        continue;
      }
      if (ch === 35 && isAtxHeading(text, at, end)) {
        closeUnmatched(matched, start);
        markChild();
        leaf = Leaf.None;
        done = true;
        break;
      }
      if (ch === BACKTICK || ch === TILDE) {
        const length = openingFence(text, at, end);
        if (length) {
          closeUnmatched(matched, start);
          markChild();
          leaf = Leaf.Fence;
          fenceChar = ch;
          fenceLength = length;
          fenceIndent = cursor.indent;
          let infoAt = at + length;
          while (infoAt < end && isSpaceOrTab(text.charCodeAt(infoAt))) infoAt++;
          wanted = visitor.open(at, end, infoAt, ch, length);
          done = true;
          break;
        }
      }
      if (ch === LESS) {
        const rest = text.slice(at, end);
        let type = 0;
        for (let t = 1; t <= 7 && !type; t++) {
          if (t === 7 && (inParagraph || lazy)) break;
          if (htmlStart[t - 1].test(rest)) type = t;
        }
        if (type) {
          closeUnmatched(matched, start);
          markChild();
          leaf = Leaf.Html;
          htmlType = type;
          if (type <= 5 && htmlEnd[type - 1].test(text.slice(cursor.offset, end))) leaf = Leaf.None;
          done = true;
          break;
        }
      }
      if ((ch === 61 || ch === 45) && inParagraph && isSetextUnderline(text, at, end)) {
        // §4.3: the paragraph becomes a heading and closes.
        leaf = Leaf.None;
        done = true;
        break;
      }
      if ((ch === 42 || ch === 45 || ch === 95) && isThematicBreak(text, at, end)) {
        closeUnmatched(matched, start);
        markChild();
        leaf = Leaf.None;
        done = true;
        break;
      }
      const width = listItem(cursor, inParagraph);
      if (width) {
        closeUnmatched(matched, start);
        markChild();
        leaf = Leaf.None;
        containers.push({ quote: false, width, hasChild: false });
        matched = containers.length;
        inParagraph = lazy = false;
        continue;
      }
      break;
    }
    if (done) continue;

    // 4. A text line: a lazy continuation line keeps every container open (§5.1), else it opens or continues a
    // paragraph in the innermost container that goes on.
    if (lazy) continue;
    closeUnmatched(matched, start);
    if (cursor.blank || leaf === Leaf.Paragraph) continue;
    markChild();
    leaf = Leaf.Paragraph;
  }
  if (leaf === Leaf.Fence) visitor.close(undefined, text.length, true);
}

/**
 * §5.2: a list item marker at the cursor's next non-blank; on success the cursor stands where the item's
 * content starts and the result is the item's width (marker offset plus padding), else 0.
 */
function listItem(cursor: Cursor, inParagraph: boolean): number {
  const text = cursor.text;
  const at = cursor.next;
  const end = cursor.end;
  const ch = text.charCodeAt(at);
  let markerLength: number;
  if (ch === 42 || ch === 43 || ch === 45) {
    markerLength = 1;
  } else if (ch >= 48 && ch <= 57) {
    let i = at;
    while (i < end && i - at < 10 && text.charCodeAt(i) >= 48 && text.charCodeAt(i) <= 57) i++;
    const digits = i - at;
    const delimiter = i < end ? text.charCodeAt(i) : -1;
    if (digits > 9 || (delimiter !== 46 && delimiter !== 41)) return 0;
    // An ordered list interrupts a paragraph only when it starts at 1.
    if (inParagraph && Number(text.slice(at, i)) !== 1) return 0;
    markerLength = digits + 1;
  } else {
    return 0;
  }
  const after = at + markerLength;
  if (after < end && !isSpaceOrTab(text.charCodeAt(after))) return 0;
  if (inParagraph) {
    // An item that interrupts a paragraph does not start with a blank line.
    let i = after;
    while (i < end && isSpaceOrTab(text.charCodeAt(i))) i++;
    if (i >= end) return 0;
  }
  const markerOffset = cursor.indent;
  cursor.advanceToNext();
  cursor.advance(markerLength, true);
  const spacesColumn = cursor.column;
  const spacesOffset = cursor.offset;
  do {
    cursor.advance(1, true);
  } while (cursor.column - spacesColumn < 5 && isSpaceOrTab(cursor.charAt(cursor.offset)));
  const blankItem = cursor.offset >= end;
  const spaces = cursor.column - spacesColumn;
  let padding: number;
  if (spaces >= 5 || spaces < 1 || blankItem) {
    // Content that starts 5+ columns after the marker is indented code: the item's content starts after one.
    padding = markerLength + 1;
    cursor.column = spacesColumn;
    cursor.offset = spacesOffset;
    cursor.partialTab = false;
    if (isSpaceOrTab(cursor.charAt(cursor.offset))) cursor.advance(1, true);
  } else {
    padding = markerLength + spaces;
  }
  return markerOffset + padding;
}
