// The gain-ramp mix of one voice into the mix bus (wasm/resample-kernel.ts exports it), in module memory.

// Parameter block of `mix` at `params` (bytes): 0 i32 x0 · 4 i32 x1 · 8 i32 mixL · 12 i32 mixR · 16 i32 frames ·
// 24 f64 gl0 · 32 f64 dgl · 40 f64 gr0 · 48 f64 dgr.

/**
 * Gain-ramp mix of one voice: mixL[i] += x0[i]·(gl0 + dgl·(i + 1)), mixR[i] += x1[i]·(gr0 + dgr·(i + 1)), i < frames,
 * in f64 lanes (f64x2) rounded once to f32, the same operations as the TypeScript mix. Returns 1 when every input
 * sample is finite, 0 otherwise.
 */
export function mix(params: usize): i32 {
  const x0 = <usize>load<i32>(params, 0);
  const x1 = <usize>load<i32>(params, 4);
  const mixL = <usize>load<i32>(params, 8);
  const mixR = <usize>load<i32>(params, 12);
  const frames = load<i32>(params, 16);
  const gl0 = load<f64>(params, 24);
  const dgl = load<f64>(params, 32);
  const gr0 = load<f64>(params, 40);
  const dgr = load<f64>(params, 48);
  let check = f64x2.splat(0);
  let i = 0;
  const quad = frames & ~3;
  const two = f64x2.splat(2);
  const gl0v = f64x2.splat(gl0);
  const dglv = f64x2.splat(dgl);
  const gr0v = f64x2.splat(gr0);
  const dgrv = f64x2.splat(dgr);
  let k = f64x2(1, 2); // i + 1 for lanes of the low pair
  for (; i < quad; i += 4) {
    const io = <usize>i << 2;
    const k2 = f64x2.add(k, two);
    const a = v128.load(x0 + io);
    const b = v128.load(x1 + io);
    const l = v128.load(mixL + io);
    const r = v128.load(mixR + io);
    const aLo = f64x2.promote_low_f32x4(a);
    const aHi = f64x2.promote_low_f32x4(v128.shuffle<f32>(a, a, 2, 3, 2, 3));
    const bLo = f64x2.promote_low_f32x4(b);
    const bHi = f64x2.promote_low_f32x4(v128.shuffle<f32>(b, b, 2, 3, 2, 3));
    const lLo = f64x2.add(f64x2.promote_low_f32x4(l), f64x2.mul(aLo, f64x2.add(gl0v, f64x2.mul(dglv, k))));
    const lHi = f64x2.add(f64x2.promote_low_f32x4(v128.shuffle<f32>(l, l, 2, 3, 2, 3)), f64x2.mul(aHi, f64x2.add(gl0v, f64x2.mul(dglv, k2))));
    const rLo = f64x2.add(f64x2.promote_low_f32x4(r), f64x2.mul(bLo, f64x2.add(gr0v, f64x2.mul(dgrv, k))));
    const rHi = f64x2.add(f64x2.promote_low_f32x4(v128.shuffle<f32>(r, r, 2, 3, 2, 3)), f64x2.mul(bHi, f64x2.add(gr0v, f64x2.mul(dgrv, k2))));
    const ld = f32x4.demote_f64x2_zero(lLo);
    const rd = f32x4.demote_f64x2_zero(rLo);
    v128.store(mixL + io, v128.shuffle<f32>(ld, f32x4.demote_f64x2_zero(lHi), 0, 1, 4, 5));
    v128.store(mixR + io, v128.shuffle<f32>(rd, f32x4.demote_f64x2_zero(rHi), 0, 1, 4, 5));
    check = f64x2.add(check, f64x2.add(f64x2.add(aLo, bLo), f64x2.add(aHi, bHi)));
    k = f64x2.add(k2, two);
  }
  let c = f64x2.extract_lane(check, 0) + f64x2.extract_lane(check, 1);
  for (; i < frames; i++) {
    const io = <usize>i << 2;
    const a = <f64>load<f32>(x0 + io);
    const b = <f64>load<f32>(x1 + io);
    const n = <f64>(i + 1);
    store<f32>(mixL + io, <f32>(<f64>load<f32>(mixL + io) + a * (gl0 + dgl * n)));
    store<f32>(mixR + io, <f32>(<f64>load<f32>(mixR + io) + b * (gr0 + dgr * n)));
    c += a + b;
  }
  return c - c == 0 ? 1 : 0;
}
