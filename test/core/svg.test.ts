import { strict as assert } from 'assert';
import fc from 'fast-check';
import { renderWaveformSvg, niceTicks, timeLabel } from '../../core/wave/svg';
import { niceStep } from '../../core/wave/ticks';
import type { Waveform } from '../../core/circuits/model';

// ---- A strict well-formedness checker after W3C XML 1.0 (5th ed.): §2.1 one root element, §2.2 Char,
// §2.3 names and quoted attribute values, §2.4 no `<` or bare `&` in text, §3.1 matching tags and
// unique attributes, §4.1 references. Enough for SVG without a DOCTYPE.
interface XmlElement {
  name: string;
  attrs: Record<string, string>;
  children: XmlElement[];
  text: string;
}

const XML_CHAR = /^[\t\n\r\u0020-\uD7FF\uE000-\uFFFD\u{10000}-\u{10FFFF}]*$/u;
const NAME = /^[A-Za-z_:][A-Za-z0-9_:.-]*/;

function decode(raw: string, where: number): string {
  if (raw.includes('<')) throw new Error(`'<' in character data at ${where}`);
  return raw.replace(/&([^;]*);?/g, (whole, ref: string) => {
    if (!whole.endsWith(';')) throw new Error(`unterminated reference at ${where}`);
    const named: Record<string, string> = { amp: '&', lt: '<', gt: '>', quot: '"', apos: "'" };
    if (ref in named) return named[ref];
    const m = /^#(?:x([0-9A-Fa-f]+)|([0-9]+))$/.exec(ref);
    if (!m) throw new Error(`unknown entity &${ref}; at ${where}`);
    return String.fromCodePoint(m[1] ? parseInt(m[1], 16) : parseInt(m[2], 10));
  });
}

function parseXml(source: string): XmlElement {
  if (!XML_CHAR.test(source)) throw new Error('a character outside XML 1.0 Char');
  let i = 0;
  const skipSpace = () => { while (i < source.length && /\s/.test(source[i])) i++; };
  const skipMisc = () => {
    for (;;) {
      skipSpace();
      if (source.startsWith('<?', i)) i = source.indexOf('?>', i) + 2;
      else if (source.startsWith('<!--', i)) i = source.indexOf('-->', i) + 3;
      else return;
      if (i < 2) throw new Error('unterminated markup');
    }
  };
  const element = (): XmlElement => {
    if (source[i] !== '<') throw new Error(`expected '<' at ${i}`);
    i++;
    const name = NAME.exec(source.slice(i))?.[0];
    if (!name) throw new Error(`bad tag name at ${i}`);
    i += name.length;
    const node: XmlElement = { name, attrs: {}, children: [], text: '' };
    for (;;) {
      const before = i;
      skipSpace();
      if (source.startsWith('/>', i)) { i += 2; return node; }
      if (source[i] === '>') { i++; break; }
      if (i === before) throw new Error(`expected space before attribute at ${i}`);
      const attr = NAME.exec(source.slice(i))?.[0];
      if (!attr) throw new Error(`bad attribute name at ${i}`);
      i += attr.length;
      skipSpace();
      if (source[i] !== '=') throw new Error(`expected '=' at ${i}`);
      i++;
      skipSpace();
      const quote = source[i];
      if (quote !== '"' && quote !== "'") throw new Error(`unquoted attribute at ${i}`);
      const end = source.indexOf(quote, i + 1);
      if (end < 0) throw new Error('unterminated attribute');
      if (attr in node.attrs) throw new Error(`duplicate attribute ${attr}`);
      node.attrs[attr] = decode(source.slice(i + 1, end), i);
      i = end + 1;
    }
    for (;;) {
      const next = source.indexOf('<', i);
      if (next < 0) throw new Error(`unclosed <${name}>`);
      const raw = source.slice(i, next);
      if (raw.includes(']]>')) throw new Error(`']]>' in text at ${i}`);
      node.text += decode(raw, i);
      i = next;
      if (source.startsWith('</', i)) {
        i += 2;
        if (!source.startsWith(name, i)) throw new Error(`mismatched end tag at ${i}, open <${name}>`);
        i += name.length;
        skipSpace();
        if (source[i] !== '>') throw new Error(`bad end tag at ${i}`);
        i++;
        return node;
      }
      if (source.startsWith('<!--', i)) {
        const end = source.indexOf('-->', i);
        if (end < 0) throw new Error('unterminated comment');
        i = end + 3;
        continue;
      }
      node.children.push(element());
    }
  };
  skipMisc();
  const root = element();
  skipMisc();
  if (i !== source.length) throw new Error(`content after the root element at ${i}`);
  return root;
}

