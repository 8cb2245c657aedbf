// The tickmark.* settings as the features read them; names and defaults match package.json.
import * as vscode from 'vscode';
import { parseSettings, type TickmarkSettings } from '../core/analyze/settings';

export type { TickmarkSettings } from '../core/analyze/settings';

export function readSettings(scope?: vscode.Uri): TickmarkSettings {
  const config = vscode.workspace.getConfiguration('tickmark', scope);
  const settings = parseSettings((key) => (key === 'workspaceTrusted' ? vscode.workspace.isTrusted : config.get(key)));
  // The editor's own switch turns every code lens off; ours only Tickmark's.
  return { ...settings, lensEnabled: settings.lensEnabled && vscode.workspace.getConfiguration('editor', scope).get<boolean>('codeLens', true) };
}
