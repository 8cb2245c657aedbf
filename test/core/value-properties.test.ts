// Properties of the value parser over generated text: it never throws and never points outside its text,
// and what the formatter prints reads back as the same quantity.
import { strict as assert } from 'assert';
import fc from 'fast-check';
import { parseValue, compileValue, dimOf, splitList, parseIntegerSet, type ValueNode } from '../../core/value';
import { formatQuantity, formatPercent } from '../../core/format';
import type { Dim, Finding } from '../../core/types';

const alphabet = [...'0123456789.eEkKMmunpfGTRVFHzsA%baudohm±+-−*/()?, _\t\u00b5\u03bc\u03a9\u2126', '+-', '+/-', 'ppm', 'Bd', 'x', 'R47', '4k7', '..'];
const valueLike = fc.array(fc.constantFrom(...alphabet), { maxLength: 40 }).map((parts) => parts.join(''));
const anyText = fc.oneof(valueLike, fc.string({ maxLength: 60 }), fc.string({ unit: 'binary', maxLength: 30 }));

function assertInside(findings: Finding[], offset: number, length: number): void {
  for (const f of findings) {
    assert.ok(f.span.start >= offset && f.span.end <= offset + length && f.span.start <= f.span.end,
      `span ${JSON.stringify(f.span)} outside [${offset}, ${offset + length}]`);
    assert.ok(f.message.length > 0 && f.code.length > 0);
  }
}

describe('value parser properties', () => {
  it('parseValue never throws and every span lies within its text', () => {
    fc.assert(fc.property(anyText, fc.nat(10_000), (text, offset) => {
      const parsed = parseValue(text, offset);
      assertInside(parsed.findings, offset, text.length);
      for (const span of [parsed.expr?.span, parsed.unknown, parsed.toleranceSpan]) {
        if (span) assert.ok(span.start >= offset && span.end <= offset + text.length);
      }
    }), { numRuns: 3000 });
  });

  it('dimOf, compileValue, splitList and parseIntegerSet never throw on what the parser accepts', () => {
    const dims: Dim[] = ['Ω', 'F', 'V', 'Hz', 's', 'A', '', '%', 'baud', 'other'];
    fc.assert(fc.property(anyText, fc.constantFrom(...dims), (text, d) => {
      const parsed = parseValue(text, 0);
      if (parsed.expr) {
        const result = dimOf(parsed.expr, (name) => (name.length % 2 === 0 ? d : undefined));
        if ('finding' in result) assertInside([result.finding], 0, text.length);
        compileValue(parsed.expr)({});
      }
      for (const piece of splitList(text, 7)) {
        assert.ok(piece.offset >= 7 && piece.offset + piece.text.length <= 7 + text.length);
        assert.equal(text.slice(piece.offset - 7, piece.offset - 7 + piece.text.length), piece.text);
      }
      assertInside(parseIntegerSet(text, 3).findings, 3, text.length);
    }), { numRuns: 2000 });
  });

  it('formatQuantity reads back within 4 significant figures, unit included', () => {
    // Round trip of engineering notation with SI prefixes (BIPM SI Brochure 9th ed. table 7).
    const units: Array<['Ω' | 'F' | 'V' | 'Hz' | 's' | 'A' | 'baud' | '', Dim]> = [
      ['Ω', 'Ω'], ['F', 'F'], ['V', 'V'], ['Hz', 'Hz'], ['s', 's'], ['A', 'A'], ['baud', 'baud'], ['', ''],
    ];
    const magnitude = fc.double({ min: 1e-15, max: 9.99e14, noNaN: true });
    fc.assert(fc.property(magnitude, fc.boolean(), fc.constantFrom(...units), (x, negative, [unit, dim]) => {
      const value = negative ? -x : x;
      const text = formatQuantity(value, unit);
      const parsed = parseValue(text, 0);
      assert.deepEqual(parsed.findings, [], text);
      const expr = parsed.expr as ValueNode;
      const back = compileValue(expr)({});
      assert.ok(Math.abs(back - value) <= 5e-4 * Math.abs(value), `${value} → ${text} → ${back}`);
      const checked = dimOf(expr, () => undefined);
      assert.deepEqual(checked, { dim }, text);
    }), { numRuns: 3000 });
  });

  it('formatPercent reads back as the same fraction', () => {
    fc.assert(fc.property(fc.double({ min: 1e-6, max: 10, noNaN: true }), (fraction) => {
      const parsed = parseValue(formatPercent(fraction), 0);
      assert.ok(parsed.expr?.kind === 'number' && parsed.expr.dim === '%');
      assert.ok(Math.abs(parsed.expr.value - fraction) <= 5e-4 * fraction);
    }), { numRuns: 1000 });
  });
});
