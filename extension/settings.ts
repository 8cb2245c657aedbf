// The tickmark.* settings as the features read them; names and defaults match package.json.
import * as vscode from 'vscode';

export type DataModelSetting = 'ilp32' | 'lp64' | 'ip16';

export interface TickmarkSettings {
  defaultTolerancePercent: number;
  defaultSeries: string;
  dataModel: DataModelSetting;
  includeFolders: string[];
  lensEnabled: boolean;
  maxSizeKB: number;
}

const dataModels: readonly DataModelSetting[] = ['ilp32', 'lp64', 'ip16'];

export function readSettings(scope?: vscode.Uri): TickmarkSettings {
  const config = vscode.workspace.getConfiguration('tickmark', scope);
  const dataModel = config.get<string>('c.dataModel', 'ilp32');
  return {
    defaultTolerancePercent: positiveOr(config.get<number>('check.defaultTolerance'), 1),
    defaultSeries: config.get<string>('solve.defaultSeries', 'E24'),
    dataModel: dataModels.includes(dataModel as DataModelSetting) ? (dataModel as DataModelSetting) : 'ilp32',
    includeFolders: (config.get<unknown[]>('c.includeFolders') ?? []).filter((f): f is string => typeof f === 'string'),
    lensEnabled: config.get<boolean>('lens.enabled', true),
    maxSizeKB: positiveOr(config.get<number>('files.maxSizeKB'), 1024),
  };
}

function positiveOr(value: number | undefined, fallback: number): number {
  return typeof value === 'number' && Number.isFinite(value) && value > 0 ? value : fallback;
}
