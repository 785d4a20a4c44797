// Polyphase windowed-sinc interpolation (J. O. Smith, "Digital Audio Resampling", CCRMA) as WebAssembly SIMD (f32x4)
// dot products over contiguous residue rows; the TypeScript StreamReader in src/dsp is the reference it must match.
//
// AssemblyScript source (compiled by scripts/build-wasm.mjs, not by tsc). Memory is laid out by the JavaScript side
// (src/dsp/wasm/wasm-kernel.ts); this module only reads and writes the regions it is handed.
//
// Table header at `table` (bytes): 0 i32 phases P · 4 i32 halfDense (= halfTaps·P) · 8 f64 stretchPerRatio ·
// 16 i32 gridFloor (P+1 i32: largest grid stride ≤ m) · 20 i32 descByStride (P+1 i32: descriptor base per stride).
// Descriptor of (stride s, sub-phase ci), 32 bytes: row0 ptr · row1 ptr · a1n (taps left of the centre) · count8 ·
// diff ptr (count8 floats row1 − row0, so that two-channel sources interpolate the taps once and share them).

// The run's ratios (wasm/ratios.ts), the voice mix (wasm/mix.ts) and its low-pass (wasm/lowpass.ts) are exports of this module too.
export { sanitize, ramp } from './ratios';
export { mix } from './mix';
export { lowpass, lowpassMix } from './lowpass';

/** First free byte after the module's own data (the JavaScript allocator starts here). */
export function heapBase(): usize {
  return __heap_base;
}

/** Floats of the row block of one stride: every dense entry once (total + 2) plus 8 zeros after each residue row. */
export function rowFloats(total: i32, s: i32): i32 {
  return total + 2 + 8 * s;
}

@inline function rowBase(rho: i32, s: i32, count: i32): i32 {
  // Entries of residues below rho: floor(count/s) each, one more for the first (count mod s); plus 8 pad per row.
  const q = count / s;
  const rem = count % s;
  return rho * (q + 8) + (rho < rem ? rho : rem);
}

/** Floats of the difference rows of one stride: count8 per sub-phase. */
export function diffFloats(halfDense: i32, s: i32): i32 {
  let n = 0;
  for (let ci = 0; ci < s; ci++) n += (((halfDense - 1 - ci) / s + (halfDense + ci) / s + 1) + 7) & ~7;
  return n;
}

/**
 * Lays out the stretched kernel of stride `s`: residue row ρ holds dense[K − m·s] for m = 0… (K = largest k ≤ total + 1
 * with k ≡ ρ mod s), so the taps of one output sample are contiguous and ascend with the source frame.
 */
export function buildStride(params: usize): void {
  // Parameter block (i32 each, bytes): 0 table · 4 dense · 8 total · 12 s · 16 desc · 20 rows · 24 diffs.
  const table = <usize>load<i32>(params, 0);
  const dense = <usize>load<i32>(params, 4);
  const total = load<i32>(params, 8);
  const s = load<i32>(params, 12);
  const desc = <usize>load<i32>(params, 16);
  const rows = <usize>load<i32>(params, 20);
  let diffs = <usize>load<i32>(params, 24);
  const halfDense = load<i32>(table, 4);
  const count = total + 2;
  for (let rho = 0; rho < s; rho++) {
    const nr = (count - 1 - rho) / s + 1;
    const k = rho + (nr - 1) * s;
    const base = rows + (<usize>rowBase(rho, s, count) << 2);
    for (let m = 0; m < nr; m++) store<f32>(base + (<usize>m << 2), load<f32>(dense + (<usize>(k - m * s) << 2)));
    for (let m = nr; m < nr + 8; m++) store<f32>(base + (<usize>m << 2), 0);
  }
  for (let ci = 0; ci < s; ci++) {
    const a1n = (halfDense - 1 - ci) / s;
    const cnt = a1n + (halfDense + ci) / s + 1;
    const k0 = a1n * s + halfDense + ci;
    const r0 = k0 % s;
    const r1 = (k0 + 1) % s;
    const kTop0 = r0 + ((count - 1 - r0) / s) * s;
    const kTop1 = r1 + ((count - 1 - r1) / s) * s;
    const d = desc + (<usize>ci << 5);
    const p0 = <usize>rows + (<usize>(rowBase(r0, s, count) + (kTop0 - k0) / s) << 2);
    const p1 = <usize>rows + (<usize>(rowBase(r1, s, count) + (kTop1 - k0 - 1) / s) << 2);
    const cnt8 = (cnt + 7) & ~7;
    store<i32>(d, <i32>p0);
    store<i32>(d, <i32>p1, 4);
    store<i32>(d, a1n, 8);
    store<i32>(d, cnt8, 12);
    store<i32>(d, <i32>diffs, 16);
    for (let j = 0; j < cnt8; j++) {
      const jo = <usize>j << 2;
      store<f32>(diffs + jo, load<f32>(p1 + jo) - load<f32>(p0 + jo));
    }
    diffs += <usize>cnt8 << 2;
  }
  store<i32>(load<i32>(table, 20) + (s << 2), <i32>desc);
}

