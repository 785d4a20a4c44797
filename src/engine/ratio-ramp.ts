// The per-sample read ratios of a propagating voice's block: the time ratio ramped across the block times the Doppler
// factor over it, clamped to the resampler's range. Its inputs and outputs live in the fields of the object it is given
// (the propagation stage): a call V8 does not inline would box every double passed or returned (docs/allocation.md).

/** Where `fillRatioRamp` reads its doubles and leaves its results. */
export interface RatioRampState {
  /** Inputs: the time ratio at the block's start and end, the Doppler factor at both, and its mean. */
  readonly ramp: Float64Array;
  /** Source frames advanced by the last fill (the sum of its ratios). */
  rampSum: number;
  /** Ratios clamped to the resampler's range, counted. */
  ratioClamps: number;
  /** The resampler's ratio range, as fields (module constants merged with a computed double made V8 box the double). */
  readonly minRatio: number;
  readonly maxRatio: number;
}

/**
 * Writes one voice's per-sample read ratios for a block of `frames`: the time ratio ramped linearly from r0 to r1
 * times the Doppler factor going from d0 to d1 (values at the block's start and end) with mean `mean`, clamped to
 * the resampler's range (counted in `s.ratioClamps`). The five doubles are taken from `s.ramp` (r0, r1, d0, d1, mean)
 * and their sum (source frames advanced) is left in `s.rampSum`.
 */
export function fillRatioRamp(s: RatioRampState, out: Float32Array, frames: number): void {
  const q = s.ramp;
  const r0 = q[0];
  const r1 = q[1];
  const d0 = q[2];
  const d1 = q[3];
  const mean = q[4];
  const dr = (r1 - r0) / frames;
  const dd = (d1 - d0) / frames;
  const lo = d0 < d1 ? d0 : d1;
  const hi = d0 < d1 ? d1 : d0;
  // The Doppler factor over the block: the derivative of the cubic Hermite U with U(0) = 0, U(1) = mean, U'(0) = d0,
  // U'(1) = d1, averaged over each sample, so that the read advances by exactly the emission-time span; linear
  // when the mean is unknown or implausible (a new track, a Mach cone).
  const cubic = mean >= 0.5 * lo && mean <= 2 * hi;
  const minRatio = s.minRatio;
  const maxRatio = s.maxRatio;
  let uPrev = 0;
  let sum = 0;
  for (let i = 0; i < frames; i++) {
    let d: number;
    if (cubic) {
      const x = (i + 1) / frames;
      const x2 = x * x;
      const x3 = x2 * x;
      const u = (x3 - 2 * x2 + x) * d0 + (-2 * x3 + 3 * x2) * mean + (x3 - x2) * d1;
      d = (u - uPrev) * frames;
      uPrev = u;
    } else d = d0 + dd * i;
    let r = (r0 + dr * i) * d;
    if (!(r >= minRatio)) {
      r = minRatio;
      s.ratioClamps++;
    } else if (r > maxRatio) {
      r = maxRatio;
      s.ratioClamps++;
    }
    out[i] = r;
    sum += out[i];
  }
  s.rampSum = sum;
}
