// Separates one source from a mix: a band-pass that follows the expected fundamental (RBJ audio-EQ cookbook band-pass,
// constant 0 dB peak gain, docs/references.md §4), two sections in series, coefficients redesigned every 32 samples,
// run forward then backward so it adds no delay (zero-phase filtering, common practice).

/** Filters `signal` (at `sampleRate`) in place around centreHz(i) (Hz at sample i; NaN keeps the last centre), quality q. */
export function followBand(signal: Float32Array, sampleRate: number, centreHz: (i: number) => number, q = 6): Float32Array {
  const n = signal.length;
  const coeff = new Float64Array(5);
  const design = (f: number): void => {
    const w = (2 * Math.PI * Math.min(f, sampleRate * 0.45)) / sampleRate;
    const alpha = Math.sin(w) / (2 * q);
    const a0 = 1 + alpha;
    coeff[0] = alpha / a0;
    coeff[1] = 0;
    coeff[2] = -alpha / a0;
    coeff[3] = (-2 * Math.cos(w)) / a0;
    coeff[4] = (1 - alpha) / a0;
  };
  const pass = (forward: boolean): void => {
    let x1 = 0;
    let x2 = 0;
    let y1 = 0;
    let y2 = 0;
    let f = 1000;
    for (let k = 0; k < n; k++) {
      const i = forward ? k : n - 1 - k;
      if (k % 32 === 0) {
        const c = centreHz(i);
        if (c > 0) f = c;
        design(f);
      }
      const x = signal[i];
      const y = coeff[0] * x + coeff[1] * x1 + coeff[2] * x2 - coeff[3] * y1 - coeff[4] * y2;
      x2 = x1;
      x1 = x;
      y2 = y1;
      y1 = y;
      signal[i] = y;
    }
  };
  pass(true);
  pass(true);
  pass(false);
  pass(false);
  return signal;
}
