// YIN fundamental-frequency estimator (A. de Cheveigné & H. Kawahara, J. Acoust. Soc. Am. 111(4), 1917–1930, 2002):
// difference function, cumulative mean normalised difference, absolute threshold, parabolic interpolation (steps 2–5),
// then a local refinement of our own: a parabola through the band-limited difference at ±0.1 sample around the estimate.
import type { Hz, Seconds } from '../units';
import { DifferenceFunction } from './difference-function';
import { FractionalLagDifference } from './fractional-lag';

/** Options of a YinEstimator; all capacities follow from these at construction. */
export interface YinOptions {
  /** Sample rate of the analysed signal in Hz (> 0). */
  sampleRate: Hz;
  /** Integration window W in seconds (default 0.03); at least about two periods of minHz is advisable. */
  windowSeconds?: Seconds;
  /** Absolute threshold on the normalised difference d′, 0…1 (default 0.1, the paper's suggestion). */
  threshold?: number;
  /** Lowest frequency searched in Hz (default 50). */
  minHz?: Hz;
  /** Highest frequency searched in Hz (default 4000, below sampleRate/4). */
  maxHz?: Hz;
  /** Refine the period on the band-limited difference function (default true). */
  refine?: boolean;
}

/** Frozen defaults of YinOptions. */
export const yinDefaults = Object.freeze({
  windowSeconds: 0.03,
  threshold: 0.1,
  minHz: 50,
  maxHz: 4000,
  refine: true,
});

const REFINE_STEP = 0.1;
const SILENCE_ENERGY_PER_SAMPLE = 1e-12;

/** Frame-by-frame YIN estimator with preallocated buffers: estimate() never allocates. */
export class YinEstimator {
  /** Sample rate in Hz. */
  readonly sampleRate: Hz;
  /** Integration window W in samples. */
  readonly windowFrames: number;
  /** Smallest and largest integer lags searched, in samples. */
  readonly minLag: number;
  readonly maxLag: number;
  /** Samples read from the offset on by estimate(): W + maxLag + kernel reach. */
  readonly frameFrames: number;
  /** Absolute threshold on d′. */
  readonly threshold: number;
  /** Last estimate: frequency in Hz (NaN when none). */
  frequency: Hz = NaN;
  /** Last estimate: period in samples (NaN when none). */
  period = NaN;
  /** Last estimate: 1 − d′ at the chosen lag, 0…1 (0 when none). */
  periodicity = 0;
  private readonly refine: boolean;
  private readonly diff: DifferenceFunction;
  private readonly fine: FractionalLagDifference;
  private readonly d: Float64Array;
  private readonly dn: Float64Array;

  /** Validates options and allocates every buffer. */
  constructor(options: YinOptions) {
    const sr = options.sampleRate;
    if (!(sr > 0)) throw new RangeError('sampleRate must be > 0');
    const minHz = options.minHz ?? yinDefaults.minHz;
    const maxHz = options.maxHz ?? yinDefaults.maxHz;
    if (!(minHz > 0) || !(maxHz > minHz) || !(maxHz <= sr / 4)) {
      throw new RangeError('need 0 < minHz < maxHz ≤ sampleRate/4');
    }
    this.sampleRate = sr;
    this.threshold = options.threshold ?? yinDefaults.threshold;
    this.refine = options.refine ?? yinDefaults.refine;
    this.windowFrames = Math.max(1, Math.round((options.windowSeconds ?? yinDefaults.windowSeconds) * sr));
    this.minLag = Math.max(2, Math.floor(sr / maxHz));
    this.maxLag = Math.ceil(sr / minHz) + 1;
    this.diff = new DifferenceFunction({ windowFrames: this.windowFrames, maxLag: this.maxLag });
    this.fine = new FractionalLagDifference({ windowFrames: this.windowFrames });
    this.frameFrames = this.windowFrames + this.maxLag + (this.refine ? this.fine.halfTaps + 1 : 0);
    this.d = new Float64Array(this.maxLag + 1);
    this.dn = new Float64Array(this.maxLag + 1);
  }

