// CAN bit timing of ISO 11898-1: segments in time quanta, the bit rate, sample point and oscillator tolerance.

/** The segments of one bit, in time quanta; prop-seg and phase-seg1 are undefined when only tseg1 is known. */
export interface BitSegments {
  prop?: number;
  phase1?: number;
  /** prop-seg + phase-seg1. */
  tseg1: number;
  phase2: number;
}

/** Nominal bit time: the sync segment (one quantum) and the three others. ISO 11898-1. */
export function nominalBitTime(s: BitSegments): number {
  return 1 + s.tseg1 + s.phase2;
}

/** Where the bit is sampled: at the end of phase-seg1. ISO 11898-1. */
export function samplePoint(s: BitSegments): number {
  return (1 + s.tseg1) / nominalBitTime(s);
}

/**
 * The largest oscillator tolerance df the timing survives, by ISO 11898-1's two conditions:
 * df ≤ sjw / (20 · NBT) (resynchronisation over ten bits) and
 * df ≤ min(phase-seg1, phase-seg2) / (2 · (13 · NBT − phase-seg2)) (sampling after a stuff error and 13 bits).
 */
export function oscillatorTolerance(s: BitSegments, sjw: number): { resync: number; sampling: number; tolerance: number } | undefined {
  if (s.phase1 === undefined) return undefined;
  const nbt = nominalBitTime(s);
  const resync = sjw / (20 * nbt);
  const sampling = Math.min(s.phase1, s.phase2) / (2 * (13 * nbt - s.phase2));
  return { resync, sampling, tolerance: Math.min(resync, sampling) };
}

/** ISO 11898-1's classic ranges (from memory): what a bare `?` searches and what gets a warning outside. */
export const classicLimits = {
  nbt: { min: 8, max: 25 },
  prop: { min: 1, max: 8 },
  phase1: { min: 1, max: 8 },
  phase2: { min: 2, max: 8 },
  /** Not ISO's own: the widest prescaler of common controllers (common practice). */
  prescaler: { min: 1, max: 1024 },
} as const;
