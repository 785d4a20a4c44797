// The per-sample read ratios of a propagating voice (src/engine/ratio-ramp.ts): the cubic's basis is tabulated once per
// block size, and the ratios must be the very numbers of the per-sample form.
import { describe, expect, it } from 'vitest';
import { RatioRampBasis, fillRatioRamp, type RatioRampState } from '../../src/engine/ratio-ramp';
import { MAX_RATIO, MIN_RATIO } from '../../src/dsp';

/**
 * Reference: the ramp written out per sample — ratio r0 + (r1 − r0)/frames · i times the Doppler factor, which is the
 * per-sample difference of the cubic Hermite U(x) = (x³ − 2x² + x)·d0 + (−2x³ + 3x²)·mean + (x³ − x²)·d1 at
 * x = (i + 1)/frames (U(0) = 0, U(1) = mean, U'(0) = d0, U'(1) = d1), times frames; linear d0 → d1 when the mean lies
 * outside [lo/2, 2·hi]; clamped to MIN_RATIO…MAX_RATIO.
 */
function reference(q: readonly number[], frames: number): { out: Float32Array; sum: number; clamps: number } {
  const [r0, r1, d0, d1, mean] = q;
  const out = new Float32Array(frames);
  const lo = Math.min(d0, d1);
  const hi = Math.max(d0, d1);
  const cubic = mean >= 0.5 * lo && mean <= 2 * hi;
  let uPrev = 0;
  let sum = 0;
  let clamps = 0;
  for (let i = 0; i < frames; i++) {
    let d: number;
    if (cubic) {
      const x = (i + 1) / frames;
      const x2 = x * x;
      const x3 = x2 * x;
      const u = (x3 - 2 * x2 + x) * d0 + (-2 * x3 + 3 * x2) * mean + (x3 - x2) * d1;
      d = (u - uPrev) * frames;
      uPrev = u;
    } else d = d0 + ((d1 - d0) / frames) * i;
    let r = (r0 + ((r1 - r0) / frames) * i) * d;
    if (!(r >= MIN_RATIO)) {
      r = MIN_RATIO;
      clamps++;
    } else if (r > MAX_RATIO) {
      r = MAX_RATIO;
      clamps++;
    }
    out[i] = r;
    sum += out[i];
  }
  return { out, sum, clamps };
}

describe('fillRatioRamp', () => {
  it('gives the per-sample form bit for bit across block sizes, cubic and linear, with clamps', () => {
    const s: RatioRampState = { ramp: new Float64Array(5), rampSum: 0, ratioClamps: 0, minRatio: MIN_RATIO, maxRatio: MAX_RATIO, basis: new RatioRampBasis() };
    const cases: number[][] = [
      [0.8, 0.79, 1.01, 1.02, 1.015], // cubic, gliding
      [1, 1, 0.9, 1.1, 0.95], // cubic, Doppler rising
      [0.7, 0.72, 1.2, 0.8, NaN], // linear: mean unknown
      [0.7, 0.72, 1.2, 0.8, 5], // linear: mean implausible
      [3.9, 4.2, 1, 1.1, 1.05], // clamps at MAX_RATIO
      [1e-6, 1e-6, 1, 1, 1], // clamps at MIN_RATIO
    ];
    // 128 (the default block), then shorter, longer (the tables grow), odd and 1 frame.
    for (const frames of [128, 100, 128, 300, 37, 1]) {
      for (const q of cases) {
        s.ramp.set(q);
        s.ratioClamps = 0;
        const out = new Float32Array(frames);
        fillRatioRamp(s, out, frames);
        const want = reference(q, frames);
        expect(Array.from(out)).toEqual(Array.from(want.out));
        expect(s.rampSum).toBe(want.sum);
        expect(s.ratioClamps).toBe(want.clamps);
      }
    }
  });
});
