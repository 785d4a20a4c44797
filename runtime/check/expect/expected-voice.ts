// Expected heard frequency of one voice from the recorded motion and the tuning's declared values alone: the group's
// pitch curve at the time scale (CheckCurve), the Doppler model the tuning asks for — emission-time propagation
// (docs/references.md §11, EmissionSolver) or the same-instant OpenAL 1.1 §3.5.2 formula (docs/references.md §1c) —
// and the tuning's maximum shift. Nothing here is taken from the engine; smoothing or lag is never expected.
import type { Tuning } from '../../../src/tuning';
import { DEFAULT_GROUP } from '../../../src/tuning';
import { centsToRatio, dbToGain, ratioToCents } from '../../../src/dsp';
import type { MotionSpec, SceneScript, VoiceSpec } from '../../offline/scene-types';
import { CheckCurve } from './check-curve';
import { CheckPath, type Vec } from './check-path';
import { EmissionSolver } from './emission-time';
import { TimeScaleTrack } from './time-scale-track';

/** How the heard pitch follows the motion: emission-time propagation, the same-instant formula, or none. */
export type DopplerModel = 'propagation' | 'instant' | 'off';

/** Lowest and highest total playback ratio the tuning format allows (frozen below; the resampler's top). */
export const EXPECTED_RATIO_RANGE = Object.freeze({ min: 1 / 1024, max: 4 });
/** Game-clock velocities divide by max(s, this), the guard the tuning format documents for velocityClock 'game'. */
export const GAME_CLOCK_FLOOR = 0.05;

const MODELS: readonly string[] = ['propagation', 'instant', 'off'];
const isModel = (v: unknown): v is DopplerModel => typeof v === 'string' && MODELS.includes(v);

/** Field `key` of `o` as stored, whatever the format's type says: the checker reads older and newer tuning formats alike. */
const stored = (o: object | undefined, key: string): unknown => (o === undefined ? undefined : Reflect.get(o, key));

/**
 * The Doppler model a tuning asks for in `groupName` (unknown groups use the default group): `doppler: false` or a
 * Doppler factor of 0 is 'off'; otherwise the group's `motion` switch ('propagation' | 'instant' | 'off') when the
 * tuning has one (the propagation engine's tuning format), else a string `doppler` or `dopplerModel`, else a tuning-wide
 * `doppler.model`, else 'instant' — the only model of the engine before the switch existed.
 */
export function dopplerModelOf(tuning: Tuning, groupName: string | null | undefined): DopplerModel {
  const group: object | undefined = tuning.groups[groupName ?? DEFAULT_GROUP] ?? tuning.groups[DEFAULT_GROUP];
  if (!group || !(tuning.doppler.factor > 0) || stored(group, 'doppler') === false) return 'off';
  for (const own of [stored(group, 'motion'), stored(group, 'doppler'), stored(group, 'dopplerModel')]) if (isModel(own)) return own;
  const global = stored(tuning.doppler, 'model');
  return isModel(global) ? global : 'instant';
}

/** Speed of sound the tuning declares, m/s: the override, or 331.3·√(1 + T/273.15) (docs/references.md §2, from memory). */
export function declaredSpeedOfSound(tuning: Tuning): number {
  return tuning.air.speedOfSound ?? 331.3 * Math.sqrt(1 + tuning.air.temperatureCelsius / 273.15);
}

/** One expected value. */
export interface ExpectedSample {
  /** Expected heard fundamental, Hz (NaN when the voice is not heard then). */
  hz: number;
  /** Why hz is NaN: before the sound arrives or after it ends, frozen, or no single emission (supersonic). */
  silentWhy: 'not-started' | 'ended' | 'frozen' | 'supersonic' | null;
}

/** Expected pitch of one voice of a scene script. */
export class ExpectedVoice {
  /** The Doppler model used. */
  readonly model: DopplerModel;
  /** Emitted fundamental at ratio 1, Hz, times the voice's ratio. */
  readonly emittedHz: number;
  private readonly pitch: CheckCurve;
  private readonly followsTime: boolean;
  private readonly clock: TimeScaleTrack;
  private readonly listener: CheckPath;
  private readonly source: CheckPath | null;
  private readonly solver: EmissionSolver | null;
  private readonly sourceMotion: MotionSpec | null;
  private readonly listenerMotion: MotionSpec;
  private readonly c: number;
  private readonly factor: number;
  private readonly maxShift: number;
  private readonly gameClock: boolean;
  private readonly level: CheckCurve;
  private readonly exempt: boolean;
  private readonly distance: Tuning['distance'];
  private readonly L: Vec = { x: 0, y: 0, z: 0 };
  private readonly vL: Vec = { x: 0, y: 0, z: 0 };
  private readonly S: Vec = { x: 0, y: 0, z: 0 };
  private readonly vS: Vec = { x: 0, y: 0, z: 0 };

  private readonly duration: number;
  private endTime = NaN;

