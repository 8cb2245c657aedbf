// The tickmark.* settings as the server reads them from any client: nested objects (`{ c: { dataModel } }`, as
// workspace/configuration answers) or dotted keys (`{ "c.dataModel": … }`, as people write initializationOptions).
// Names and defaults match package.json; a value of the wrong type or out of range falls back to the default.

import { defaultSettings, parseSettings as parseWith, type TickmarkSettings } from '../core/analyze/settings';

/** The one shape of the settings (core/analyze/settings.ts), here read from a language-server client. */
export type ServerSettings = TickmarkSettings;
export { defaultSettings };

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
  return parseWith((key) => pick(raw, key), base);
}
