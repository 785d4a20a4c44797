// The tone stage's low-pass of a stereo voice in module memory (wasm/resample-kernel.ts exports it): the cookbook
// biquad of src/dsp/biquad-lowpass.ts with the two channels in the two f64 lanes of one f64x2, the same operations
// per lane in the same order (so the same samples), one recurrence instead of two run one after the other; a whole
// block in one call, with its own coefficients per sub-block; optionally mixed into the bus as it goes (the gain-ramp
// mix of wasm/mix.ts, whose arithmetic then runs while the recurrence waits on its latency).

// Parameter block at `params` (bytes): 0 i32 x0 · 4 i32 x1 · 8 i32 frames · 12 i32 frames per sub-block · 16 state
// as f64 pairs (left, right): x[n−1] · 32 x[n−2] · 48 y[n−1] · 64 y[n−2] (read and written back) · 80 coefficients
// b0, b1, b2, a1, a2 (f64) of sub-block 0, then 40 bytes per further sub-block.

/** Outputs this close to zero are flushed to +0, as the TypeScript filter does (no denormals in the feedback). */
const TINY: f64 = 1e-25;

/**
 * Filters `frames` samples of the float32 channels at x0 and x1 in place: per lane y = b0·x + b1·x1 + b2·x2 − a1·y1 −
 * a2·y2 in float64 with the coefficients of the sample's sub-block, flushed to +0 when −1e-25 < y < 1e-25, stored
 * rounded to float32; the state continues from and is left in the block.
 */
export function lowpass(params: usize): void {
  run(params, 0, false);
}

/**
 * `lowpass` over a whole block, then as `mix` (its parameter block at `mixParams`, wasm/mix.ts) adds each filtered
 * sample into the bus with the gain ramp: mixL[i] += y0[i]·(gl0 + dgl·(i + 1)), the same for the right, in f64 rounded
 * once to f32. Returns 1 when every filtered sample is finite, 0 otherwise (as `mix`).
 */
export function lowpassMix(params: usize, mixParams: usize): i32 {
  return run(params, mixParams, true);
}

// @ts-ignore: decorator
@inline
function run(params: usize, mixParams: usize, mixing: bool): i32 {
  const x0 = <usize>load<i32>(params, 0);
  const x1 = <usize>load<i32>(params, 4);
  const frames = load<i32>(params, 8);
  const sub = load<i32>(params, 12);
  const tiny = f64x2.splat(TINY);
  let xp1 = v128.load(params, 16);
  let xp2 = v128.load(params, 32);
  let yp1 = v128.load(params, 48);
  let yp2 = v128.load(params, 64);
  let coef = params + 80;
  // The mix: bus addresses and the gains before sample 0 and per sample, as (left, right) lanes.
  const mixL = mixing ? <usize>load<i32>(mixParams, 8) : 0;
  const mixR = mixing ? <usize>load<i32>(mixParams, 12) : 0;
  const g0 = mixing ? f64x2.replace_lane(f64x2.splat(load<f64>(mixParams, 24)), 1, load<f64>(mixParams, 40)) : f64x2.splat(0);
  const dg = mixing ? f64x2.replace_lane(f64x2.splat(load<f64>(mixParams, 32)), 1, load<f64>(mixParams, 48)) : f64x2.splat(0);
  let check = f64x2.splat(0);
  for (let start = 0; start < frames; start += sub) {
    const end = frames - start < sub ? frames : start + sub;
    const b0 = f64x2.splat(load<f64>(coef, 0));
    const b1 = f64x2.splat(load<f64>(coef, 8));
    const b2 = f64x2.splat(load<f64>(coef, 16));
    const a1 = f64x2.splat(load<f64>(coef, 24));
    const a2 = f64x2.splat(load<f64>(coef, 32));
    coef += 40;
    for (let i = start; i < end; i++) {
      const io = <usize>i << 2;
      const x = f64x2.replace_lane(f64x2.splat(<f64>load<f32>(x0 + io)), 1, <f64>load<f32>(x1 + io));
      let y = f64x2.sub(f64x2.sub(f64x2.add(f64x2.add(f64x2.mul(b0, x), f64x2.mul(b1, xp1)), f64x2.mul(b2, xp2)), f64x2.mul(a1, yp1)), f64x2.mul(a2, yp2));
      // A branch, not a select: almost never taken, so the recurrence does not wait for the test.
      const small = f64x2.lt(f64x2.abs(y), tiny);
      if (v128.any_true(small)) y = v128.andnot(y, small);
      const f = f32x4.demote_f64x2_zero(y);
      store<f32>(x0 + io, f32x4.extract_lane(f, 0));
      store<f32>(x1 + io, f32x4.extract_lane(f, 1));
      if (mixing) {
        const w = f64x2.promote_low_f32x4(f);
        const g = f64x2.add(g0, f64x2.mul(dg, f64x2.splat(<f64>(i + 1))));
        const bus = f64x2.replace_lane(f64x2.splat(<f64>load<f32>(mixL + io)), 1, <f64>load<f32>(mixR + io));
        const m = f32x4.demote_f64x2_zero(f64x2.add(bus, f64x2.mul(w, g)));
        store<f32>(mixL + io, f32x4.extract_lane(m, 0));
        store<f32>(mixR + io, f32x4.extract_lane(m, 1));
        check = f64x2.add(check, w);
      }
      xp2 = xp1;
      xp1 = x;
      yp2 = yp1;
      yp1 = y;
    }
  }
  v128.store(params, xp1, 16);
  v128.store(params, xp2, 32);
  v128.store(params, yp1, 48);
  v128.store(params, yp2, 64);
  const c = f64x2.extract_lane(check, 0) + f64x2.extract_lane(check, 1);
  return c - c == 0 ? 1 : 0;
}