function all(node: XmlElement, name?: string): XmlElement[] {
  const found = !name || node.name === name ? [node] : [];
  return found.concat(...node.children.map((child) => all(child, name)));
}

// ---- The checker itself must reject what XML 1.0 rejects, or the tests below prove nothing.
describe('test XML checker', () => {
  it('rejects malformed documents', () => {
    for (const bad of ['<a>', '<a></b>', '<a x=1/>', '<a x="1" x="2"/>', '<a>&foo;</a>', '<a>x & y</a>', '<a/><b/>', '<a>\u0001</a>', '<a x="<"/>']) {
      assert.throws(() => parseXml(bad), Error, bad);
    }
    assert.equal(parseXml('<a x="&lt;&#65;"><b>t&amp;</b></a>').attrs.x, '<A');
  });
});

// ---- Fixtures computed here: an RC charging curve and a square wave.
const supply = 3.3;
const tau = 1e-3;
/** RC charging law v = V·(1 − e^(−t/RC)) (any circuits handbook; common practice). */
function charging(durationSeconds: number, samples: number): Array<[number, number]> {
  return Array.from({ length: samples + 1 }, (_, k) => {
    const t = (k / samples) * durationSeconds;
    return [t, supply * (1 - Math.exp(-t / tau))];
  });
}
function square(periodSeconds: number, cycles: number, high: number): Array<[number, number]> {
  const points: Array<[number, number]> = [];
  for (let k = 0; k < cycles; k++) {
    const t0 = k * periodSeconds;
    points.push([t0, high], [t0 + periodSeconds / 2, high], [t0 + periodSeconds / 2, 0], [t0 + periodSeconds, 0]);
  }
  return points;
}

const rcWave: Waveform = {
  traces: [
    { name: 'capacitor', dim: 'V', points: charging(0.005, 200) },
    { name: 'output', dim: 'V', points: square(0.002, 2, supply).concat([[0.005, 0]]) },
  ],
  levels: [{ label: 'VT+', value: 2 }, { label: 'VT−', value: 1.1 }],
  duration: 0.005,
};