  /**
   * `fundamentalHz`: the sound's fundamental at ratio 1 (Hz, > 0); `soundSeconds`: the sound's length at ratio 1 (s),
   * which ends a voice that does not loop once its playhead has read it all (null: never ends by itself).
   */
  constructor(
    script: SceneScript,
    private readonly voice: VoiceSpec,
    tuning: Tuning,
    private readonly fundamentalHz: number,
    private readonly soundSeconds: number | null = null,
  ) {
    this.duration = script.duration;
    const group = tuning.groups[voice.group ?? DEFAULT_GROUP] ?? tuning.groups[DEFAULT_GROUP];
    this.pitch = new CheckCurve(group.pitch);
    this.level = new CheckCurve(group.level);
    this.exempt = group.policy === 'exempt';
    this.distance = tuning.distance;
    this.followsTime = group.policy === 'follow-time';
    this.emittedHz = fundamentalHz * voice.ratio;
    this.clock = new TimeScaleTrack(script.timeScale, script.duration);
    this.listener = new CheckPath(script.listener.motion);
    this.source = voice.source === null ? null : new CheckPath(script.sources[voice.source].motion);
    this.sourceMotion = voice.source === null ? null : script.sources[voice.source].motion;
    this.listenerMotion = script.listener.motion;
    this.model = this.source === null ? 'off' : dopplerModelOf(tuning, voice.group);
    this.factor = tuning.doppler.factor;
    // A Doppler factor DF scales the effect as a speed of sound c/DF would (OpenAL 1.1 §3.5.2 algebra).
    this.c = declaredSpeedOfSound(tuning) / (this.factor > 0 ? this.factor : 1);
    this.maxShift = Math.min(tuning.doppler.maxShiftCents, ratioToCents(EXPECTED_RATIO_RANGE.max));
    this.gameClock = tuning.doppler.velocityClock === 'game';
    this.solver = this.model === 'propagation' && this.source ? new EmissionSolver(this.source, this.c, this.clock) : null;
  }

  /** Time scale of the script at scene time t. */
  timeScaleAt(t: number): number {
    return this.clock.valueAt(t);
  }

  /** Expected heard frequency at scene time t (s). */
  at(t: number): ExpectedSample {
    if (!this.voice.loop && this.soundSeconds !== null && t > this.end()) return { hz: NaN, silentWhy: 'ended' };
    return this.playing(t);
  }

  /**
   * Reception time (s) at which a voice that does not loop has read its whole sound: the playhead advances by the
   * heard over emitted-at-ratio-1 frequency, integrated on a 1 ms grid from the voice's start (Infinity: never).
   */
  private end(): number {
    if (!Number.isNaN(this.endTime)) return this.endTime;
    const left = Math.max(0, (this.soundSeconds ?? Infinity) - this.voice.offsetSeconds);
    const dt = 0.001;
    let read = 0;
    this.endTime = Infinity;
    for (let t = Math.max(0, this.voice.start); t <= this.duration + dt; t += dt) {
      const hz = this.playing(t).hz;
      if (hz > 0) read += (hz / this.fundamentalHz) * dt;
      if (read >= left) {
        this.endTime = t;
        break;
      }
    }
    return this.endTime;
  }

  /** Expected heard frequency at scene time t (s) of a voice still playing its sound. */
  private playing(t: number): ExpectedSample {
    let emitAt = t;
    let dopplerCents = 0;
    if (this.source !== null && this.model !== 'off') {
      this.listener.at(t, this.L, this.vL);
      if (this.solver) {
        const e = this.solver.emissionAt(t, this.L, this.vL);
        if (!Number.isFinite(e.tau)) return { hz: NaN, silentWhy: 'supersonic' };
        emitAt = e.tau;
        // The tuning's pitch curve acts at the listener and multiplies the propagation ratio on the game clock,
        // dG(τ)/dG(t) = dτ/dt · s(τ)/s(t) (docs/physics.md, "Decision"): equal to dτ/dt at a steady time scale, and
        // to the emission-time physics for the identity curve. A stopped clock at the listener holds sound in flight.
        const sHere = this.clock.valueAt(t);
        if (!(sHere > 0)) return { hz: NaN, silentWhy: 'frozen' };
        const gameRatio = (e.ratio * this.clock.valueAt(e.tau)) / sHere;
        dopplerCents = gameRatio > 0 ? ratioToCents(gameRatio) : -Infinity;
      } else {
        // maxShiftCents belongs to the same-instant formula only: propagation has no clamp but the ratio range's.
        dopplerCents = Math.max(-this.maxShift, Math.min(this.maxShift, this.instantCents(t)));
      }
    }
    if (emitAt < this.voice.start) return { hz: NaN, silentWhy: 'not-started' };
    if (this.voice.stop !== null && emitAt > this.voice.stop) return { hz: NaN, silentWhy: 'ended' };
    const s = this.clock.valueAt(t);
    const speed = this.followsTime ? this.pitch.valueAt(s) : 1;
    const total = speed > 0 ? ratioToCents(speed) + dopplerCents : -Infinity;
    if (!(total >= ratioToCents(EXPECTED_RATIO_RANGE.min))) return { hz: NaN, silentWhy: 'frozen' };
    return { hz: this.emittedHz * centsToRatio(Math.min(total, ratioToCents(EXPECTED_RATIO_RANGE.max))), silentWhy: null };
  }

