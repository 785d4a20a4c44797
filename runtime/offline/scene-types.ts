// The scene script: a JSON document of our own design that describes sounds, moving sources, a
// moving listener, time-scale changes and voices, for the offline renderer and the checker.
import type { Easing } from '../../src/index';

/** A position or vector in metres (or m/s) as [x, y, z]. */
export type Triple = readonly [number, number, number];

/** Noise spectrum: white (flat), pink (−3 dB/octave), brown (−6 dB/octave). */
export type NoiseColour = 'white' | 'pink' | 'brown';

/** A sound of the scene: generated in code, or read from a WAV file. */
export type SoundSpec =
  | { readonly type: 'tone'; readonly frequency: number; readonly seconds: number; readonly gain: number; readonly sampleRate: number | null }
  | {
      readonly type: 'hum';
      readonly frequency: number;
      /** Amplitudes of harmonics 1, 2, 3 … (relative; the sum is normalised to `gain`). */
      readonly partials: readonly number[];
      readonly seconds: number;
      readonly gain: number;
      readonly sampleRate: number | null;
    }
  | { readonly type: 'noise'; readonly colour: NoiseColour; readonly seed: number; readonly seconds: number; readonly gain: number; readonly sampleRate: number | null }
  | { readonly type: 'file'; readonly path: string };

/** Keyframe interpolation: straight segments, or a Catmull–Rom cubic through the keys. */
export type KeyframeInterpolation = 'linear' | 'cubic';

/** How a source or the listener moves over scene time (seconds). */
export type MotionSpec =
  | { readonly type: 'fixed'; readonly position: Triple }
  | { readonly type: 'line'; readonly from: Triple; readonly velocity: Triple; readonly time: number }
  | {
      readonly type: 'circle';
      readonly center: Triple;
      readonly radius: number;
      readonly periodSeconds: number;
      readonly plane: 'xz' | 'xy' | 'yz';
      readonly phaseDegrees: number;
    }
  | { readonly type: 'keyframes'; readonly interpolation: KeyframeInterpolation; readonly keys: readonly MotionKey[] };

/**
 * One key of a keyframed path. `cut: true` marks a jump (a teleport): the path holds the previous key's position,
 * at rest, until this key's time and then continues from here, with no interpolation across the jump.
 */
export interface MotionKey {
  readonly time: number;
  readonly position: Triple;
  readonly cut?: boolean;
}

/** A positioned source. */
export interface SourceSpec {
  readonly motion: MotionSpec;
}

/** The listener: motion plus a fixed orientation. */
export interface ListenerSpec {
  readonly motion: MotionSpec;
  readonly forward: Triple;
  readonly up: Triple;
}

/** A time-scale change starting at `time`. */
export interface TimeScaleKey {
  readonly time: number;
  readonly target: number;
  readonly rampSeconds: number;
  readonly easing: Easing;
}

/** One voice: a sound played from `start` to `stop` (scene seconds), optionally on a source. */
export interface VoiceSpec {
  readonly sound: string;
  readonly source: string | null;
  readonly group: string | null;
  readonly loop: boolean;
  /** Loop region in seconds of the sound (null = whole sound). */
  readonly loopStartSeconds: number | null;
  readonly loopEndSeconds: number | null;
  readonly offsetSeconds: number;
  readonly gain: number;
  readonly ratio: number;
  readonly priority: number | null;
  readonly start: number;
  readonly stop: number | null;
  readonly fadeOutSeconds: number;
  /** Per-play pitch variation [low, high] in cents, or null. */
  readonly pitchRange: readonly [number, number] | null;
  /** Per-play gain variation [low, high] in dB, or null. */
  readonly gainRange: readonly [number, number] | null;
}

/** A parsed scene script (version 1). */
export interface SceneScript {
  readonly version: 1;
  /** Length of the render in seconds. */
  readonly duration: number;
  /** Preferred output rate; the renderer's option overrides it. */
  readonly sampleRate: number;
  /** 'exact': motion derivatives are sent as velocities; 'estimated': the engine estimates them from positions. */
  readonly velocities: 'exact' | 'estimated';
  /** Snapshot rate in Hz (how often a game would send gameplay state). */
  readonly snapshotRate: number;
  /** The tuning as a raw object (parsed by parseTuning), a path relative to the script, or null for the built-in one. */
  readonly tuning: { readonly inline: unknown } | { readonly path: string } | null;
  readonly sounds: Readonly<Record<string, SoundSpec>>;
  readonly sources: Readonly<Record<string, SourceSpec>>;
  readonly listener: ListenerSpec;
  readonly timeScale: readonly TimeScaleKey[];
  readonly voices: readonly VoiceSpec[];
  /** Seed of the per-play variation (integer; default 1): the same script renders the same samples. */
  readonly seed: number;
}
