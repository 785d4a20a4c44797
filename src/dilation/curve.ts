// Curve of the time scale: piecewise linear, or monotone cubic Hermite with Fritsch–Carlson tangents
// (F. N. Fritsch & R. E. Carlson, "Monotone piecewise cubic interpolation", SIAM J. Numer. Anal. 17(2), 1980).
import type { CurveSpec } from '../tuning';

/** Smallest x distance between neighbouring keys (the tuning parser enforces the same), keeps tangents finite. */
export const MIN_KEY_SPACING = 1e-6;

/** An evaluable curve built once from a CurveSpec; evaluate() creates no objects (what V8 may still box: docs/allocation.md). */
export class Curve {
  /** Key x values, strictly increasing. */
  readonly xs: Float64Array;
  /** Key y values. */
  readonly ys: Float64Array;
  /** Hermite tangents at the keys (Fritsch–Carlson; zeros for linear curves). */
  readonly tangents: Float64Array;
  /** True for monotone cubic interpolation, false for linear. */
  readonly monotone: boolean;

  /** Builds the curve; throws RangeError unless keys are ≥ 1, finite and increasing in x by ≥ MIN_KEY_SPACING. */
  constructor(spec: CurveSpec) {
    const n = spec.keys.length;
    if (n < 1) throw new RangeError('a curve needs at least one key');
    this.xs = new Float64Array(n);
    this.ys = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      const { x, y } = spec.keys[i];
      if (!Number.isFinite(x) || !Number.isFinite(y)) throw new RangeError(`curve key ${i} is not finite`);
      if (i > 0 && !(x - this.xs[i - 1] >= MIN_KEY_SPACING)) throw new RangeError(`curve key ${i}: x must exceed the previous key's by ≥ ${MIN_KEY_SPACING}`);
      this.xs[i] = x;
      this.ys[i] = y;
    }
    this.monotone = spec.interpolation === 'monotone';
    this.tangents = new Float64Array(n);
    if (this.monotone) fritschCarlsonTangents(this.xs, this.ys, this.tangents);
  }

  /** Value at x; clamped to the first/last key's y outside the keys; NaN x gives the first key's y. */
  evaluate(x: number): number {
    const xs = this.xs;
    const n = xs.length;
    if (!(x > xs[0])) return this.ys[0];
    if (x >= xs[n - 1]) return this.ys[n - 1];
    // Binary search for the interval [xs[lo], xs[lo + 1]) containing x.
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (xs[mid] <= x) lo = mid;
      else hi = mid;
    }
    const x0 = xs[lo];
    const h = xs[lo + 1] - x0;
    const t = (x - x0) / h;
    const y0 = this.ys[lo];
    const y1 = this.ys[lo + 1];
    if (!this.monotone) return y0 + (y1 - y0) * t;
    // Cubic Hermite basis.
    const t2 = t * t;
    const t3 = t2 * t;
    const h00 = 2 * t3 - 3 * t2 + 1;
    const h10 = t3 - 2 * t2 + t;
    const h01 = -2 * t3 + 3 * t2;
    const h11 = t3 - t2;
    return h00 * y0 + h10 * h * this.tangents[lo] + h01 * y1 + h11 * h * this.tangents[lo + 1];
  }
}

/**
 * Fritsch–Carlson tangents into `out`: secant means (0 at sign changes and flat secants), end tangents = end
 * secants, then each interval's (α, β) pulled onto the circle of radius 3 when outside it.
 */
export function fritschCarlsonTangents(xs: ArrayLike<number>, ys: ArrayLike<number>, out: Float64Array): Float64Array {
  const n = xs.length;
  if (n < 2) {
    if (n === 1) out[0] = 0;
    return out;
  }
  const secant = (k: number): number => (ys[k + 1] - ys[k]) / (xs[k + 1] - xs[k]);
  out[0] = secant(0);
  out[n - 1] = secant(n - 2);
  for (let k = 1; k < n - 1; k++) {
    const a = secant(k - 1);
    const b = secant(k);
    out[k] = a * b <= 0 ? 0 : (a + b) / 2;
  }
  for (let k = 0; k < n - 1; k++) {
    const d = secant(k);
    if (d === 0) {
      out[k] = 0;
      out[k + 1] = 0;
      continue;
    }
    let alpha = out[k] / d;
    let beta = out[k + 1] / d;
    if (alpha < 0) {
      out[k] = 0;
      alpha = 0;
    }
    if (beta < 0) {
      out[k + 1] = 0;
      beta = 0;
    }
    const s = alpha * alpha + beta * beta;
    if (s > 9) {
      const tau = 3 / Math.sqrt(s);
      out[k] = tau * alpha * d;
      out[k + 1] = tau * beta * d;
    }
  }
  return out;
}