  /**
   * Estimates the period of signal[offset … offset + frameFrames); true when periodic (fields updated),
   * false on silence or aperiodic input (no d′ dip below the threshold inside the lag range).
   */
  estimate(signal: ArrayLike<number>, offset: number): boolean {
    this.frequency = NaN;
    this.period = NaN;
    this.periodicity = 0;
    const d = this.d;
    const dn = this.dn;
    const e0 = this.diff.compute(signal, offset, d);
    if (!(e0 > SILENCE_ENERGY_PER_SAMPLE * this.windowFrames)) return false;
    // Step 3: cumulative mean normalised difference d′(τ) = d(τ)·τ / Σ_{j=1..τ} d(j), d′(0) = 1.
    dn[0] = 1;
    let sum = 0;
    for (let tau = 1; tau <= this.maxLag; tau++) {
      sum += d[tau];
      dn[tau] = sum > 0 ? (d[tau] * tau) / sum : 1;
    }
    // Step 4: first lag under the threshold, then down to its local minimum.
    let tau = -1;
    for (let t = this.minLag; t < this.maxLag; t++) {
      if (dn[t] < this.threshold) {
        while (t + 1 < this.maxLag && dn[t + 1] < dn[t]) t++;
        tau = t;
        break;
      }
    }
    if (tau < 0 || tau >= this.maxLag - 1 || dn[tau - 1] < dn[tau]) return false;
    // Step 5: parabolic interpolation of d′ around the minimum.
    const a = dn[tau - 1];
    const b = dn[tau];
    const c = dn[tau + 1];
    const curvature = a - 2 * b + c;
    let period = tau + (curvature > 0 ? (0.5 * (a - c)) / curvature : 0);
    if (this.refine) period = this.refinePeriod(signal, offset, period);
    this.period = period;
    this.frequency = this.sampleRate / period;
    this.periodicity = Math.min(1, Math.max(0, 1 - b));
    return true;
  }

  /** Signal offset (samples, from the frame start) that the last estimate describes: mid-window, mid-lag. */
  centreOffset(): number {
    const p = Number.isNaN(this.period) ? 0 : this.period;
    return (this.windowFrames - 1) / 2 + p / 2;
  }

  private refinePeriod(signal: ArrayLike<number>, offset: number, guess: number): number {
    const h = REFINE_STEP;
    if (guess - h < 1) return guess;
    const lo = this.fine.evaluate(signal, offset, guess - h);
    const mid = this.fine.evaluate(signal, offset, guess);
    const hi = this.fine.evaluate(signal, offset, guess + h);
    const curvature = lo - 2 * mid + hi;
    if (!(curvature > 0)) return guess;
    const shift = (0.5 * h * (lo - hi)) / curvature;
    return Math.abs(shift) <= 2 * h ? guess + shift : guess;
  }
}

/** Result of a single-frame pitch estimate. */
export interface PitchEstimate {
  /** Fundamental frequency in Hz. */
  frequency: Hz;
  /** 1 − d′ at the chosen lag, 0…1 (1 = perfectly periodic). */
  periodicity: number;
}

/** Options of yinPitch: YinOptions without sampleRate; the window defaults to the whole frame. */
export type YinPitchOptions = Omit<YinOptions, 'sampleRate'>;

/**
 * YIN estimate of one frame (allocates an estimator; use YinEstimator or trackPitch for many frames).
 * Uses the longest window the frame allows unless windowSeconds is given; null when aperiodic or silent.
 */
export function yinPitch(frame: Float32Array | Float64Array, sampleRate: Hz, options: YinPitchOptions = {}): PitchEstimate | null {
  const probe = new YinEstimator({ ...options, sampleRate, windowSeconds: 1 / sampleRate });
  const reach = probe.frameFrames - probe.windowFrames;
  const windowSeconds = options.windowSeconds ?? (frame.length - reach) / sampleRate;
  if (!(windowSeconds * sampleRate >= 1) || frame.length - reach < Math.round(windowSeconds * sampleRate)) {
    throw new RangeError(`frame too short: need more than ${reach} samples for minHz ${options.minHz ?? yinDefaults.minHz}`);
  }
  const yin = new YinEstimator({ ...options, sampleRate, windowSeconds });
  return yin.estimate(frame, 0) ? { frequency: yin.frequency, periodicity: yin.periodicity } : null;
}
