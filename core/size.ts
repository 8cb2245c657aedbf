// File size limits are in bytes of UTF-8, as on disk; counted only when the characters alone cannot decide.
export function isTooLarge(text: string, maxBytes: number): boolean {
  if (text.length > maxBytes) return true;
  if (text.length * 3 <= maxBytes) return false;
  return utf8Bytes(text) > maxBytes;
}

const nonAscii = /[^\x00-\x7f]+/g;

/** Bytes of `text` in UTF-8 (RFC 3629): 1 to 3 per UTF-16 unit, 4 per surrogate pair, 3 for a lone surrogate (U+FFFD). */
export function utf8Bytes(text: string): number {
  // One byte per unit, plus what the non-ASCII stretches add, found by a native scan (source text is mostly ASCII).
  let bytes = text.length;
  nonAscii.lastIndex = 0;
  for (let m = nonAscii.exec(text); m; m = nonAscii.exec(text)) {
    const run = m[0];
    for (let i = 0; i < run.length; i++) {
      const unit = run.charCodeAt(i);
      if (unit < 0x800) bytes += 1;
      else if (unit >= 0xd800 && unit <= 0xdbff && i + 1 < run.length && (run.charCodeAt(i + 1) & 0xfc00) === 0xdc00) {
        bytes += 2;
        i++;
      } else bytes += 2;
    }
  }
  return bytes;
}
