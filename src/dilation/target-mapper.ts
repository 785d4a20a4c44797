// Control-rate mapping of one voice from gameplay state to targets: ratio = base × pitch(s) × Doppler (OpenAL 1.1
// §3.5.2, clamped to the tuning's max shift), tone/level curves of s, Web Audio distance model and equal-power panning.
import type { Tuning } from '../tuning';
import { DEFAULT_GROUP, OPEN_CUTOFF_HZ, MAX_TIME_SCALE } from '../tuning';
import type { Vec3Like } from '../units';
import { dopplerFromSpeedsAt, speedOfSound, createDopplerStats, type DopplerStats } from '../motion';
import type { ListenerState, SourceState, VoiceTargets } from './snapshot-types';
import { CompiledGroup } from './group-policy';
import { distanceGain, distanceGainAt, equalPowerFromSineAt } from './spatial-gains';
import { coneGain } from './cone-gain';
import { centsToRatio } from '../dsp';
import type { SourceSpatial } from './source-spatial';
import { MAX_TARGET_RATIO, MIN_TARGET_RATIO, MAX_VOICE_GAIN, MAX_COORDINATE, MAX_RADIAL_SPEED, GAME_CLOCK_MIN_TIME_SCALE, MIN_CUTOFF_HZ, type VoiceInput, type TargetMapperOptions } from './voice-input';

/** Maps voices to targets under one tuning; creates no objects per call (docs/allocation.md); counts every clamped input. */
export class TargetMapper {
  /** Inputs replaced or clamped: time scales, ratios, gains, positions, velocities, orientations. */
  clamps = 0;
  /** Voices whose group was unknown (mapped as 'effects'). */
  unknownGroups = 0;
  /** Doppler guard counters (ratio capped at a supersonic approach). */
  readonly dopplerStats: DopplerStats = createDopplerStats();
  private tuning!: Tuning;
  private groups = new Map<string, CompiledGroup>();
  private fallback!: CompiledGroup;
  private c = 343;
  private minDoppler = 0.5;
  private maxDoppler = 2;
  // Non-small-integer constants copied into fields: in an ES module, reading a module-level double
  // constant on the hot path made V8 allocate a heap number per call (measured by bench/mapping.bench.ts).
  private readonly minRatio: number = MIN_TARGET_RATIO;
  private readonly maxTargetRatio: number = MAX_TARGET_RATIO;
  private readonly maxCoordinate: number = MAX_COORDINATE;
  private readonly maxRadialSpeed: number = MAX_RADIAL_SPEED;
  private readonly gameClockMinScale: number = GAME_CLOCK_MIN_TIME_SCALE;
  private gameClock = false;
  private scale = 0.5;
  private dopplerFactor = 1;
  private distanceModel: Tuning['distance']['model'] = 'inverse';
  private refDistance = 1;
  private maxDistance = 10000;
  private rolloff = 1;
  /** Listener orientation the scratch fwd/right were computed from (recomputed only when it changes). */
  private readonly lastForward: Vec3Like = { x: Number.NaN, y: 0, z: 0 };
  private readonly lastUp: Vec3Like = { x: Number.NaN, y: 0, z: 0 };
  private lastOrientationValid = true;
  private readonly pan = new Float64Array(2);
  /** distanceGainAt's [d, refDistance, maxDistance, rolloffFactor] in, gain out. */
  private readonly distanceQuery = new Float64Array(4);
  /** dopplerFromSpeedsAt's [vls, vss, c, factor] in, ratio out. */
  private readonly dopplerQuery = new Float64Array(4);
  /** The source's and the listener's line-of-sight speeds, clamped in place (clampSpeeds). */
  private readonly speeds = new Float64Array(2);
  /** PannerNode's default orientation, for sources with a cone but no orientation. */
  private readonly defaultOrientation: Vec3Like = { x: 1, y: 0, z: 0 };
  private readonly dir: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly fwd: Vec3Like = { x: 0, y: 0, z: -1 };
  private readonly right: Vec3Like = { x: 1, y: 0, z: 0 };

  /** Creates a mapper for options.tuning. */
  constructor(options: TargetMapperOptions) {
    this.setTuning(options.tuning);
  }

  /** Switches to tuning `t` (builds its curves; call outside the audio path's inner loop). */
  setTuning(t: Tuning): void {
    const groups = new Map<string, CompiledGroup>();
    for (const name of Object.keys(t.groups)) groups.set(name, new CompiledGroup(name, t.groups[name]));
    this.groups = groups;
    this.fallback = groups.get(DEFAULT_GROUP) ?? groups.values().next().value!;
    this.tuning = t;
    this.c = t.air.speedOfSound ?? speedOfSound(t.air.temperatureCelsius);
    const maxShift = t.doppler.maxShiftCents;
    this.maxDoppler = Math.min(centsToRatio(maxShift), MAX_TARGET_RATIO);
    this.minDoppler = 1 / this.maxDoppler;
    this.gameClock = t.doppler.velocityClock === 'game';
    this.dopplerFactor = t.doppler.factor;
    this.distanceModel = t.distance.model;
    this.refDistance = t.distance.refDistance;
    this.maxDistance = t.distance.maxDistance;
    this.rolloff = t.distance.rolloffFactor;
  }

