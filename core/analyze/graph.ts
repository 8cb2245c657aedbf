// The reference graph of a workspace: which block each `@name` means (the same file first, then every file),
// cycles among them, and an order in which every block comes after the blocks it reads. Iterative throughout:
// a hostile graph of any shape ends in findings, never a deep recursion or a hang.
import type { Finding, RawBlock } from '../types';
import { Code } from '../codes';
import { referencesIn, type BlockRef } from '../value';
import { editDistance } from './keys';
import { isMetaEntry } from './keys';
import { emptyList } from '../empty';

/** References further up than this many blocks are refused: every evaluation walks the chain. */
export const maxChainDepth = 64;

/** A block as the graph reads it (a prepared block is one): its document and 1-based header line. */
export interface GraphBlock {
  raw: RawBlock;
  context: { uri: string; line: number };
}

/** What one block's `@name` resolved to: a block, or the problem to report at each reference. */
export type Resolution = { target: number } | { problem: { code: string; message: string } };

export interface ReferenceGraph {
  /** Per block, its references by name as written. */
  resolutions: Array<Map<string, Resolution>>;
  /** Block indexes, each after every block it reads. */
  order: number[];
  /** Warnings on blocks sharing a name in one file, by block index. */
  duplicates: Map<number, Finding>;
  /** Blocks that another block's reference resolved to: only these need to hand their results on. */
  referenced: Set<number>;
}

/** One empty list for every block without references: nothing adds to it. */
const noRefs: BlockRef[] = emptyList;

/** References written in a block's circuit values (claims and settings state numbers, not references). */
export function blockReferences(raw: RawBlock): BlockRef[] {
  let refs = noRefs;
  for (let i = 0; i < raw.entries.length; i++) {
    const entry = raw.entries[i];
    if (!entry.valueText.includes('@') || isMetaEntry(entry.key, entry.valueText)) continue;
    const found = referencesIn(entry.valueText, entry.valueSpan.start);
    if (found.length === 0) continue;
    if (refs === noRefs) refs = [];
    for (let r = 0; r < found.length; r++) refs.push(found[r]);
  }
  return refs;
}

// Shared by every block without references: the passes below write only to names a table holds, so never to it.
const noResolutions = new Map<string, Resolution>();

/** `pathOf`: the display path of a block's document, for messages that point elsewhere. */
export function buildGraph(blocks: readonly GraphBlock[], pathOf: (index: number) => string): ReferenceGraph {
  // Blocks by name: the index of a name's only block, a list once a second block has it.
  const byName: ByName = new Map();
  for (let i = 0; i < blocks.length; i++) {
    const name = blocks[i].raw.name;
    if (name === undefined) continue;
    const known = byName.get(name);
    if (known === undefined) byName.set(name, i);
    else if (typeof known === 'number') byName.set(name, [known, i]);
    else known.push(i);
  }
  const duplicates = new Map<number, Finding>();
  byName.forEach((list, name) => {
    // A name only one block has cannot be repeated in a file.
    if (typeof list === 'number') return;
    for (const i of list) {
      const others = list.filter((j) => j !== i && blocks[j].context.uri === blocks[i].context.uri);
      if (others.length === 0 || !blocks[i].raw.nameSpan) continue;
      duplicates.set(i, {
        severity: 'warning',
        code: Code.blockNameRepeated,
        message: `another block in this file is also named \`${name}\` (line ${others.map((j) => blocks[j].context.line).join(', ')}): \`@${name}\` cannot tell them apart; give each block its own name`,
        span: blocks[i].raw.nameSpan,
      });
    }
  });

  let linked = false;
  const resolutions = blocks.map((block) => {
    const refs = blockReferences(block.raw);
    // Most blocks read no other block: they share one empty table, which nothing below writes to.
    if (refs.length === 0) return noResolutions;
    const own = new Map<string, Resolution>();
    for (const ref of refs) if (!own.has(ref.block)) own.set(ref.block, resolve(ref.block, block, blocks, byName, pathOf));
    linked = true;
    return own;
  });
  // Without a single reference every block stands alone, in document order.
  if (!linked) return { resolutions, order: blocks.map((_, i) => i), duplicates, referenced: new Set() };
  const targets = resolutions.map((own) => [...own.values()].flatMap((r) => ('target' in r ? [r.target] : [])));
  const referenced = new Set(targets.flat());
  markCycles(blocks, resolutions, targets);
  const order = topologicalOrder(targets, resolutions, blocks);
  return { resolutions, order, duplicates, referenced };
}

type ByName = Map<string, number | number[]>;

function resolve(name: string, from: GraphBlock, blocks: readonly GraphBlock[], byName: ByName, pathOf: (index: number) => string): Resolution {
  const known = byName.get(name);
  const all = known === undefined ? [] : typeof known === 'number' ? [known] : known;
  const here = all.filter((i) => blocks[i].context.uri === from.context.uri);
  const pool = here.length ? here : all;
  if (pool.length === 1) return { target: pool[0] };
  if (pool.length > 1) {
    const where = pool.map((i) => (here.length ? `line ${blocks[i].context.line}` : `${pathOf(i)}:${blocks[i].context.line}`)).join(', ');
    return { problem: { code: Code.referenceAmbiguous, message: `\`@${name}\` is ambiguous: ${pool.length} blocks ${here.length ? 'in this file' : 'in the workspace'} are named \`${name}\` (${where}); rename all but one` } };
  }
  const near = [...byName.keys()]
    .map((candidate) => ({ candidate, distance: editDistance(name.toLowerCase(), candidate.toLowerCase(), 3) }))
    .filter((c) => c.distance <= 3)
    .sort((a, b) => a.distance - b.distance || a.candidate.localeCompare(b.candidate))
    .slice(0, 3)
    .map((c) => `\`${c.candidate}\``);
  const hint = near.length ? ` — nearest: ${near.join(', ')}` : byName.size ? '' : ' (no block here has a name)';
  return { problem: { code: Code.referenceUnknown, message: `\`@${name}\`: no block named \`${name}\` in this file or the workspace${hint}` } };
}

