// Integer, floating and character constants: value and type (ISO C11 6.4.4).
import { fits, roundFloating, type CType, type FloatType, type IntType, type TypeSystem, type Val } from './ctypes';

const UNSIGNED_TYPES = ['unsigned int', 'unsigned long', 'unsigned long long'];
const SIGNED_TYPES = ['int', 'long', 'long long'];
const EITHER_TYPES = ['int', 'unsigned int', 'long', 'unsigned long', 'long long', 'unsigned long long'];

/** Types tried in order by suffix and base, C11 6.4.4.1p5 (binary 0b, a gcc extension, types like hex), from `first`. */
function candidates(suffix: string, decimal: boolean): { names: string[]; first: number } {
  const u = suffix.includes('u');
  const longs = suffix.includes('ll') ? 2 : suffix.includes('l') ? 1 : 0;
  if (u) return { names: UNSIGNED_TYPES, first: longs };
  if (decimal) return { names: SIGNED_TYPES, first: longs };
  return { names: EITHER_TYPES, first: longs * 2 };
}

const isDigitCode = (c: number): boolean => c >= 48 && c <= 57;

/** How many decimal digits `text` starts with. */
function leadingDigits(text: string): number {
  let k = 0;
  while (k < text.length && isDigitCode(text.charCodeAt(k))) k++;
  return k;
}

const SUFFIX = /(?:[uU](?:ll|LL|l|L)?|(?:ll|LL|l|L)[uU]?)$/;

const parsedByTypes = new WeakMap<TypeSystem, Map<string, Val | string>>();
const MAX_PARSED = 256;
let lastTypes: TypeSystem | undefined;
let lastParsed = new Map<string, Val | string>();

/** `pp`: inside #if every integer acts as intmax_t or uintmax_t (C11 6.10.1p4). */
export function parseNumber(text: string, ts: TypeSystem, pp = false): Val | string {
  // Values are never mutated, so one parse per spelling serves a whole table (firmware repeats `1u`, `8u` …).
  let parsed = ts === lastTypes ? lastParsed : parsedByTypes.get(ts);
  if (!parsed) parsedByTypes.set(ts, (parsed = new Map()));
  lastTypes = ts;
  lastParsed = parsed;
  const key = pp ? '#' + text : text;
  let found = parsed.get(key);
  if (found === undefined) {
    // Bounded: the spellings a file repeats come back at once after a clear, and the thousands it spells once each
    // (`1000`, `1001` …) are not kept for the table's life.
    if (parsed.size >= MAX_PARSED) parsed.clear();
    parsed.set(key, (found = parseNumberUncached(text, ts, pp)));
  }
  return found;
}

function parseNumberUncached(text: string, ts: TypeSystem, pp: boolean): Val | string {
  // Read by character codes, as the patterns /^0[xX]/, /^[0-9]*\.|^[0-9]+[eE]/ and /^0[bB]/ would: a firmware
  // file spells thousands of different constants, each parsed once.
  const x = text.charCodeAt(1);
  const zero = text.charCodeAt(0) === 48;
  const isHex = zero && (x === 120 || x === 88);
  const lead = leadingDigits(text);
  const after = text.charCodeAt(lead);
  const floating = isHex ? /[pP]/.test(text) : (after === 46 || (lead > 0 && (after === 101 || after === 69))) && !(zero && (x === 98 || x === 66));
  if (floating) return parseFloating(text, ts);
  // Every suffix ends in a letter: a constant ending in a digit has none.
  const m = isDigitCode(text.charCodeAt(text.length - 1)) ? null : SUFFIX.exec(text);
  const suffix = m ? m[0].toLowerCase() : '';
  const digits = m ? text.slice(0, m.index) : text;
  let value: bigint;
  let decimal = false;
  // Decimal (/^[1-9][0-9]*$/) is the common case and cannot be taken for hex, binary or octal, which start with 0.
  if (!zero && lead === digits.length && lead > 0) { value = BigInt(digits); decimal = true; }
  else if (/^0[xX][0-9a-fA-F]+$/.test(digits)) value = BigInt(digits);
  else if (/^0[bB][01]+$/.test(digits)) value = BigInt(digits);
  else if (/^0[0-7]*$/.test(digits)) value = digits.length > 1 ? BigInt('0o' + digits.slice(1)) : 0n;
  else if (/^[1-9][0-9]*$/.test(digits)) { value = BigInt(digits); decimal = true; }
  else return `'${text}' is not a valid integer constant`;
  if (pp) {
    const t = suffix.includes('u') || !fits(value, ts.llong) ? ts.ullong : ts.llong;
    return fits(value, t) ? { v: value, t } : `integer constant '${text}' is too large for any type`;
  }
  const { names, first: from } = candidates(suffix, decimal);
  for (let k = from; k < names.length; k++) {
    const t = ts.named.get(names[k]) as IntType;
    if (fits(value, t)) return { v: value, t };
  }
  return `integer constant '${text}' is too large for any type (C11 6.4.4.1)`;
}

