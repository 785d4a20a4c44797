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
