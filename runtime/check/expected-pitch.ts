// Expected heard frequency for `ralenti check`, from motion and tuning alone (never from the engine's ratios):
// Doppler by the OpenAL 1.1 §3.5.2 moving-source/moving-listener formula (src/motion), the tuning's max-shift clamp,
// the group's pitch curve at the time scale, and setTargetAtTime-style one-pole smoothing in cents (Web Audio spec).
import type { Hz, Seconds, Tuning, Vec3Like } from '../../src/index';
import { dopplerRatio, speedOfSound, createDopplerStats } from '../../src/motion';
import { Curve, GAME_CLOCK_MIN_TIME_SCALE } from '../../src/dilation';
import { DEFAULT_GROUP, MAX_TIME_SCALE } from '../../src/tuning';
import { centsToRatio, MAX_RATIO, ratioToCents } from '../../src/dsp';

/** Position (m) and wall-clock velocity (m/s) of a moving point, filled by a MotionAt callback. */
export interface MotionSample {
  position: Vec3Like;
  velocity: Vec3Like;
}

/** Writes the position and wall-clock velocity at `time` (seconds from the render start) into `out`. */
export type MotionAt = (time: Seconds, out: MotionSample) => void;

/** Everything the expectation needs; independent of any scene-script format. */
export interface ExpectedPitchInput {
  /** Frequency of the tone in the sound when played at ratio 1 at the output rate, Hz (> 0). */
  emittedHz: Hz;
  /** The voice's base ratio, (0, 4] (default 1). */
  baseRatio?: number;
  /** Tuning group of the voice; unknown names fall back to the default group, as the engine does. */
  group?: string;
  /** The tuning the render used. */
  tuning: Tuning;
  /** Source motion, or null for a non-positional voice (no Doppler). */
  source: MotionAt | null;
  /** Listener motion. */
  listener: MotionAt;
  /** Global time scale at `time` (seconds from the render start), 0…4. */
  timeScaleAt: (time: Seconds) => number;
  /** When the voice starts, s (default: the first requested time); smoothing starts settled at the target. */
  startTime?: Seconds;
  /** Largest integration step of the smoothing, s (default 0.001). */
  stepSeconds?: Seconds;
}

/** Frozen defaults of ExpectedPitchInput's optional fields. */
export const expectedPitchDefaults = Object.freeze({ baseRatio: 1, group: DEFAULT_GROUP, stepSeconds: 0.001 });

/** Lowest total ratio that still sounds; below it the voice is held (frozen) and no pitch is expected. */
export const EXPECTED_MIN_RATIO = 1 / 1024;

/** The two unsmoothed parts of the expected ratio at one instant, in cents. */
export interface ExpectedTargets {
  /** Base ratio × pitch curve of the group at the time scale, in cents (−Infinity when the curve gives 0). */
  speedCents: number;
  /** Doppler ratio after the max-shift clamp, in cents (0 when the group or the tuning has no Doppler). */
  dopplerCents: number;
}

/** Computes expected heard frequencies; one instance per voice, reusable across calls. */
export class ExpectedPitch {
  private readonly input: ExpectedPitchInput;
  private readonly pitch: Curve;
  private readonly followsTime: boolean;
  private readonly doppler: boolean;
  private readonly c: number;
  private readonly maxShiftCents: number;
  private readonly src: MotionSample = { position: { x: 0, y: 0, z: 0 }, velocity: { x: 0, y: 0, z: 0 } };
  private readonly lis: MotionSample = { position: { x: 0, y: 0, z: 0 }, velocity: { x: 0, y: 0, z: 0 } };
  private readonly stats = createDopplerStats();

  /** Prepares the group's curve and the air constants from the tuning. */
  constructor(input: ExpectedPitchInput) {
    if (!(input.emittedHz > 0)) throw new RangeError('emittedHz must be > 0');
    this.input = input;
    const t = input.tuning;
    const name = input.group ?? expectedPitchDefaults.group;
    const group = t.groups[name] ?? t.groups[DEFAULT_GROUP];
    this.pitch = new Curve(group.pitch);
    this.followsTime = group.policy === 'follow-time';
    this.doppler = group.doppler && t.doppler.factor > 0 && input.source !== null;
    this.c = t.air.speedOfSound ?? speedOfSound(t.air.temperatureCelsius);
    this.maxShiftCents = Math.min(t.doppler.maxShiftCents, ratioToCents(MAX_RATIO));
  }

  /** Unsmoothed targets at `time`: speed part and clamped Doppler part, in cents. */
  targetsAt(time: Seconds, out: ExpectedTargets): ExpectedTargets {
    const input = this.input;
    const rawScale = input.timeScaleAt(time);
    const s = rawScale >= 0 ? Math.min(rawScale, MAX_TIME_SCALE) : 0;
    const base = input.baseRatio ?? expectedPitchDefaults.baseRatio;
    const speed = base * (this.followsTime ? this.pitch.evaluate(s) : 1);
    out.speedCents = speed > 0 ? ratioToCents(speed) : -Infinity;
    out.dopplerCents = 0;
    if (this.doppler) {
      input.source!(time, this.src);
      input.listener(time, this.lis);
      if (input.tuning.doppler.velocityClock === 'game') {
        // Game-clock velocity = wall-clock velocity ÷ time scale, with the runtime's guard against s → 0.
        const k = 1 / Math.max(s, GAME_CLOCK_MIN_TIME_SCALE);
        scale(this.src.velocity, k);
        scale(this.lis.velocity, k);
      }
      const ratio = dopplerRatio(this.src, this.lis, { speedOfSound: this.c, dopplerFactor: input.tuning.doppler.factor, stats: this.stats });
      const cents = ratio > 0 ? ratioToCents(ratio) : -Infinity;
      out.dopplerCents = Math.max(-this.maxShiftCents, Math.min(this.maxShiftCents, cents));
    }
    return out;
  }

