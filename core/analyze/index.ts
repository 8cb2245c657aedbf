// The one entry point the CLI and the editor share: a document's text in, every block's analysis out.
import type { DocumentAnalysis, Finding, TextDocumentLike } from '../types';
import { Code } from '../codes';
import { isTooLarge } from '../size';
import { hostOf, scanDocument } from '../scan';
import { LineCounter } from '../scan/lines';
import { analyzeBlock } from './block';
import { noIdentifiers, type AnalyzeOptions, type IdentifierSource } from './context';
import { cFileSource, fromFileSource } from './sources';
import { firmwareEntry } from './keys';
import { AnalysisCache, type CacheStats } from './cache';

export { analyzeBlock } from './block';
export * from './context';
export { AnalysisCache, type CacheStats } from './cache';

/** One document's analyser, kept while the document is open: an edit re-analyses only the blocks it touched. */
export class Analyzer {
  private readonly cache = new AnalysisCache();
  analyze(doc: TextDocumentLike, options: AnalyzeOptions): DocumentAnalysis {
    return analyzeDocument(doc, options, this.cache);
  }
  /** Blocks in the last pass, and how many of them were analysed afresh. */
  get stats(): CacheStats {
    return { ...this.cache.stats };
  }
}

export function analyzeDocument(doc: TextDocumentLike, options: AnalyzeOptions, cache?: AnalysisCache): DocumentAnalysis {
  cache?.begin(options);
  try {
    return analyzeAll(doc, options, cache);
  } finally {
    cache?.end();
  }
}

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

function analyzeAll(doc: TextDocumentLike, options: AnalyzeOptions, cache: AnalysisCache | undefined): DocumentAnalysis {
  const analysis: DocumentAnalysis = { uri: doc.uri, blocks: [], findings: [], dependencies: [] };
  if (isTooLarge(doc.text, options.maxFileBytes)) return tooLargeAnalysis(doc.uri, options);
  const blocks = scanDocument(doc);
  if (blocks.length === 0) return analysis;
  const lines = new LineCounter(doc.text);
  const isC = hostOf(doc) === 'c';
  const own = isC ? cFileSource(doc.uri, doc.text, options) : undefined;
  const fromSources = new Map<string, { source?: IdentifierSource; problem?: string }>();
  const used = new Set<IdentifierSource>();

  for (const raw of blocks) {
    let source: IdentifierSource = own ?? noIdentifiers;
    const extra: Finding[] = [];
    const firmware = firmwareEntry(raw.entries);
    if (firmware) {
      if (isC) extra.push({ severity: 'warning', code: Code.firmwareInC, message: `\`${firmware.key}:\` names a note's firmware file; a block in C reads the constants of its own file and its includes`, span: firmware.keySpan });
      else {
        if (firmware.key === 'from') extra.push({ severity: 'info', code: Code.keyRenamed, message: '`from:` for a firmware file is now `firmware:` (`from:` is rc-delay\'s start voltage); it is still read', span: firmware.keySpan, fixes: [{ title: 'Rename `from:` to `firmware:`', edits: [{ uri: doc.uri, span: firmware.keySpan, newText: 'firmware' }] }] });
        const spelled = firmware.valueText.trim();
        let entry = fromSources.get(spelled);
        if (!entry) fromSources.set(spelled, (entry = fromFileSource(doc.uri, spelled, options)));
        if (entry.source) source = entry.source;
        else extra.push({ severity: 'error', code: Code.cInclude, message: entry.problem ?? `cannot read \`${spelled}\``, span: firmware.valueSpan });
      }
    }
    used.add(source);
    const context = { uri: doc.uri, line: lines.lineOf(raw.headerSpan.start) + 1, options, source };
    const result = cache ? cache.analyzeBlock(raw, context) : analyzeBlock(raw, context);
    result.findings.unshift(...extra);
    analysis.blocks.push(result);
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
}

export { isTooLarge } from '../size';
