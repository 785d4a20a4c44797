// Per-play variation: a uniform draw in [low, high] (cents or dB) from the engine's seeded generator, so that the
// same seed and the same plays give the same samples in both hosts (mulberry32 via src/random; common practice).

/** Largest pitch variation each way, cents. */
export const MAX_PITCH_VARIATION_CENTS = 2400;
/** Gain variation bounds, dB. */
export const MIN_GAIN_VARIATION_DB = -60;
export const MAX_GAIN_VARIATION_DB = 24;

/**
 * An offset drawn uniformly in [range[0], range[1]] (clamped to min…max) with `random`; 0 without a range (no draw).
 * Non-finite bounds give 0 and still draw once, so that later plays stay in step.
 */
export function drawVariation(random: () => number, range: readonly [number, number] | undefined, min: number, max: number): number {
  if (range === undefined || range === null) return 0;
  const u = random();
  let lo = range[0];
  let hi = range[1];
  if (!Number.isFinite(lo) || !Number.isFinite(hi)) return 0;
  if (hi < lo) [lo, hi] = [hi, lo];
  lo = lo < min ? min : lo > max ? max : lo;
  hi = hi < min ? min : hi > max ? max : hi;
  return lo + (hi - lo) * u;
}
