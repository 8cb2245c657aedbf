// The tickmark.* settings as the features read them; names and defaults match package.json.
import * as vscode from 'vscode';
import { parseFirmwareSettings, type DataModelSetting, type TickmarkSettings } from '../core/analyze/settings';

export type { TickmarkSettings } from '../core/analyze/settings';

const dataModels: readonly DataModelSetting[] = ['ilp32', 'lp64', 'ip16'];
const seriesNames: readonly string[] = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192', 'none'];

export function readSettings(scope?: vscode.Uri): TickmarkSettings {
  const config = vscode.workspace.getConfiguration('tickmark', scope);
  const dataModel = config.get<string>('c.dataModel', 'ilp32');
  return {
    // 0 % is allowed (package.json minimum): an exact claim.
    defaultTolerancePercent: inRangeOr(config.get<number>('check.defaultTolerance'), 0, 100, 1),
    defaultSeries: seriesNames.find((name) => name.toLowerCase() === String(config.get<string>('solve.defaultSeries', 'E24')).toLowerCase()) ?? 'E24',
    dataModel: dataModels.includes(dataModel as DataModelSetting) ? (dataModel as DataModelSetting) : 'ilp32',
    includeFolders: (config.get<unknown[]>('c.includeFolders') ?? []).filter((f): f is string => typeof f === 'string'),
    // The editor's own switch turns every code lens off; ours only Tickmark's.
    lensEnabled: config.get<boolean>('lens.enabled', true) && vscode.workspace.getConfiguration('editor', scope).get<boolean>('codeLens', true),
    maxSizeKB: positiveOr(config.get<number>('files.maxSizeKB'), 1024),
    firmware: parseFirmwareSettings((key) => (key === 'workspaceTrusted' ? vscode.workspace.isTrusted : config.get(key))),
  };
}

function inRangeOr(value: number | undefined, min: number, max: number, fallback: number): number {
  return typeof value === 'number' && Number.isFinite(value) && value >= min && value <= max ? value : fallback;
}

function positiveOr(value: number | undefined, fallback: number): number {
  return typeof value === 'number' && Number.isFinite(value) && value > 0 ? value : fallback;
}
