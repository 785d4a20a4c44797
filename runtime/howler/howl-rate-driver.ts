// Light mode for sounds left on howler: drives howl.rate(ratio, id), throttled and thresholded.
// NOT band-limited: howler sets the browser's playbackRate in steps, so quality is the browser's resampler.
import type { Seconds, Tuning } from '../../src/index';
import { Curve } from '../../src/dilation/index';
import { DEFAULT_GROUP } from '../../src/tuning/index';
import { ratioToCents } from '../../src/dsp/index';
import { checkRange } from '../runtime-error';
import type { HowlLike } from './howler-types';

/** Options of HowlRateDriver. */
export interface HowlRateDriverOptions {
  howl: HowlLike;
  /** Voice id returned by howl.play(). */
  id: number;
  /** Most rate calls per second, 1…30 (default 30): each call re-arms howler's end timer. */
  maxHz?: number;
  /** Smallest change worth sending, in cents, 0…100 (default 5). */
  thresholdCents?: number;
}

/** Frozen defaults of HowlRateDriverOptions. */
export const howlRateDriverDefaults = Object.freeze({ maxHz: 30, thresholdCents: 5 });

/** Lowest playback ratio the driver sends, 1/16 (lower wanted ratios are clamped to it). */
export const HOWL_RATE_MIN = 1 / 16;
/** Highest playback ratio the driver sends, 4 (the engine's maximum). */
export const HOWL_RATE_MAX = 4;

/** Sends a voice's playback ratio to howler at most maxHz times per second and only on changes ≥ thresholdCents. */
export class HowlRateDriver {
  /** Rate calls made so far. */
  calls = 0;
  /** Last ratio sent (1 before the first call). */
  sent = 1;
  private readonly howl: HowlLike;
  private readonly id: number;
  private readonly interval: Seconds;
  private readonly threshold: number;
  private lastTime = -Infinity;

  /** Creates a driver; throws RalentiOptionError for out-of-range options. */
  constructor(options: HowlRateDriverOptions) {
    this.howl = options.howl;
    this.id = options.id;
    this.interval = 1 / checkRange('howlRateDriver.maxHz', options.maxHz ?? howlRateDriverDefaults.maxHz, 1, 30);
    this.threshold = checkRange('howlRateDriver.thresholdCents', options.thresholdCents ?? howlRateDriverDefaults.thresholdCents, 0, 100);
  }

  /** Offers the wanted ratio at wall-clock `time` (s); returns true when howl.rate was called. Non-finite ratios are ignored. */
  update(ratio: number, time: Seconds): boolean {
    if (!Number.isFinite(ratio) || ratio <= 0) return false;
    const r = ratio < HOWL_RATE_MIN ? HOWL_RATE_MIN : ratio > HOWL_RATE_MAX ? HOWL_RATE_MAX : ratio;
    if (time - this.lastTime < this.interval) return false;
    const cents = Math.abs(ratioToCents(r / this.sent));
    if (cents < this.threshold || cents === 0) return false;
    this.howl.rate(r, this.id);
    this.sent = r;
    this.lastTime = time;
    this.calls += 1;
    return true;
  }
}

const curves = new WeakMap<object, Curve>();

/**
 * Speed multiplier of `group` at `timeScale` (0…4) from the tuning's pitch curve: 1 for exempt and tone-only groups;
 * an unknown name falls back to the `effects` group, as in the engine.
 */
export function groupSpeed(tuning: Tuning, group: string, timeScale: number): number {
  const own = (name: string) => (Object.prototype.hasOwnProperty.call(tuning.groups, name) ? tuning.groups[name] : undefined);
  const g = own(group) ?? own(DEFAULT_GROUP);
  if (!g || g.policy !== 'follow-time') return 1;
  let c = curves.get(g.pitch);
  if (!c) curves.set(g.pitch, (c = new Curve(g.pitch)));
  return c.evaluate(timeScale);
}
