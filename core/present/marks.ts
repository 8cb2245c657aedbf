// How a severity is marked and named wherever a finding is shown: lens, hover, preview, panel and CLI. Its own
// module so the editor glue can use it without loading the engine.
import type { Severity } from '../types';

/** One mark per severity, the same in every view. */
export const severityMark: Readonly<Record<Severity, string>> = { error: '⛔', warning: '⚠️', info: 'ℹ️' };
export const cautionMark = '⚠️';
/** Severities in words as SARIF names its levels (`info` is a `note`): the CLI log, the preview and code scanning agree. */
export const severityWord: Readonly<Record<Severity, string>> = { error: 'error', warning: 'warning', info: 'note' };
