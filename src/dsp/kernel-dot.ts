// Windowed-sinc dot products of the StreamReader's general path (J. O. Smith, "Digital Audio Resampling", CCRMA):
// kernel rows or strided dense-kernel reads, linearly interpolated between adjacent phases.
// The fraction f comes in io[0] and a dot product goes out in io[1]: V8 boxes a double passed to or returned from a
// call it does not inline (docs/allocation.md).

/** Dot product of x[base…] with phase rows at k0 and k0+taps, linearly interpolated by f = io[0], into io[1]. */
export function dotRows(pm: Float32Array, k0: number, taps: number, x: Float32Array, base: number, io: Float64Array): void {
  const f = io[0];
  let a0 = 0;
  let a1 = 0;
  const k1 = k0 + taps;
  for (let j = 0; j < taps; j++) {
    const s = x[base + j];
    a0 += pm[k0 + j] * s;
    a1 += pm[k1 + j] * s;
  }
  io[1] = a0 + f * (a1 - a0);
}

/** Dot product of x[base…] with the dense kernel read at k0, k0 − stride, …, linearly interpolated by f = io[0], into io[1]. */
export function dotStride(d: Float32Array, k0: number, stride: number, x: Float32Array, base: number, count: number, io: Float64Array): void {
  const f = io[0];
  let a0 = 0;
  let a1 = 0;
  let k = k0;
  for (let j = 0; j < count; j++) {
    const s = x[base + j];
    a0 += d[k] * s;
    a1 += d[k + 1] * s;
    k -= stride;
  }
  io[1] = a0 + f * (a1 - a0);
}

/** Fills w[0…taps) with the phase rows at k0 and k0+taps, linearly interpolated by f = io[0]. */
export function fillRows(w: Float64Array, pm: Float32Array, k0: number, taps: number, io: Float64Array): void {
  const f = io[0];
  const k1 = k0 + taps;
  for (let j = 0; j < taps; j++) w[j] = pm[k0 + j] + f * (pm[k1 + j] - pm[k0 + j]);
}

/** Fills w[0…count) with the dense kernel read at k0, k0 − stride, …, linearly interpolated by f = io[0]. */
export function fillStride(w: Float64Array, d: Float32Array, k0: number, stride: number, count: number, io: Float64Array): void {
  const f = io[0];
  let k = k0;
  for (let j = 0; j < count; j++) {
    w[j] = d[k] + f * (d[k + 1] - d[k]);
    k -= stride;
  }
}

// The fast path of TypeScriptTaps (ratios ≤ 1, mono, window inside the source) sums each window in two chains, even
// and odd taps, added at the end: two chains hide the latency of floating-point addition. The pair forms sum two
// output samples in one loop, each keeping exactly the operations of its single form. Rows are `taps` long (even).

/** One-row sum: x[m…] against the phase row at k0, into io[2]. */
export function rowSum(pm: Float32Array, k0: number, taps: number, x: Float32Array, m: number, io: Float64Array): void {
  let a0 = 0;
  let b0 = 0;
  for (let j = 0; j < taps; j += 2) {
    a0 += pm[k0 + j] * x[m + j];
    b0 += pm[k0 + j + 1] * x[m + j + 1];
  }
  io[2] = a0 + b0;
}

/** rowSum of two samples: row k0 against x[m0…] into io[2], row k1 against x[m1…] into io[3] (one read of x when m0 = m1). */
export function rowSumPair(pm: Float32Array, k0: number, k1: number, taps: number, x: Float32Array, m0: number, m1: number, io: Float64Array): void {
  let a0 = 0;
  let b0 = 0;
  let c0 = 0;
  let d0 = 0;
  if (m0 === m1) {
    for (let j = 0; j < taps; j += 2) {
      const s0 = x[m0 + j];
      const s1 = x[m0 + j + 1];
      a0 += pm[k0 + j] * s0;
      b0 += pm[k0 + j + 1] * s1;
      c0 += pm[k1 + j] * s0;
      d0 += pm[k1 + j + 1] * s1;
    }
  } else {
    for (let j = 0; j < taps; j += 2) {
      a0 += pm[k0 + j] * x[m0 + j];
      b0 += pm[k0 + j + 1] * x[m0 + j + 1];
      c0 += pm[k1 + j] * x[m1 + j];
      d0 += pm[k1 + j + 1] * x[m1 + j + 1];
    }
  }
  io[2] = a0 + b0;
  io[3] = c0 + d0;
}

