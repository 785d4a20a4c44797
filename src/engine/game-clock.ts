// The game clock as a function of engine time: game time G(T) = ∫ s(T) dT, piecewise linear (one slope per rendered
// block, midpoint rule), kept as a bounded history of slope changes so that emission times in the past map to game time.
import type { Seconds } from '../units';

/** Slope changes the clock keeps (a constant time scale needs one; a ramp one per block). */
export const GAME_CLOCK_ENTRIES = 4096;

/** Game time over engine time; allocation-free after construction. */
export class GameClock {
  /** Game time at the end of the last advanced block, s. */
  game: Seconds = 0;
  /** Engine time at the end of the last advanced block, s. */
  time: Seconds = 0;
  private readonly cap: number;
  private readonly t: Float64Array;
  private readonly g: Float64Array;
  private readonly s: Float64Array;
  private first = 0;
  private count = 0;
  private maxSlopeSeen = 1;

  /** Keeps up to `entries` (≥ 2) slope changes. */
  constructor(entries: number = GAME_CLOCK_ENTRIES) {
    this.cap = Math.max(2, Math.floor(entries));
    this.t = new Float64Array(this.cap);
    this.g = new Float64Array(this.cap);
    this.s = new Float64Array(this.cap);
    this.push(0, 0, 1);
  }

  /** Advances from `time` to `end` (engine s) at time scale `scale` (0…4); records a slope change when it differs. */
  advance(end: Seconds, scale: number): void {
    const dt = end - this.time;
    if (!(dt > 0)) return;
    const s = scale >= 0 && scale <= 4 ? scale : 0;
    const last = (this.first + this.count - 1) % this.cap;
    if (this.s[last] !== s) this.push(this.time, this.game, s);
    this.game += s * dt;
    this.time = end;
    if (s > this.maxSlopeSeen) this.maxSlopeSeen = s;
  }

  /** Largest time scale in the history (for bounds on how fast the emission-time equation can change). */
  get maxSlope(): number {
    return this.maxSlopeSeen;
  }

  /** Game time at engine time `T` (s); extrapolated with the first and last slopes outside the history. */
  gameAt(T: Seconds): Seconds {
    const i = this.entryAt(T);
    return this.g[i] + this.s[i] * (T - this.t[i]);
  }

  /** Time scale (dG/dT) at engine time `T`. */
  slopeAt(T: Seconds): number {
    return this.s[this.entryAt(T)];
  }

  private entryAt(T: Seconds): number {
    const cap = this.cap;
    let lo = 0;
    let hi = this.count - 1;
    const lastIdx = (this.first + hi) % cap;
    if (T >= this.t[lastIdx]) return lastIdx;
    if (T <= this.t[this.first]) return this.first;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (this.t[(this.first + mid) % cap] <= T) lo = mid;
      else hi = mid;
    }
    return (this.first + lo) % cap;
  }

  private push(T: Seconds, G: Seconds, s: number): void {
    let idx: number;
    if (this.count < this.cap) idx = (this.first + this.count++) % this.cap;
    else {
      idx = this.first;
      this.first = (this.first + 1) % this.cap;
    }
    this.t[idx] = T;
    this.g[idx] = G;
    this.s[idx] = s;
  }
}
