// Pitch error statistics in cents (1200·log2 of a frequency ratio); percentiles by linear interpolation between
// order statistics (R. J. Hyndman & Y. Fan, "Sample quantiles in statistical packages", Am. Stat. 50(4) 1996, definition 7).
import type { Cents, Hz } from '../units';
import { ratioToCents } from '../dsp';

/** Summary of |measured − expected| in cents over the frames where both are present. */
export interface PitchErrorStats {
  /** Frames compared (both values finite and > 0). */
  count: number;
  /** Frames left out because either value was missing (NaN, non-finite or ≤ 0). */
  excluded: number;
  /** Median absolute error in cents (NaN when count is 0). */
  medianCents: Cents;
  /** 95th percentile of the absolute error in cents (NaN when count is 0). */
  p95Cents: Cents;
  /** Largest absolute error in cents (NaN when count is 0). */
  maxCents: Cents;
  /** Mean signed error in cents (measured above expected is positive; NaN when count is 0). */
  meanSignedCents: Cents;
}

/** Interval from referenceHz to measuredHz in cents: 1200·log2(measured/reference); NaN if either is missing. */
export function centsBetween(referenceHz: Hz, measuredHz: Hz): Cents {
  if (!(referenceHz > 0) || !(measuredHz > 0) || !Number.isFinite(referenceHz) || !Number.isFinite(measuredHz)) return NaN;
  return ratioToCents(measuredHz / referenceHz);
}

/** p-quantile (p in 0…1) of ascending-sorted values, Hyndman–Fan definition 7; NaN for an empty list. */
export function quantileSorted(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) return NaN;
  const h = (n - 1) * Math.min(1, Math.max(0, p));
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/**
 * Error statistics of measured against expected pitch series of equal length (Hz, frame by frame); frames where
 * either is missing are excluded and counted. Throws RangeError when the lengths differ.
 */
export function pitchErrorStats(expectedHz: ArrayLike<number>, measuredHz: ArrayLike<number>): PitchErrorStats {
  if (expectedHz.length !== measuredHz.length) throw new RangeError('expected and measured series differ in length');
  const errors = new Float64Array(expectedHz.length);
  let count = 0;
  let signed = 0;
  for (let i = 0; i < expectedHz.length; i++) {
    const c = centsBetween(expectedHz[i], measuredHz[i]);
    if (Number.isNaN(c)) continue;
    errors[count++] = Math.abs(c);
    signed += c;
  }
  const used = errors.subarray(0, count).sort();
  return {
    count,
    excluded: expectedHz.length - count,
    medianCents: quantileSorted(used, 0.5),
    p95Cents: quantileSorted(used, 0.95),
    maxCents: count > 0 ? used[count - 1] : NaN,
    meanSignedCents: count > 0 ? signed / count : NaN,
  };
}
