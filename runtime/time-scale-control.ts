// The time scale as the main thread sees it: the same transition the worklet runs, on a clock that a world pause
// stops, so `Ralenti.timeScale` reads what the audio thread plays.
import type { Seconds, TimeScaleRequest, Tuning } from '../src/index';
import { MAX_TIME_SCALE } from '../src/tuning/index';
import { PauseClock, TimeFlow } from '../src/dilation/index';
import { RalentiOptionError, checkRange } from './runtime-error';
import type { TimeScaleOptions } from './ralenti-types';

/** The main thread's copy of the time flow and its pause clock. */
export class TimeScaleControl {
  private readonly flow = new TimeFlow({ initial: 1 });
  private readonly pauseClock = new PauseClock();

  /** True while the whole world is paused. */
  get paused(): boolean {
    return this.pauseClock.isPaused;
  }

  /** Time scale at context time `now` (s). */
  valueAt(now: Seconds): number {
    return this.flow.valueAt(this.pauseClock.flowTime(now));
  }

  /** Stops the time flow's clock at context time `now` (a world pause). */
  pause(now: Seconds): void {
    this.pauseClock.pause(now);
  }

  /** Restarts the time flow's clock at context time `now`. */
  resume(now: Seconds): void {
    this.pauseClock.resume(now);
  }

  /**
   * Checks a ramp to `target` (0…4) at context time `now`, with the tuning's ramp and easing where `options` leave them
   * out; throws RalentiOptionError for bad values, else starts it here and returns the request to send (context time).
   */
  ramp(target: number, options: TimeScaleOptions, tuning: Tuning, now: Seconds): TimeScaleRequest {
    checkRange('setTimeScale.target', target, 0, MAX_TIME_SCALE);
    const tf = tuning.timeFlow;
    const rampSeconds = options.ramp ?? (target < this.flow.valueAt(now) ? tf.rampInSeconds : tf.rampOutSeconds);
    checkRange('setTimeScale.ramp', rampSeconds, 0, 60);
    const easing = options.easing ?? tf.easing;
    if (easing !== 'linear' && easing !== 'smooth' && easing !== 'exponential')
      throw new RalentiOptionError('setTimeScale.easing', `expected 'linear', 'smooth' or 'exponential', got ${String(easing)}`);
    const request = { target, rampSeconds, easing, startTime: now };
    this.flow.set({ ...request, startTime: this.pauseClock.requestTime(now, now) }, this.pauseClock.flowTime(now));
    return request;
  }
}
