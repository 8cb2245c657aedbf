// Core fixes (offset edits, maybe in a header) as editor workspace edits.
import * as vscode from 'vscode';
import type { Fix } from '../core/types';
import { editorUriOf } from './documents';
import { mapperFor } from './findings';
import { spanToRange } from './ranges';

/** Undefined when a file the fix edits cannot be read (then the fix is not offered). */
export function toWorkspaceEdit(fix: Fix): vscode.WorkspaceEdit | undefined {
  const edit = new vscode.WorkspaceEdit();
  for (const change of fix.edits) {
    const mapper = mapperFor(change.uri);
    if (!mapper) return undefined;
    edit.replace(editorUriOf(change.uri), spanToRange(mapper, change.span), change.newText);
  }
  return edit;
}
