// Doppler ratio for a moving source and a moving listener along the line of sight, medium at rest:
// the OpenAL 1.1 model (specification §3.5.2): f'/f = (SS − DF·vls) / (SS − DF·vss), with vls and vss clamped to SS/DF.
import type { MetersPerSecond, Vec3Like } from '../units';
import { speedOfSound } from './speed-of-sound';

/** Largest Doppler ratio returned (+2400 cents): the resampler's maximum playback ratio. */
export const DOPPLER_RATIO_CAP = 4;
/** Below this source–listener distance (m) the direction is undefined and the ratio is 1. */
export const DOPPLER_MIN_DISTANCE = 1e-6;

/** Counters of guarded cases; pass one in the options to count allocation-free. */
export interface DopplerStats {
  /** Calls with a non-finite position, velocity, speed of sound or Doppler factor (ratio 1 returned). */
  nonFinite: number;
  /** Calls where the ratio hit DOPPLER_RATIO_CAP (source at or above the speed of sound toward the listener). */
  capped: number;
}

/** Creates a zeroed DopplerStats counter object. */
export function createDopplerStats(): DopplerStats {
  return { nonFinite: 0, capped: 0 };
}

/** Counter object used when no `stats` is passed to dopplerRatio. */
export const globalDopplerStats: DopplerStats = createDopplerStats();

/** A moving point: position in m, velocity in m/s. */
export interface MovingPoint {
  position: Vec3Like;
  velocity: Vec3Like;
}

/** Options of dopplerRatio. */
export interface DopplerOptions {
  /** Speed of sound in m/s, > 0 (default speedOfSound(20) ≈ 343.2). */
  speedOfSound?: MetersPerSecond;
  /** OpenAL DOPPLER_FACTOR, ≥ 0 (default 1; 0 disables the shift). */
  dopplerFactor?: number;
  /** Counters to increment (default globalDopplerStats). */
  stats?: DopplerStats;
}

const SPEED_OF_SOUND_20C = speedOfSound(20);

/**
 * Doppler ratio from line-of-sight speeds, OpenAL 1.1 §3.5.2 with its clamps, plus our guard.
 * vls, vss: listener and source velocity projected on the source→listener direction, m/s
 * (vss > 0: source approaching; vls > 0: listener receding). Returns heard/emitted frequency in [0, 4]:
 * - both projections at the clamp (moving together at or above SS/DF): 1, the shifts cancel;
 * - source at the clamp only (denominator 0) or a ratio above 4: DOPPLER_RATIO_CAP, counted as capped;
 * - listener out-running the sound (numerator 0): 0, as in OpenAL.
 * Inputs must be finite; c > 0, factor > 0 (callers handle factor 0 as ratio 1).
 */
export function dopplerFromSpeeds(
  vls: MetersPerSecond,
  vss: MetersPerSecond,
  c: MetersPerSecond,
  factor: number,
  stats: DopplerStats,
): number {
  const q = SPEEDS_SCRATCH;
  q[0] = vls;
  q[1] = vss;
  q[2] = c;
  q[3] = factor;
  dopplerFromSpeedsAt(q, stats);
  return q[0];
}

/** The doubles of `dopplerFromSpeeds` handed to dopplerFromSpeedsAt. */
const SPEEDS_SCRATCH = new Float64Array(4);

/**
 * `dopplerFromSpeeds` in place: reads [vls, vss, c, factor] from `q` and writes the ratio into q[0], each branch
 * storing its own value. For the render path: a double passed to or returned from a call V8 does not inline is boxed,
 * and so is one merged with a module constant (docs/allocation.md).
 */
export function dopplerFromSpeedsAt(q: Float64Array, stats: DopplerStats): void {
  const vls = q[0];
  const vss = q[1];
  const c = q[2];
  const factor = q[3];
  const limit = c / factor;
  const ls = vls < limit ? vls : limit;
  const ss = vss < limit ? vss : limit;
  const num = c - factor * ls;
  const den = c - factor * ss;
  if (den <= 0) {
    if (num <= 0) q[0] = 1;
    else {
      stats.capped += 1;
      q[0] = DOPPLER_RATIO_CAP;
    }
    return;
  }
  const ratio = num / den;
  if (ratio > DOPPLER_RATIO_CAP) {
    stats.capped += 1;
    q[0] = DOPPLER_RATIO_CAP;
  } else if (ratio > 0) q[0] = ratio;
  else q[0] = 0;
}

/**
 * Heard/emitted frequency ratio for `source` and `listener` (positions in m, velocities in m/s),
 * OpenAL 1.1 §3.5.2 model with its velocity clamps; range [0, 4], never NaN or Infinity.
 * Zero distance gives 1; any non-finite input gives 1 and increments `stats.nonFinite`.
 */
export function dopplerRatio(source: MovingPoint, listener: MovingPoint, options?: DopplerOptions): number {
  const stats = options?.stats ?? globalDopplerStats;
  const c = options?.speedOfSound ?? SPEED_OF_SOUND_20C;
  const factor = options?.dopplerFactor ?? 1;
  if (!(c > 0) || c === Infinity || !(factor >= 0) || factor === Infinity) {
    stats.nonFinite += 1;
    return 1;
  }
  const sp = source.position;
  const lp = listener.position;
  let dx = lp.x - sp.x;
  let dy = lp.y - sp.y;
  let dz = lp.z - sp.z;
  const m = Math.max(Math.abs(dx), Math.abs(dy), Math.abs(dz));
  const sv = source.velocity;
  const lv = listener.velocity;
  if (!(m < Infinity) || !Number.isFinite(sv.x + sv.y + sv.z + lv.x + lv.y + lv.z)) {
    stats.nonFinite += 1;
    return 1;
  }
  if (m < DOPPLER_MIN_DISTANCE || factor === 0) return 1;
  dx /= m;
  dy /= m;
  dz /= m;
  const n = Math.sqrt(dx * dx + dy * dy + dz * dz);
  dx /= n;
  dy /= n;
  dz /= n;
  const vls = lv.x * dx + lv.y * dy + lv.z * dz;
  const vss = sv.x * dx + sv.y * dy + sv.z * dz;
  if (!Number.isFinite(vls) || !Number.isFinite(vss)) {
    stats.nonFinite += 1;
    return 1;
  }
  return dopplerFromSpeeds(vls, vss, c, factor, stats);
}
