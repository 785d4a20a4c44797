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
