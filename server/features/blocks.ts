// Block references across files (`@name.result`): go to the block, find every reference to it, complete block
// names after `@` and result names after the dot, and rename a block with its references in every file.
import { CompletionItemKind, type CompletionItem, type Location, type Range, type TextEdit } from 'vscode-languageserver';
import { circuitById } from '../../core/circuits/registry';
import { referencesIn, type BlockRef } from '../../core/value';
import type { BlockAnalysis, DocumentAnalysis, Span } from '../../core/types';
import { corePathOf } from '../files';
import type { At, Feature, ServerContext } from '../context';
import { spanToRange } from '../findings';

interface BlockPlace {
  uri: string;
  block: BlockAnalysis;
}

/** The reference under the offset, in the value of a block entry, as written. */
function referenceAt(ctx: ServerContext, at: At): { ref: BlockRef; block: BlockAnalysis } | undefined {
  const found = ctx.store.blockAt(at.uri, at.offset);
  const entry = found?.block.block.entries.find((e) => at.offset >= e.valueSpan.start && at.offset <= e.valueSpan.end);
  if (!found || !entry) return undefined;
  const ref = referencesIn(entry.valueText, entry.valueSpan.start).find((r) => at.offset >= r.blockSpan.start - 1 && at.offset <= (r.resultSpan ?? r.blockSpan).end);
  return ref ? { ref, block: found.block } : undefined;
}

/** The block a reference resolved to, from the analysis (which already chose same file first, then workspace). */
function targetOf(ctx: ServerContext, at: At): BlockPlace | undefined {
  const found = referenceAt(ctx, at);
  if (!found) return undefined;
  const resolved = found.block.references?.find((r) => r.span.start === found.ref.blockSpan.start - 1);
  if (resolved) return blockNamed(ctx, resolved.uri, resolved.name);
  // An unresolved reference still leads somewhere when exactly one block has the name (the error says why not).
  const all = everyBlock(ctx).filter((p) => p.block.block.name === found.ref.block);
  return all.length === 1 ? all[0] : undefined;
}

function everyBlock(ctx: ServerContext): BlockPlace[] {
  ctx.store.openUris().forEach((uri) => ctx.store.current(uri));
  return ctx.store.workspaceAnalyses().flatMap((a: DocumentAnalysis) => a.blocks.map((block) => ({ uri: a.uri, block })));
}

function blockNamed(ctx: ServerContext, uri: string, name: string): BlockPlace | undefined {
  return everyBlock(ctx).find((p) => p.uri === uri && p.block.block.name === name);
}

/** The block whose header name is under the offset. */
function headerAt(ctx: ServerContext, at: At): BlockPlace | undefined {
  const found = ctx.store.blockAt(at.uri, at.offset);
  const span = found?.block.block.nameSpan;
  if (!found || !span || at.offset < span.start || at.offset > span.end) return undefined;
  return { uri: corePathOf(at.uri), block: found.block };
}

function rangeIn(ctx: ServerContext, corePath: string, span: Span): Range | undefined {
  const mapper = ctx.reader.mapperOf(corePath);
  return mapper ? spanToRange(mapper, span) : undefined;
}

function location(ctx: ServerContext, corePath: string, span: Span): Location[] {
  const range = rangeIn(ctx, corePath, span);
  return range ? [{ uri: ctx.reader.uriOf(corePath), range }] : [];
}

/** Every `@name` (the name part) that resolved to the block, across the workspace. */
function referencesTo(ctx: ServerContext, target: BlockPlace): Array<{ uri: string; span: Span }> {
  const name = target.block.block.name;
  if (name === undefined) return [];
  return everyBlock(ctx).flatMap((p) =>
    (p.block.references ?? []).filter((r) => r.uri === target.uri && r.name === name).map((r) => ({ uri: p.uri, span: { start: r.span.start + 1, end: r.span.start + 1 + name.length } })),
  );
}

function definition(ctx: ServerContext, at: At): Location[] | undefined {
  const target = targetOf(ctx, at);
  const span = target?.block.block.nameSpan ?? target?.block.block.headerSpan;
  return target && span ? location(ctx, target.uri, span) : undefined;
}

function references(ctx: ServerContext, at: At, includeDeclaration: boolean): Location[] | undefined {
  const target = targetOf(ctx, at) ?? headerAt(ctx, at);
  if (!target) return undefined;
  const found = referencesTo(ctx, target).flatMap((r) => location(ctx, r.uri, r.span));
  const own = target.block.block.nameSpan;
  return includeDeclaration && own ? [...location(ctx, target.uri, own), ...found] : found;
}

const nameChars = /[A-Za-z0-9_-]/;

