// One presented block: what the hover, the preview, the waveform panel, the language server and the CLI show,
// built once from the analysis as plain data (formatted text, no markup). Each renders it in its own medium.
import type { BlockAnalysis, Finding } from '../types';
import type { CircuitModel, WorkingLine } from '../circuits/model';
import { circuitById } from '../circuits/registry';
import { Code } from '../codes';
import { formatConstant, formatQuantity, formatResult, formatSignedPercent } from '../format';
import { headline, spreadText } from './values';

export { cautionMark, severityMark, severityWord } from './marks';

export interface ResultRow {
  key: string;
  label: string;
  value: string;
  /** Worst case over the tolerances (`172–209 Hz`), or '' when none moves it. */
  worstCase: string;
  /** 1st to 99th percentile of the Monte Carlo samples (`samples:`), or ''. */
  percentiles: string;
}

export interface SolvedRow {
  key: string;
  /** The value to use, formatted, with its series (`10 kΩ (E24)`). */
  value: string;
  /** The exact solution before rounding to the series, when there was one. */
  exact?: string;
  /** How far the used value lands from the target (`−3.17 % from the target`, `exact`). */
  fromTarget?: string;
}

export interface IdentifierRow {
  name: string;
  value: string;
  uri: string;
  line: number;
}

/** Another block's result the block read: shown as a value, with where that block stands. */
export interface ReferenceRow {
  /** `@name.result`. */
  label: string;
  value: string;
  uri: string;
  line: number;
}

/** How tolerance travels through references: said wherever a block reads another block's result. */
export const referenceAssumption =
  'Referenced results bring their toleranced inputs with them: a source that two references share (one crystal behind two bus clocks) moves as one input, in the worst case and in Monte Carlo alike; different sources vary independently.';

export interface BlockView {
  name: string;
  circuit?: string;
  /** The circuit's title in words, or 'timing block' when it is not known. */
  title: string;
  /** Whether the circuit is one Tickmark models (else only the problems are shown). */
  modelled: boolean;
  line: number;
  /** The lens line: headline numbers, or the first error. */
  headline: string;
  /** Errors and warnings, in the order found. */
  problems: Finding[];
  /** Safety and hazard cautions: shown before the numbers. */
  cautions: string[];
  /** Notes (info findings other than cautions): solved values, hints. */
  notes: Finding[];
  results: ResultRow[];
  hasWorstCase: boolean;
  hasPercentiles: boolean;
  /** Which toleranced inputs make up the spread of the first headline result, largest share first. */
  shares?: { result: string; parts: Array<{ key: string; percent: number }> };
  solved: SolvedRow[];
  identifiers: IdentifierRow[];
  /** Other blocks' results used, each once. */
  references: ReferenceRow[];
  working: WorkingLine[];
  assumptions: string[];
}

export function blockView(analysis: BlockAnalysis): BlockView {
  const model = analysis.circuit ? circuitById(analysis.circuit) : undefined;
  const results = model ? resultRows(model, analysis) : [];
  return {
    name: analysis.name,
    circuit: analysis.circuit,
    title: model?.title ?? 'timing block',
    modelled: model !== undefined,
    line: analysis.line,
    headline: headline(analysis),
    problems: analysis.findings.filter((f) => f.severity !== 'info'),
    cautions: analysis.findings.filter((f) => f.code === Code.caution).map((f) => f.message),
    notes: analysis.findings.filter((f) => f.severity === 'info' && f.code !== Code.caution),
    results,
    hasWorstCase: results.some((r) => r.worstCase),
    hasPercentiles: results.some((r) => r.percentiles),
    shares: model ? sharesOf(model, analysis) : undefined,
    solved: model ? solvedRows(model, analysis) : [],
    identifiers: analysis.identifiers.map((id) => ({ name: id.name, value: formatConstant(id.value), uri: id.uri, line: id.line })),
    references: referenceRows(analysis),
    working: model ? workingOf(model, analysis) : [],
    assumptions: model ? [...model.assumptions.filter((a) => assumptionApplies(model, analysis.choices, a)), ...(analysis.references?.length ? [referenceAssumption] : [])] : [],
  };
}

function referenceRows(analysis: BlockAnalysis): ReferenceRow[] {
  const rows: ReferenceRow[] = [];
  for (const ref of analysis.references ?? []) {
    const label = `@${ref.name}.${ref.result}`;
    if (rows.some((r) => r.label === label && r.uri === ref.uri)) continue;
    const model = circuitById(ref.circuit);
    rows.push({ label, value: model ? formatResult(model, ref.result, ref.value) : formatConstant(ref.value), uri: ref.uri, line: ref.line });
  }
  return rows;
}

function resultRows(model: CircuitModel, analysis: BlockAnalysis): ResultRow[] {
  return model.results
    .filter((spec) => analysis.values[spec.key] !== undefined)
    .map((spec) => {
      const band = analysis.spread?.[spec.key];
      const percentiles = band?.p1 !== undefined && band.p99 !== undefined ? spreadText(model, spec.key, { min: band.p1, max: band.p99 }) : '';
      return {
        key: spec.key,
        label: spec.label,
        value: formatResult(model, spec.key, analysis.values[spec.key]),
        worstCase: spreadText(model, spec.key, band),
        percentiles,
      };
    });
}

function sharesOf(model: CircuitModel, analysis: BlockAnalysis): BlockView['shares'] {
  const first = model.headline.find((k) => analysis.spread?.[k]?.shares);
  const shares = first ? analysis.spread![first].shares! : undefined;
  if (!first || !shares) return undefined;
  const parts = Object.entries(shares)
    .filter(([, s]) => s > 0.005)
    .sort((a, b) => b[1] - a[1])
    .map(([key, s]) => ({ key, percent: Math.round(s * 100) }));
  return parts.length ? { result: first, parts } : undefined;
}

function solvedRows(model: CircuitModel, analysis: BlockAnalysis): SolvedRow[] {
  return Object.entries(analysis.solved ?? {}).map(([key, part]) => {
    const spec = model.params.find((p) => p.key === key);
    const dim = spec && spec.kind === 'quantity' ? spec.dim : '';
    const show = (value: number) => (dim ? formatQuantity(value, dim) : formatConstant(value));
    return {
      key,
      value: show(part.value) + (part.series ? ` (${part.series})` : ''),
      exact: part.exact !== undefined ? show(part.exact) : undefined,
      fromTarget: part.error === undefined ? undefined : part.error === 0 ? 'exact' : `${formatSignedPercent(part.error)} from the target`,
    };
  });
}

/** An assumption written `mode up-down: …` speaks of that choice only, and is shown only when it is chosen. */
function assumptionApplies(model: CircuitModel, choices: Readonly<Record<string, string>>, assumption: string): boolean {
  const match = /^([a-z][\w-]*) ([\w-]+): /.exec(assumption);
  const spec = match && model.params.find((p) => p.key === match[1]);
  if (!match || !spec || spec.kind !== 'choice') return true;
  return (choices[spec.key] ?? spec.default) === match[2];
}

function workingOf(model: CircuitModel, analysis: BlockAnalysis): WorkingLine[] {
  if (!Object.keys(analysis.values).length) return [];
  try {
    return model.working({ values: analysis.params, choices: analysis.choices, lists: analysis.lists, ranges: analysis.ranges, tolerances: analysis.tolerances, name: analysis.block.name }, analysis.values);
  } catch {
    return [];
  }
}
