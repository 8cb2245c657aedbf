// One block from scanned text to every number the engine can say about it.
import type { BlockAnalysis, BlockEntry, Finding, RawBlock, SolvedPart } from '../types';
import { isRegisterKey, type CircuitModel, type ModelIssue } from '../circuits/model';
import { circuitById, circuits } from '../circuits/registry';
import { isSafetyName, safetyCaution } from '../circuits/common';
import { compileValue, parseValue } from '../value';
import { Code } from '../codes';
import type { BlockContext, DataModelName } from './context';
import { didYouMean } from './keys';
import { modelKeys } from './model-keys';
import { buildPlan, type Plan } from './plan';
import { evaluateParams, ownTolerancedKeys, tolerancedKeys } from './evaluate';
import { computeAt, finiteRecord, limitIssues, modelInput, runModel } from './measure';
import { parseClaims } from './claims';
import { monteCarlo, worstCase } from './spread';
import { solveUnknowns } from './unknowns';
import { checkClaims } from './mismatch';
import { seriesFindings } from './series-check';
import { blockKey } from '../block-keys';
import { emptyRecord } from '../empty';

const dataModels = (blockKey('data-model')?.words ?? []).map((w) => w.word as DataModelName);

/** Overrides of a block without `?` keys: nothing solved, so nothing replaces a value (never written to). */
const noOverrides: Record<string, number> = emptyRecord;

/** The results of a block stopped before its model ran: one shared empty record, never written. */
const noValues: Record<string, number> = emptyRecord;

function hasError(findings: readonly Finding[]): boolean {
  for (let i = 0; i < findings.length; i++) if (findings[i].severity === 'error') return true;
  return false;
}

export function analyzeBlock(raw: RawBlock, context: BlockContext): BlockAnalysis {
  const findings: Finding[] = raw.findings.slice();
  const entries = new Map<string, BlockEntry>();
  // Indexed loops on the per-block path: a cold process runs them before any optimisation removes the iterators.
  for (let i = 0; i < raw.entries.length; i++) entries.set(raw.entries[i].key, raw.entries[i]);
  const circuitEntry = entries.get('circuit');
  const circuitId = circuitEntry?.valueText.trim().toLowerCase();
  const name = raw.name ?? `${circuitId || 'timing'}@${context.line}`;
  const model = circuitEntry && circuitId ? circuitById(circuitId) : undefined;
  if (!model) {
    const analysis: BlockAnalysis = { name, line: context.line, circuit: circuitId || undefined, block: raw, params: {}, choices: {}, lists: {}, values: {}, identifiers: [], findings };
    if (!circuitEntry || !circuitId) {
      findings.push({ severity: 'error', code: Code.circuitMissing, message: `block needs \`circuit:\` (one of ${circuits.map((c) => c.id).join(', ')})`, span: raw.headerSpan });
    } else {
      findings.push({
        severity: 'error',
        code: Code.circuitUnknown,
        message: `unknown circuit \`${circuitId}\`${didYouMean(circuitId, circuits.map((c) => c.id)) || ` (known: ${circuits.map((c) => c.id).join(', ')})`}`,
        span: circuitEntry.valueSpan,
      });
    }
    return analysis;
  }

  let dataModel = context.options.dataModel;
  const dataModelEntry = entries.get('data-model');
  if (dataModelEntry) {
    const word = dataModelEntry.valueText.trim().toLowerCase() as DataModelName;
    if (dataModels.includes(word)) dataModel = word;
    else findings.push({ severity: 'error', code: Code.valueOption, message: `\`data-model\` takes ${dataModels.join(', ')}, not \`${dataModelEntry.valueText}\``, span: dataModelEntry.valueSpan });
  }

  if (raw.host === 'c') unsignedSuffixHints(raw, model, findings);
  const plan = buildPlan(raw, model, context.source, dataModel, entries, context.references);
  for (let i = 0; i < plan.findings.length; i++) findings.push(plan.findings[i]);
  const seriesProblems = seriesFindings(plan, context.uri);
  for (let i = 0; i < seriesProblems.length; i++) findings.push(seriesProblems[i]);

  let overrides = noOverrides;
  let solved: BlockAnalysis['solved'];
  const unknowns = plan.unknowns;
  if (unknowns.length && !hasError(findings)) {
    overrides = {};
    solved = solveUnknowns(plan, entries, context, overrides, findings);
  } else if (unknowns.length) {
    for (const u of unknowns) findings.push({ severity: 'info', code: Code.solveBlocked, message: `\`${u.key}: ?\` is solved once the errors above are fixed`, span: u.span });
  }

  const params = evaluateParams(plan, undefined, overrides);
  // The plan's own records, made for this block alone: the analysis keeps them rather than copies.
  const analysis: BlockAnalysis = { name, line: context.line, circuit: circuitId, block: raw, params: finiteRecord(params), choices: plan.choices, lists: plan.lists, values: noValues, identifiers: plan.identifiers, findings };
  if (plan.references.length) analysis.references = plan.references as BlockAnalysis['references'];
  if (solved) analysis.solved = solved;
  if (hasError(findings)) return analysis;
  for (let i = 0; i < unknowns.length; i++) if (!(unknowns[i].key in overrides)) return analysis;

  const input = modelInput(plan, params, true, overrides);
  analysis.ranges = plan.ranges;
  analysis.tolerances = input.tolerances;
  // The parameter table's limits speak first; the model's own check of the same key would only repeat them.
  const limits = limitIssues(model, params);
  for (let i = 0; i < limits.length; i++) findings.push(physicsFinding(limits[i], entries, raw));
  const checked = safeValidate(model, input);
  for (let i = 0; i < checked.length; i++) if (!flagged(limits, checked[i].key)) findings.push(physicsFinding(checked[i], entries, raw));
  if (hasError(findings)) return analysis;
  try {
    const run = runModel(model, input);
    analysis.values = run.values;
    if (run.missing.length) {
      findings.push(overflowFinding(plan, params, run.missing, raw));
      return analysis;
    }
  } catch {
    findings.push({ severity: 'error', code: Code.physics, message: `${model.id} could not be computed from these values`, span: raw.headerSpan });
    return analysis;
  }

  if (context.computed) handOn(context.computed, plan, overrides, analysis.values);
  const keys = tolerancedKeys(plan);
  if (keys.length) {
    const spread = worstCase(plan, keys, overrides);
    const samples = integerMeta(entries.get('samples'), findings);
    if (samples) monteCarlo(plan, keys, samples, integerMeta(entries.get('seed'), findings) ?? 1, spread, overrides);
    analysis.spread = spread;
  }

  const expectEntry = entries.get('expect');
  if (expectEntry) {
    const claims = parseClaims(expectEntry, model, context.options.defaultTolerance, findings);
    if (claims.length) checkClaims(analysis, plan, claims, overrides, context, findings);
  }

  const cautions = blockCautions(model, input, raw, entries, findings);
  for (let i = 0; i < cautions.length; i++) findings.push({ severity: 'info', code: Code.caution, message: cautions[i], span: raw.headerSpan });
  return analysis;
}

