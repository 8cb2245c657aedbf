// A document's blocks made ready for analysis: each with its line, its firmware source (the C file itself or
// the note's `firmware:`) and the findings that belong to it before its values are read. Shared by the one-document
// pass (index.ts) and the workspace pass (workspace.ts), which analyse the blocks in different orders.
import type { BlockAnalysis, DocumentAnalysis, Finding, RawBlock, TextDocumentLike } from '../types';
import { Code } from '../codes';
import { hostOf, scanDocument } from '../scan';
import { LineCounter } from '../scan/lines';
import type { BlockContext } from './context';
import type { AnalyzeOptions, IdentifierSource } from './context';
import { cFileSource, fromFileSource, noIdentifiers } from './sources';
import { firmwareEntry } from './keys';
import { unresolvedReferences } from './references';
import { emptyList } from '../empty';

export interface PreparedBlock {
  raw: RawBlock;
  context: BlockContext;
  /** Findings on the block found before analysis (a `from:` that cannot be read); one shared empty list when none. */
  extra: readonly Finding[];
}

export interface PreparedDocument {
  uri: string;
  blocks: PreparedBlock[];
  /** The document's analysis from its blocks' analyses, in document order. */
  finish(analyses: BlockAnalysis[]): DocumentAnalysis;
}

/** The findings of a block without any found before analysis: shared, never added to. */
const noExtra: readonly Finding[] = emptyList;

/** The one notice for a file above the size setting; the CLI uses it too, before reading such a file. */
export function tooLargeAnalysis(uri: string, options: Pick<AnalyzeOptions, 'maxFileBytes'>): DocumentAnalysis {
  return {
    uri,
    blocks: [],
    dependencies: [],
    findings: [{
      // A warning, not a note: a check that silently skipped a file must not pass in CI.
      severity: 'warning',
      code: Code.fileTooLarge,
      message: `file is larger than the size limit of ${Math.round(options.maxFileBytes / 1024)} KB (setting tickmark.files.maxSizeKB, CLI --max-size-kb); its timing blocks are not read`,
      span: { start: 0, end: 0 },
    }],
  };
}

export function prepareDocument(doc: TextDocumentLike, options: AnalyzeOptions): PreparedDocument {
  const blocks = scanDocument(doc);
  if (blocks.length === 0) return { uri: doc.uri, blocks: [], finish: () => ({ uri: doc.uri, blocks: [], findings: [], dependencies: [] }) };
  const lines = new LineCounter(doc.text);
  const isC = hostOf(doc) === 'c';
  const own = isC ? cFileSource(doc.uri, doc.text, options) : undefined;
  const fromSources = new Map<string, { source?: IdentifierSource; problem?: string }>();
  const used = new Set<IdentifierSource>();
  const prepared: PreparedBlock[] = [];

  for (let b = 0; b < blocks.length; b++) {
    const raw = blocks[b];
    let source: IdentifierSource = own ?? noIdentifiers;
    let extra = noExtra;
    const firmware = firmwareEntry(raw.entries);
    if (firmware) {
      const found: Finding[] = [];
      extra = found;
      if (isC) found.push({ severity: 'warning', code: Code.firmwareInC, message: `\`${firmware.key}:\` names a note's firmware file; a block in C reads the constants of its own file and its includes`, span: firmware.keySpan });
      else {
        if (firmware.key === 'from') found.push({ severity: 'info', code: Code.keyRenamed, message: '`from:` for a firmware file is now `firmware:` (`from:` is rc-delay\'s start voltage); it is still read', span: firmware.keySpan, fixes: [{ title: 'Rename `from:` to `firmware:`', edits: [{ uri: doc.uri, span: firmware.keySpan, newText: 'firmware' }] }] });
        const spelled = firmware.valueText.trim();
        let entry = fromSources.get(spelled);
        if (!entry) fromSources.set(spelled, (entry = fromFileSource(doc.uri, spelled, options)));
        if (entry.source) source = entry.source;
        else found.push({ severity: 'error', code: Code.cInclude, message: entry.problem ?? `cannot read \`${spelled}\``, span: firmware.valueSpan });
      }
    }
    used.add(source);
    // Ready for the workspace pass as it stands when the block names no other and none reads it.
    prepared.push({ raw, context: { uri: doc.uri, line: lines.lineOf(raw.headerSpan.start) + 1, options, source, references: unresolvedReferences, computed: undefined }, extra });
  }

  const finish = (analyses: BlockAnalysis[]): DocumentAnalysis => {
    const analysis: DocumentAnalysis = { uri: doc.uri, blocks: [], findings: [], dependencies: [] };
    for (let i = 0; i < analyses.length; i++) {
      const extra = prepared[i].extra;
      if (extra.length) analyses[i].findings.unshift(...extra);
      analysis.blocks.push(analyses[i]);
    }
    const dependencies = new Set<string>();
    for (const source of used) {
      for (const file of source.dependencies()) if (file !== doc.uri) dependencies.add(file);
      for (const finding of source.findings()) {
        // Problems inside a header are reported where the header is included from, once.
        if (source === own) analysis.findings.push({ ...finding, uri: finding.uri === doc.uri ? undefined : finding.uri });
      }
    }
    analysis.dependencies = [...dependencies];
    return analysis;
  };
  return { uri: doc.uri, blocks: prepared, finish };
}
