// Safety peak limiter: soft-knee gain computer with an infinite ratio and smooth-branching release
// (Giannoulis, Massberg & Reiss, "Digital Dynamic Range Compressor Design — A Tutorial and Analysis", JAES 60(6), 2012).
import type { Decibels, Hz, Seconds } from '../units';
import { dbToGain, gainToDb } from '../dsp';

/** Options of PeakLimiter. */
export interface PeakLimiterOptions {
  /** Sample rate in Hz (8000…192000). */
  sampleRate: Hz;
  /** Output ceiling in dBFS (−24…0), default −1. */
  ceilingDb?: Decibels;
  /** Knee width in dB (0…12), default 4: the knee is centred on the ceiling, so limiting starts softly half of it below. */
  kneeDb?: Decibels;
  /** Release time constant in seconds (0.001…2), default 0.08. */
  releaseSeconds?: Seconds;
}

/** Frozen defaults of PeakLimiter. */
export const peakLimiterDefaults = Object.freeze({ ceilingDb: -1, kneeDb: 4, releaseSeconds: 0.08 });

/**
 * Stereo sample-peak limiter with instant attack (look-ahead 0: no overshoot, no latency) and exponential release.
 * The ceiling: with `enabled`, no sample leaves above `ceilingDb` (sample peaks; a final clamp catches rounding).
 * Peaks from ceiling − knee/2 to ceiling + knee/2 are reduced softly and leave below the ceiling; louder ones leave
 * exactly at it. Non-finite samples become 0 (counted). With `enabled` false the tuning's ceiling does not apply, but
 * a hard ceiling at 0 dBFS still holds (samples beyond it are clipped and counted in `hardClips`).
 */
export class PeakLimiter {
  /** Whether limiting is applied (sanitising of non-finite samples always is). */
  enabled = true;
  /** Non-finite samples replaced by 0 since construction. */
  nonFinite = 0;
  /** Samples clipped to ±1 (0 dBFS) while limiting was off, since construction. */
  hardClips = 0;
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
    this.ceiling = dbToGain(this.ceilingDb);
    this.kneeStart = dbToGain(this.ceilingDb - this.kneeDb / 2);
  }

  /** Static curve: output level in dB for input level `x` dB (soft knee of width W centred on the ceiling, ratio ∞). */
  curveDb(x: Decibels): Decibels {
    const w = this.kneeDb;
    // Threshold T = ceiling: with an infinite ratio the knee's output rises to T and stays there, so the output
    // settles at the ceiling. (Placing T at ceiling − W/2 made a −1 dBFS ceiling settle at −3 dBFS.)
    const t = this.ceilingDb;
    if (x <= t - w / 2) return x;
    if (w > 0 && x < t + w / 2) return x - ((x - t + w / 2) * (x - t + w / 2)) / (2 * w);
    return t;
  }

  /** Gain reduction now, in dB (≤ 0). */
  get reductionDb(): Decibels {
    return this.gain >= 1 ? 0 : gainToDb(this.gain);
  }

  /** Limits left/right in place over [offset, offset + frames). */
  process(left: Float32Array, right: Float32Array, offset: number, frames: number): void {
    const end = offset + frames;
    const ceiling = this.ceiling;
    const kneeStart = this.kneeStart;
    const rel = this.release;
    const t = this.ceilingDb;
    const w = this.kneeDb;
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
        // Hard ceiling at 0 dBFS: cannot be switched off.
        if (l > 1 || l < -1) {
          l = l > 1 ? 1 : -1;
          this.hardClips++;
        }
        if (r > 1 || r < -1) {
          r = r > 1 ? 1 : -1;
          this.hardClips++;
        }
        left[i] = l;
        right[i] = r;
        continue;
      }
      const al = l < 0 ? -l : l;
      const ar = r < 0 ? -r : r;
      const x = al > ar ? al : ar;
      let target = 1;
      if (x > kneeStart) {
        // curveDb(xdb) written out: a call taking and returning doubles boxes them where V8 does not inline it.
        const xdb = gainToDb(x);
        const ydb = xdb <= t - w / 2 ? xdb : w > 0 && xdb < t + w / 2 ? xdb - ((xdb - t + w / 2) * (xdb - t + w / 2)) / (2 * w) : t;
        target = dbToGain(ydb - xdb);
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