/** Two-row form: x[m…] against the phase rows at k0 and k0 + taps, linearly interpolated by f = io[0], into io[1]. */
export function dotRowsSplit(pm: Float32Array, k0: number, taps: number, x: Float32Array, m: number, io: Float64Array): void {
  const k1 = k0 + taps;
  let a0 = 0;
  let b0 = 0;
  let a1 = 0;
  let b1 = 0;
  for (let j = 0; j < taps; j += 2) {
    const s0 = x[m + j];
    const s1 = x[m + j + 1];
    a0 += pm[k0 + j] * s0;
    a1 += pm[k1 + j] * s0;
    b0 += pm[k0 + j + 1] * s1;
    b1 += pm[k1 + j + 1] * s1;
  }
  a0 += b0;
  io[1] = a0 + io[0] * (a1 + b1 - a0);
}

/** dotRowsSplit of two samples: rows at k0 on x[m0…] by f = io[0] into io[2], rows at k2 on x[m1…] by f = io[1] into io[3]. */
export function dotRowsSplitPair(pm: Float32Array, k0: number, k2: number, taps: number, x: Float32Array, m0: number, m1: number, io: Float64Array): void {
  const k1 = k0 + taps;
  const k3 = k2 + taps;
  let a0 = 0;
  let b0 = 0;
  let a1 = 0;
  let b1 = 0;
  let c0 = 0;
  let d0 = 0;
  let c1 = 0;
  let d1 = 0;
  if (m0 === m1) {
    for (let j = 0; j < taps; j += 2) {
      const s0 = x[m0 + j];
      const s1 = x[m0 + j + 1];
      a0 += pm[k0 + j] * s0;
      a1 += pm[k1 + j] * s0;
      b0 += pm[k0 + j + 1] * s1;
      b1 += pm[k1 + j + 1] * s1;
      c0 += pm[k2 + j] * s0;
      c1 += pm[k3 + j] * s0;
      d0 += pm[k2 + j + 1] * s1;
      d1 += pm[k3 + j + 1] * s1;
    }
  } else {
    for (let j = 0; j < taps; j += 2) {
      const s0 = x[m0 + j];
      const s1 = x[m0 + j + 1];
      const t0 = x[m1 + j];
      const t1 = x[m1 + j + 1];
      a0 += pm[k0 + j] * s0;
      a1 += pm[k1 + j] * s0;
      b0 += pm[k0 + j + 1] * s1;
      b1 += pm[k1 + j + 1] * s1;
      c0 += pm[k2 + j] * t0;
      c1 += pm[k3 + j] * t0;
      d0 += pm[k2 + j + 1] * t1;
      d1 += pm[k3 + j + 1] * t1;
    }
  }
  a0 += b0;
  c0 += d0;
  io[2] = a0 + io[0] * (a1 + b1 - a0);
  io[3] = c0 + io[1] * (c1 + d1 - c0);
}

// The stretched fast path (ratios above 1): the dense kernel read at k0, k0 − stride, … against x[m…], `count` taps,
// again even and odd taps in two chains.

/** One-column sum (a table point), into io[2]. */
export function columnSum(d: Float32Array, k0: number, stride: number, x: Float32Array, m: number, count: number, io: Float64Array): void {
  const stride2 = stride * 2;
  const even = count & ~1;
  let k = k0;
  let j = 0;
  let a0 = 0;
  let b0 = 0;
  for (; j < even; j += 2) {
    a0 += d[k] * x[m + j];
    b0 += d[k - stride] * x[m + j + 1];
    k -= stride2;
  }
  if (j < count) a0 += d[k] * x[m + j];
  io[2] = a0 + b0;
}

/** Two adjacent columns (k and k + 1), linearly interpolated by f = io[0], into io[1]. */
export function dotColumns(d: Float32Array, k0: number, stride: number, x: Float32Array, m: number, count: number, io: Float64Array): void {
  const stride2 = stride * 2;
  const even = count & ~1;
  let k = k0;
  let j = 0;
  let a0 = 0;
  let b0 = 0;
  let a1 = 0;
  let b1 = 0;
  for (; j < even; j += 2) {
    const s0 = x[m + j];
    const s1 = x[m + j + 1];
    const k2 = k - stride;
    a0 += d[k] * s0;
    a1 += d[k + 1] * s0;
    b0 += d[k2] * s1;
    b1 += d[k2 + 1] * s1;
    k -= stride2;
  }
  if (j < count) {
    const s0 = x[m + j];
    a0 += d[k] * s0;
    a1 += d[k + 1] * s0;
  }
  a0 += b0;
  io[1] = a0 + io[0] * (a1 + b1 - a0);
}
