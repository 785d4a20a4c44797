// Pitch track over time: YIN (de Cheveigné & Kawahara, JASA 111(4) 2002) on hop-spaced frames, each estimate
// stamped at the centre of the span it compares (mid-window plus half the period).
import type { Hz, Seconds } from '../units';
import { YinEstimator, type YinOptions } from './yin';

/** Options of a PitchTracker: YinOptions plus the hop between frames. */
export interface PitchTrackerOptions extends YinOptions {
  /** Hop between frame starts in seconds (default 0.01); at least one sample. */
  hopSeconds?: Seconds;
}

/** A pitch track: parallel arrays, one entry per frame. */
export interface PitchTrack {
  /** Time each estimate describes, in seconds from the signal start (increasing). */
  times: Float64Array;
  /** Fundamental frequency in Hz; NaN where no pitch was found (aperiodic or silent). */
  frequencies: Float64Array;
  /** 1 − d′ at the chosen lag, 0…1; 0 where no pitch was found. */
  periodicities: Float64Array;
}

/** Frozen defaults of PitchTrackerOptions beyond YinOptions. */
export const pitchTrackerDefaults = Object.freeze({ hopSeconds: 0.01 });

/** Tracks pitch over a whole signal with one preallocated YIN estimator (no allocation per frame). */
export class PitchTracker {
  /** Hop between frames in samples. */
  readonly hopFrames: number;
  /** Sample rate in Hz. */
  readonly sampleRate: Hz;
  private readonly yin: YinEstimator;

  /** Builds the estimator and its buffers once. */
  constructor(options: PitchTrackerOptions) {
    this.yin = new YinEstimator(options);
    this.sampleRate = options.sampleRate;
    this.hopFrames = Math.max(1, Math.round((options.hopSeconds ?? pitchTrackerDefaults.hopSeconds) * options.sampleRate));
  }

  /** Samples one frame reads (window + lag range + interpolation reach). */
  get frameFrames(): number {
    return this.yin.frameFrames;
  }

  /** Number of frames a signal of `length` samples yields (0 when shorter than one frame). */
  frameCount(length: number): number {
    const span = length - this.yin.frameFrames;
    return span < 0 ? 0 : Math.floor(span / this.hopFrames) + 1;
  }

  /** Tracks `signal`; writes into `out` when its arrays are long enough (reused), else allocates a new track. */
  track(signal: Float32Array | Float64Array, out?: PitchTrack): PitchTrack {
    const count = this.frameCount(signal.length);
    const track =
      out && out.times.length >= count && out.frequencies.length >= count && out.periodicities.length >= count
        ? out
        : { times: new Float64Array(count), frequencies: new Float64Array(count), periodicities: new Float64Array(count) };
    const yin = this.yin;
    const sr = this.sampleRate;
    const idleCentre = (yin.windowFrames - 1) / 2;
    for (let i = 0; i < count; i++) {
      const offset = i * this.hopFrames;
      const found = yin.estimate(signal, offset);
      track.times[i] = (offset + (found ? yin.centreOffset() : idleCentre)) / sr;
      track.frequencies[i] = found ? yin.frequency : NaN;
      track.periodicities[i] = found ? yin.periodicity : 0;
    }
    return track;
  }
}

/** Tracks the pitch of a mono signal at `sampleRate` Hz; see PitchTrackerOptions for the defaults. */
export function trackPitch(
  signal: Float32Array | Float64Array,
  sampleRate: Hz,
  options: Omit<PitchTrackerOptions, 'sampleRate'> = {},
): PitchTrack {
  return new PitchTracker({ ...options, sampleRate }).track(signal);
}
