// The audio thread's render load: time spent in process() and in message handling against the audio time rendered,
// as a running average, plus the longest single call since the last report.
import type { RenderLoad } from '../protocol';

/** A millisecond clock for timing process(), and its name (reported with the load). */
export interface RenderClock {
  /** 'performance.now' or 'Date.now'. */
  name: string;
  /** Current time in milliseconds (any origin). */
  now: () => number;
}

/** Time constant of the render-load average in seconds of audio: long enough to average Date.now's 1 ms steps. */
const LOAD_AVERAGE_SECONDS = 1;

/** Sums busy and audio time between reports and folds them into an exponentially weighted average. */
export class RenderLoadMeter {
  /** Milliseconds in process() and of audio rendered since the last report. */
  private busyMs = 0;
  private audioMs = 0;
  /** Exponentially weighted sums of the same (time constant LOAD_AVERAGE_SECONDS); their ratio is the load. */
  private busyAvgMs = 0;
  private audioAvgMs = 0;
  /** Longest single call (process or message) since the last report, ms. */
  private peakMs = 0;

  /** `clock`: the clock that times the calls (its name goes out with the load). */
  constructor(readonly clock: RenderClock) {}

  /** Counts `elapsed` ms of audio-thread work (one call); a clock step backwards or a huge jump is not render time. */
  addBusy(elapsed: number): void {
    if (!(elapsed > 0 && elapsed < 1e4)) return;
    this.busyMs += elapsed;
    if (elapsed > this.peakMs) this.peakMs = elapsed;
  }

  /** Counts `ms` of audio rendered. */
  addAudio(ms: number): void {
    this.audioMs += ms;
  }

  /** Folds the time since the last report into the running average; null before any audio. */
  take(): RenderLoad | null {
    if (this.audioMs <= 0) return null;
    const keep = Math.exp(-this.audioMs / (1000 * LOAD_AVERAGE_SECONDS));
    this.busyAvgMs = this.busyAvgMs * keep + this.busyMs;
    this.audioAvgMs = this.audioAvgMs * keep + this.audioMs;
    this.busyMs = 0;
    this.audioMs = 0;
    const peakMs = this.peakMs;
    this.peakMs = 0;
    return { fraction: this.busyAvgMs / this.audioAvgMs, clock: this.clock.name, averageSeconds: LOAD_AVERAGE_SECONDS, peakMs };
  }
}
