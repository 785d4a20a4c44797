// Hann analysis window (periodic, DFT-even form); the Kaiser window comes from src/dsp.

/** Fills `out` with a periodic Hann window (0.5 − 0.5·cos(2πn/N), N = out.length, the DFT-even form); returns out. */
export function hannWindow(out: Float64Array): Float64Array {
  const n = out.length;
  for (let i = 0; i < n; i++) out[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n);
  return out;
}
