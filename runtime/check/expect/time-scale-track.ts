// The checker's own reading of a script's time-scale keys: each key starts a ramp from the value at its time to its
// target over rampSeconds, eased linearly, by smoothstep 3u² − 2u³ (common practice) or by equal ratio per second
// (geometric, with values under 0.01 joined linearly to their end, as the tuning format documents); 0…4 throughout.
// Also the game clock G(t) = ∫ s dt that sound travels on. Written apart from src/dilation on purpose.
import type { Easing } from '../../../src/tuning';

/** One time-scale request as a scene script stores it. */
export interface TimeScaleKeyLike {
  readonly time: number;
  readonly target: number;
  readonly rampSeconds: number;
  readonly easing: Easing;
}

const FLOOR = 0.01;
const GRID = 0.001;

function clamp(s: number): number {
  return s > 0 ? Math.min(s, 4) : 0;
}

function ease(from: number, to: number, u: number, easing: Easing): number {
  if (u <= 0) return from;
  if (u >= 1) return to;
  if (easing === 'smooth') return from + (to - from) * u * u * (3 - 2 * u);
  if (easing === 'exponential') {
    const a = Math.max(from, FLOOR);
    const b = Math.max(to, FLOOR);
    return a * (b / a) ** u + (from - a) * (1 - u) + (to - b) * u;
  }
  return from + (to - from) * u;
}

/** The time scale of a script over scene time (s), and its game clock. */
export class TimeScaleTrack {
  private readonly ramps: { start: number; from: number; to: number; ramp: number; easing: Easing }[] = [];
  private readonly clock: Float64Array;

  /** Builds the track for keys in time order, over scene times 0…duration (s). */
  constructor(keys: readonly TimeScaleKeyLike[], duration: number) {
    for (const k of keys) {
      const from = this.valueAt(k.time);
      this.ramps.push({ start: k.time, from, to: clamp(k.target), ramp: Math.max(0, k.rampSeconds), easing: k.easing });
    }
    const n = Math.ceil(Math.max(duration, 0) / GRID) + 2;
    this.clock = new Float64Array(n);
    for (let i = 1; i < n; i++) this.clock[i] = this.clock[i - 1] + 0.5 * GRID * (this.valueAt((i - 1) * GRID) + this.valueAt(i * GRID));
  }

  /** Whether no key ever changes the time scale from 1. */
  get constant(): boolean {
    return this.ramps.every((r) => r.to === 1 && r.from === 1);
  }

  /** Time scale at scene time t (s), 0…4. */
  valueAt(t: number): number {
    let k = this.ramps.length - 1;
    while (k >= 0 && this.ramps[k].start > t) k--;
    if (k < 0) return 1;
    const r = this.ramps[k];
    if (r.ramp <= 0) return r.to;
    return ease(r.from, r.to, (t - r.start) / r.ramp, r.easing);
  }

  /** Game clock at scene time t (s): ∫₀ᵗ s dt (t before 0 or after the end continue at the end values). */
  gameTime(t: number): number {
    if (this.constant) return t;
    const x = t / GRID;
    const n = this.clock.length;
    if (x <= 0) return t * this.valueAt(0);
    if (x >= n - 1) return this.clock[n - 1] + (t - (n - 1) * GRID) * this.valueAt(t);
    const i = Math.floor(x);
    return this.clock[i] + (x - i) * (this.clock[i + 1] - this.clock[i]);
  }
}
