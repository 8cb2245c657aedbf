// The tickmark.c.* settings that say how the firmware is built, read alike by the VS Code extension and the
// language server from whatever their client hands over, and turned into the core's options in one place.
import * as path from '../paths';
import { parseMacroFlag, type MacroFlag } from '../c/config';
import type { AnalyzeOptions } from './context';

export interface FirmwareSettings {
  /** `tickmark.c.defines`: `NAME`, `NAME=VALUE`, or `-DNAME=VALUE` / `-UNAME` as on a command line. */
  defines: string[];
  /** `tickmark.c.compileCommands`: a compile_commands.json, relative to the workspace folder; '' finds it. */
  compileCommands: string;
  /** `tickmark.c.maxHeaderSizeKB`. */
  maxHeaderSizeKB: number;
  /** Whether the workspace is trusted (VS Code's workspace trust; a client without it counts as trusted). */
  trusted: boolean;
}

export type DataModelSetting = 'ilp32' | 'lp64' | 'ip16';

/** Every tickmark.* setting as the extension and the language server read it; names and defaults as in package.json. */
export interface TickmarkSettings {
  defaultTolerancePercent: number;
  defaultSeries: string;
  dataModel: DataModelSetting;
  includeFolders: string[];
  lensEnabled: boolean;
  maxSizeKB: number;
  /** tickmark.c.defines, compileCommands, maxHeaderSizeKB and workspace trust. */
  firmware: FirmwareSettings;
}

export const defaultFirmwareSettings: FirmwareSettings = { defines: [], compileCommands: '', maxHeaderSizeKB: 8192, trusted: true };

export const defaultSettings: TickmarkSettings = {
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

/**
 * Every tickmark.* setting through `pick` (a dotted key below `tickmark`, as `c.dataModel`); a value of the wrong
 * type or out of range falls back to `base`. The extension and the language server differ only in their `pick`.
 */
export function parseSettings(pick: (key: string) => unknown, base: TickmarkSettings = defaultSettings): TickmarkSettings {
  const tolerance = pick('check.defaultTolerance');
  const series = pick('solve.defaultSeries');
  const dataModel = pick('c.dataModel');
  const folders = pick('c.includeFolders');
  const lens = pick('lens.enabled');
  const size = pick('files.maxSizeKB');
  return {
    // 0 % is allowed (package.json minimum): an exact claim.
    defaultTolerancePercent: typeof tolerance === 'number' && Number.isFinite(tolerance) && tolerance >= 0 && tolerance <= 100 ? tolerance : base.defaultTolerancePercent,
    defaultSeries: seriesNames.find((name) => typeof series === 'string' && name.toLowerCase() === series.toLowerCase()) ?? base.defaultSeries,
    dataModel: dataModels.includes(dataModel as DataModelSetting) ? (dataModel as DataModelSetting) : base.dataModel,
    includeFolders: Array.isArray(folders) ? folders.filter((f): f is string => typeof f === 'string') : base.includeFolders,
    lensEnabled: typeof lens === 'boolean' ? lens : base.lensEnabled,
    maxSizeKB: typeof size === 'number' && Number.isFinite(size) && size > 0 ? size : base.maxSizeKB,
    firmware: parseFirmwareSettings(pick, base.firmware),
  };
}

/** Reads the settings through `pick` (a dotted key below `tickmark`, as `c.defines`); wrong types fall back to `base`. */
export function parseFirmwareSettings(pick: (key: string) => unknown, base: FirmwareSettings = defaultFirmwareSettings): FirmwareSettings {
  const defines = pick('c.defines');
  const database = pick('c.compileCommands');
  const header = pick('c.maxHeaderSizeKB');
  const trusted = pick('workspaceTrusted');
  return {
    defines: Array.isArray(defines) ? defines.filter((d): d is string => typeof d === 'string' && d.trim() !== '') : base.defines,
    compileCommands: typeof database === 'string' ? database.trim() : base.compileCommands,
    maxHeaderSizeKB: typeof header === 'number' && Number.isFinite(header) && header > 0 ? header : base.maxHeaderSizeKB,
    trusted: typeof trusted === 'boolean' ? trusted : base.trusted,
  };
}

/** The core's options for reading firmware; `folder` is the workspace folder relative paths start from. */
export function firmwareOptions(settings: FirmwareSettings, folder: string | undefined): Pick<AnalyzeOptions, 'macros' | 'macrosOrigin' | 'compileCommands' | 'maxHeaderBytes' | 'trusted'> {
  const macros: MacroFlag[] = [];
  for (const raw of settings.defines) {
    const text = raw.trim();
    const undef = text.startsWith('-U');
    const m = parseMacroFlag(text.replace(/^-[DU]\s*/, ''), undef ? 'undef' : 'define');
    // A malformed entry is left out; the settings editor's schema already flags it.
    if (typeof m !== 'string') macros.push(m);
  }
  const database = settings.compileCommands;
  return {
    macros,
    macrosOrigin: 'tickmark.c.defines',
    compileCommands: database ? [path.isAbsolute(database) || folder === undefined ? database : path.join(folder, database)] : [],
    maxHeaderBytes: Math.round(settings.maxHeaderSizeKB * 1024),
    trusted: settings.trusted,
  };
}
