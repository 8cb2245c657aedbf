// Integer-N PLL: reference divider, phase-frequency detector, VCO with a feedback multiplier, output dividers.
import { isSearchFailure, type CircuitModel, type IntegerSet, type ModelInput, type ModelIssue, type RegisterSearch, type WorkingLine } from './model';
import { checkPositive, checkWhole, eng, finiteOnly, hasErrors, quantity } from './common';
import { pllDefaultSets, pllOutputs, searchPll } from './pll-search';
import { formatQuantity } from '../format';
import { Code } from '../codes';

const source = 'integer-N PLL arithmetic: pfd = ref / prediv, vco = pfd · mult, f = vco / postdiv (common practice)';

function has(input: ModelInput, key: string): boolean {
  return input.values[key] !== undefined && Number.isFinite(input.values[key]);
}

function outputsOf(input: ModelInput) {
  return pllOutputs.filter((o) => has(input, o.divider));
}

function rangeText(range: { min: number; max: number }): string {
  return `${eng(range.min, 'Hz')} .. ${eng(range.max, 'Hz')}`;
}

/** Outside by more than rounding: 344 MHz written as a range end and reached as 8 MHz · 43 is inside. */
function outside(value: number, range: { min: number; max: number }): boolean {
  return value < range.min * (1 - 1e-12) || value > range.max * (1 + 1e-12);
}

