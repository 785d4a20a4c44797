// Hann and Kaiser analysis windows; Kaiser's I0–sinh window (J. F. Kaiser, Proc. IEEE ISCAS 1974),
// w[n] = I0(β·sqrt(1 − (2n/M − 1)²)) / I0(β) as restated in REFERENCES.md §3a.

/** Zeroth-order modified Bessel function of the first kind, I0(x), by its power series; x any real. */
export function besselI0(x: number): number {
  const q = (x * x) / 4;
  let term = 1;
  let sum = 1;
  for (let k = 1; k < 500; k++) {
    term *= q / (k * k);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return sum;
}

/** Fills `out` with a symmetric Kaiser window of out.length points and shape β ≥ 0; returns out. */
export function kaiserWindow(out: Float64Array, beta: number): Float64Array {
  const m = out.length - 1;
  if (m === 0) {
    out[0] = 1;
    return out;
  }
  const norm = 1 / besselI0(beta);
  for (let n = 0; n <= m; n++) {
    const r = (2 * n) / m - 1;
    out[n] = besselI0(beta * Math.sqrt(Math.max(0, 1 - r * r))) * norm;
  }
  return out;
}

/** Fills `out` with a periodic Hann window (0.5 − 0.5·cos(2πn/N), N = out.length, the DFT-even form); returns out. */
export function hannWindow(out: Float64Array): Float64Array {
  const n = out.length;
  for (let i = 0; i < n; i++) out[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n);
  return out;
}

/** Kaiser window value at x ∈ [−1, 1] (0 outside) for shape β; used for continuous-time kernels. */
export function kaiserAt(x: number, beta: number, inverseI0Beta: number): number {
  if (x <= -1 || x >= 1) return 0;
  return besselI0(beta * Math.sqrt(1 - x * x)) * inverseI0Beta;
}
