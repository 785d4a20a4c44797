// The tuning document: everything a designer tunes, as one JSON-serialisable value.
import type { Celsius, Cents, Decibels, Hz, Meters, MetersPerSecond, Seconds } from '../units';

/** Interpolation between curve keys: straight lines, or Fritsch–Carlson monotone cubic. */
export type CurveInterpolation = 'linear' | 'monotone';

/** One curve key; x is the time scale (0…maxTimeScale), y the curve's unit. */
export interface CurveKey {
  readonly x: number;
  readonly y: number;
}

/** A curve of the time scale: keys sorted by strictly increasing x, at least one key. */
export interface CurveSpec {
  readonly interpolation: CurveInterpolation;
  readonly keys: readonly CurveKey[];
}

/**
 * How a group reacts to the time scale.
 * - 'follow-time': speed and pitch follow the pitch curve; tone and level curves apply.
 * - 'exempt': untouched by the time scale (interface sounds).
 * - 'tone-only': speed unchanged; tone and level curves apply (music).
 * - 'stretch': voices advance through their sound at the pitch curve's speed while their pitch follows the
 *   stretchPitch curve (time-scale modification, src/stretch); tone and level curves apply.
 */
export type GroupPolicy = 'follow-time' | 'exempt' | 'tone-only' | 'stretch';

/** What a 'stretch' group does at time scale 0: fade to silence and resume, or hold its sound (grains repeat in place). */
export type StretchFreeze = 'silence' | 'hold';

/** Tuning of one group of sounds. */
export interface GroupTuning {
  readonly policy: GroupPolicy;
  /** time scale → speed multiplier (1 = unchanged), range 0…4 (0 = frozen: the voice holds). */
  readonly pitch: CurveSpec;
  /** time scale → low-pass cutoff in Hz; at or above 20 kHz the filter is bypassed. */
  readonly tone: CurveSpec;
  /** time scale → level in dB (0 = unchanged). */
  readonly level: CurveSpec;
  /** Whether positioned voices of this group move with their sources (false: no delay and no Doppler, as motion 'off'). */
  readonly doppler: boolean;
  /** How positioned voices hear motion (when `doppler` is true); absent in older files: 'propagation'. */
  readonly motion: MotionModel;
  /** Stealing priority: higher survives longer; integer 0…255. */
  readonly priority: number;
  /** time scale → pitch shift in cents for 'stretch' groups, −2400…2400 (0 = pitch kept); optional in files (default 0). */
  readonly stretchPitch: CurveSpec;
  /** Time scale 0 in 'stretch' groups; optional in files (default 'silence'). */
  readonly stretchFreeze: StretchFreeze;
}

/**
 * How a group's positioned voices hear their sources' motion.
 * - 'propagation': sound travels at the speed of sound on the game clock: arrival delay, emission-time Doppler,
 *   silence before a supersonic source's Mach cone (the default).
 * - 'instant': the same-instant Doppler ratio of OpenAL 1.1 §3.5.2, no delay (stylised games).
 * - 'off': no delay and no Doppler (panning and distance only).
 */
export type MotionModel = 'propagation' | 'instant' | 'off';

/** Easing of a time-scale transition. */
export type Easing = 'linear' | 'smooth' | 'exponential';

/** Which clock velocities are measured in. 'wall': physical; 'game': wall velocity ÷ time scale. */
export type VelocityClock = 'wall' | 'game';

/** Web Audio API distance models (PannerNode.distanceModel). */
export type DistanceModel = 'linear' | 'inverse' | 'exponential';

/** Resampler quality tier names (see src/dsp). */
export type QualityTierName = 'draft' | 'standard' | 'high';

/** The whole tuning document (schema version 1). */
export interface Tuning {
  readonly version: number;
  readonly air: {
    /** Air temperature, −50…60 °C; gives the speed of sound when speedOfSound is null. */
    readonly temperatureCelsius: Celsius;
    /** Explicit speed of sound override in m/s (1…10000), or null to derive from temperature. */
    readonly speedOfSound: MetersPerSecond | null;
    /** Relative humidity for air absorption (ISO 9613-1), 0…100 %; absent in older files: 50. */
    readonly relativeHumidity: number;
    /** Atmospheric pressure for air absorption (ISO 9613-1), 50…120 kPa; absent in older files: 101.325. */
    readonly pressureKilopascals: number;
  };
  readonly doppler: {
    /** Scales the Doppler effect (OpenAL's DOPPLER_FACTOR), 0…10; 0 disables it. */
    readonly factor: number;
    /** Largest shift allowed each way, in cents, 0…2400. */
    readonly maxShiftCents: Cents;
    /** Smoothing time constant for the Doppler ratio, 0…2 s. */
    readonly smoothingSeconds: Seconds;
    /** Clock velocities are measured in. */
    readonly velocityClock: VelocityClock;
    /** Velocity estimator smoothing time constant, 0…2 s. */
    readonly velocitySmoothingSeconds: Seconds;
    /** Implied speeds above this are teleports (estimator resets), 1…100000 m/s. */
    readonly teleportSpeed: MetersPerSecond;
  };
  readonly distance: {
    readonly model: DistanceModel;
    readonly refDistance: Meters;
    readonly maxDistance: Meters;
    readonly rolloffFactor: number;
  };
  readonly timeFlow: {
    /** Time scale that the slow-motion control ramps to, 0…1. */
    readonly slowMotionScale: number;
    /** Ramp time into slow motion, 0…10 s. */
    readonly rampInSeconds: Seconds;
    /** Ramp time out of slow motion, 0…10 s. */
    readonly rampOutSeconds: Seconds;
    readonly easing: Easing;
  };
  readonly smoothing: {
    /** Time constant for per-voice ratio changes (smoothed in cents), 0…1 s; default 0: the time-scale ramp is the smoothing. */
    readonly ratioSeconds: Seconds;
    /** Time constant for cutoff changes (smoothed in log frequency), 0…1 s. */
    readonly cutoffSeconds: Seconds;
    /** Time constant for gain changes (smoothed in dB), 0…1 s. */
    readonly gainSeconds: Seconds;
  };
  readonly resampler: { readonly tier: QualityTierName };
  readonly master: {
    /** Safety limiter on the master bus; on by default. */
    readonly limiter: boolean;
    /** Limiter ceiling in dBFS, −24…0. */
    readonly ceilingDb: Decibels;
    /** Master gain in dB, −60…12. */
    readonly gainDb: Decibels;
  };
  /** Groups by name (names match /^[A-Za-z][A-Za-z0-9_-]{0,63}$/). */
  readonly groups: { readonly [name: string]: GroupTuning };
}

/** Cutoff at or above which the dilation-tone low-pass is bypassed. */
export const OPEN_CUTOFF_HZ: Hz = 20000;

/** Largest time scale the time flow and curves accept (x range of every curve is 0…MAX_TIME_SCALE). */
export const MAX_TIME_SCALE = 4;