/** The computed block, for the blocks that reference it (made apart from analyzeBlock, which then keeps no closure). */
function handOn(computed: NonNullable<BlockContext['computed']>, plan: Plan, overrides: Record<string, number>, values: Readonly<Record<string, number>>): void {
  computed({ model: plan.model, tolerancedKeys: ownTolerancedKeys(plan), upstreamInputs: plan.upstreamInputs, at: (local, upstream) => computeAt(plan, local, overrides, upstream) }, values);
}

function flagged(limits: readonly ModelIssue[], key: string): boolean {
  for (let i = 0; i < limits.length; i++) if (limits[i].key === key) return true;
  return false;
}

/** A limit or a model's finding on a key: it names its key, even where the model's sentence speaks in the trade's words. */
function physicsFinding(issue: ModelIssue, entries: Map<string, BlockEntry>, raw: RawBlock): Finding {
  const entry = entries.get(issue.key);
  const message = issue.message.includes(`\`${issue.key}\``) ? issue.message : `\`${issue.key}\`: ${issue.message}`;
  return { severity: issue.severity ?? 'error', code: issue.code ?? Code.physics, message, span: entry ? entry.valueSpan : raw.headerSpan };
}

/**
 * A result that overflows a double comes from inputs of extreme magnitude (1e300 Ω · 1e300 F): the finding names
 * those given values and points at the first, or at the header when none stands out.
 */
