// Safety peak limiter: soft-knee gain computer with an infinite ratio and smooth-branching release
// (Giannoulis, Massberg & Reiss, "Digital Dynamic Range Compressor Design — A Tutorial and Analysis", JAES 60(6), 2012).
import type { Decibels, Hz, Seconds } from '../units';

/** Options of PeakLimiter. */
export interface PeakLimiterOptions {
  /** Sample rate in Hz (8000…192000). */
  sampleRate: Hz;
  /** Output ceiling in dBFS (−24…0), default −1. */
  ceilingDb?: Decibels;
  /** Knee width in dB (0…12), default 4: limiting starts softly this far below the ceiling. */
  kneeDb?: Decibels;
  /** Release time constant in seconds (0.001…2), default 0.08. */
  releaseSeconds?: Seconds;
}

/** Frozen defaults of PeakLimiter. */
export const peakLimiterDefaults = Object.freeze({ ceilingDb: -1, kneeDb: 4, releaseSeconds: 0.08 });

/**
 * Stereo peak limiter with instant attack (no overshoot, no lookahead latency) and exponential release.
 * Non-finite samples become 0 (counted); with `enabled` false only that sanitising is done.
 */
export class PeakLimiter {
  /** Whether limiting is applied (sanitising of non-finite samples always is). */
  enabled = true;
  /** Non-finite samples replaced by 0 since construction. */
  nonFinite = 0;
  /** Current gain (linear, ≤ 1). */
  gain = 1;
  private ceiling = 1;
  private kneeStart = 1;
  private ceilingDb = -1;
  private kneeDb = 4;
  private release = 0;

  /** Creates a limiter; values outside the ranges are clamped. */
  constructor(options: PeakLimiterOptions) {
    this.setCeiling(options.ceilingDb ?? peakLimiterDefaults.ceilingDb, options.kneeDb ?? peakLimiterDefaults.kneeDb);
    const r = Math.min(2, Math.max(0.001, options.releaseSeconds ?? peakLimiterDefaults.releaseSeconds));
    this.release = Math.exp(-1 / (r * options.sampleRate));
  }

  /** Sets the ceiling (dBFS, −24…0) and knee width (dB, 0…12). */
  setCeiling(ceilingDb: Decibels, kneeDb: Decibels = this.kneeDb): void {
    this.ceilingDb = Number.isFinite(ceilingDb) ? Math.min(0, Math.max(-24, ceilingDb)) : -1;
    this.kneeDb = Number.isFinite(kneeDb) ? Math.min(12, Math.max(0, kneeDb)) : 4;
    this.ceiling = Math.pow(10, this.ceilingDb / 20);
    this.kneeStart = Math.pow(10, (this.ceilingDb - this.kneeDb) / 20);
  }

  /** Static curve: output level in dB for input level `x` dB (soft knee of width W ending at the ceiling). */
  curveDb(x: Decibels): Decibels {
    const w = this.kneeDb;
    const t = this.ceilingDb - w / 2; // threshold: the knee spans t − W/2 … t + W/2 = ceiling
    if (x <= t - w / 2) return x;
    if (w > 0 && x < t + w / 2) return x - ((x - t + w / 2) * (x - t + w / 2)) / (2 * w);
    return t;
  }

  /** Gain reduction now, in dB (≤ 0). */
  get reductionDb(): Decibels {
    return this.gain >= 1 ? 0 : 20 * Math.log10(this.gain);
  }

  /** Limits left/right in place over [offset, offset + frames). */
  process(left: Float32Array, right: Float32Array, offset: number, frames: number): void {
    const end = offset + frames;
    const ceiling = this.ceiling;
    const kneeStart = this.kneeStart;
    const rel = this.release;
    let g = this.gain;
    for (let i = offset; i < end; i++) {
      let l = left[i];
      let r = right[i];
      if (!(l - l === 0)) {
        l = 0;
        this.nonFinite++;
      }
      if (!(r - r === 0)) {
        r = 0;
        this.nonFinite++;
      }
      if (!this.enabled) {
        left[i] = l;
        right[i] = r;
        continue;
      }
      const al = l < 0 ? -l : l;
      const ar = r < 0 ? -r : r;
      const x = al > ar ? al : ar;
      let target = 1;
      if (x > kneeStart) {
        const xdb = 20 * Math.log10(x);
        target = Math.pow(10, (this.curveDb(xdb) - xdb) / 20);
      }
      if (target < g) g = target;
      else if (g < 1) {
        g = target + (g - target) * rel;
        if (g > 0.9999999) g = 1;
      }
      l *= g;
      r *= g;
      // Guard against rounding: never above the ceiling.
      left[i] = l > ceiling ? ceiling : l < -ceiling ? -ceiling : l;
      right[i] = r > ceiling ? ceiling : r < -ceiling ? -ceiling : r;
    }
    this.gain = g;
  }

  /** Returns to unity gain. */
  reset(): void {
    this.gain = 1;
  }
}
