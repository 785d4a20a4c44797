// Level and pitch unit conversions: dB = 20·log10(amplitude ratio); cents = 1200·log2(frequency ratio).
import type { Cents, Decibels } from '../units';

/** Linear gain for a level in dB (any finite dB; −Infinity → 0). */
export function dbToGain(db: Decibels): number {
  return Math.pow(10, db / 20);
}

/** Level in dB for a linear gain (> 0; 0 → −Infinity). */
export function gainToDb(gain: number): Decibels {
  return 20 * Math.log10(gain);
}

/** Frequency (playback) ratio for an interval in cents: 2^(cents/1200). */
export function centsToRatio(cents: Cents): number {
  return Math.pow(2, cents / 1200);
}

/** Interval in cents for a frequency (playback) ratio (> 0): 1200·log2(ratio). */
export function ratioToCents(ratio: number): Cents {
  return 1200 * Math.log2(ratio);
}