export const pll: CircuitModel = {
  id: 'pll',
  title: 'PLL (reference divider, multiplier, output dividers)',
  summary: 'An integer-N PLL: pfd, VCO and up to three outputs from the reference, checked against the pfd and VCO ranges; `?` dividers are searched together for the targets.',
  assumptions: [
    'prediv, mult and the post-dividers are the division and multiplication ratios themselves (a register holding ratio − 1 or ratio/2 must be converted).',
    'The PLL is locked: the output is exactly the reference times mult / (prediv · postdiv); jitter is not modelled.',
    'A search walks the allowed values of every `?` (bare `?`: prediv 1..64, mult 1..512, post-dividers 1..16) within pfd-range and vco-range, for the smallest worst relative error over the targets.',
    'A toleranced reference moves every output by the same fraction (the ratios are exact).',
  ],
  params: [
    quantity('ref', 'reference clock', 'Hz', 'Clock into the reference divider; write its tolerance after it.'),
    quantity('prediv', 'reference divider', '', 'Division ratio before the phase-frequency detector.', { default: 1, defaultText: '1', integer: true, min: 1, solvable: true }),
    quantity('mult', 'feedback multiplier', '', 'Multiplication ratio of the feedback divider (may be fractional for a fractional-N PLL).', { min: Number.MIN_VALUE, solvable: true, register: true }),
    quantity('postdiv', 'output divider', '', 'Division ratio from the VCO to the main output.', { default: 1, defaultText: '1', integer: true, min: 1, solvable: true }),
    quantity('postdiv2', 'second output divider', '', 'Division ratio from the VCO to the second output.', { integer: true, min: 1, optional: true, solvable: true }),
    quantity('postdiv3', 'third output divider', '', 'Division ratio from the VCO to the third output.', { integer: true, min: 1, optional: true, solvable: true }),
    { kind: 'range', key: 'pfd-range', label: 'allowed pfd (comparison) frequency', dim: 'Hz', description: 'Range the phase-frequency detector works in, from the part\'s data (`1 MHz .. 2 MHz`).' },
    { kind: 'range', key: 'vco-range', label: 'allowed VCO frequency', dim: 'Hz', description: 'Range the VCO locks in, from the part\'s data (`96 MHz .. 344 MHz`).' },
  ],
  results: [
    { key: 'frequency', label: 'output frequency', dim: 'Hz' },
    { key: 'frequency2', label: 'second output frequency', dim: 'Hz', optional: true },
    { key: 'frequency3', label: 'third output frequency', dim: 'Hz', optional: true },
    { key: 'vco', label: 'VCO frequency', dim: 'Hz' },
    { key: 'pfd', label: 'pfd (comparison) frequency', dim: 'Hz' },
  ],
  headline: ['frequency', 'frequency2', 'vco'],

  validate(input) {
    const issues: ModelIssue[] = [];
    if (!checkPositive(input, ['ref', 'prediv', 'mult', ...outputsOf(input).map((o) => o.divider)], issues)) return issues;
    if (!['prediv', 'postdiv', 'postdiv2', 'postdiv3'].every((key) => checkWhole(input, key, 1, Number.MAX_SAFE_INTEGER, issues))) return issues;
    const { pfd, vco } = pll.compute(input);
    // Judged at the nominal evaluation; spread corners keep their numbers (see ModelInput.tolerances).
    const nominal = input.tolerances;
    const band = nominal?.ref ?? { plus: 0, minus: 0 };
    const ranges: Array<[string, string, number, string, { min: number; max: number } | undefined]> = [
      ['prediv', 'pfd', pfd, 'ref / prediv', input.ranges?.['pfd-range']],
      ['mult', 'vco', vco, 'pfd · mult', input.ranges?.['vco-range']],
    ];
    for (const [key, name, value, formula, range] of ranges) {
      if (!nominal || !range) continue;
      if (outside(value, range)) {
        issues.push({ key, code: Code.clockRange, message: `${name} = ${formula} = ${eng(value, 'Hz')} is outside \`${name}-range\` ${rangeText(range)}` });
        continue;
      }
      const low = value * (1 - band.minus);
      const high = value * (1 + band.plus);
      if (outside(low, range) || outside(high, range)) {
        issues.push({
          key,
          severity: 'warning',
          code: Code.clockRange,
          message: `with the reference's tolerance ${name} spans ${formatQuantity(low, 'Hz', 8)} … ${formatQuantity(high, 'Hz', 8)}, beyond \`${name}-range\` ${rangeText(range)}`,
        });
      }
    }
    return issues;
  },

  compute(input) {
    const { ref, prediv, mult } = input.values;
    const pfd = ref / prediv;
    const vco = pfd * mult;
    const results: Record<string, number> = { pfd, vco };
    for (const o of outputsOf(input)) results[o.result] = vco / input.values[o.divider];
    return finiteOnly(results);
  },

  working(input, results) {
    const { ref, prediv, mult } = input.values;
    const lines: WorkingLine[] = [
      { formula: 'pfd = ref / prediv', substituted: `pfd = ${eng(ref, 'Hz')} / ${prediv} = ${eng(results.pfd, 'Hz')}`, source },
      { formula: 'vco = pfd · mult', substituted: `vco = ${eng(results.pfd, 'Hz')} · ${mult} = ${eng(results.vco, 'Hz')}`, source },
    ];
    for (const o of outputsOf(input)) {
      if (results[o.result] === undefined) continue;
      lines.push({ formula: `${o.result} = vco / ${o.divider}`, substituted: `${o.result} = ${eng(results.vco, 'Hz')} / ${input.values[o.divider]} = ${eng(results[o.result], 'Hz')}`, source });
    }
    return lines;
  },

  search(input, search: RegisterSearch) {
    const targets = search.targets ?? [{ measure: search.measure, target: search.target }];
    const ref = input.values.ref;
    if (!(ref > 0) || !Number.isFinite(ref)) return { error: 'the search needs a positive `ref`' };
    const unknown = new Set(search.unknowns);
    const setOf = (key: string): IntegerSet | undefined => {
      if (unknown.has(key)) return search.allowed?.[key] ?? pllDefaultSets[key];
      const value = input.values[key];
      return value !== undefined && Number.isFinite(value) ? { kind: 'list', values: [value] } : undefined;
    };
    const outputs: Array<{ divider: string; target: number; set: IntegerSet }> = [];
    for (const t of targets) {
      const output = pllOutputs.find((o) => o.result === t.measure);
      if (!output) return { error: `a PLL search needs target frequencies (frequency, frequency2, frequency3), not ${t.measure}` };
      if (!(t.target > 0) || !Number.isFinite(t.target)) return { error: `the target for ${t.measure} must be a positive frequency` };
      const set = setOf(output.divider);
      if (!set) return { error: `a target for ${t.measure} needs \`${output.divider}\` (a value or \`?\`)` };
      outputs.push({ divider: output.divider, target: t.target, set });
    }
    const untargeted = search.unknowns.filter((k) => pllOutputs.some((o) => o.divider === k) && !outputs.some((o) => o.divider === k));
    if (untargeted.length) {
      const output = pllOutputs.find((o) => o.divider === untargeted[0])!;
      return { error: `\`${untargeted[0]}: ?\` needs a target for ${output.result} (${output.result === 'frequency' ? '`target:`' : `\`target${output.result.slice(-1)}:\``})` };
    }
    const prediv = setOf('prediv');
    const mult = setOf('mult');
    if (!prediv || !mult) return { error: 'the search needs `prediv` and `mult` (a value or `?`)' };
    const fixedMult = unknown.has('mult') ? mult : input.values.mult;
    const pfdRange = input.ranges?.['pfd-range'];
    const vcoRange = input.ranges?.['vco-range'];
    // First with the reference's whole band inside both ranges; failing that, the nominal inside them.
    const band = input.tolerances?.ref;
    const within = (r: { min: number; max: number } | undefined) => r && band && { min: r.min / (1 - band.minus), max: r.max / (1 + band.plus) };
    const query = { ref, sets: { prediv, mult: fixedMult }, outputs, pfdRange, vcoRange };
    let found = band ? searchPll({ ...query, pfdRange: within(pfdRange), vcoRange: within(vcoRange) }) : undefined;
    if (!found || isSearchFailure(found)) found = searchPll(query);
    if (isSearchFailure(found)) return found;
    return { values: Object.fromEntries(search.unknowns.map((k) => [k, found.values[k]])), error: found.error };
  },
};