describe('renderWaveformSvg', () => {
  it('is well-formed SVG for every theme, with xmlns and a sans-serif font', () => {
    for (const theme of ['light', 'dark', 'currentColor'] as const) {
      const svg = renderWaveformSvg(rcWave, { title: 'rc', theme });
      const root = parseXml(svg);
      assert.equal(root.name, 'svg');
      assert.equal(root.attrs.xmlns, 'http://www.w3.org/2000/svg');
      assert.equal(root.attrs['font-family'], 'sans-serif');
    }
  });

  it('escapes hostile names in title, legend and level labels', () => {
    const hostile = '<script>alert("x")</script> & \'q\' ]]> \u0001\ud800';
    const wave: Waveform = {
      ...rcWave,
      traces: rcWave.traces.map((t) => ({ ...t, name: `${t.name} ${hostile}` })),
      levels: [{ label: `</text><script>`, value: 2 }],
    };
    const svg = renderWaveformSvg(wave, { title: hostile });
    const root = parseXml(svg);
    assert.equal(all(root, 'script').length, 0);
    const clean = hostile.replace('\u0001', '').replace('\ud800', '');
    assert.equal(all(root, 'title')[0].text, clean);
    const texts = all(root, 'text').map((t) => t.text);
    assert.ok(texts.includes(clean));
    assert.ok(texts.includes(`capacitor ${clean}`));
    assert.ok(texts.includes('</text><script> 2 V'));
    assert.ok(!/<script/i.test(svg));
  });

  it('refers to nothing outside itself', () => {
    const svg = renderWaveformSvg(rcWave, { title: 'x', theme: 'dark' });
    for (const element of all(parseXml(svg))) {
      for (const [name, value] of Object.entries(element.attrs)) {
        if (name === 'xmlns') continue;
        assert.ok(!/href/i.test(name), `${element.name} has ${name}`);
        assert.ok(!/url\(|https?:/i.test(value), `${element.name} ${name}=${value}`);
      }
      assert.ok(!['script', 'image', 'use', 'foreignObject', 'style', 'a'].includes(element.name));
    }
    assert.ok(!svg.includes('href="http'));
  });

  it('labels the time axis in engineering units', () => {
    const root = parseXml(renderWaveformSvg(rcWave, { title: 'rc' }));
    const middle = all(root, 'text').filter((t) => t.attrs['text-anchor'] === 'middle').map((t) => t.text);
    assert.deepEqual(middle, ['0', '1 ms', '2 ms', '3 ms', '4 ms', '5 ms']);
  });

  it('draws the capacitor where its voltage axis says it is', () => {
    const root = parseXml(renderWaveformSvg(rcWave, { title: 'rc' }));
    // Voltage tick labels sit 4 px below their grid line; two of them fix the scale.
    const ticks = all(root, 'text')
      .filter((t) => t.attrs['text-anchor'] === 'end')
      .map((t) => ({ volts: parseFloat(t.text), y: parseFloat(t.attrs.y) - 4 }));
    assert.deepEqual(ticks.map((t) => t.volts), [0, 1, 2, 3, 4]);
    const [low, high] = [ticks[0], ticks[ticks.length - 1]];
    const voltsAt = (y: number) => low.volts + ((y - low.y) / (high.y - low.y)) * (high.volts - low.volts);
    const capacitor = all(root, 'polyline')[0].attrs.points.split(' ').map((p) => p.split(',').map(Number));
    // One time constant in, the capacitor stands at 1 − 1/e = 63.2 % of the supply (RC charging law).
    const atTau = capacitor[40];
    assert.ok(Math.abs(voltsAt(atTau[1]) - supply * (1 - Math.exp(-1))) < 0.02);
  });

  it('draws labelled dashed threshold lines, the upper one higher', () => {
    const root = parseXml(renderWaveformSvg(rcWave, { title: 'rc' }));
    const dashed = all(root, 'line').filter((l) => l.attrs['stroke-dasharray']);
    assert.equal(dashed.length, 2);
    const ys = dashed.map((l) => parseFloat(l.attrs.y1)).sort((a, b) => a - b);
    const labels = all(root, 'text').map((t) => t.text);
    assert.ok(labels.includes('VT+ 2 V') && labels.includes('VT− 1.1 V'));
    assert.ok(ys[0] < ys[1]);
  });

  it('shares a lane for comparable voltages and splits a counter from its 0/1 output', () => {
    const lanes = (wave: Waveform) => all(parseXml(renderWaveformSvg(wave, { title: 't' })), 'rect').filter((r) => r.attrs.fill === 'none').length;
    assert.equal(lanes(rcWave), 1);
    const timer: Waveform = {
      traces: [
        { name: 'counter', dim: '', points: [[0, 0], [0.001, 249], [0.001, 0], [0.002, 249]] },
        { name: 'output', dim: '', points: square(0.001, 2, 1) },
      ],
      levels: [{ label: 'reload', value: 249 }],
      duration: 0.002,
    };
    assert.equal(lanes(timer), 2);
    const texts = all(parseXml(renderWaveformSvg(timer, { title: 't' })), 'text').map((t) => t.text);
    assert.ok(texts.includes('250') && texts.includes('0.2') && texts.includes('reload 249'), texts.join('|'));
  });

  it('draws a legend entry per trace', () => {
    const texts = all(parseXml(renderWaveformSvg(rcWave, { title: 'rc' })), 'text').map((t) => t.text);
    assert.ok(texts.includes('capacitor') && texts.includes('output'));
  });

  it('says so, well-formed, when there is nothing to draw', () => {
    for (const wave of [
      { traces: [], levels: [], duration: 1 },
      { traces: [{ name: 'x', dim: 'V' as const, points: [[NaN, 1]] as Array<[number, number]> }], levels: [], duration: 1 },
      { ...rcWave, duration: 0 },
    ]) {
      const root = parseXml(renderWaveformSvg(wave, { title: 'empty' }));
      assert.ok(all(root, 'text').some((t) => t.text === 'No waveform to draw'));
    }
  });

  it('never throws and stays well-formed for arbitrary waveforms (fast-check)', () => {
    const number = fc.oneof(fc.double(), fc.double({ min: -10, max: 10, noNaN: true }));
    const trace = fc.record({
      name: fc.string({ unit: 'binary', maxLength: 20 }),
      dim: fc.constantFrom('V' as const, '' as const, 's' as const),
      points: fc.array(fc.tuple(number, number), { maxLength: 30 }),
    });
    const wave = fc.record({
      traces: fc.array(trace, { maxLength: 4 }),
      levels: fc.array(fc.record({ label: fc.string({ unit: 'binary', maxLength: 10 }), value: number }), { maxLength: 3 }),
      duration: number,
    });
    fc.assert(
      fc.property(wave, fc.string({ unit: 'binary', maxLength: 20 }), (w, title) => {
        const root = parseXml(renderWaveformSvg(w, { title, width: 400, height: 300 }));
        for (const element of all(root)) {
          for (const value of Object.values(element.attrs)) assert.ok(!/NaN|Infinity/.test(value), value);
        }
      }),
      { numRuns: 300 },
    );
  });
});

describe('niceTicks', () => {
  // 1-2-5 steps are common practice (oscilloscope ranges, chart axes).
  it('picks 1-2-5 steps for known ranges', () => {
    assert.deepEqual(niceTicks(0, 10, 5), [0, 2, 4, 6, 8, 10]);
    assert.deepEqual(niceTicks(0, 1, 5), [0, 0.2, 0.4, 0.6, 0.8, 1]);
    assert.deepEqual(niceTicks(0, 0.0106, 5), [0, 0.002, 0.004, 0.006, 0.008, 0.01]);
    assert.deepEqual(niceTicks(0, 3.3, 4), [0, 1, 2, 3]);
    assert.deepEqual(niceTicks(-1, 1, 4), [-1, -0.5, 0, 0.5, 1]);
    assert.deepEqual(niceTicks(0.1, 0.3, 2), [0.1, 0.2, 0.3]);
    assert.deepEqual(niceTicks(0, 250e-6, 5), [0, 50e-6, 100e-6, 150e-6, 200e-6, 250e-6]);
    assert.deepEqual(niceTicks(5, 5, 4), [5]);
    assert.deepEqual(niceTicks(NaN, 1, 4), []);
  });

  it('always steps by 1, 2 or 5 times a power of ten, near span/count (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1e-9, max: 1e6, noNaN: true }), fc.integer({ min: 1, max: 12 }), (min, span, count) => {
        const step = niceStep(span, count);
        const mantissa = step / Number(`1e${Math.floor(Math.log10(step) + 1e-9)}`);
        assert.ok([1, 2, 5, 10].some((m) => Math.abs(mantissa - m) < 1e-9), String(step));
        const ratio = step / (span / count);
        assert.ok(ratio > 2 / 3 - 1e-9 && ratio <= 5 / 3 + 1e-9, String(ratio));
        // Ticks cannot be placed finer than the doubles around them resolve (IEEE 754 binary64).
        const slack = step * 1e-6 + (Math.abs(min) + span) * 1e-15;
        for (const tick of niceTicks(min, min + span, count)) {
          assert.ok(tick >= min - slack && tick <= min + span + slack);
        }
      }),
    );
  });
});

