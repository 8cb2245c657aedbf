// One block from scanned text to every number the engine can say about it.
import type { BlockAnalysis, BlockEntry, Finding, RawBlock, SolvedPart } from '../types';
import { isRegisterKey, type CircuitModel } from '../circuits/model';
import { circuitById, circuits } from '../circuits/registry';
import { isSafetyName, safetyCaution } from '../circuits/common';
import { compileValue, parseValue } from '../value';
import { Code } from '../codes';
import type { BlockContext, DataModelName } from './context';
import { didYouMean } from './keys';
import { modelKeys } from './model-keys';
import { buildPlan, type Plan } from './plan';
import { evaluateParams, ownTolerancedKeys, tolerancedKeys } from './evaluate';
import { computeAt, finiteOnly, limitIssues, modelInput, runModel } from './measure';
import { parseClaims } from './claims';
import { monteCarlo, worstCase } from './spread';
import { solveUnknowns } from './unknowns';
import { checkClaims } from './mismatch';
import { seriesFindings } from './series-check';
import { blockKey } from '../block-keys';

const dataModels = (blockKey('data-model')?.words ?? []).map((w) => w.word as DataModelName);

export function analyzeBlock(raw: RawBlock, context: BlockContext): BlockAnalysis {
  const findings: Finding[] = [...raw.findings];
  const entries = new Map<string, BlockEntry>();
  // Indexed loops on the per-block path: a cold process runs them before any optimisation removes the iterators.
  for (let i = 0; i < raw.entries.length; i++) entries.set(raw.entries[i].key, raw.entries[i]);
  const circuitEntry = entries.get('circuit');
  const circuitId = circuitEntry?.valueText.trim().toLowerCase();
  const analysis: BlockAnalysis = {
    name: raw.name ?? `${circuitId || 'timing'}@${context.line}`,
    line: context.line,
    circuit: circuitId || undefined,
    block: raw,
    params: {},
    choices: {},
    lists: {},
    values: {},
    identifiers: [],
    findings,
  };
  if (!circuitEntry || !circuitId) {
    findings.push({ severity: 'error', code: Code.circuitMissing, message: `block needs \`circuit:\` (one of ${circuits.map((c) => c.id).join(', ')})`, span: raw.headerSpan });
    return analysis;
  }
  const model = circuitById(circuitId);
  if (!model) {
    findings.push({
      severity: 'error',
      code: Code.circuitUnknown,
      message: `unknown circuit \`${circuitId}\`${didYouMean(circuitId, circuits.map((c) => c.id)) || ` (known: ${circuits.map((c) => c.id).join(', ')})`}`,
      span: circuitEntry.valueSpan,
    });
    return analysis;
  }

  let dataModel = context.options.dataModel;
  const dataModelEntry = entries.get('data-model');
  if (dataModelEntry) {
    const word = dataModelEntry.valueText.trim().toLowerCase() as DataModelName;
    if (dataModels.includes(word)) dataModel = word;
    else findings.push({ severity: 'error', code: Code.valueOption, message: `\`data-model\` takes ${dataModels.join(', ')}, not \`${dataModelEntry.valueText}\``, span: dataModelEntry.valueSpan });
  }

  if (raw.host === 'c') findings.push(...unsignedSuffixHints(raw, model));
  const plan = buildPlan(raw, model, context.source, dataModel, entries, context.references);
  findings.push(...plan.findings);
  if (plan.references.length) analysis.references = plan.references;
  findings.push(...seriesFindings(plan, context.uri));
  analysis.identifiers = plan.identifiers;
  analysis.choices = { ...plan.choices };
  analysis.lists = { ...plan.lists };
  const blocked = () => findings.some((f) => f.severity === 'error');

  const overrides: Record<string, number> = {};
  if (plan.unknowns.length && !blocked()) {
    const solved = solveUnknowns(plan, entries, context, overrides, findings);
    if (solved) analysis.solved = solved;
  } else if (plan.unknowns.length) {
    for (const u of plan.unknowns) findings.push({ severity: 'info', code: Code.solveBlocked, message: `\`${u.key}: ?\` is solved once the errors above are fixed`, span: u.span });
  }

  const params = evaluateParams(plan, undefined, overrides);
  analysis.params = finiteOnly(params);
  if (blocked() || plan.unknowns.some((u) => !(u.key in overrides))) return analysis;

  const input = modelInput(plan, params, true, overrides);
  analysis.ranges = { ...plan.ranges };
  analysis.tolerances = input.tolerances;
  // The parameter table's limits speak first; the model's own check of the same key would only repeat them.
  const limits = limitIssues(model, params);
  const flagged = new Set(limits.map((i) => i.key));
  const issues = [...limits, ...safeValidate(model, input).filter((i) => !flagged.has(i.key))];
  for (let i = 0; i < issues.length; i++) {
    const issue = issues[i];
    const entry = entries.get(issue.key);
    // Every physics finding names its key, even where the model's sentence speaks in the trade's words.
    const message = issue.message.includes(`\`${issue.key}\``) ? issue.message : `\`${issue.key}\`: ${issue.message}`;
    findings.push({ severity: issue.severity ?? 'error', code: issue.code ?? Code.physics, message, span: entry ? entry.valueSpan : raw.headerSpan });
  }
  if (blocked()) return analysis;
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

  context.computed?.(
    { model, tolerancedKeys: ownTolerancedKeys(plan), upstreamInputs: plan.upstreamInputs, at: (local, upstream) => computeAt(plan, local, overrides, upstream) },
    analysis.values,
  );
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
    checkClaims(analysis, plan, claims, overrides, context, findings);
  }

  for (const caution of blockCautions(model, input, raw, entries, findings)) {
    findings.push({ severity: 'info', code: Code.caution, message: caution, span: raw.headerSpan });
  }
  return analysis;
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

function unsignedSuffixHints(raw: RawBlock, model: CircuitModel): Finding[] {
  const hints: Finding[] = [];
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
  return hints;
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