@inline function strideOf(r: f64, spr: f64, phases: i32, grid: usize): i32 {
  const sr = r * spr;
  return sr <= 1 ? phases : load<i32>(grid + (<usize>(<i32>Math.floor(<f64>phases / sr)) << 2));
}

@inline function pairSums(a: v128, b: v128): v128 {
  // lanes 0 and 2 of the result: the sums of a's and b's lanes.
  const t = f32x4.add(v128.shuffle<f32>(a, b, 0, 1, 4, 5), v128.shuffle<f32>(a, b, 2, 3, 6, 7));
  return f32x4.add(t, v128.shuffle<f32>(t, t, 1, 0, 3, 2));
}

// Parameter block of `render`, `sanitize` and `ramp` at `params` (bytes), written by the JavaScript side
// (src/dsp/wasm/kernel-params.ts): 0 i32 table · 4 i32 x0 · 8 i32 x1 · 12 i32 spanBase · 16 i32 out0 · 20 i32 out1 ·
// 24 i32 iStart · 28 i32 iEnd · 32 i32 ratios (f64) · 36 i32 last stride (out) · 40 f64 pos (in: start, out: end) ·
// 48 f64 frames · 56 f64 rs · 64 f64 dr · 72 f64 loopEnd · 80 i32 raw ratios (f32) · 84 i32 count · 88 f64 last
// ratio (in and out) · 96 f64 smallest and 104 f64 largest ratio of the run (written by `sanitize` or `ramp`).

/**
 * Output samples iStart…iEnd−1 at ratios[i − iStart] (f64, written by `sanitize` or `ramp`, with the extremes of their
 * run at offsets 96 and 104), the position advancing from `pos`; source windows come from x0 (and x1 when ≠ 0), whose
 * float 0 is source frame `spanBase`; outputs go to out0[i − iStart] (and out1). Stops after the sample whose advance
 * reaches `loopEnd`. Returns the samples written; the position after them replaces `pos` and the last stride goes to
 * its slot (offset 36).
 */
