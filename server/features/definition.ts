// Go to definition from a firmware name in a block's value to where the firmware defines it (`#define`,
// enum constant, const variable), as the analysis resolved it.
import type { Location } from 'vscode-languageserver';
import type { At, Feature, ServerContext } from '../context';

const identifierChars = /[A-Za-z0-9_]/;

/** The C identifier under the offset, inside one of the block's values. */
function identifierAt(text: string, offset: number): string | undefined {
  let start = offset;
  while (start > 0 && identifierChars.test(text[start - 1])) start--;
  let end = offset;
  while (end < text.length && identifierChars.test(text[end])) end++;
  const word = text.slice(start, end);
  return /^[A-Za-z_]\w*$/.test(word) ? word : undefined;
}

function firmwareDefinition(ctx: ServerContext, at: At): Location[] | undefined {
  const found = ctx.store.blockAt(at.uri, at.offset);
  if (!found) return undefined;
  const entry = found.block.block.entries.find((e) => at.offset >= e.valueSpan.start && at.offset <= e.valueSpan.end);
  if (!entry) return undefined;
  const name = identifierAt(found.entry.doc.getText(), at.offset);
  const identifier = name && found.block.identifiers.find((id) => id.name === name);
  if (!identifier) return undefined;
  const mapper = ctx.reader.mapperOf(identifier.uri);
  if (!mapper) return undefined;
  // The analysis knows the 1-based line; the name is found on it (the first whole-word match).
  const lineStart = mapper.offsetAt({ line: identifier.line - 1, character: 0 });
  const lineText = mapper.getText({ start: { line: identifier.line - 1, character: 0 }, end: { line: identifier.line, character: 0 } });
  const match = new RegExp(`(^|[^A-Za-z0-9_])(${name})(?![A-Za-z0-9_])`).exec(lineText);
  const column = match ? match.index + match[1].length : 0;
  const start = mapper.positionAt(lineStart + column);
  const end = mapper.positionAt(lineStart + column + (match ? name.length : 0));
  return [{ uri: ctx.reader.uriOf(identifier.uri), range: { start, end } }];
}

export const definition: Feature = {
  name: 'go to definition',
  capabilities: { definitionProvider: true },
  contribute(into) {
    into.definition.push(firmwareDefinition);
  },
};
