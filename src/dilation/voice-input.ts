// What the target mapper takes and its input limits: one voice's input, the mapper's options, the clamp bounds it
// applies (each clamp counted in its stats), and the neutral targets a voice starts from.
import type { Tuning } from '../tuning';
import { OPEN_CUTOFF_HZ } from '../tuning';
import type { Vec3Like } from '../units';
import type { ListenerState, SourceState, VoiceTargets } from './snapshot-types';
import type { SourceSpatial } from './source-spatial';

/** Largest target ratio (the resampler's maximum playback ratio). */
export const MAX_TARGET_RATIO = 4;
/** Smallest target ratio; a follow-time voice whose ratio would fall below it is reported `frozen`. */
export const MIN_TARGET_RATIO = 1 / 1024;
/** Largest voice gain accepted (linear); above is clamped and counted. */
export const MAX_VOICE_GAIN = 16;
/** Coordinates beyond ±1e12 m are treated like non-finite ones (voice heard non-positional). */
export const MAX_COORDINATE = 1e12;
/** Line-of-sight speeds beyond ±1e9 m/s are absurd: clamped to it and counted. */
export const MAX_RADIAL_SPEED = 1e9;
/** Lowest time scale used to turn wall-clock into game-clock velocity (wall ÷ max(s, this)). */
export const GAME_CLOCK_MIN_TIME_SCALE = 0.05;
/** Lowest cutoff target, Hz. */
export const MIN_CUTOFF_HZ = 20;

/** One voice's input to the mapper; velocities are wall-clock m/s. */
export interface VoiceInput {
  /** Global time scale, 0…4 (NaN or negative → 0, counted). */
  timeScale: number;
  /** Group name; unknown names use 'effects' (counted in `unknownGroups`). */
  group: string;
  /** Base ratio (0, 4] (invalid → 1, counted). */
  baseRatio: number;
  /** Voice gain, linear 0…16 (invalid → 0 or 16, counted). */
  gain: number;
  /** Listener with velocity. */
  listener: ListenerState & { velocity: Vec3Like };
  /** Positioned source with velocity, or null for a non-positional voice (centred, gains 1, no Doppler). */
  source: (SourceState & { velocity: Vec3Like }) | null;
  /** The source's own distance model and cone (overriding the tuning's), or null/absent for the tuning's. */
  spatial?: SourceSpatial | null;
}

/** Options of TargetMapper. */
export interface TargetMapperOptions {
  /** A parsed tuning (parseTuning output or defaultTuning). */
  tuning: Tuning;
}

/** Creates a VoiceTargets object with neutral values (allocate once per voice). */
export function createVoiceTargets(): VoiceTargets {
  return { ratio: 1, cutoffHz: OPEN_CUTOFF_HZ, gain: 1, left: 1, right: 1, doppler: 1, radialSpeed: 0, distance: 0, frozen: false, pitch: 1 };
}
