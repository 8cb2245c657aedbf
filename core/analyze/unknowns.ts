// `?` values: one part solved onto a standard series, or timer registers searched, always against `target:`.
import type { BlockEntry, Finding, SolvedPart } from '../types';
import { isSearchFailure } from '../circuits/model';
import { Code } from '../codes';
import { formatQuantity, formatSignedPercent } from '../format';
import type { BlockContext } from './block';
import { meetsClaim, parseClaims } from './claims';
import { computeAt, modelInput } from './measure';
import type { Plan } from './plan';
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
  if (!targetEntry) {
    findings.push({ severity: 'error', code: Code.solveFailed, message: `\`${first.key}: ?\` needs \`target:\` (the result to meet, e.g. \`target: 1 kHz\`)`, span: first.span });
    return undefined;
  }
  const claims = parseClaims(targetEntry, plan.model, context.options.defaultTolerance, findings);
  const target = claims[0];
  if (!target) return undefined;
  const solved: Record<string, SolvedPart> = {};
  const unknownKeys = plan.unknowns.map((u) => u.key);

  if (plan.model.search) {
    const input = modelInput(plan, evaluateParams(plan));
    const result = plan.model.search(input, { unknowns: unknownKeys, measure: target.measure, target: target.value });
    if (isSearchFailure(result)) {
      findings.push({ severity: 'error', code: Code.solveFailed, message: result.error, span: first.span });
      return undefined;
    }
    const found = result;
    Object.assign(overrides, found.values);
    const achieved = computeAt(plan, undefined, overrides)?.[target.measure];
    for (const u of plan.unknowns) {
      const value = found.values[u.key];
      solved[u.key] = { value, error: found.error };
      const inBand = achieved !== undefined && meetsClaim(target, achieved);
      const what = achieved === undefined ? '' : `: ${target.measure} ${formatQuantity(achieved, resultDim(plan, target.measure))}`;
      findings.push({
        severity: inBand ? 'info' : 'warning',
        code: inBand ? Code.solved : Code.solveInexact,
        message: found.error === 0 ? `\`${u.key}\` = ${value} meets ${target.text} exactly${what}` : `closest \`${u.key}\` = ${value}${what}, ${formatSignedPercent(found.error)} from the target ${target.text}${inBand ? '' : ' — outside the target band'}`,
        span: u.span,
        fixes: [{ title: `Fill in ${u.key}: ${value}`, edits: [{ uri: context.uri, span: u.span, newText: String(value) }] }],
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

function solvableKeys(plan: Plan): string {
  return plan.model.params.filter((p) => p.kind === 'quantity' && p.solvable).map((p) => p.key).join(', ') || 'none';
}

export function resultDim(plan: Plan, key: string) {
  return plan.model.results.find((r) => r.key === key)?.dim ?? '';
}
