// The tone stage's low-pass of a stereo voice in module memory (wasm/resample-kernel.ts exports it): the cookbook
// biquad of src/dsp/biquad-lowpass.ts with the two channels in the two f64 lanes of one f64x2, the same operations
// per lane in the same order (so the same samples), one recurrence instead of two run one after the other.

// Parameter block at `params` (bytes): 0 i32 x0 · 4 i32 x1 · 8 i32 frames · 16 f64 b0 · 24 b1 · 32 b2 · 40 a1 ·
// 48 a2 · 56 state as f64 pairs (left, right): x[n−1] · 72 x[n−2] · 88 y[n−1] · 104 y[n−2] (read and written back).

/** Outputs this close to zero are flushed to +0, as the TypeScript filter does (no denormals in the feedback). */
const TINY: f64 = 1e-25;

/**
 * Filters `frames` samples of the float32 channels at x0 and x1 in place: per lane y = b0·x + b1·x1 + b2·x2 − a1·y1 −
 * a2·y2 in float64, flushed to +0 when −1e-25 < y < 1e-25, stored rounded to float32; the state continues from and
 * is left in the block.
 */
export function lowpass(params: usize): void {
  const x0 = <usize>load<i32>(params, 0);
  const x1 = <usize>load<i32>(params, 4);
  const frames = load<i32>(params, 8);
  const b0 = f64x2.splat(load<f64>(params, 16));
  const b1 = f64x2.splat(load<f64>(params, 24));
  const b2 = f64x2.splat(load<f64>(params, 32));
  const a1 = f64x2.splat(load<f64>(params, 40));
  const a2 = f64x2.splat(load<f64>(params, 48));
  const tiny = f64x2.splat(TINY);
  let xp1 = v128.load(params, 56);
  let xp2 = v128.load(params, 72);
  let yp1 = v128.load(params, 88);
  let yp2 = v128.load(params, 104);
  for (let i = 0; i < frames; i++) {
    const io = <usize>i << 2;
    const x = f64x2.replace_lane(f64x2.splat(<f64>load<f32>(x0 + io)), 1, <f64>load<f32>(x1 + io));
    let y = f64x2.sub(f64x2.sub(f64x2.add(f64x2.add(f64x2.mul(b0, x), f64x2.mul(b1, xp1)), f64x2.mul(b2, xp2)), f64x2.mul(a1, yp1)), f64x2.mul(a2, yp2));
    // A branch, not a select: almost never taken, so the recurrence does not wait for the test.
    const small = f64x2.lt(f64x2.abs(y), tiny);
    if (v128.any_true(small)) y = v128.andnot(y, small);
    const f = f32x4.demote_f64x2_zero(y);
    store<f32>(x0 + io, f32x4.extract_lane(f, 0));
    store<f32>(x1 + io, f32x4.extract_lane(f, 1));
    xp2 = xp1;
    xp1 = x;
    yp2 = yp1;
    yp1 = y;
  }
  v128.store(params, xp1, 56);
  v128.store(params, xp2, 72);
  v128.store(params, yp1, 88);
  v128.store(params, yp2, 104);
}
