// WSOLA's tolerance search (W. Verhelst and M. Roelands, ICASSP 1993; docs/references.md §12): the offset within
// ±tolerance whose segment best matches the natural continuation, by normalised cross-correlation, coarse on a
// box-decimated copy, then refined at full rate around the coarse winner.

/** Decimation factor of the coarse pass (samples per coarse step). */
export const SEARCH_DECIMATION = 4;

/** Preallocated buffers and the search itself; never allocates after construction. */
export class SimilaritySearch {
  /** Longest compared segment, samples. */
  readonly maxCompare: number;
  /** Largest tolerance, samples. */
  readonly maxTolerance: number;
  /** The continuation segment (filled by the caller, `compare` samples). */
  readonly target: Float32Array;
  /** The candidate region (filled by the caller, 2·tolerance + compare samples, starting at offset −tolerance). */
  readonly region: Float32Array;
  private readonly targetCoarse: Float32Array;
  private readonly regionCoarse: Float32Array;

  /** Buffers for segments of up to `maxCompare` samples and offsets up to ±`maxTolerance` samples (both ≥ 1). */
  constructor(maxCompare: number, maxTolerance: number) {
    this.maxCompare = Math.max(1, Math.floor(maxCompare));
    this.maxTolerance = Math.max(1, Math.floor(maxTolerance));
    this.target = new Float32Array(this.maxCompare);
    this.region = new Float32Array(2 * this.maxTolerance + this.maxCompare + SEARCH_DECIMATION);
    this.targetCoarse = new Float32Array(Math.ceil(this.maxCompare / SEARCH_DECIMATION) + 1);
    this.regionCoarse = new Float32Array(Math.ceil(this.region.length / SEARCH_DECIMATION) + 1);
  }

  /**
   * Best offset in −tolerance…tolerance (samples) of `region` against `target`, comparing `compare` samples.
   * Offset 0 wins ties, so a candidate identical to the continuation is always kept.
   */
  best(compare: number, tolerance: number): number {
    const n = compare < this.maxCompare ? compare : this.maxCompare;
    const tol = tolerance < this.maxTolerance ? tolerance : this.maxTolerance;
    if (tol <= 0 || n <= 0) return 0;
    const D = SEARCH_DECIMATION;
    const t = this.target;
    const r = this.region;
    // Coarse pass: box sums of D samples, lags in steps of D.
    const nc = Math.floor(n / D);
    const lc = Math.floor(tol / D);
    const tc = this.targetCoarse;
    const rc = this.regionCoarse;
    for (let m = 0; m < nc; m++) {
      const b = m * D;
      tc[m] = t[b] + t[b + 1] + t[b + 2] + t[b + 3];
    }
    // Region index of lag 0 is `tol`; coarse region starts at tol − lc·D so that coarse lag 0 is full-rate lag 0.
    const base = tol - lc * D;
    const rcLen = 2 * lc + nc;
    for (let m = 0; m < rcLen; m++) {
      const b = base + m * D;
      rc[m] = r[b] + r[b + 1] + r[b + 2] + r[b + 3];
    }
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
    // Fine pass: ±(D − 1) around the coarse winner at full rate, staying within ±tol; offset 0 first when in range.
    const centre = bestCoarse * D;
    let lo = centre - (D - 1);
    let hi = centre + (D - 1);
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