export function render(params: usize): i32 {
  const table = <usize>load<i32>(params, 0);
  const x0 = <usize>load<i32>(params, 4);
  const x1 = <usize>load<i32>(params, 8);
  const spanBase = load<i32>(params, 12);
  const out0 = <usize>load<i32>(params, 16);
  const out1 = <usize>load<i32>(params, 20);
  const iStart = load<i32>(params, 24);
  const iEnd = load<i32>(params, 28);
  const ratios = <usize>load<i32>(params, 32);
  const pos = load<f64>(params, 40);
  const loopEnd = load<f64>(params, 72);
  const phases = load<i32>(table, 0);
  const spr = load<f64>(table, 8);
  const grid = <usize>load<i32>(table, 16);
  const descs = <usize>load<i32>(table, 20);
  const fp = <f64>phases;
  let p = pos;
  let st = phases;
  let scale: f64 = 1; // st / phases
  let dbase: usize = 0; // descriptors of stride st
  let lastR: f64 = -1; // the stride depends on r only: reuse it while r repeats
  let dst = -1; // the stride that scale and dbase belong to
  // The stride is monotone in r: equal strides at the smallest and the largest ratio of the run hold throughout (and
  // so for a later part of it, after a loop wrap).
  const s0 = strideOf(load<f64>(params, 96), spr, phases, grid);
  const fixed = s0 == strideOf(load<f64>(params, 104), spr, phases, grid);
  if (fixed) {
    st = s0;
    dst = st;
    scale = <f64>st / fp;
    dbase = <usize>load<i32>(descs + (<usize>st << 2));
    if (x1 != 0) return stereoRun(params, x0 + (<usize>(-spanBase) << 2), x1 - x0, out0, out1, iEnd - iStart, ratios, p, loopEnd, st, scale, dbase);
  }
  let i = iStart;
  while (i < iEnd) {
    const r = load<f64>(ratios + (<usize>(i - iStart) << 3));
    if (!fixed && r != lastR) {
      lastR = r;
      st = strideOf(r, spr, phases, grid);
      if (st != dst) {
        dst = st;
        scale = <f64>st / fp;
        dbase = <usize>load<i32>(descs + (<usize>st << 2));
      }
    }
    const nf = Math.floor(p);
    const n = <i32>nf;
    const c = (p - nf) * <f64>st;
    const ci = <i32>c;
    const f = c - <f64>ci;
    const d = dbase + (<usize>ci << 5);
    const row0 = <usize>load<i32>(d);
    const row1 = <usize>load<i32>(d, 4);
    const a1n = load<i32>(d, 8);
    const cnt = load<i32>(d, 12);
    const xo = <usize>(n - a1n - spanBase) << 2;
    const o = <usize>(i - iStart) << 2;
    if (x1 == 0) {
      const xp = x0 + xo;
      let a0 = f32x4.splat(0);
      let b0 = f32x4.splat(0);
      let a1 = f32x4.splat(0);
      let b1 = f32x4.splat(0);
      for (let j = 0; j < cnt; j += 8) {
        const jo = <usize>j << 2;
        const s0 = v128.load(xp + jo);
        const s1 = v128.load(xp + jo, 16);
        a0 = f32x4.add(a0, f32x4.mul(v128.load(row0 + jo), s0));
        b0 = f32x4.add(b0, f32x4.mul(v128.load(row1 + jo), s0));
        a1 = f32x4.add(a1, f32x4.mul(v128.load(row0 + jo, 16), s1));
        b1 = f32x4.add(b1, f32x4.mul(v128.load(row1 + jo, 16), s1));
      }
      const u = pairSums(f32x4.add(a0, a1), f32x4.add(b0, b1));
      const ya = <f64>f32x4.extract_lane(u, 0);
      const yb = <f64>f32x4.extract_lane(u, 2);
      store<f32>(out0 + o, <f32>(scale * (ya + f * (yb - ya))));
    } else {
      // Two channels: taps interpolated once (h = row0 + f·(row1 − row0)) and shared by both dot products.
      const xp = x0 + xo;
      const xq = x1 + xo;
      const dp = <usize>load<i32>(d, 16);
      const fv = f32x4.splat(<f32>f);
      let a0 = f32x4.splat(0);
      let b0 = f32x4.splat(0);
      let a1 = f32x4.splat(0);
      let b1 = f32x4.splat(0);
      for (let j = 0; j < cnt; j += 8) {
        const jo = <usize>j << 2;
        const h0 = f32x4.add(v128.load(row0 + jo), f32x4.mul(fv, v128.load(dp + jo)));
        const h1 = f32x4.add(v128.load(row0 + jo, 16), f32x4.mul(fv, v128.load(dp + jo, 16)));
        a0 = f32x4.add(a0, f32x4.mul(h0, v128.load(xp + jo)));
        b0 = f32x4.add(b0, f32x4.mul(h0, v128.load(xq + jo)));
        a1 = f32x4.add(a1, f32x4.mul(h1, v128.load(xp + jo, 16)));
        b1 = f32x4.add(b1, f32x4.mul(h1, v128.load(xq + jo, 16)));
      }
      const u = pairSums(f32x4.add(a0, a1), f32x4.add(b0, b1));
      store<f32>(out0 + o, <f32>(scale * <f64>f32x4.extract_lane(u, 0)));
      store<f32>(out1 + o, <f32>(scale * <f64>f32x4.extract_lane(u, 2)));
    }
    p += r;
    i++;
    if (p >= loopEnd) break;
  }
  store<f64>(params, p, 40);
  store<i32>(params, st, 36);
  return i - iStart;
}