describe('timeLabel', () => {
  // SI prefixes: BIPM SI Brochure, 9th ed., table 7.
  it('writes seconds with SI prefixes and zero bare', () => {
    assert.equal(timeLabel(0), '0');
    assert.equal(timeLabel(0.002), '2 ms');
    assert.equal(timeLabel(500e-6), '500 µs');
    assert.equal(timeLabel(1.5), '1.5 s');
    assert.equal(timeLabel(20e-9), '20 ns');
  });
});

describe('renderWaveformSvg with subnormal values', () => {
  // IEEE 754 subnormals: 5e-324 is the smallest double; a tenth of it rounds to 0, which once left a zero-width
  // axis and NaN coordinates (found by the fast-check property above, seed -1565648229).
  it('draws a flat trace at 5e-324 V without NaN', () => {
    const svg = renderWaveformSvg({ traces: [{ name: '', dim: 'V', points: [[0, 5e-324]] }], levels: [], duration: 1e-15 }, { title: '' });
    assert.doesNotMatch(svg, /NaN|Infinity/);
  });
});

describe('level labels', () => {
  it('keeps a long level label inside the drawing, whole', () => {
    const wave: Waveform = {
      traces: [{ name: 'timing node', dim: 'V', points: [[0, 0], [1e-3, 2.64]] }],
      levels: [{ label: 'end level', value: 2.64 }],
      duration: 1e-3,
    };
    const svg = renderWaveformSvg(wave, { title: 'rc', width: 480 });
    const label = /<text x="([\d.]+)"[^>]*>(end level [^<]*)<\/text>/.exec(svg);
    assert.ok(label, 'the level label is drawn');
    // Sans-serif at 11 px averages under 6.5 px a character (common practice for Helvetica/DejaVu widths, from memory).
    assert.ok(Number(label[1]) + 6.5 * label[2].length <= 480, `"${label[2]}" at x=${label[1]} runs past 480 px`);
  });
});
