// Block references as a block sees them: another block's results, nominal and at tolerance offsets, with the
// toleranced inputs upstream of them. The workspace pass (workspace.ts) decides which block a name means.
import type { Dim } from '../types';
import type { ResultSpec } from '../circuits/model';
import type { BlockRef } from '../value';
import { Code } from '../codes';
import type { BlockOutput, ReferenceLookup, ReferenceSource } from './context';
export type { BlockOutput, ReferenceLookup, ReferenceSource, UpstreamInput } from './context';

export const noReferences: ReferenceSource = {
  resolve: (ref) => ({ ok: false, code: Code.referenceUnknown, message: `\`@${ref.block}\`: no block of that name is known here` }),
};

/**
 * The references of a block in the workspace pass whose values name no other block: any name it might still ask
 * for was found nowhere. One for every such block, in every pass.
 */
export const unresolvedReferences: ReferenceSource = {
  resolve: (ref) => lookupResult(ref, undefined, 'not found'),
};

/** The dimension a result has inside another block's arithmetic: fractions shown as percent read as percent. */
export function resultDim(spec: ResultSpec): Dim {
  return spec.percent ? '%' : spec.dim;
}

/** Checks the result a reference names against the block it found; the lookup the plan uses. */
export function lookupResult(ref: BlockRef, output: BlockOutput | undefined, problem: string | undefined): ReferenceLookup {
  const shown = `\`@${ref.block}${ref.result ? `.${ref.result}` : ''}\``;
  if (!output) {
    return { ok: false, code: Code.referenceResult, message: `${shown}: block \`${ref.block}\` has no results to give${problem ? ` (${problem})` : ''}` };
  }
  const list = output.results.map((r) => `\`${r.key}\``).join(', ');
  const result = ref.result ?? 'frequency';
  const spec = output.results.find((r) => r.key === result);
  if (!spec) {
    const message = ref.result
      ? `${shown}: ${output.circuit} block \`${ref.block}\` has no result \`${result}\` (its results: ${list})`
      : `${shown} stands for a frequency, and ${output.circuit} block \`${ref.block}\` has none: name a result, one of ${list}`;
    return { ok: false, code: Code.referenceResult, message };
  }
  if (!(result in output.values)) {
    return { ok: false, code: Code.referenceResult, message: `${shown}: block \`${ref.block}\` did not compute its \`${result}\`` };
  }
  return { ok: true, output, result, dim: resultDim(spec) };
}