/** 1.5 · 2^52: added to an integer-valued float64 below 2^51 in magnitude, leaves it in the low mantissa bits. */
const INT_MAGIC: f64 = 6755399441055744.0;

/** `x` (integer-valued, |x| < 2^31) as i32, without the range checks of a truncating conversion. */
@inline function intOf(x: f64): i32 {
  return <i32>reinterpret<i64>(x + INT_MAGIC);
}

/**
 * `render`'s loop for two channels at one stride `st` (descriptors at `dbase`, output scale `scale`) over `count`
 * per-sample ratios at `ratios`: the same arithmetic with fewer live values (and so fewer spills). `xs` is the address
 * of source frame 0 of the first channel, `dx` the distance in bytes to the second.
 */
function stereoRun(params: usize, xs: usize, dx: usize, out0: usize, out1: usize, count: i32, ratios: usize, pos: f64, loopEnd: f64, st: i32, scale: f64, dbase: usize): i32 {
  const fst = <f64>st;
  const vscale = f64x2.splat(scale);
  let p = pos;
  let k = 0;
  while (k < count) {
    const r = load<f64>(ratios + (<usize>k << 3));
    const nf = Math.floor(p);
    const c = (p - nf) * fst;
    const cf = Math.floor(c); // c ≥ 0: the truncation render's loop takes
    const fv = f32x4.splat(<f32>(c - cf));
    const d = dbase + (<usize>intOf(cf) << 5);
    let row = <usize>load<i32>(d);
    const end = row + (<usize>load<i32>(d, 12) << 2);
    // Byte distances from the row to the difference row and to the two source windows, which advance with it.
    const toDiff = <usize>load<i32>(d, 16) - row;
    const toX = xs + (<usize>(intOf(nf) - load<i32>(d, 8)) << 2) - row;
    const toY = toX + dx;
    let a0 = f32x4.splat(0);
    let b0 = f32x4.splat(0);
    let a1 = f32x4.splat(0);
    let b1 = f32x4.splat(0);
    do {
      const h0 = f32x4.add(v128.load(row), f32x4.mul(fv, v128.load(row + toDiff)));
      const h1 = f32x4.add(v128.load(row, 16), f32x4.mul(fv, v128.load(row + toDiff, 16)));
      a0 = f32x4.add(a0, f32x4.mul(h0, v128.load(row + toX)));
      b0 = f32x4.add(b0, f32x4.mul(h0, v128.load(row + toY)));
      a1 = f32x4.add(a1, f32x4.mul(h1, v128.load(row + toX, 16)));
      b1 = f32x4.add(b1, f32x4.mul(h1, v128.load(row + toY, 16)));
      row += 32;
    } while (row < end);
    // Lanes 0 and 1: the sums of both channels, scaled in float64 and rounded to float32 as one pair.
    const u = pairSums(f32x4.add(a0, a1), f32x4.add(b0, b1));
    const y = f32x4.demote_f64x2_zero(f64x2.mul(vscale, f64x2.promote_low_f32x4(v128.shuffle<f32>(u, u, 0, 2, 0, 2))));
    const o = <usize>k << 2;
    v128.store32_lane(out0 + o, y, 0);
    v128.store32_lane(out1 + o, y, 1);
    p += r;
    k++;
    if (p >= loopEnd) break;
  }
  store<f64>(params, p, 40);
  store<i32>(params, st, 36);
  return k;
}
