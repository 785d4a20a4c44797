// Resampler quality tiers: each names a Kaiser-windowed sinc design; the measured figures are in docs/benchmarks.md.
import type { QualityTierName } from '../tuning';

export type { QualityTierName };

/** Smallest playback ratio the audio path accepts (source frames per output frame); smaller ones are clamped and counted. */
export const MIN_RATIO = 1 / 65536;
/** Largest playback ratio (4 = two octaves up); larger ones are clamped on the audio path and refused by `resample`. */
export const MAX_RATIO = 4;

/** Top of the audible band, Hz: nothing may fold below min(this, Nyquist). */
export const AUDIBLE_TOP_HZ = 20000;

/**
 * Where the stretched (ratio > 1) kernel's stopband edge may sit, as a fraction of the output Nyquist, so that anything
 * folded by the speed-up lands above the audible band: a component at f > Nyquist folds to fs − f, which stays above
 * min(20 kHz, Nyquist) while f ≤ fs − min(20 kHz, Nyquist). 7/6 at 48 kHz (28 kHz), 1.093 at 44.1 kHz, 1 at 40 kHz and below.
 */
export function aliasStopFraction(sampleRate: number): number {
  const nyquist = sampleRate / 2;
  return 2 - Math.min(1, AUDIBLE_TOP_HZ / nyquist);
}

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
  /** Geometric step between the kernel widths used above ratio 1 (default STRETCH_GRID_STEP, 1.05; finer costs WebAssembly memory). */
  readonly gridStep?: number;
}

/** Per-tier kernel designs (frozen). */
export const tierDesigns: Readonly<Record<QualityTierName, TierDesign>> = Object.freeze({
  draft: Object.freeze({ attenuationDb: 65, passbandEdge: 0.72, stopbandEdge: 1.05, phases: 128 }),
  standard: Object.freeze({ attenuationDb: 104, passbandEdge: 0.855, stopbandEdge: 1.05, phases: 256 }),
  high: Object.freeze({ attenuationDb: 124, passbandEdge: 0.87, stopbandEdge: 1.05, phases: 1024 }),
});

/**
 * Where the stopband must end at or below Nyquist (output rates under ~42 kHz, where the audible band reaches Nyquist),
 * each tier's passband edge, phases and stretch-grid step: chosen so that the 0.5 dB point stays above 0.9 of Nyquist
 * even where the stretch grid widens the kernel by up to one step (standard and high); the draft tier (no passband
 * figure) trades some width for fewer taps (42 rather than 26).
 */
export const narrowDesigns: Readonly<Record<QualityTierName, { readonly passbandEdge: number; readonly phases: number; readonly gridStep: number }>> = Object.freeze({
  draft: Object.freeze({ passbandEdge: 0.8, phases: 128, gridStep: 1.05 }),
  standard: Object.freeze({ passbandEdge: 0.925, phases: 256, gridStep: 1.03 }),
  high: Object.freeze({ passbandEdge: 0.93, phases: 1024, gridStep: 1.05 }),
});

/** A tier's kernel design at an output rate, and the stopband limit of its stretched (ratio > 1) form. */
export interface RateDesign {
  /** The kernel design (edges as fractions of Nyquist). */
  readonly design: TierDesign;
  /** The stretched kernel's stopband edge may not exceed this fraction of the output Nyquist (`aliasStopFraction`). */
  readonly aliasStop: number;
}

/**
 * The design of `tier` for output rate `sampleRate` (Hz, 8000…192000): the tier's own design where its stopband edge
 * already ends below fs − min(20 kHz, Nyquist) (42.1 kHz and up: the 48 kHz tables), else the stopband edge moved down
 * to that limit with the passband edge, phases and grid step of `narrowDesigns`, so that nothing folds or images into the audible band.
 */
export function tierDesignAt(tier: QualityTierName, sampleRate: number): RateDesign {
  const base = tierDesigns[tier];
  const aliasStop = aliasStopFraction(sampleRate);
  if (base.stopbandEdge <= aliasStop) return { design: base, aliasStop };
  return { design: { ...base, ...narrowDesigns[tier], stopbandEdge: aliasStop }, aliasStop };
}

/** True when `name` is one of `qualityTiers`. */
export function isQualityTier(name: unknown): name is QualityTierName {
  return name === 'draft' || name === 'standard' || name === 'high';
}
