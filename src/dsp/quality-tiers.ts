// Resampler quality tiers: each names a Kaiser-windowed sinc design; the measured figures are in docs/benchmarks.md.
import type { QualityTierName } from '../tuning/tuning-types';

export type { QualityTierName };

/** Smallest playback ratio the audio path accepts (source frames per output frame); smaller ones are clamped and counted. */
export const MIN_RATIO = 1 / 65536;
/** Largest playback ratio (4 = two octaves up); larger ones are clamped on the audio path and refused by `resample`. */
export const MAX_RATIO = 4;

/**
 * Above ratio 1 the kernel's stopband edge is placed at this fraction of the output Nyquist (7/6: 28 kHz at 48 kHz), so
 * anything folded by the speed-up lands only between 20 kHz and the output Nyquist; the kernel is stretched by
 * ratio · stopbandEdge / ALIAS_STOP_FRACTION (never below 1).
 */
export const ALIAS_STOP_FRACTION = 7 / 6;

/** The quality tier names, cheapest first. */
export const qualityTiers: readonly QualityTierName[] = Object.freeze(['draft', 'standard', 'high'] as QualityTierName[]);
/** The tier used when none is named. */
export const defaultQualityTier: QualityTierName = 'standard';

/** Design of one tier's kernel; edges are fractions of the cutoff frequency's reference (input Nyquist at ratio ≤ 1, Nyquist/ratio above). */
export interface TierDesign {
  /** Stopband attenuation the Kaiser β is chosen for, in dB. */
  readonly attenuationDb: number;
  /** Passband edge as a fraction of Nyquist (0…1). */
  readonly passbandEdge: number;
  /** Stopband edge as a fraction of Nyquist (> passbandEdge). */
  readonly stopbandEdge: number;
  /** Table phases per input sample (entries per zero crossing of the unit sinc). */
  readonly phases: number;
}

/** Per-tier kernel designs (frozen). */
export const tierDesigns: Readonly<Record<QualityTierName, TierDesign>> = Object.freeze({
  draft: Object.freeze({ attenuationDb: 65, passbandEdge: 0.72, stopbandEdge: 1.05, phases: 128 }),
  standard: Object.freeze({ attenuationDb: 104, passbandEdge: 0.855, stopbandEdge: 1.05, phases: 256 }),
  high: Object.freeze({ attenuationDb: 124, passbandEdge: 0.87, stopbandEdge: 1.05, phases: 1024 }),
});

/** True when `name` is one of `qualityTiers`. */
export function isQualityTier(name: unknown): name is QualityTierName {
  return name === 'draft' || name === 'standard' || name === 'high';
}
