// The per-sample ratios of one run of the resample kernel (wasm/resample-kernel.ts, which exports these): sanitised
// from the caller's float32 ratios or computed for a linear ramp, widened to float64, with the run's extremes.
// Reads and writes the `render` parameter block (offsets in wasm/resample-kernel.ts and src/dsp/wasm/kernel-params.ts).

/** Bounds of a playback ratio (src/dsp/quality-tiers.ts MIN_RATIO, MAX_RATIO). */
const MIN_RATIO: f64 = 1.0 / 65536.0;
const MAX_RATIO: f64 = 4.0;

/**
 * Sanitises `count` raw ratios (f32 at `raw`) into the f64 ratios `render` reads (at `ratios`), as ReadCursor.sanitize
 * does one by one: a ratio in MIN_RATIO…MAX_RATIO is kept, a finite one outside becomes the nearest bound, a
 * non-finite one the last ratio kept; each of the latter two counts as a clamp. Reads and writes the last ratio
 * (offset 88), writes the run's smallest and largest ratio (96, 104); returns the clamps.
 */
export function sanitize(params: usize): i32 {
  const raw = <usize>load<i32>(params, 80);
  const count = load<i32>(params, 84);
  const ratios = <usize>load<i32>(params, 32);
  let last = load<f64>(params, 88);
  let lo = MAX_RATIO;
  let hi = MIN_RATIO;
  let clamps = 0;
  // Four at a time while all four lie in range (float32 compares against the bounds, which are float32 values, agree
  // with float64 ones; widening is exact): kept as they are, their extremes tracked in float32 lanes.
  const vMin = f32x4.splat(<f32>MIN_RATIO);
  const vMax = f32x4.splat(<f32>MAX_RATIO);
  let vLo = vMax;
  let vHi = vMin;
  let q = 0;
  while (q < count) {
    if (q + 4 <= count) {
      const v = v128.load(raw + (<usize>q << 2));
      if (i32x4.all_true(v128.and(f32x4.ge(v, vMin), f32x4.le(v, vMax)))) {
        const d = ratios + (<usize>q << 3);
        v128.store(d, f64x2.promote_low_f32x4(v));
        v128.store(d, f64x2.promote_low_f32x4(v128.shuffle<f32>(v, v, 2, 3, 2, 3)), 16);
        vLo = f32x4.pmin(vLo, v);
        vHi = f32x4.pmax(vHi, v);
        last = <f64>f32x4.extract_lane(v, 3);
        q += 4;
        continue;
      }
    }
    // One by one (a clamp among the next four, or the last three ratios).
    const end = q + 4 < count ? q + 4 : count;
    for (; q < end; q++) {
      const r = <f64>load<f32>(raw + (<usize>q << 2));
      if (r >= MIN_RATIO && r <= MAX_RATIO) last = r;
      else {
        clamps++;
        if (r - r == 0) last = r > MAX_RATIO ? MAX_RATIO : MIN_RATIO; // finite (NaN and ±Infinity keep the last)
      }
      store<f64>(ratios + (<usize>q << 3), last);
      lo = last < lo ? last : lo;
      hi = last > hi ? last : hi;
    }
  }
  const l4 = f32x4.min(vLo, v128.shuffle<f32>(vLo, vLo, 2, 3, 0, 1));
  const h4 = f32x4.max(vHi, v128.shuffle<f32>(vHi, vHi, 2, 3, 0, 1));
  const vl = <f64>f32x4.extract_lane(f32x4.min(l4, v128.shuffle<f32>(l4, l4, 1, 0, 3, 2)), 0);
  const vh = <f64>f32x4.extract_lane(f32x4.max(h4, v128.shuffle<f32>(h4, h4, 1, 0, 3, 2)), 0);
  lo = vl < lo ? vl : lo;
  hi = vh > hi ? vh : hi;
  store<f64>(params, last, 88);
  store<f64>(params, lo, 96);
  store<f64>(params, hi, 104);
  return clamps;
}

/**
 * Writes the ratios of a linear ramp, rs + dr·i/frames for samples iStart…iEnd−1 (the values `render` computes when
 * `ratios` is 0), to `ratios` as `sanitize` would, with their extremes at offsets 96 and 104: a ramp then takes the
 * per-sample path, and the stereo loop at one stride.
 */
export function ramp(params: usize): void {
  const iStart = load<i32>(params, 24);
  const iEnd = load<i32>(params, 28);
  const ratios = <usize>load<i32>(params, 32);
  const frames = load<f64>(params, 48);
  const rs = load<f64>(params, 56);
  const dr = load<f64>(params, 64);
  for (let i = iStart; i < iEnd; i++) store<f64>(ratios + (<usize>(i - iStart) << 3), dr == 0 ? rs : rs + (dr * <f64>i) / frames);
  // A ramp is monotone: its extremes are its ends.
  const a = load<f64>(ratios);
  const b = load<f64>(ratios + (<usize>(iEnd - 1 - iStart) << 3));
  store<f64>(params, a < b ? a : b, 96);
  store<f64>(params, a > b ? a : b, 104);
}
