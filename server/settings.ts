// The tickmark.* settings as the server reads them from any client: nested objects (`{ c: { dataModel } }`, as
// workspace/configuration answers) or dotted keys (`{ "c.dataModel": … }`, as people write initializationOptions).
// Names and defaults match package.json; a value of the wrong type or out of range falls back to the default.

import { defaultFirmwareSettings, parseFirmwareSettings, type DataModelSetting, type TickmarkSettings } from '../core/analyze/settings';

/** The one shape of the settings (core/analyze/settings.ts), here read from a language-server client. */
export type ServerSettings = TickmarkSettings;

export const defaultSettings: ServerSettings = {
  defaultTolerancePercent: 1,
  defaultSeries: 'E24',
  dataModel: 'ilp32',
  includeFolders: [],
  lensEnabled: true,
  maxSizeKB: 1024,
  firmware: defaultFirmwareSettings,
};

const dataModels: readonly DataModelSetting[] = ['ilp32', 'lp64', 'ip16'];
const seriesNames: readonly string[] = ['E3', 'E6', 'E12', 'E24', 'E48', 'E96', 'E192', 'none'];

/** The value at a dotted path (`c.dataModel`), nested or spelled flat. */
function pick(raw: unknown, dotted: string): unknown {
  if (raw === null || typeof raw !== 'object') return undefined;
  const record = raw as Record<string, unknown>;
  if (dotted in record) return record[dotted];
  const dot = dotted.indexOf('.');
  return dot < 0 ? undefined : pick(record[dotted.slice(0, dot)], dotted.slice(dot + 1));
}

/** Settings from the `tickmark` section; `base` fills what the section leaves out. */
export function parseSettings(raw: unknown, base: ServerSettings = defaultSettings): ServerSettings {
  const tolerance = pick(raw, 'check.defaultTolerance');
  const series = pick(raw, 'solve.defaultSeries');
  const dataModel = pick(raw, 'c.dataModel');
  const folders = pick(raw, 'c.includeFolders');
  const lens = pick(raw, 'lens.enabled');
  const size = pick(raw, 'files.maxSizeKB');
  return {
    // 0 % is allowed (package.json minimum): an exact claim.
    defaultTolerancePercent: typeof tolerance === 'number' && Number.isFinite(tolerance) && tolerance >= 0 && tolerance <= 100 ? tolerance : base.defaultTolerancePercent,
    defaultSeries: seriesNames.find((name) => typeof series === 'string' && name.toLowerCase() === series.toLowerCase()) ?? base.defaultSeries,
    dataModel: dataModels.includes(dataModel as DataModelSetting) ? (dataModel as DataModelSetting) : base.dataModel,
    includeFolders: Array.isArray(folders) ? folders.filter((f): f is string => typeof f === 'string') : base.includeFolders,
    lensEnabled: typeof lens === 'boolean' ? lens : base.lensEnabled,
    maxSizeKB: typeof size === 'number' && Number.isFinite(size) && size > 0 ? size : base.maxSizeKB,
    firmware: parseFirmwareSettings((key) => pick(raw, key), base.firmware),
  };
}
