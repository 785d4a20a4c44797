// Blast guard of the master bus: a leaky energy integrator (one-pole mean square, common practice) that mutes the
// output with a short linear ramp when the mix stays far above full scale or carries a non-finite sample.
import type { Decibels, Hz, Seconds } from '../units';

/** Options of BlastGuard. */
export interface BlastGuardOptions {
  /** Sample rate in Hz (8000…384000). */
  sampleRate: Hz;
}

/** Frozen constants of the guard (not tunable from the panel or a tuning file). */
export const blastGuardDefaults = Object.freeze({
  /** Mean-square level (dBFS, a full-scale sine reads −3) that trips the guard when sustained. */
  tripDb: 24 as Decibels,
  /** Time constant of the mean-square integrator, s: a signal at tripDb + 6 dB trips it in about 10 ms. */
  averageSeconds: 0.05 as Seconds,
  /** Mute ramp, s. */
  muteSeconds: 0.005 as Seconds,
  /** Silence held after the last trip condition, s. */
  holdSeconds: 0.5 as Seconds,
  /** Ramp back in after the hold, s. */
  returnSeconds: 0.05 as Seconds,
});

/** Mutes a stereo mix in place when it blasts; creates no objects (docs/allocation.md); counts trips and non-finite samples. */
export class BlastGuard {
  /** Times the guard has muted the output since construction. */
  trips = 0;
  /** Non-finite samples replaced by 0 since construction. */
  nonFinite = 0;
  /** Current guard gain (0 muted … 1 open). */
  gain = 1;
  private power = 0;
  private hold = 0;
  private readonly keep: number;
  private readonly trip: number;
  private readonly down: number;
  private readonly up: number;
  private readonly holdFrames: number;

  /** Derives per-sample constants from the sample rate. */
  constructor(options: BlastGuardOptions) {
    const sr = options.sampleRate;
    const d = blastGuardDefaults;
    this.keep = Math.exp(-1 / (d.averageSeconds * sr));
    this.trip = Math.pow(10, d.tripDb / 10);
    this.down = 1 / Math.max(1, d.muteSeconds * sr);
    this.up = 1 / Math.max(1, d.returnSeconds * sr);
    this.holdFrames = Math.round(d.holdSeconds * sr);
  }

  /** Whether the output is muted or on its way back in. */
  get muted(): boolean {
    return this.hold > 0 || this.gain < 1;
  }

  /** Guards left/right over [0, n): non-finite samples become 0 and trip the guard; the guard gain is applied. */
  process(left: Float32Array, right: Float32Array, n: number): void {
    const keep = this.keep;
    const fresh = 1 - keep;
    let p = this.power;
    let g = this.gain;
    let hold = this.hold;
    for (let i = 0; i < n; i++) {
      let l = left[i];
      let r = right[i];
      let bad = false;
      if (!(l - l === 0)) {
        l = 0;
        bad = true;
        this.nonFinite++;
      }
      if (!(r - r === 0)) {
        r = 0;
        bad = true;
        this.nonFinite++;
      }
      const e = l * l > r * r ? l * l : r * r;
      p = keep * p + fresh * (e < 1e30 ? e : 1e30);
      if (bad || p > this.trip) {
        if (hold === 0) this.trips++;
        hold = this.holdFrames;
      } else if (hold > 0) hold--;
      if (hold > 0) g = g > this.down ? g - this.down : 0;
      else if (g < 1) g = g + this.up < 1 ? g + this.up : 1;
      left[i] = l * g;
      right[i] = r * g;
    }
    this.power = p;
    this.gain = g;
    this.hold = hold;
  }
}