  /** Same-instant formula: projections on source→listener, each clamped to c/DF from above, (c − vls)/(c − vss). */
  private instantCents(t: number): number {
    this.source!.at(t, this.S, this.vS);
    const dx = this.L.x - this.S.x;
    const dy = this.L.y - this.S.y;
    const dz = this.L.z - this.S.z;
    const d = Math.hypot(dx, dy, dz);
    if (d < 1e-6) return 0;
    const k = this.gameClock ? 1 / Math.max(this.clock.valueAt(t), GAME_CLOCK_FLOOR) : 1;
    // With c already divided by DF, clamping DF·v to SS equals clamping v to c here.
    const vls = Math.min(((this.vL.x * dx + this.vL.y * dy + this.vL.z * dz) / d) * k, this.c);
    const vss = Math.min(((this.vS.x * dx + this.vS.y * dy + this.vS.z * dz) / d) * k, this.c);
    const num = this.c - vls;
    const den = this.c - vss;
    if (den <= 0) return num <= 0 ? 0 : Infinity;
    return num > 0 ? ratioToCents(num / den) : -Infinity;
  }

  /**
   * Rough amplitude of the voice at the listener at time t (linear, before panning): its gain, the group's level
   * curve at the time scale (except for exempt groups), and the Web Audio distance model of the tuning
   * (docs/references.md §5). Used only to tell which other voices can disturb a voice's band in a mix.
   */
  gainAt(t: number): number {
    const groupDb = this.exempt ? 0 : this.level.valueAt(this.clock.valueAt(t));
    let g = this.voice.gain * dbToGain(groupDb);
    if (this.source !== null) {
      this.listener.at(t, this.L, this.vL);
      this.source.at(t, this.S, this.vS);
      const d = Math.hypot(this.L.x - this.S.x, this.L.y - this.S.y, this.L.z - this.S.z);
      const { model, refDistance: ref, maxDistance: max, rolloffFactor: f } = this.distance;
      if (model === 'linear') {
        const lo = Math.min(ref, max);
        const hi = Math.max(ref, max);
        g *= hi === lo ? 1 - f : 1 - (f * (Math.min(Math.max(d, lo), hi) - lo)) / (hi - lo);
      } else if (ref <= 0) g = 0;
      else if (model === 'inverse') g *= ref / (ref + f * (Math.max(d, ref) - ref));
      else g *= (Math.max(d, ref) / ref) ** -f;
    }
    return Math.max(0, g);
  }

  /**
   * Reception-time windows (s) around the jumps (cut keys) of the source's and the listener's paths: from the jump to
   * the arrival of sound from both sides of it (distance ÷ c after the jump in 'propagation'), widened by `guard` s.
   * What a renderer plays across a teleport is not defined by physics, so these frames are listed, not judged.
   */
  jumpWindows(guard: number): { from: number; to: number }[] {
    if (this.source === null || this.model === 'off') return [];
    const cuts = [...cutTimes(this.sourceMotion), ...cutTimes(this.listenerMotion)];
    return cuts.map((T) => {
      let reach = 0;
      if (this.model === 'propagation') {
        for (const t of [T - 1e-6, T + 1e-6]) {
          this.listener.at(t, this.L, this.vL);
          this.source!.at(t, this.S, this.vS);
          reach = Math.max(reach, Math.hypot(this.L.x - this.S.x, this.L.y - this.S.y, this.L.z - this.S.z) / (this.c * Math.max(this.clock.valueAt(T), GAME_CLOCK_FLOOR)));
        }
      }
      return { from: T - guard, to: T + reach + guard };
    });
  }

  /**
   * Closest approach of the source to the listener as heard: reception time (s) of the sound emitted at the
   * moment of least distance (searched on a 5 ms grid, then refined), and that distance (m); null for no source.
   */
  closestApproach(duration: number): { time: number; distance: number } | null {
    if (this.source === null) return null;
    const dist = (t: number): number => {
      this.listener.at(t, this.L, this.vL);
      this.source!.at(t, this.S, this.vS);
      return Math.hypot(this.L.x - this.S.x, this.L.y - this.S.y, this.L.z - this.S.z);
    };
    let best = 0;
    let bestD = Infinity;
    for (let t = 0; t <= duration; t += 0.005) {
      const d = dist(t);
      if (d < bestD) [best, bestD] = [t, d];
    }
    let lo = Math.max(0, best - 0.005);
    let hi = Math.min(duration, best + 0.005);
    for (let i = 0; i < 40; i++) {
      const a = lo + (hi - lo) / 3;
      const b = hi - (hi - lo) / 3;
      if (dist(a) < dist(b)) hi = b;
      else lo = a;
    }
    const t = 0.5 * (lo + hi);
    const d = dist(t);
    const delay = this.model === 'propagation' ? d / this.c : 0;
    return { time: t + delay, distance: d };
  }
}

/** Times (s) of the cut keys (jumps) of a keyframed path. */
function cutTimes(m: MotionSpec | null): number[] {
  return m && m.type === 'keyframes' ? m.keys.filter((k) => k.cut === true).map((k) => k.time) : [];
}
