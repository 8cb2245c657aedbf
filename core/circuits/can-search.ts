// Search of CAN bit timing: the exact bit rate first, then the sample point nearest the wanted one.
// The segments are few (8 × 8 × 7 combinations in the classic ranges); for each, the prescaler that gives the bit
// rate is found directly as the allowed value nearest clock / (bitrate · NBT).
import type { IntegerSet, RegisterSearchFailure, RegisterSearchResult } from './model';
import { nearestMembers, normaliseSet, setSize } from './integer-set';
import { classicLimits, nominalBitTime, oscillatorTolerance, samplePoint, type BitSegments } from './can-timing';

export interface CanSearchQuery {
  clock: number;
  bitrate: number;
  /** Wanted sample point, a fraction. */
  samplePoint: number;
  sjw: number;
  /** Allowed values per key: a one-member set for a key that is given; absent for a key not used. */
  sets: Partial<Record<'prescaler' | 'prop-seg' | 'phase-seg1' | 'phase-seg2' | 'tseg1', IntegerSet>>;
  /** Keep 8–25 quanta per bit (a bare `?`); false once a `? a..b` says otherwise. */
  classicBitTime: boolean;
}

const exactTolerance = 1e-12;
const range = (r: { min: number; max: number }): IntegerSet => ({ kind: 'range', min: r.min, max: r.max });

/** A bare `?` per key: ISO 11898-1's classic ranges; tseg1 spans prop-seg + phase-seg1. */
export const canDefaultSets: Readonly<Record<string, IntegerSet>> = {
  prescaler: range(classicLimits.prescaler),
  'prop-seg': range(classicLimits.prop),
  'phase-seg1': range(classicLimits.phase1),
  'phase-seg2': range(classicLimits.phase2),
  tseg1: range({ min: classicLimits.prop.min + classicLimits.phase1.min, max: classicLimits.prop.max + classicLimits.phase1.max }),
};

function members(set: IntegerSet): number[] {
  const n = normaliseSet(set);
  if (n.kind === 'list') return n.values;
  const out: number[] = [];
  for (let v = n.min; v <= n.max && out.length < 4096; v++) out.push(v);
  return out;
}

interface Candidate {
  segments: BitSegments;
  prescaler: number;
  error: number;
  spDistance: number;
  tolerance: number;
}

/** Better first: exact (or nearer) bit rate, sample point nearer, more tolerance, more quanta, longer prop-seg. */
function better(a: Candidate, b: Candidate): boolean {
  const ea = Math.abs(a.error) < exactTolerance ? 0 : Math.abs(a.error);
  const eb = Math.abs(b.error) < exactTolerance ? 0 : Math.abs(b.error);
  if (Math.abs(ea - eb) > 1e-15) return ea < eb;
  if (Math.abs(a.spDistance - b.spDistance) > 1e-12) return a.spDistance < b.spDistance;
  if (Math.abs(a.tolerance - b.tolerance) > 1e-15) return a.tolerance > b.tolerance;
  const na = nominalBitTime(a.segments);
  const nb = nominalBitTime(b.segments);
  if (na !== nb) return na > nb;
  return (a.segments.prop ?? 0) > (b.segments.prop ?? 0);
}

export function searchCanTiming(query: CanSearchQuery): RegisterSearchResult | RegisterSearchFailure {
  const { clock, bitrate, sjw } = query;
  if (!(clock > 0) || !(bitrate > 0)) return { error: 'the search needs a positive `clock` and target bit rate' };
  const sets = query.sets;
  if (Object.values(sets).some((s) => s && setSize(normaliseSet(s)) === 0)) return { error: 'a `?` allows no value' };
  const prescalers = normaliseSet(sets.prescaler!);
  const phase2s = members(sets['phase-seg2']!);
  // Either tseg1 as one number, or prop-seg and phase-seg1 apart.
  const splits: Array<{ prop?: number; phase1?: number; tseg1: number }> = [];
  if (sets.tseg1) {
    for (const tseg1 of members(sets.tseg1)) {
      const prop = sets['prop-seg'] ? members(sets['prop-seg'])[0] : undefined;
      const phase1 = sets['phase-seg1'] ? members(sets['phase-seg1'])[0] : prop !== undefined ? tseg1 - prop : undefined;
      if (phase1 !== undefined && phase1 < 1) continue;
      splits.push({ prop: prop ?? (phase1 !== undefined ? tseg1 - phase1 : undefined), phase1, tseg1 });
    }
  } else {
    for (const prop of members(sets['prop-seg']!)) for (const phase1 of members(sets['phase-seg1']!)) splits.push({ prop, phase1, tseg1: prop + phase1 });
  }

  let best: Candidate | undefined;
  for (const split of splits) {
    for (const phase2 of phase2s) {
      const segments: BitSegments = { ...split, phase2 };
      const nbt = nominalBitTime(segments);
      if (query.classicBitTime && (nbt < classicLimits.nbt.min || nbt > classicLimits.nbt.max)) continue;
      for (const prescaler of nearestMembers(prescalers, clock / (bitrate * nbt))) {
        const error = clock / (prescaler * nbt) / bitrate - 1;
        const tolerance = oscillatorTolerance(segments, sjw)?.tolerance ?? 0;
        const candidate = { segments, prescaler, error, spDistance: Math.abs(samplePoint(segments) - query.samplePoint), tolerance };
        if (!best || better(candidate, best)) best = candidate;
      }
    }
  }
  if (!best) return { error: 'no prescaler and segments fit the allowed values and 8–25 time quanta per bit' };
  const s = best.segments;
  const values: Record<string, number> = { prescaler: best.prescaler, 'phase-seg2': s.phase2, tseg1: s.tseg1 };
  if (s.prop !== undefined) values['prop-seg'] = s.prop;
  if (s.phase1 !== undefined) values['phase-seg1'] = s.phase1;
  return { values, error: Math.abs(best.error) < exactTolerance ? 0 : best.error };
}