  /** The tuning in use. */
  get currentTuning(): Tuning {
    return this.tuning;
  }

  /** Whether the tuning has a group called `name`. */
  hasGroup(name: string): boolean {
    return this.groups.has(name);
  }

  /** The compiled group for `name` (the fallback group when unknown). */
  group(name: string): CompiledGroup {
    return this.groups.get(name) ?? this.fallback;
  }

  /** Writes the targets of one voice into `out` and returns it; every output is finite, ratio within (0, 4]. */
  map(out: VoiceTargets, input: VoiceInput): VoiceTargets {
    let s = input.timeScale;
    if (!(s >= 0)) {
      s = 0;
      this.clamps += 1;
    } else if (s > MAX_TIME_SCALE) {
      s = MAX_TIME_SCALE;
      this.clamps += 1;
    }
    let g = this.groups.get(input.group);
    if (g === undefined) {
      g = this.fallback;
      this.unknownGroups += 1;
    }
    let base = input.baseRatio;
    if (!(base > 0) || base === Infinity) {
      base = 1;
      this.clamps += 1;
    } else if (base > MAX_TARGET_RATIO) {
      base = MAX_TARGET_RATIO;
      this.clamps += 1;
    }
    let gain = input.gain;
    if (!(gain >= 0)) {
      gain = 0;
      this.clamps += 1;
    } else if (gain > MAX_VOICE_GAIN) {
      gain = MAX_VOICE_GAIN;
      this.clamps += 1;
    }

    // The time scale in a field: the call is not always inlined here, and then a double passed to it is boxed.
    g.scaleQuery = s;
    g.evaluate(MIN_CUTOFF_HZ, OPEN_CUTOFF_HZ);
    const speed = g.cachedSpeed;
    out.cutoffHz = g.cachedCutoffHz;
    out.gain = gain * g.cachedLevelGain;

    out.radialSpeed = 0;
    out.distance = 0;
    out.left = 1;
    out.right = 1;
    out.doppler = 1;
    const src = input.source;
    // The time scale travels in a field: a double argument to a non-inlined call would be boxed (allocated).
    this.scale = s;
    if (src !== null) this.spatial(out, input, src, g);

    let ratio = base * speed * out.doppler;
    const minRatio = this.minRatio;
    out.frozen = g.followsSpeed && !g.holdsWhenFrozen && !(ratio >= minRatio);
    // Each branch stores its own value: V8 boxes a double merged with a constant (docs/allocation.md).
    const maxRatio = this.maxTargetRatio;
    if (!(ratio >= minRatio)) out.ratio = minRatio;
    else if (ratio > maxRatio) {
      out.ratio = maxRatio;
      this.clamps += 1;
    } else out.ratio = ratio;
    if (g.stretches) {
      const pitch = base * g.cachedPitch * out.doppler;
      if (pitch > maxRatio) out.pitch = maxRatio;
      else if (!(pitch >= minRatio)) out.pitch = minRatio;
      else out.pitch = pitch;
    } else out.pitch = out.ratio;
    return out;
  }

