// File size limits are in bytes of UTF-8, as on disk; counted only when the characters alone cannot decide.
export function isTooLarge(text: string, maxBytes: number): boolean {
  if (text.length > maxBytes) return true;
  if (text.length * 3 <= maxBytes) return false;
  return Buffer.byteLength(text, 'utf8') > maxBytes;
}
