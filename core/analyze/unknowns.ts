// `?` values: one part solved onto a standard series, or timer registers searched, always against `target:`.
import type { BlockEntry, Finding, SolvedPart, Span } from '../types';
import type { QuantityParam } from '../circuits/model';
import { isSearchFailure } from '../circuits/model';
import { Code } from '../codes';
import { formatQuantity, formatSignedPercent } from '../format';
import type { BlockContext } from './context';
import { meetsClaim, parseClaims, type Claim } from './claims';
import { computeAt, modelInput } from './measure';
import type { Plan, Unknown } from './plan';
import { evaluateParams } from './evaluate';
import { snapToSeries, solveContinuous } from './solve';

export function solveUnknowns(
  plan: Plan,
  entries: Map<string, BlockEntry>,
  context: BlockContext,
  overrides: Record<string, number>,
  findings: Finding[],
): Record<string, SolvedPart> | undefined {
  const first = plan.unknowns[0];
  const targetEntry = entries.get('target');
  const untargeted = !targetEntry && plan.model.search !== undefined && plan.model.searchWithoutTarget === true;
  if (!targetEntry && !untargeted) {
    findings.push({ severity: 'error', code: Code.solveFailed, message: `\`${first.key}: ?\` needs \`target:\` (the result to meet, e.g. \`target: 1 kHz\`)`, span: first.span });
    return undefined;
  }
  const claims = targetEntry ? parseClaims(targetEntry, plan.model, context.options.defaultTolerance, findings) : [];
  const target = claims[0];
  if (targetEntry && !target) return undefined;
  const solved: Record<string, SolvedPart> = {};
  const unknownKeys = plan.unknowns.map((u) => u.key);
  const restricted = plan.unknowns.find((u) => u.allowed);
  if (restricted && !plan.model.search) {
    findings.push({ severity: 'error', code: Code.solveFailed, message: `\`${restricted.key}\`: allowed values after \`?\` are for register searches; ${plan.model.id} solves one part exactly`, span: restricted.span });
    return undefined;
  }

  if (plan.model.search) {
    const later = target ? laterTargets(plan, entries, context, findings) : [];
    if (!later) return undefined;
    const targets = target ? [target, ...later] : [];
    const allowed = Object.fromEntries(plan.unknowns.filter((u) => u.allowed).map((u) => [u.key, u.allowed!]));
    // Nominal, with the inputs' bands: a search may keep a toleranced clock's whole band inside a limit.
    const input = modelInput(plan, evaluateParams(plan), true);
    const result = plan.model.search(input, {
      unknowns: unknownKeys,
      measure: target?.measure ?? '',
      target: target?.value ?? NaN,
      targets: targets.map((t) => ({ measure: t.measure, target: t.value })),
      allowed,
      series: entries.get('series')?.valueText.trim() ?? context.options.defaultSeries,
    });
    if (isSearchFailure(result)) {
      findings.push({ severity: 'error', code: Code.solveFailed, message: result.error, span: first.span });
      return undefined;
    }
    const found = result;
    Object.assign(overrides, found.values);
    const results = computeAt(plan, undefined, overrides);
    const inBand = targets.every((t) => results?.[t.measure] !== undefined && meetsClaim(t, results[t.measure]));
    const what = targets.length && results ? `: ${targets.map((t) => `${t.measure} ${results[t.measure] === undefined ? '—' : formatQuantity(results[t.measure], resultDim(plan, t.measure))}`).join(', ')}` : '';
    const wanted = targets.map((t) => t.text).join(', ');
    for (const u of plan.unknowns) {
      const value = found.values[u.key];
      const text = valueText(u.spec, value);
      solved[u.key] = { value, error: found.error, ...(found.exact?.[u.key] !== undefined ? { exact: found.exact[u.key] } : {}), ...(found.series ? { series: found.series } : {}) };
      const message = !targets.length
        ? `\`${u.key}\` = ${text}${found.note ? `: ${found.note}` : ''}`
        : found.error === 0
          ? `\`${u.key}\` = ${text} meets ${wanted} exactly${what}`
          : `closest \`${u.key}\` = ${text}${what}, ${targets.length > 1 ? 'worst ' : ''}${formatSignedPercent(found.error)} from the target ${wanted}${inBand ? '' : ' — outside the target band'}${found.note ? ` (${found.note})` : ''}`;
      findings.push({
        severity: inBand ? 'info' : 'warning',
        code: inBand ? Code.solved : Code.solveInexact,
        message,
        span: u.span,
        fixes: [{ title: `Fill in ${u.key}: ${text}`, edits: [{ uri: context.uri, span: fillSpan(u), newText: text }] }],
      });
    }
    return solved;
  }

  if (plan.unknowns.length > 1) {
    findings.push({ severity: 'error', code: Code.solveFailed, message: `only one \`?\` can be solved for ${plan.model.id} (found ${unknownKeys.join(', ')})`, span: plan.unknowns[1].span });
    return undefined;
  }
  if (!first.spec.solvable) {
    findings.push({ severity: 'error', code: Code.solveFailed, message: `\`${first.key}\` cannot be solved for; give it a value and put \`?\` on a part (${solvableKeys(plan)})`, span: first.span });
    return undefined;
  }
  const outcome = solveContinuous(plan, first.spec, target.measure, target.value);
  if (!outcome.ok) {
    findings.push({ severity: 'error', code: Code.solveFailed, message: outcome.message, span: first.span });
    return undefined;
  }
  const seriesText = entries.get('series')?.valueText.trim() ?? context.options.defaultSeries;
  const snapped = snapToSeries(first.spec, outcome.exact, seriesText);
  overrides[first.key] = snapped.value;
  const achieved = computeAt(plan, undefined, overrides)?.[target.measure];
  const error = achieved === undefined ? undefined : achieved / target.value - 1;
  solved[first.key] = { exact: outcome.exact, value: snapped.value, series: snapped.series, error };
  const dim = first.spec.dim;
  const text = formatQuantity(snapped.value, dim);
  const inBand = achieved !== undefined && meetsClaim(target, achieved);
  findings.push({
    severity: inBand ? 'info' : 'warning',
    code: inBand ? Code.solved : Code.solveInexact,
    message:
      `\`${first.key}\`: exact value ${formatQuantity(outcome.exact, dim)}` +
      (snapped.series ? `; nearest ${snapped.series} part ${text}` : '') +
      (achieved !== undefined ? ` gives ${formatQuantity(achieved, resultDim(plan, target.measure))} (${formatSignedPercent(error!)} from the target)` : '') +
      (inBand ? '' : ` — outside ${target.text}${target.toleranceGiven ? '' : ` (default ±${Math.round(target.tolerance.plus * 1e6) / 1e4} %)`}`),
    span: first.span,
    fixes: [{ title: `Fill in ${first.key}: ${text}`, edits: [{ uri: context.uri, span: first.span, newText: text }] }],
  });
  return solved;
}