  /** Writes spatial gains, distance, radial speed and the (max-shift clamped) Doppler ratio of a positioned voice. */
  private spatial(out: VoiceTargets, input: VoiceInput, src: SourceState & { velocity: Vec3Like }, g: CompiledGroup): void {
    const lis = input.listener;
    const sp = src.position;
    const lp = lis.position;
    const lim = this.maxCoordinate;
    // Every coordinate finite and within ±lim (NaN fails each comparison). Written out, not a helper: a double passed
    // to a call V8 did not inline is boxed (docs/allocation.md).
    const inside = sp.x >= -lim && sp.x <= lim && sp.y >= -lim && sp.y <= lim && sp.z >= -lim && sp.z <= lim;
    if (!inside || !(lp.x >= -lim && lp.x <= lim && lp.y >= -lim && lp.y <= lim && lp.z >= -lim && lp.z <= lim)) {
      this.clamps += 1;
      return;
    }
    // Listener → source, for distance and panning.
    const dx = sp.x - lp.x;
    const dy = sp.y - lp.y;
    const dz = sp.z - lp.z;
    const d = Math.sqrt(dx * dx + dy * dy + dz * dz);
    const own = input.spatial ?? null;
    let dist = 0;
    if (own === null) {
      // In place (distanceGainAt): the call is not always inlined here, and then a double crossing it is boxed.
      const q = this.distanceQuery;
      q[0] = d;
      q[1] = this.refDistance;
      q[2] = this.maxDistance;
      q[3] = this.rolloff;
      distanceGainAt(this.distanceModel, q);
      dist = q[0];
    } else dist = this.sourceGain(own, d, sp, lp);
    out.distance = d;
    const dir = this.dir;
    if (d > 0) {
      dir.x = dx / d;
      dir.y = dy / d;
      dir.z = dz / d;
      this.orientation(lis);
      // Sine of the Web Audio azimuth: the direction's right component over its length in the horizontal plane.
      const r = dx * this.right.x + dy * this.right.y + dz * this.right.z;
      const f = dx * this.fwd.x + dy * this.fwd.y + dz * this.fwd.z;
      const h = Math.sqrt(r * r + f * f);
      this.pan[0] = h > 1e-12 * d ? r / h : 0;
      equalPowerFromSineAt(this.pan);
    } else {
      dir.x = 0;
      dir.y = 0;
      dir.z = 0;
      this.pan[0] = 0;
      equalPowerFromSineAt(this.pan);
    }
    out.left = dist * this.pan[0];
    out.right = dist * this.pan[1];

    // Line-of-sight speeds along source → listener (= −dir): vss > 0 approaching, vls > 0 receding.
    const sv = src.velocity;
    const lv = lis.velocity;
    const speeds = this.speeds;
    speeds[0] = -(sv.x * dir.x + sv.y * dir.y + sv.z * dir.z);
    speeds[1] = -(lv.x * dir.x + lv.y * dir.y + lv.z * dir.z);
    this.clampSpeeds();
    let vss = speeds[0];
    let vls = speeds[1];
    if (this.gameClock) {
      const s = this.scale;
      const floor = this.gameClockMinScale;
      const k = 1 / (s > floor ? s : floor);
      vss *= k;
      vls *= k;
    }
    out.radialSpeed = vss - vls;
    const factor = this.dopplerFactor;
    if (!g.doppler || factor === 0 || d === 0) return;
    // In place (dopplerFromSpeedsAt), as the distance gain above.
    const q = this.dopplerQuery;
    q[0] = vls;
    q[1] = vss;
    q[2] = this.c;
    q[3] = factor;
    dopplerFromSpeedsAt(q, this.dopplerStats);
    const ratio = q[0];
    out.doppler = ratio < this.minDoppler ? this.minDoppler : ratio > this.maxDoppler ? this.maxDoppler : ratio;
  }

  /** Distance gain with the source's own model parameters (the tuning's where absent) times its cone gain. */
  private sourceGain(sp: SourceSpatial, d: number, sourcePosition: Vec3Like, listenerPosition: Vec3Like): number {
    const model = sp.distanceModel ?? this.distanceModel;
    const g = distanceGain(model, d, sp.refDistance ?? this.refDistance, sp.maxDistance ?? this.maxDistance, sp.rolloffFactor ?? this.rolloff);
    const o = sp.orientation;
    if (o === undefined) return g * coneGain(sourcePosition, this.defaultOrientation, listenerPosition, sp.coneInnerAngle ?? 360, sp.coneOuterAngle ?? 360, sp.coneOuterGain ?? 0);
    return g * coneGain(sourcePosition, o, listenerPosition, sp.coneInnerAngle ?? 360, sp.coneOuterAngle ?? 360, sp.coneOuterGain ?? 0);
  }

  /** Clamps both line-of-sight speeds in `speeds` in place: non-finite → 0, beyond ±MAX_RADIAL_SPEED → clamped; counted. */
  private clampSpeeds(): void {
    const lim = this.maxRadialSpeed;
    const q = this.speeds;
    for (let k = 0; k < 2; k++) {
      const v = q[k];
      if (v >= -lim && v <= lim) continue;
      this.clamps += 1;
      q[k] = v > lim ? lim : v < -lim ? -lim : 0;
    }
  }

  /** Normalised forward and right (= forward × up) of the listener into scratch; defaults when degenerate (counted). */
  private orientation(lis: ListenerState): void {
    const f = lis.forward;
    const u = lis.up;
    const lf = this.lastForward;
    const lu = this.lastUp;
    if (f.x === lf.x && f.y === lf.y && f.z === lf.z && u.x === lu.x && u.y === lu.y && u.z === lu.z) {
      if (!this.lastOrientationValid) this.clamps += 1;
      return;
    }
    lf.x = f.x;
    lf.y = f.y;
    lf.z = f.z;
    lu.x = u.x;
    lu.y = u.y;
    lu.z = u.z;
    let fx = f.x;
    let fy = f.y;
    let fz = f.z;
    let fl = Math.sqrt(fx * fx + fy * fy + fz * fz);
    let rx = fy * u.z - fz * u.y;
    let ry = fz * u.x - fx * u.z;
    let rz = fx * u.y - fy * u.x;
    let rl = Math.sqrt(rx * rx + ry * ry + rz * rz);
    this.lastOrientationValid = fl > 1e-12 && fl < Infinity && rl > 1e-12 * fl && rl < Infinity;
    if (!this.lastOrientationValid) {
      this.clamps += 1;
      fx = 0;
      fy = 0;
      fz = -1;
      fl = 1;
      rx = 1;
      ry = 0;
      rz = 0;
      rl = 1;
    }
    this.fwd.x = fx / fl;
    this.fwd.y = fy / fl;
    this.fwd.z = fz / fl;
    this.right.x = rx / rl;
    this.right.y = ry / rl;
    this.right.z = rz / rl;
  }
}
