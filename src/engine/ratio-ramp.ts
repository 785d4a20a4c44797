// The per-sample read ratios of a propagating voice's block: the time ratio ramped across the block times the Doppler
// factor over it, clamped to the resampler's range. Its inputs and outputs live in the fields of the object it is given
// (the propagation stage): a call V8 does not inline would box every double passed or returned (docs/allocation.md).

/** Frames the Hermite basis of a new RatioRampBasis holds before it grows (the engine's default block). */
const BASIS_FRAMES = 128;

/**
 * The cubic Hermite basis at x = (i + 1)/frames, i < frames, for the last block size asked: the same for every voice
 * of a block, so it is computed once per block size instead of once per voice and sample (a division and seven
 * operations per sample). Each value is the very expression the per-sample form computed, so the ratios are the same.
 */
export class RatioRampBasis {
  /** Block size the tables hold (0: none yet). */
  frames = 0;
  /** x³ − 2x² + x (the weight of the start Doppler factor), −2x³ + 3x² (the mean's), x³ − x² (the end factor's). */
  h0 = new Float64Array(BASIS_FRAMES);
  h1 = new Float64Array(BASIS_FRAMES);
  h2 = new Float64Array(BASIS_FRAMES);

  /** Fills the tables for blocks of `frames` (grows them the first time a longer block comes: once per engine). */
  prepare(frames: number): void {
    if (frames === this.frames) return;
    if (frames > this.h0.length) {
      this.h0 = new Float64Array(frames);
      this.h1 = new Float64Array(frames);
      this.h2 = new Float64Array(frames);
    }
    const h0 = this.h0;
    const h1 = this.h1;
    const h2 = this.h2;
    for (let i = 0; i < frames; i++) {
      const x = (i + 1) / frames;
      const x2 = x * x;
      const x3 = x2 * x;
      h0[i] = x3 - 2 * x2 + x;
      h1[i] = -2 * x3 + 3 * x2;
      h2[i] = x3 - x2;
    }
    this.frames = frames;
  }
}

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
  /** The Hermite basis of the block size in use. */
  readonly basis: RatioRampBasis;
}

/**
 * Writes one voice's per-sample read ratios for a block of `frames`: the time ratio ramped linearly from r0 to r1
 * times the Doppler factor going from d0 to d1 (values at the block's start and end) with mean `mean`, clamped to
 * the resampler's range (counted in `s.ratioClamps`). The five doubles are taken from `s.ramp` (r0, r1, d0, d1, mean)
 * and their sum (source frames advanced) is left in `s.rampSum`.
 */
export function fillRatioRamp(s: RatioRampState, out: Float32Array, frames: number): void {
  const q = s.ramp;
  const d0 = q[2];
  const d1 = q[3];
  const mean = q[4];
  const lo = d0 < d1 ? d0 : d1;
  const hi = d0 < d1 ? d1 : d0;
  // The Doppler factor over the block: the derivative of the cubic Hermite U with U(0) = 0, U(1) = mean, U'(0) = d0,
  // U'(1) = d1, averaged over each sample, so that the read advances by exactly the emission-time span; linear
  // when the mean is unknown or implausible (a new track, a Mach cone).
  if (mean >= 0.5 * lo && mean <= 2 * hi) fillCubic(s, out, frames);
  else fillLinear(s, out, frames);
}

// The two forms apart, so that neither loop tests per sample which form it runs; each reads its doubles from `s.ramp`
// (a double passed to a call V8 does not inline is boxed).

/** The cubic form of `fillRatioRamp`. */
function fillCubic(s: RatioRampState, out: Float32Array, frames: number): void {
  const q = s.ramp;
  const r0 = q[0];
  const dr = (q[1] - r0) / frames;
  const d0 = q[2];
  const d1 = q[3];
  const mean = q[4];
  const basis = s.basis;
  basis.prepare(frames);
  const h0 = basis.h0;
  const h1 = basis.h1;
  const h2 = basis.h2;
  const minRatio = s.minRatio;
  const maxRatio = s.maxRatio;
  let uPrev = 0;
  let sum = 0;
  for (let i = 0; i < frames; i++) {
    const u = h0[i] * d0 + h1[i] * mean + h2[i] * d1;
    const d = (u - uPrev) * frames;
    uPrev = u;
    let r = (r0 + dr * i) * d;
    if (!(r >= minRatio)) {
      r = minRatio;
      s.ratioClamps++;
    } else if (r > maxRatio) {
      r = maxRatio;
      s.ratioClamps++;
    }
    out[i] = r;
    // The stored value (float32), without reading it back.
    sum += Math.fround(r);
  }
  s.rampSum = sum;
}

/** The linear form of `fillRatioRamp`: the Doppler factor ramps from d0 to d1. */
function fillLinear(s: RatioRampState, out: Float32Array, frames: number): void {
  const q = s.ramp;
  const r0 = q[0];
  const dr = (q[1] - r0) / frames;
  const d0 = q[2];
  const dd = (q[3] - d0) / frames;
  const minRatio = s.minRatio;
  const maxRatio = s.maxRatio;
  let sum = 0;
  for (let i = 0; i < frames; i++) {
    let r = (r0 + dr * i) * (d0 + dd * i);
    if (!(r >= minRatio)) {
      r = minRatio;
      s.ratioClamps++;
    } else if (r > maxRatio) {
      r = maxRatio;
      s.ratioClamps++;
    }
    out[i] = r;
    sum += Math.fround(r);
  }
  s.rampSum = sum;
}
