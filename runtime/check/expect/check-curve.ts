// The checker's own evaluation of a tuning curve: straight lines between keys, or a monotone cubic Hermite with
// Fritsch–Carlson tangents (F. N. Fritsch & R. E. Carlson, SIAM J. Numer. Anal. 17(2), 1980; docs/references.md §8).
// Written apart from src/dilation on purpose: the checker must not share the engine's code for what it checks.
import type { CurveSpec } from '../../../src/tuning';

/** A tuning curve evaluated the checker's own way; outside the keys it holds the end keys' values. */
export class CheckCurve {
  private readonly xs: number[];
  private readonly ys: number[];
  private readonly m: number[];
  private readonly cubic: boolean;

  /** Builds the curve from a parsed tuning's CurveSpec (keys increasing in x, at least one). */
  constructor(spec: CurveSpec) {
    this.xs = spec.keys.map((k) => k.x);
    this.ys = spec.keys.map((k) => k.y);
    this.cubic = spec.interpolation === 'monotone';
    this.m = this.cubic ? tangents(this.xs, this.ys) : this.xs.map(() => 0);
  }

  /** Curve value at x (the time scale, 0…4). */
  valueAt(x: number): number {
    const { xs, ys } = this;
    const n = xs.length;
    if (n === 1 || x <= xs[0]) return ys[0];
    if (x >= xs[n - 1]) return ys[n - 1];
    let k = 0;
    while (x >= xs[k + 1]) k++;
    const h = xs[k + 1] - xs[k];
    const u = (x - xs[k]) / h;
    if (!this.cubic) return ys[k] + (ys[k + 1] - ys[k]) * u;
    // Hermite form on [x_k, x_k+1]: value and slope at both ends.
    const a = 1 - u;
    return ys[k] * (1 + 2 * u) * a * a + this.m[k] * h * u * a * a + ys[k + 1] * u * u * (3 - 2 * u) - this.m[k + 1] * h * u * u * a;
  }
}

/** Tangents by the published rule: secant means, zero at extrema and flat secants, pulled inside the radius-3 circle. */
function tangents(xs: number[], ys: number[]): number[] {
  const n = xs.length;
  if (n < 2) return [0];
  const d: number[] = [];
  for (let k = 0; k < n - 1; k++) d.push((ys[k + 1] - ys[k]) / (xs[k + 1] - xs[k]));
  const m: number[] = [d[0]];
  for (let k = 1; k < n - 1; k++) m.push(d[k - 1] * d[k] <= 0 ? 0 : 0.5 * (d[k - 1] + d[k]));
  m.push(d[n - 2]);
  for (let k = 0; k < n - 1; k++) {
    if (d[k] === 0) {
      m[k] = 0;
      m[k + 1] = 0;
      continue;
    }
    const a = Math.max(0, m[k] / d[k]);
    const b = Math.max(0, m[k + 1] / d[k]);
    m[k] = a * d[k];
    m[k + 1] = b * d[k];
    const r = Math.hypot(a, b);
    if (r > 3) {
      m[k] = (3 / r) * a * d[k];
      m[k + 1] = (3 / r) * b * d[k];
    }
  }
  return m;
}
