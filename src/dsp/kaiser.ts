// Kaiser window and its design formulas: J. F. Kaiser, "Nonrecursive digital filter design using the
// I0-sinh window function", Proc. IEEE ISCAS 1974; Oppenheim & Schafer, Discrete-Time Signal Processing §7.5.3.

/** Zeroth-order modified Bessel function of the first kind, I0(x), by its power series (any finite x). */
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

/** Kaiser's β for a stopband attenuation `attenuationDb` (dB, ≥ 0): 0.1102(A−8.7) above 50 dB, the 0.5842 power law in 21…50 dB, 0 below 21 dB. */
export function kaiserBeta(attenuationDb: number): number {
  const a = attenuationDb;
  if (a > 50) return 0.1102 * (a - 8.7);
  if (a >= 21) return 0.5842 * Math.pow(a - 21, 0.4) + 0.07886 * (a - 21);
  return 0;
}

/** Kaiser's length estimate as taps N (integer ≥ 1) for attenuation `attenuationDb` (dB) and transition width `width` as a fraction of Nyquist (0…1]: N = ceil((A − 7.95)/(2.285·π·width) + 1). */
export function kaiserTaps(attenuationDb: number, width: number): number {
  return Math.ceil((attenuationDb - 7.95) / (2.285 * Math.PI * width) + 1);
}

/** Kaiser window value at x ∈ [−1, 1] (0 outside) for shape β ≥ 0: I0(β·sqrt(1 − x²)) / I0(β). */
export function kaiserAt(x: number, beta: number, i0Beta: number = besselI0(beta)): number {
  if (x < -1 || x > 1) return 0;
  return besselI0(beta * Math.sqrt(1 - x * x)) / i0Beta;
}

/** Fills `out` (length M+1) with the Kaiser window w[n] = I0(β·sqrt(1 − (2n/M − 1)²)) / I0(β), n = 0…M; returns `out`. */
export function kaiserWindow(out: Float64Array, beta: number): Float64Array {
  const m = out.length - 1;
  const i0b = besselI0(beta);
  if (m === 0) {
    out[0] = 1;
    return out;
  }
  for (let n = 0; n <= m; n++) out[n] = kaiserAt((2 * n) / m - 1, beta, i0b);
  return out;
}