function completion(ctx: ServerContext, at: At): CompletionItem[] | undefined {
  const found = ctx.store.blockAt(at.uri, at.offset);
  const entry = found?.block.block.entries.find((e) => at.offset >= e.valueSpan.start && at.offset <= e.valueSpan.end + 1);
  if (!found || !entry) return undefined;
  const text = at.doc.getText();
  let start = at.offset;
  while (start > entry.valueSpan.start && nameChars.test(text[start - 1])) start--;
  const typed = text.slice(start, at.offset);
  const range = spanToRange(at.doc, { start, end: at.offset });
  const here = corePathOf(at.uri);
  if (text[start - 1] === '@') {
    // Block names, the same file's first (they win when a name is in both).
    const seen = new Set<string>();
    const items: CompletionItem[] = [];
    const places = everyBlock(ctx).sort((a, b) => Number(b.uri === here) - Number(a.uri === here));
    for (const p of places) {
      const name = p.block.block.name;
      if (name === undefined || seen.has(name) || !/^[A-Za-z0-9_]+(-[A-Za-z0-9_]+)*$/.test(name) || p.block === found.block) continue;
      seen.add(name);
      const frequency = p.block.values.frequency;
      items.push({
        label: name,
        kind: CompletionItemKind.Reference,
        detail: `${p.block.circuit ?? 'block'}${p.uri === here ? '' : ` — ${ctx.reader.uriOf(p.uri).split('/').pop()}`}`,
        labelDetails: { description: frequency === undefined ? p.block.circuit : `${p.block.circuit}, ${formatHz(frequency)}` },
        textEdit: { range, newText: name } as TextEdit,
        filterText: typed ? undefined : name,
      });
    }
    return items;
  }
  if (text[start - 1] === '.') {
    let nameStart = start - 1;
    while (nameStart > entry.valueSpan.start && nameChars.test(text[nameStart - 1])) nameStart--;
    if (text[nameStart - 1] !== '@') return undefined;
    const name = text.slice(nameStart, start - 1);
    const place = everyBlock(ctx).sort((a, b) => Number(b.uri === here) - Number(a.uri === here)).find((p) => p.block.block.name === name);
    const model = place?.block.circuit ? circuitById(place.block.circuit) : undefined;
    if (!place || !model) return undefined;
    return model.results.map((result) => ({
      label: result.key,
      kind: CompletionItemKind.Field,
      detail: result.label,
      labelDetails: { description: result.label },
      textEdit: { range, newText: result.key } as TextEdit,
    }));
  }
  return undefined;
}

function formatHz(value: number): string {
  const prefixes: Array<[number, string]> = [[1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, '']];
  const [scale, prefix] = prefixes.find(([s]) => Math.abs(value) >= s) ?? [1, ''];
  return `${Number((value / scale).toPrecision(4))} ${prefix}Hz`;
}

/** A block's name (in its header or in a reference to it): the range to rename. */
function renamePlace(ctx: ServerContext, at: At): { target: BlockPlace; range: Range; text: string } | undefined {
  const header = headerAt(ctx, at);
  if (header?.block.block.nameSpan) {
    const range = rangeIn(ctx, header.uri, header.block.block.nameSpan);
    return range ? { target: header, range, text: header.block.block.name! } : undefined;
  }
  const found = referenceAt(ctx, at);
  const target = found && at.offset <= found.ref.blockSpan.end ? targetOf(ctx, at) : undefined;
  if (!found || !target) return undefined;
  return { target, range: spanToRange(at.doc, found.ref.blockSpan), text: found.ref.block };
}

const validName = /^[A-Za-z0-9_]+(-[A-Za-z0-9_]+)*$/;

export const blocks: Feature = {
  name: 'block references',
  contribute(into) {
    into.definition.push(definition);
    into.references.push(references);
    into.completion.push(completion);
    into.prepareRename.push((ctx, at) => {
      const place = renamePlace(ctx, at);
      return place ? { range: place.range, placeholder: place.text } : undefined;
    });
    into.rename.push((ctx, at, newName) => {
      const place = renamePlace(ctx, at);
      if (!place) return undefined;
      // A name `@` can reach: letters, digits, `_`, single hyphens between them.
      if (!validName.test(newName)) throw new Error(`\`${newName}\` cannot be referenced as \`@${newName}\`: use letters, digits, _ and single hyphens`);
      const changes: Record<string, TextEdit[]> = {};
      const add = (corePath: string, span: Span) => {
        const range = rangeIn(ctx, corePath, span);
        if (range) (changes[ctx.reader.uriOf(corePath)] ??= []).push({ range, newText: newName });
      };
      const own = place.target.block.block.nameSpan;
      if (own) add(place.target.uri, own);
      for (const r of referencesTo(ctx, place.target)) add(r.uri, r.span);
      return { changes };
    });
  },
};
