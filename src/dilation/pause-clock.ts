// The game clock of the time flow under pause: engine (or context) time minus the time spent paused, so that a
// time-scale transition holds while the world is paused and continues where it was on resume.
import type { Seconds } from '../units';

/** Maps host time to time-flow time, stopping while paused; a pure function of the pause/resume calls. */
export class PauseClock {
  /** A running clock with no time paused. */
  constructor() {
    this.pausedAt = 0;
    this.offset = 0;
  }

  private pausedAt: Seconds = 0.5;
  private offset: Seconds = 0.5;
  private paused = false;

  /** True while paused. */
  get isPaused(): boolean {
    return this.paused;
  }

  /** Stops the clock at host time `now` (s); a second pause is ignored. */
  pause(now: Seconds): void {
    if (this.paused || !Number.isFinite(now)) return;
    this.paused = true;
    this.pausedAt = now;
  }

  /** Restarts the clock at host time `now` (s) from where it stopped; ignored when not paused. */
  resume(now: Seconds): void {
    if (!this.paused) return;
    this.paused = false;
    if (Number.isFinite(now) && now > this.pausedAt) this.offset += now - this.pausedAt;
  }

  /** Time-flow time at host time `t` (s): t minus the paused time, held at the pause instant while paused. */
  flowTime(t: Seconds): Seconds {
    this.host = t;
    this.mapHost();
    return this.flow;
  }

  /** The host time `mapHost` reads, s (a field declared with a double). */
  host = 0.5;
  /** The time-flow time `mapHost` wrote, s: flowTime(host). */
  flow = 0.5;

  /** `flowTime` of the `host` field into the `flow` field (no double passed or returned: docs/allocation.md). */
  mapHost(): void {
    const t = this.host;
    if (this.paused && t > this.pausedAt) this.flow = this.pausedAt - this.offset;
    else this.flow = t - this.offset;
  }

  /** Host time `t` (s) of a request → time-flow time: a request made while paused starts when the clock runs again. */
  requestTime(t: Seconds, now: Seconds): Seconds {
    this.asked = t;
    this.host = now;
    this.mapRequest();
    return this.requested;
  }

  /** The host time of a request `mapRequest` reads, s (made at host time `host`). */
  asked = 0.5;
  /** The time-flow time `mapRequest` wrote, s: requestTime(asked, host). */
  requested = 0.5;

  /**
   * `requestTime` of the `asked` and `host` fields into `requested`, leaving flowTime(host) in `flow`: the render path
   * runs it on every call, so every comparison is made on every pass (a branch first taken after optimisation would
   * deoptimise it; docs/allocation.md).
   */
  mapRequest(): void {
    const t = this.asked;
    const now = this.host;
    this.mapHost();
    const flowNow = this.flow;
    const paused = this.paused;
    const pausedAt = this.pausedAt;
    const offset = this.offset;
    const held = pausedAt - offset;
    const running = t - offset;
    const later = flowNow + (t - now);
    const late = t > pausedAt;
    const ahead = t >= now;
    const flowT = paused && late ? held : running;
    this.requested = paused && ahead ? later : flowT;
  }
}
