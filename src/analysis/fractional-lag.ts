// Difference at a fractional lag, D(τ) = Σ_{j<W} (x_j − x(j+τ))², with x(t) rebuilt by band-limited interpolation
// through a Kaiser-windowed sinc (J. O. Smith, "Digital Audio Resampling Home Page", CCRMA; docs/references.md §3b).
import { besselI0, kaiserAt } from '../dsp';

/** Options of a FractionalLagDifference. */
export interface FractionalLagOptions {
  /** Integration window W in samples, ≥ 1. */
  windowFrames: number;
  /** Kernel half-width in taps (zero crossings each side), 2…64; default 16. */
  halfTaps?: number;
  /** Kaiser shape β of the kernel window, 0…20; default 8. */
  beta?: number;
}

const defaults = Object.freeze({ halfTaps: 16, beta: 8 });

/** Evaluates the YIN difference function between integer lags, for sub-sample period refinement. */
export class FractionalLagDifference {
  /** Integration window W in samples. */
  readonly windowFrames: number;
  /** Kernel half-width in taps: the evaluation reads halfTaps samples past W + lag. */
  readonly halfTaps: number;
  private readonly beta: number;
  private readonly i0Beta: number;
  private readonly kernel: Float64Array;

  /** Allocates the kernel scratch once. */
  constructor(options: FractionalLagOptions) {
    this.windowFrames = Math.floor(options.windowFrames);
    this.halfTaps = Math.min(64, Math.max(2, Math.floor(options.halfTaps ?? defaults.halfTaps)));
    this.beta = options.beta ?? defaults.beta;
    this.i0Beta = besselI0(this.beta);
    this.kernel = new Float64Array(2 * this.halfTaps);
  }

  /**
   * D(lag) for signal[offset …] at a fractional lag ≥ 1 in samples; the kernel narrows when fewer than halfTaps
   * samples precede it, and samples past the signal's end read as 0.
   */
  evaluate(signal: ArrayLike<number>, offset: number, lag: number): number {
    const whole = Math.floor(lag);
    const h = Math.max(1, Math.min(this.halfTaps, whole + offset + 1));
    const mu = lag - whole;
    const kernel = this.kernel;
    // Tap m (m = −h+1 … h) weights x_{j+whole+m}: h(m − μ) = sinc(m − μ)·kaiser((m − μ)/h).
    for (let m = -h + 1; m <= h; m++) {
      const t = m - mu;
      const s = t === 0 ? 1 : Math.sin(Math.PI * t) / (Math.PI * t);
      kernel[m + h - 1] = s * kaiserAt(t / h, this.beta, this.i0Beta);
    }
    const w = this.windowFrames;
    const n = signal.length;
    const first = offset + whole - h + 1;
    const last = offset + w - 1 + whole + h;
    let sum = 0;
    if (offset >= 0 && first >= 0 && last < n && offset + w <= n) {
      for (let j = 0; j < w; j++) {
        const base = first + j;
        let y = 0;
        for (let k = 0; k < 2 * h; k++) y += kernel[k] * signal[base + k];
        const e = signal[offset + j] - y;
        sum += e * e;
      }
      return sum;
    }
    for (let j = 0; j < w; j++) {
      const base = first + j;
      let y = 0;
      for (let k = 0; k < 2 * h; k++) {
        const i = base + k;
        if (i >= 0 && i < n) y += kernel[k] * signal[i];
      }
      const i0 = offset + j;
      const e = (i0 >= 0 && i0 < n ? signal[i0] : 0) - y;
      sum += e * e;
    }
    return sum;
  }
}
