// A claim its block does not meet: the warning states the computed value, the claim and the difference, and
// offers the fixes that are certain — the register constant that meets it, or the claim updated.
import type { BlockAnalysis, Fix, Finding } from '../types';
import { isSearchFailure } from '../circuits/model';
import { Code } from '../codes';
import { formatResult, formatSignedPercent } from '../format';
import type { BlockContext } from './context';
import { meetsClaim, type Claim } from './claims';
import { computeAt, modelInput } from './measure';
import type { Plan, Slot } from './plan';
import { evaluateParams } from './evaluate';
import { solveContinuous } from './solve';

export function checkClaims(analysis: BlockAnalysis, plan: Plan, claims: Claim[], overrides: Record<string, number>, context: BlockContext, findings: Finding[]): void {
  for (let i = 0; i < claims.length; i++) {
    const claim = claims[i];
    const computed = analysis.values[claim.measure];
    if (computed === undefined) {
      const missing = plan.model.params.filter((p) => p.kind === 'quantity' && p.optional && !plan.entries.has(p.key)).map((p) => `\`${p.key}:\``);
      const hint = missing.length ? ` — add ${missing.join(' or ')} to compute it` : '';
      findings.push({ severity: 'info', code: Code.expectNotComputed, message: `${claim.measure} is not computed for this block, so \`${claim.text}\` is not checked${hint}`, span: claim.span });
      continue;
    }
    if (meetsClaim(claim, computed)) continue;
    const difference = computed / claim.value - 1;
    const fixes: Fix[] = [];
    let hint = '';
    const register = registerFix(plan, claim, overrides, context);
    if (register) {
      hint = `; ${register.label} gives ${formatResult(plan.model, claim.measure, register.achieved)}`;
      fixes.push(register.fix);
    }
    const written = formatResult(plan.model, claim.measure, computed);
    fixes.push({ title: `Update the claim to ${written}`, edits: [{ uri: context.uri, span: claim.valueSpan, newText: written }] });
    const tolerance = claim.toleranceGiven ? '' : ` (default tolerance ±${trimPercent(claim.tolerance.plus)} %)`;
    findings.push({
      severity: 'warning',
      code: Code.expectMismatch,
      message: `${analysis.name}: computes ${written}, expect says ${claim.text}${tolerance} (${formatSignedPercent(difference)} from the claim)${hint}`,
      span: claim.span,
      fixes,
    });
  }
}

function trimPercent(fraction: number): string {
  return String(Math.round(fraction * 1e6) / 1e4);
}

/** Register-like keys, in the order a firmware engineer would change them. */
const registerOrder = ['reload', 'divisor', 'prescaler', 'compare', 'oversampling'];

interface RegisterFix {
  label: string;
  achieved: number;
  fix: Fix;
}

/**
 * The integer a register key must hold to meet the claim, when the key is a single constant (or a literal in the
 * block) and the change alone lands inside the claim's band.
 */
function registerFix(plan: Plan, claim: Claim, overrides: Record<string, number>, context: BlockContext): RegisterFix | undefined {
  const slots = [...plan.slots.values()].filter((s) => s.spec.integer).sort((a, b) => rank(a.key) - rank(b.key));
  for (const slot of slots) {
    const candidate = registerValue(plan, slot, claim, overrides);
    if (candidate === undefined) continue;
    const achieved = computeAt(plan, undefined, { ...overrides, [slot.key]: candidate })?.[claim.measure];
    if (achieved === undefined || !meetsClaim(claim, achieved)) continue;
    const edit = editFor(plan, slot, candidate, context);
    if (!edit) continue;
    return { label: edit.label, achieved, fix: { title: `Set ${edit.label.replace(/`/g, '')} (meets ${claim.text})`, edits: [edit.edit] } };
  }
  return undefined;
}

function rank(key: string): number {
  const i = registerOrder.indexOf(key);
  return i < 0 ? registerOrder.length : i;
}

function registerValue(plan: Plan, slot: Slot, claim: Claim, overrides: Record<string, number>): number | undefined {
  if (plan.model.search) {
    const values = { ...evaluateParams(plan, undefined, overrides) };
    delete values[slot.key];
    const result = plan.model.search(modelInput(plan, values), { unknowns: [slot.key], measure: claim.measure, target: claim.value });
    return isSearchFailure(result) ? undefined : result.values[slot.key];
  }
  const outcome = solveContinuous(plan, slot.spec, claim.measure, claim.value, overrides);
  if (!outcome.ok) return undefined;
  // The nearest whole register value, checked on both sides: results are monotonic but not linear in it.
  const around = [Math.floor(outcome.exact), Math.ceil(outcome.exact)];
  let best: number | undefined;
  let bestError = Infinity;
  for (const value of around) {
    const achieved = computeAt(plan, undefined, { ...overrides, [slot.key]: value })?.[claim.measure];
    if (achieved === undefined) continue;
    const error = Math.abs(achieved / claim.value - 1);
    if (error < bestError) [best, bestError] = [value, error];
  }
  return best;
}

function editFor(plan: Plan, slot: Slot, value: number, context: BlockContext): { label: string; edit: Fix['edits'][number] } | undefined {
  if (slot.soleIdentifier) {
    const found = plan.externalLookups.get(slot.soleIdentifier);
    if (!found?.literal) return undefined;
    const suffix = /[uUlL]+$/.exec(found.literal.text)?.[0] ?? '';
    const hex = /^0[xX]/.test(found.literal.text);
    const text = (hex ? '0x' + value.toString(16).toUpperCase() : String(value)) + suffix;
    return {
      label: `\`${slot.soleIdentifier}\` = ${text}`,
      edit: { uri: found.literal.uri, span: { start: found.literal.start, end: found.literal.end }, newText: text },
    };
  }
  if (/^\d+$/.test(slot.entry.valueText.trim())) {
    return { label: `\`${slot.key}: ${value}\``, edit: { uri: context.uri, span: slot.entry.valueSpan, newText: String(value) } };
  }
  return undefined;
}