  /**
   * Expected heard frequency in Hz at each of `times` (increasing, s); NaN where the voice is held (total ratio below
   * EXPECTED_MIN_RATIO) or before startTime. Speed part smoothed with smoothing.ratioSeconds, Doppler part with
   * doppler.smoothingSeconds, each a one-pole in cents; the sum is clamped to the resampler's range.
   */
  frequencies(times: ArrayLike<Seconds>, out: Float64Array = new Float64Array(times.length)): Float64Array {
    const input = this.input;
    const tuning = input.tuning;
    const step = input.stepSeconds ?? expectedPitchDefaults.stepSeconds;
    const tauSpeed = tuning.smoothing.ratioSeconds;
    const tauDoppler = tuning.doppler.smoothingSeconds;
    const start = input.startTime ?? (times.length > 0 ? times[0] : 0);
    const from: ExpectedTargets = { speedCents: 0, dopplerCents: 0 };
    const to: ExpectedTargets = { speedCents: 0, dopplerCents: 0 };
    this.targetsAt(start, from);
    let speed = from.speedCents;
    let doppler = from.dopplerCents;
    let now = start;
    const maxCents = ratioToCents(MAX_RATIO);
    const minCents = ratioToCents(EXPECTED_MIN_RATIO);
    for (let i = 0; i < times.length; i++) {
      const t = times[i];
      if (!(t >= start)) {
        out[i] = NaN;
        continue;
      }
      while (now < t) {
        // Targets at both ends of the step, straight between them (first-order hold), approached exactly.
        const dt = Math.min(step, t - now);
        const next = dt === t - now ? t : now + dt;
        this.targetsAt(next, to);
        speed = approachRamp(speed, from.speedCents, to.speedCents, next - now, tauSpeed);
        doppler = approachRamp(doppler, from.dopplerCents, to.dopplerCents, next - now, tauDoppler);
        from.speedCents = to.speedCents;
        from.dopplerCents = to.dopplerCents;
        now = next;
      }
      const total = speed + doppler;
      out[i] = total < minCents || Number.isNaN(total) ? NaN : input.emittedHz * centsToRatio(Math.min(total, maxCents));
    }
    return out;
  }
}

function scale(v: Vec3Like, k: number): void {
  v.x *= k;
  v.y *= k;
  v.z *= k;
}

/**
 * One-pole state after dt seconds (time constant tau) whose target moves linearly from x0 to x1: the exact solution
 * of dy/dt = (x − y)/τ, which for a constant target is setTargetAtTime's v = V1 + (V0 − V1)·e^(−t/τ) (Web Audio spec).
 */
function approachRamp(y0: number, x0: number, x1: number, dt: number, tau: number): number {
  if (!(tau > 0) || !(dt > 0) || !Number.isFinite(y0) || !Number.isFinite(x0) || !Number.isFinite(x1)) return x1;
  const slope = (x1 - x0) / dt;
  return x1 - tau * slope + (y0 - x0 + tau * slope) * Math.exp(-dt / tau);
}

/** Expected heard frequency (Hz) at each of `times` for one voice; see ExpectedPitch.frequencies. */
export function expectedHeardFrequencies(input: ExpectedPitchInput, times: ArrayLike<Seconds>): Float64Array {
  return new ExpectedPitch(input).frequencies(times);
}

/** A MotionAt for a point moving at constant velocity (m/s) from `position` at time 0 (s). */
export function straightLine(position: Vec3Like, velocity: Vec3Like): MotionAt {
  return (time, out) => {
    out.position.x = position.x + velocity.x * time;
    out.position.y = position.y + velocity.y * time;
    out.position.z = position.z + velocity.z * time;
    out.velocity.x = velocity.x;
    out.velocity.y = velocity.y;
    out.velocity.z = velocity.z;
  };
}

/** A MotionAt from positions alone: velocity by central difference over ±h seconds (default 1 ms). */
export function motionFromPositions(positionAt: (time: Seconds, out: Vec3Like) => void, h: Seconds = 0.001): MotionAt {
  const a = { x: 0, y: 0, z: 0 };
  const b = { x: 0, y: 0, z: 0 };
  return (time, out) => {
    positionAt(time, out.position);
    positionAt(time - h, a);
    positionAt(time + h, b);
    out.velocity.x = (b.x - a.x) / (2 * h);
    out.velocity.y = (b.y - a.y) / (2 * h);
    out.velocity.z = (b.z - a.z) / (2 * h);
  };
}
