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

/** The level floor of the floored conversions, dB: a gain at or below 10⁻⁶ reads as this, and this level as silence. */
export const DB_FLOOR: Decibels = -120;

/** Level in dB for a linear gain, floored: gains at or below 10⁻⁶ (−120 dB), 0 and NaN give DB_FLOOR (−120). */
export function gainToDbFloor(gain: number): Decibels {
  return gain > 1e-6 ? 20 * Math.log10(gain) : -120; // gainToDb's formula and DB_FLOOR written out: a module constant merged with a double boxes it in V8
}

/** Linear gain for a level in dB, floored: levels within 0.01 dB of DB_FLOOR (−120) or below give exactly 0. */
export function dbToGainFloor(db: Decibels): number {
  return db <= -119.99 ? 0 : Math.pow(10, db / 20); // dbToGain's formula and DB_FLOOR + 0.01 written out (as above)
}

// In-place forms for the render path: V8 boxes a double passed to or returned from a call it does not inline (a caller
// past its inlining budget), so these take the value in a Float64Array slot and write the result back (docs/allocation.md).

/** a[i] = dbToGain(a[i]), in place. */
export function dbToGainAt(a: Float64Array, i: number): void {
  a[i] = Math.pow(10, a[i] / 20);
}

/** a[i] = centsToRatio(a[i]), in place. */
export function centsToRatioAt(a: Float64Array, i: number): void {
  a[i] = Math.pow(2, a[i] / 1200);
}

/** a[to] = gainToDbFloor(a[from]) (DB_FLOOR = −120 at or below 10⁻⁶, for 0 and NaN). */
export function gainToDbFloorAt(a: Float64Array, from: number, to: number): void {
  const gain = a[from];
  if (gain > 1e-6) a[to] = 20 * Math.log10(gain);
  else a[to] = -120;
}

/** a[to] = dbToGainFloor(a[from]) (exactly 0 within 0.01 dB of DB_FLOOR or below). */
export function dbToGainFloorAt(a: Float64Array, from: number, to: number): void {
  const db = a[from];
  if (db <= -119.99) a[to] = 0;
  else a[to] = Math.pow(10, db / 20);
}

/** a[to] = ratioToCents(a[from]). */
export function ratioToCentsAt(a: Float64Array, from: number, to: number): void {
  a[to] = 1200 * Math.log2(a[from]);
}
