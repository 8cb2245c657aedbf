// Text for SVG: characters XML 1.0 (W3C, 5th ed., §2.2 Char) cannot hold are dropped, the rest escaped.

const NOT_XML_CHAR = /[^\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]/gu;

/** Safe in element content and in double- or single-quoted attribute values. */
export function escapeXml(text: string): string {
  return text
    .replace(NOT_XML_CHAR, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/** A coordinate with at most two decimals, so the output stays small and stable. */
export function coordinate(value: number): string {
  const rounded = Math.round(value * 100) / 100;
  return String(rounded === 0 ? 0 : rounded);
}
