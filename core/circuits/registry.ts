// The one list of circuit models. Adding a circuit: one file in this folder and one line here.
import type { CircuitModel } from './model';
import { schmittRc } from './schmitt-rc';
import { comparatorRc } from './comparator-rc';
import { ne555Astable } from './555-astable';
import { ne555Monostable } from './555-monostable';
import { inverterRc } from './inverter-rc';
import { ring } from './ring';
import { rcDelay } from './rc-delay';
import { timer } from './timer';
import { baud } from './baud';
import { crystalLoad } from './crystal-load';
import { clock } from './clock';
import { divider } from './divider';
import { pll } from './pll';
import { canBit } from './can-bit';
import { i2cRise } from './i2c-rise';
import { adcSample } from './adc-sample';
import { watchdog } from './watchdog';

export const circuits: readonly CircuitModel[] = [
  schmittRc,
  comparatorRc,
  ne555Astable,
  ne555Monostable,
  inverterRc,
  ring,
  rcDelay,
  timer,
  baud,
  crystalLoad,
  clock,
  divider,
  pll,
  canBit,
  i2cRise,
  adcSample,
  watchdog,
];

const byId = new Map(circuits.map((model) => [model.id, model]));

/** Circuit ids are matched as written in docs/blocks.md; keys are case-insensitive, so ids are too. */
export function circuitById(id: string): CircuitModel | undefined {
  return byId.get(id.trim().toLowerCase());
}
