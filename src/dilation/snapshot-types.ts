// What the game sends each frame, and what the mapping returns per voice.
import type { Hz, MetersPerSecond, Meters, Seconds, Vec3Like } from '../units';
import type { Easing } from '../tuning';

/** Listener state in one snapshot. velocity is optional: estimated from positions when absent. */
export interface ListenerState {
  position: Vec3Like;
  /** Unit-length forward direction (three.js camera looks down −z). */
  forward: Vec3Like;
  /** Unit-length up direction. */
  up: Vec3Like;
  velocity?: Vec3Like;
}

/** One positioned sound source in one snapshot. */
export interface SourceState {
  /** Stable id chosen by the game (voices refer to it). */
  id: number;
  position: Vec3Like;
  /** Optional explicit velocity (m/s, wall clock); estimated from positions when absent. */
  velocity?: Vec3Like;
}

/** A gameplay snapshot, sent once per animation frame. */
export interface GameplaySnapshot {
  /** Wall-clock time of the snapshot in seconds (the audio context's currentTime domain). */
  time: Seconds;
  /** Current global time scale (≥ 0; non-finite or negative is clamped to 0 and counted). */
  timeScale: number;
  listener: ListenerState;
  sources: SourceState[];
}

/** Per-voice targets that the engine smooths towards. */
export interface VoiceTargets {
  /** Playback ratio = base × pitch(s) × doppler, inside the resampler range (0, 4]. */
  ratio: number;
  /** Dilation-tone cutoff; ≥ OPEN_CUTOFF_HZ means bypassed. */
  cutoffHz: Hz;
  /** Linear gain from the group's level curve and the voice gain (no spatial part). */
  gain: number;
  /** Equal-power × distance gains for the left and right channel. */
  left: number;
  right: number;
  /** Diagnostics for monitors: Doppler ratio alone, radial speed (+ toward), distance. */
  doppler: number;
  radialSpeed: MetersPerSecond;
  distance: Meters;
  /**
   * True when the group follows time and base × pitch(s) × Doppler fell below the smallest target ratio
   * (time scale ≈ 0): the engine fades the voice and holds its read head until it thaws.
   */
  frozen?: boolean;
  /**
   * Pitch ratio of a 'stretch' voice's content = base × 2^(stretchPitch(s)/1200) × doppler (0, 4], while `ratio` is
   * its read speed; equal to `ratio` for other policies.
   */
  pitch?: number;
}

/** A time-scale transition request: ramp from the current value to target. */
export interface TimeScaleRequest {
  target: number;
  rampSeconds: Seconds;
  easing: Easing;
  /** Engine time the ramp starts at (default: now). */
  startTime?: Seconds;
}
