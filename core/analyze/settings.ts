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
