// The game clock as a function of engine time: game time G(T) = ∫ s(T) dT, piecewise linear (one slope per rendered
// block, midpoint rule), kept as a bounded history of slope changes so that emission times in the past map to game time.
import type { Seconds } from '../units';

/** Slope changes the clock keeps (a constant time scale needs one; a ramp one per block). */
export const GAME_CLOCK_ENTRIES = 4096;

/** Game time over engine time; creates no objects after construction; its bodies take and return no doubles (docs/allocation.md). */
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
  /** Position in the history (from `first`) of the entry the last search inside it found: where the next starts. */
  private hint = 0;
  private maxSlopeSeen = 1;
  /** Engine time of the next `lookUp`, s: held in a field so that no double crosses the search call (the render path sets it, calls `lookUp` and reads `gameFound`/`slopeFound`). */
  query: Seconds = 0.5;
  /** Time scale of the block being advanced (a field for the same reason). */
  private scale = 0.5;
  /** Slope being recorded by `push`. */
  private slope = 0.5;
  /** Results of the last `lookUp`: game time, s, and slope. */
  gameFound: Seconds = 0.5;
  /** Slope (time scale) found by the last `lookUp`. */
  slopeFound = 0.5;

  /** Keeps up to `entries` (≥ 2) slope changes. */
  constructor(entries: number = GAME_CLOCK_ENTRIES) {
    this.cap = Math.max(2, Math.floor(entries));
    this.t = new Float64Array(this.cap);
    this.g = new Float64Array(this.cap);
    this.s = new Float64Array(this.cap);
    this.slope = 1;
    this.push();
  }

  /** Advances from `time` to `end` (engine s) at time scale `scale` (0…4); records a slope change when it differs. */
  advance(end: Seconds, scale: number): void {
    this.query = end;
    this.scale = scale;
    this.step();
  }

  /** Largest time scale in the history (for bounds on how fast the emission-time equation can change). */
  get maxSlope(): number {
    return this.maxSlopeSeen;
  }

  /** Game time (extrapolated with the first and last slopes outside the history) and slope (dG/dT) at engine time `query`, into `gameFound` and `slopeFound` (fields: no boxed return). */
  lookUp(): void {
    const i = this.entry();
    this.gameFound = this.g[i] + this.s[i] * (this.query - this.t[i]);
    this.slopeFound = this.s[i];
  }

  /**
   * History entry holding engine time `query` (an integer index: returned without boxing). Inside the history it is the
   * one entry k with t[k] ≤ T < t[k + 1] (the times never decrease), so any bracket [lo, hi] with t[lo] ≤ T < t[hi]
   * leads the bisection to it: the bracket starts around the entry found last, widened in doubling steps (successive
   * look-ups — a solve's iterations, sources in turn — fall close together), which finds the same entry in fewer steps.
   */
  private entry(): number {
    const T = this.query;
    const cap = this.cap;
    const first = this.first;
    const t = this.t;
    let lo = 0;
    let hi = this.count - 1;
    const lastIdx = (first + hi) % cap;
    if (T >= t[lastIdx]) return lastIdx;
    if (T <= t[first]) return first;
    const h = this.hint;
    if (h < hi) {
      if (t[(first + h) % cap] <= T) {
        lo = h;
        for (let step = 1; h + step < hi; step += step) {
          if (t[(first + h + step) % cap] <= T) lo = h + step;
          else {
            hi = h + step;
            break;
          }
        }
      } else if (T < t[(first + h) % cap]) {
        hi = h;
        for (let step = 1; h - step > 0; step += step) {
          if (T < t[(first + h - step) % cap]) hi = h - step;
          else {
            lo = h - step;
            break;
          }
        }
      }
    }
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (t[(first + mid) % cap] <= T) lo = mid;
      else hi = mid;
    }
    this.hint = lo;
    return (first + lo) % cap;
  }

  /** The body of `advance`: doubles arrive in fields, none is passed to a call (docs/allocation.md). */
  private step(): void {
    const end = this.query;
    const dt = end - this.time;
    if (!(dt > 0)) return;
    const scale = this.scale;
    const s = scale >= 0 && scale <= 4 ? scale : 0;
    const last = (this.first + this.count - 1) % this.cap;
    if (this.s[last] !== s) {
      this.slope = s;
      this.push();
    }
    this.game += s * dt;
    this.time = end;
    if (s > this.maxSlopeSeen) this.maxSlopeSeen = s;
  }

  /** Records a slope change: `slope` from engine time `time`, game time `game` on. */
  private push(): void {
    let idx: number;
    if (this.count < this.cap) idx = (this.first + this.count++) % this.cap;
    else {
      idx = this.first;
      this.first = (this.first + 1) % this.cap;
    }
    this.t[idx] = this.time;
    this.g[idx] = this.game;
    this.s[idx] = this.slope;
  }
}
