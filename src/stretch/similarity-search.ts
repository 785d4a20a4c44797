// WSOLA's tolerance search (W. Verhelst and M. Roelands, ICASSP 1993; docs/references.md §12): the offset within
// ±tolerance whose segment best matches the natural continuation, by normalised cross-correlation, coarse on a
// box-decimated copy, then refined at full rate around the coarse winner.

/** Effective sample rate of the coarse pass, Hz: its decimation is round(sampleRate ÷ this), at least 1. */
export const SEARCH_COARSE_RATE = 6000;

/** Preallocated buffers and the search itself; creates no objects after construction (what V8 may still box: docs/allocation.md). */
export class SimilaritySearch {
  /** Longest compared segment, samples. */
  readonly maxCompare: number;
  /** Largest tolerance, samples. */
  readonly maxTolerance: number;
  /** The continuation segment (filled by the caller, `compare` samples). */
  readonly target: Float32Array;
  /** The candidate region (filled by the caller, 2·tolerance + compare samples, starting at offset −tolerance). */
  readonly region: Float32Array;
  /** Samples per coarse step (box-sum length). */
  readonly decimation: number;
  private readonly targetCoarse: Float32Array;
  private readonly regionCoarse: Float32Array;

  /** Buffers for segments of up to `maxCompare` samples and offsets up to ±`maxTolerance` samples (both ≥ 1) at `sampleRate` Hz. */
  constructor(maxCompare: number, maxTolerance: number, sampleRate: number) {
    this.maxCompare = Math.max(1, Math.floor(maxCompare));
    this.maxTolerance = Math.max(1, Math.floor(maxTolerance));
    this.decimation = Math.max(1, Math.round(sampleRate / SEARCH_COARSE_RATE));
    const D = this.decimation;
    this.target = new Float32Array(this.maxCompare);
    this.region = new Float32Array(2 * this.maxTolerance + this.maxCompare + D);
    this.targetCoarse = new Float32Array(Math.ceil(this.maxCompare / D) + 1);
    this.regionCoarse = new Float32Array(Math.ceil(this.region.length / D) + 1);
  }

  /**
   * Best offset in −tolerance…tolerance (samples) of `region` against `target`, comparing `compare` samples.
   * Offset 0 wins ties, so a candidate identical to the continuation is always kept.
   */
  best(compare: number, tolerance: number): number {
    const n = compare < this.maxCompare ? compare : this.maxCompare;
    const tol = tolerance < this.maxTolerance ? tolerance : this.maxTolerance;
    if (tol <= 0 || n <= 0) return 0;
    const D = this.decimation;
    const t = this.target;
    const r = this.region;
    // Coarse pass: box sums of D samples, lags in steps of D.
    const nc = Math.floor(n / D);
    const lc = Math.floor(tol / D);
    const tc = this.targetCoarse;
    const rc = this.regionCoarse;
    boxSums(t, 0, D, nc, tc);
    // Region index of lag 0 is `tol`; coarse region starts at tol − lc·D so that coarse lag 0 is full-rate lag 0.
    const base = tol - lc * D;
    const rcLen = 2 * lc + nc;
    boxSums(r, base, D, rcLen, rc);
    let bestCoarse = 0;
    let bestScore = scoreAt(tc, rc, lc, nc);
    for (let k = 1; k <= lc; k++) {
      const a = scoreAt(tc, rc, lc + k, nc);
      if (a > bestScore) {
        bestScore = a;
        bestCoarse = k;
      }
      const b = scoreAt(tc, rc, lc - k, nc);
      if (b > bestScore) {
        bestScore = b;
        bestCoarse = -k;
      }
    }
    // Fine pass: ±⌈D/2⌉ around the coarse winner at full rate, staying within ±tol; offset 0 first when in range.
    const centre = bestCoarse * D;
    const reach = (D + 1) >> 1;
    let lo = centre - reach;
    let hi = centre + reach;
    if (lo < -tol) lo = -tol;
    if (hi > tol) hi = tol;
    let bestOffset = lo <= 0 && hi >= 0 ? 0 : centre;
    let best = scoreAt(t, r, tol + bestOffset, n);
    for (let k = lo; k <= hi; k++) {
      if (k === bestOffset) continue;
      const s = scoreAt(t, r, tol + k, n);
      if (s > best) {
        best = s;
        bestOffset = k;
      }
    }
    return bestOffset;
  }
}

/** out[m] = Σ x[from + m·D + d] for d < D, m < count. */
function boxSums(x: Float32Array, from: number, D: number, count: number, out: Float32Array): void {
  for (let m = 0; m < count; m++) {
    const b = from + m * D;
    let s = 0;
    for (let d = 0; d < D; d++) s += x[b + d];
    out[m] = s;
  }
}

/** Normalised cross-correlation of a[0…n) with b[start…start+n): Σab / √(Σb² + ε). */
function scoreAt(a: Float32Array, b: Float32Array, start: number, n: number): number {
  let ab = 0;
  let bb = 1e-12;
  for (let i = 0; i < n; i++) {
    const y = b[start + i];
    ab += a[i] * y;
    bb += y * y;
  }
  return ab / Math.sqrt(bb);
}