/** `target2:` and `target3:` speak of the second and third outputs (`frequency2`, `frequency3`); undefined on a failure. */
function laterTargets(plan: Plan, entries: Map<string, BlockEntry>, context: BlockContext, findings: Finding[]): Claim[] | undefined {
  const out: Claim[] = [];
  for (const [key, suffix] of [['target2', '2'], ['target3', '3']] as const) {
    const entry = entries.get(key);
    if (!entry) continue;
    const claim = parseClaims(entry, plan.model, context.options.defaultTolerance, findings)[0];
    if (!claim) return undefined;
    const measure = claim.measure + suffix;
    if (!plan.model.results.some((r) => r.key === measure)) {
      findings.push({ severity: 'error', code: Code.expectUnknownMeasure, message: `\`${key}\` needs a result \`${measure}\`, which ${plan.model.id} does not give`, span: entry.valueSpan });
      return undefined;
    }
    out.push({ ...claim, measure });
  }
  return out;
}

/** A register as the whole number it is; a part with its unit (`4.7 kΩ`). */
function valueText(spec: QuantityParam, value: number): string {
  return spec.dim && !spec.integer ? formatQuantity(value, spec.dim) : String(value);
}

/** The fix replaces the whole `? 1..63`, allowed values included. */
function fillSpan(u: Unknown): Span {
  return u.allowed ? { start: u.span.start, end: u.entry.valueSpan.end } : u.span;
}

function solvableKeys(plan: Plan): string {
  return plan.model.params.filter((p) => p.kind === 'quantity' && p.solvable).map((p) => p.key).join(', ') || 'none';
}

export function resultDim(plan: Plan, key: string) {
  return plan.model.results.find((r) => r.key === key)?.dim ?? '';
}