function parseFloating(text: string, ts: TypeSystem): Val | string {
  const m = /^(.*?)([fFlL]?)$/.exec(text) as RegExpExecArray;
  const body = m[1];
  const suffix = m[2].toLowerCase();
  let value: number;
  if (/^0[xX]/.test(body)) {
    const h = /^0[xX]([0-9a-fA-F]*)(?:\.([0-9a-fA-F]*))?[pP]([+-]?[0-9]+)$/.exec(body);
    if (!h || (h[1] + (h[2] ?? '')).length === 0) return `'${text}' is not a valid floating constant`;
    const frac = h[2] ?? '';
    value = (parseInt(h[1] + frac || '0', 16) / 16 ** frac.length) * 2 ** Number(h[3]);
  } else {
    if (!/^(?:[0-9]+\.?[0-9]*|\.[0-9]+)(?:[eE][+-]?[0-9]+)?$/.test(body)) return `'${text}' is not a valid floating constant`;
    value = Number(body);
  }
  if (!Number.isFinite(value)) return `floating constant '${text}' is out of range`;
  const t = ts.named.get(suffix === 'f' ? 'float' : suffix === 'l' ? 'long double' : 'double') as FloatType;
  return { v: roundFloating(value, t), t };
}

const SIMPLE_ESCAPES: Record<string, number> = {
  n: 10, t: 9, r: 13, '0': 0, '\\': 92, "'": 39, '"': 34, a: 7, b: 8, f: 12, v: 11, '?': 63, e: 27,
};

/** An unprefixed character constant has type int and the value of the char (C11 6.4.4.4p10). */
export function parseChar(text: string, ts: TypeSystem): Val | string {
  if (!text.startsWith("'")) return `prefixed character constant ${text} is not supported`;
  const inner = text.slice(1, -1);
  const codes: number[] = [];
  for (let i = 0; i < inner.length;) {
    if (inner[i] !== '\\') { codes.push(inner.charCodeAt(i)); i++; continue; }
    const e = inner[i + 1];
    const oct = /^[0-7]{1,3}/.exec(inner.slice(i + 1));
    if (oct) { codes.push(parseInt(oct[0], 8)); i += 1 + oct[0].length; continue; }
    if (e === 'x') {
      const hex = /^[0-9a-fA-F]+/.exec(inner.slice(i + 2));
      if (!hex) return `\\x in ${text} has no hex digits`;
      codes.push(parseInt(hex[0], 16)); i += 2 + hex[0].length; continue;
    }
    if (e !== undefined && e in SIMPLE_ESCAPES) { codes.push(SIMPLE_ESCAPES[e]); i += 2; continue; }
    return `unknown escape sequence in ${text}`;
  }
  if (codes.length === 0) return 'empty character constant';
  if (codes.length > 1) return `multi-character constant ${text} has an implementation-defined value`;
  if (codes[0] > 255) return `character ${text} does not fit in a char`;
  const c = BigInt(codes[0]);
  const charType = ts.named.get('char') as IntType;
  return { v: charType.signed && c > 127n ? c - 256n : c, t: ts.int };
}