function overflowFinding(plan: Plan, params: Readonly<Record<string, number>>, missing: string[], raw: RawBlock): Finding {
  const extreme = [...plan.slots.values()].filter((slot) => {
    const size = Math.abs(params[slot.key]);
    return size > 1e15 || (size > 0 && size < 1e-15);
  });
  const named = extreme.length ? `${extreme.map((s) => `\`${s.key}\``).join(', ')}: ` : '';
  return {
    severity: 'error',
    code: Code.resultOverflow,
    message: `${named}these values are beyond what can be computed: ${missing.join(', ')} would not be a finite number`,
    span: extreme.length ? extreme[0].entry.valueSpan : raw.headerSpan,
  };
}

function safeValidate(model: CircuitModel, input: ReturnType<typeof modelInput>) {
  try {
    return model.validate(input);
  } catch {
    return [{ key: 'circuit', message: `${model.id} could not check these values` }];
  }
}

function safeCautions(model: CircuitModel, input: ReturnType<typeof modelInput>): string[] {
  try {
    return model.cautions?.(input) ?? [];
  } catch {
    return [];
  }
}

/**
 * The model's cautions, plus the safety-timing caution for any circuit whose name says it guards something
 * (`watchdog`, `por-delay`, `interlock` …) or whose block says `safety: yes`. Nothing silences it: `safety: no`
 * on a block named like a guard keeps the caution (a caution one word can remove protects no one).
 */
function blockCautions(model: CircuitModel, input: ReturnType<typeof modelInput>, raw: RawBlock, entries: Map<string, BlockEntry>, findings: Finding[]): string[] {
  const cautions = safeCautions(model, input);
  const entry = entries.get('safety');
  // The one place the safety-timing caution is added: by the block's name, by `safety: yes`, or by a model whose
  // timing always guards something (watchdog), whatever the block is called.
  let safety = isSafetyName(raw.name) || model.safetyRelated === true;
  if (entry) {
    const word = entry.valueText.trim().toLowerCase();
    if (word === 'yes') safety = true;
    else if (word === 'no' && safety) findings.push({ severity: 'info', code: Code.safetyKept, message: '`safety: no` does not remove the caution from a watchdog, or from a block named for watchdog, reset or interlock timing', span: entry.valueSpan });
    else if (word !== 'no') findings.push({ severity: 'error', code: Code.valueOption, message: `\`safety\` takes \`yes\` or \`no\`, not \`${entry.valueText}\``, span: entry.valueSpan });
  }
  return safety ? [safetyCaution, ...cautions] : cautions;
}

/**
 * In firmware, `2u` is C's unsigned 2; in a block it is 2 µ (docs/blocks.md, "Values and units"). Said out loud where a
 * firmware engineer is most likely to write it, a bare number with a lone `u`.
 */
const firmwareNamePattern = /\b[A-Z][A-Z0-9]{2,}\b/;
const firmwareName = (text: string) => text.includes('_') || firmwareNamePattern.test(text);
const digitU = /\d[uU]/;

function unsignedSuffixHints(raw: RawBlock, model: CircuitModel, hints: Finding[]): void {
  // Beside a firmware name (`SYS_CLOCK / 2u`) or in a plain-number key (`prescaler: 2u`, a register); `c: 2u`
  // alone is a 2 µF capacitor, as meant.
  // Linear tests only: a value line can be hostile and long.
  const params = modelKeys(model).params;
  for (let i = 0; i < raw.entries.length; i++) {
    const entry = raw.entries[i];
    const spec = params.get(entry.key);
    // Register keys are C (`prescaler: 2u` is the unsigned 2), so the hint is for values with a unit only.
    if (spec?.kind === 'quantity' && isRegisterKey(spec)) continue;
    const plainNumber = spec?.kind === 'quantity' && spec.dim === '';
    if (!plainNumber && !firmwareName(entry.valueText)) continue;
    // Most values hold no `u` after a digit at all: one native test before the search that builds matches.
    if (!digitU.test(entry.valueText)) continue;
    const pattern = /(?<![\w.])(\d+)[uU](?![\w(])/g;
    for (let m = pattern.exec(entry.valueText); m; m = pattern.exec(entry.valueText)) {
      const start = entry.valueSpan.start + m.index;
      hints.push({
        severity: 'warning',
        code: Code.valueUnit,
        message: `\`${m[0]}\` reads as ${m[1]} µ (the micro prefix), not C's unsigned ${m[1]}: write \`${m[1]}\` for the number`,
        span: { start, end: start + m[0].length },
      });
    }
  }
}

/** An integer block key (`samples`, `seed`) within the limits of its row in core/block-keys.ts. */
function integerMeta(entry: { valueText: string; valueSpan: { start: number; end: number }; key: string } | undefined, findings: Finding[]): number | undefined {
  if (!entry) return undefined;
  const { min = 0, max = Number.MAX_SAFE_INTEGER } = blockKey(entry.key) ?? {};
  const parsed = parseValue(entry.valueText, entry.valueSpan.start);
  const value = parsed.expr && !parsed.findings.length ? compileValue(parsed.expr)({}) : NaN;
  if (!Number.isInteger(value) || value < min || value > max) {
    findings.push({ severity: 'error', code: Code.valueRange, message: `\`${entry.key}\` takes a whole number from ${min} to ${max}`, span: entry.valueSpan });
    return undefined;
  }
  return value;
}

export type { Plan, SolvedPart };