/** Tarjan's strongly connected components, iteratively; a reference inside a component (or to itself) is a cycle. */
function markCycles(blocks: readonly GraphBlock[], resolutions: Array<Map<string, Resolution>>, targets: number[][]): void {
  const n = blocks.length;
  const index = new Array<number>(n).fill(-1);
  const low = new Array<number>(n).fill(0);
  const onStack = new Array<boolean>(n).fill(false);
  const component = new Array<number>(n).fill(-1);
  const stack: number[] = [];
  let counter = 0;
  let components = 0;
  for (let root = 0; root < n; root++) {
    if (index[root] >= 0) continue;
    const work: Array<[number, number]> = [[root, 0]];
    index[root] = low[root] = counter++;
    stack.push(root);
    onStack[root] = true;
    while (work.length) {
      const top = work[work.length - 1];
      const [v, at] = top;
      if (at < targets[v].length) {
        top[1]++;
        const w = targets[v][at];
        if (index[w] < 0) {
          index[w] = low[w] = counter++;
          stack.push(w);
          onStack[w] = true;
          work.push([w, 0]);
        } else if (onStack[w]) low[v] = Math.min(low[v], index[w]);
        continue;
      }
      work.pop();
      if (work.length) low[work[work.length - 1][0]] = Math.min(low[work[work.length - 1][0]], low[v]);
      if (low[v] === index[v]) {
        let w: number;
        do {
          w = stack.pop()!;
          onStack[w] = false;
          component[w] = components;
        } while (w !== v);
        components++;
      }
    }
  }
  for (let v = 0; v < n; v++) {
    for (const [name, resolution] of resolutions[v]) {
      if (!('target' in resolution) || component[resolution.target] !== component[v]) continue;
      const path = cyclePath(v, resolution.target, targets, component);
      const names = path.map((i) => (i < 0 ? '…' : `\`${blocks[i].raw.name}\``)).join(' → ');
      resolutions[v].set(name, {
        problem: {
          code: Code.referenceCycle,
          message: resolution.target === v
            ? `\`@${name}\` is this block itself: a block cannot read its own result`
            : `\`@${name}\` closes a cycle of references (${names}): no block in it can be computed`,
        },
      });
    }
  }
}

/** The path v → target → … → v inside one component, by breadth-first search (for the message). */
function cyclePath(v: number, target: number, targets: number[][], component: number[]): number[] {
  if (target === v) return [v, v];
  const previous = new Map<number, number>([[target, -1]]);
  const queue = [target];
  for (let at = 0; at < queue.length && !previous.has(v); at++) {
    for (const w of targets[queue[at]]) {
      if (component[w] !== component[v] || previous.has(w)) continue;
      previous.set(w, queue[at]);
      queue.push(w);
    }
  }
  const back: number[] = [];
  for (let w: number | undefined = v; w !== undefined && w !== -1; w = previous.get(w)) back.push(w);
  const path = [v, ...back.reverse()];
  // A long cycle is named by its ends; the message stays one line.
  return path.length > 8 ? [...path.slice(0, 4), -1, ...path.slice(-3)] : path;
}

/** Kahn's order over the references that resolved; chains deeper than maxChainDepth are cut with a finding. */
function topologicalOrder(targets: number[][], resolutions: Array<Map<string, Resolution>>, blocks: readonly GraphBlock[]): number[] {
  const n = targets.length;
  const live = resolutions.map((own) => [...own.values()].flatMap((r) => ('target' in r ? [r.target] : [])));
  const waiting = live.map((list) => new Set(list).size);
  const dependants: number[][] = Array.from({ length: n }, () => []);
  live.forEach((list, v) => new Set(list).forEach((w) => dependants[w].push(v)));
  const depth = new Array<number>(n).fill(0);
  const order: number[] = [];
  const queue: number[] = [];
  for (let v = 0; v < n; v++) if (waiting[v] === 0) queue.push(v);
  for (let at = 0; at < queue.length; at++) {
    const w = queue[at];
    order.push(w);
    for (const v of dependants[w]) {
      depth[v] = Math.max(depth[v], depth[w] + 1);
      if (--waiting[v] === 0) queue.push(v);
    }
  }
  for (let v = 0; v < n; v++) {
    if (depth[v] <= maxChainDepth) continue;
    for (const [name, resolution] of resolutions[v]) {
      if ('target' in resolution && depth[resolution.target] >= maxChainDepth) {
        resolutions[v].set(name, { problem: { code: Code.referenceResult, message: `\`@${name}\` is more than ${maxChainDepth} blocks down a chain of references; Tickmark follows at most ${maxChainDepth}` } });
      }
    }
  }
  // Blocks left over wait on a cycle that was cut above: after the cuts every remaining edge points outside one.
  if (order.length < n) {
    const placed = new Set(order);
    for (let v = 0; v < n; v++) if (!placed.has(v)) order.push(v);
  }
  return order;
}
