// Hostile gameplay frames for the engine: fast-check arbitraries of snapshots, time scales and voice actions, and a
// driver that pushes them into an Engine and checks every rendered block.
import fc from 'fast-check';
import { Engine, type EngineSnapshot, type VoiceMonitor } from '../../src/engine';
import { MAX_RATIO, MIN_RATIO } from '../../src/dsp';
import { defaultTuning, parseTuning, serializeTuning, type Tuning } from '../../src/tuning';
import type { Vec3Like } from '../../src/units';

/** Numbers a game can hand over by mistake, mixed with plain ones. */
const hostileNumber = fc.oneof(
  { weight: 3, arbitrary: fc.double({ min: -1e4, max: 1e4, noNaN: true }) },
  { weight: 2, arbitrary: fc.constantFrom(NaN, Infinity, -Infinity, 1e300, -1e300, -0, 0, 5e-324, 1.7e308, -1.7e308) },
);
const plainNumber = fc.double({ min: -200, max: 200, noNaN: true });
const vec = (n: fc.Arbitrary<number>) => fc.record({ x: n, y: n, z: n });

/** What happens to the scene this frame. */
export type FrameKind = 'normal' | 'hostile' | 'inside' | 'zero-distance' | 'supersonic-approach' | 'supersonic-recede' | 'teleport';
/** How the snapshot's time stamp moves. */
export type TimeStep = 'advance' | 'repeat' | 'backwards' | 'nan' | 'infinite' | 'huge' | 'negative-zero' | 'jump';
/** A voice-level action taken before the block. */
export type Action = 'none' | 'play' | 'play-unknown-group' | 'stop' | 'regroup' | 'ramp' | 'ramp-hostile' | 'set-voice-hostile' | 'tuning';

/** One generated frame: a snapshot recipe, a time scale, an action and a block size. */
export interface FrameSpec {
  kind: FrameKind;
  time: TimeStep;
  timeScale: number | undefined;
  listener: { position: Vec3Like; forward: Vec3Like; up: Vec3Like; velocity: Vec3Like | null };
  sources: { id: number; position: Vec3Like; velocity: Vec3Like | null }[];
  action: Action;
  /** Small integer picking voices, groups and tunings for the action. */
  pick: number;
  /** Frames rendered after this snapshot (16…32). */
  frames: number;
}

/** The arbitrary of one frame. */
export const frameArbitrary: fc.Arbitrary<FrameSpec> = fc.record({
  kind: fc.constantFrom<FrameKind>('normal', 'hostile', 'hostile', 'inside', 'zero-distance', 'supersonic-approach', 'supersonic-recede', 'teleport'),
  time: fc.constantFrom<TimeStep>('advance', 'advance', 'advance', 'repeat', 'backwards', 'nan', 'infinite', 'huge', 'negative-zero', 'jump'),
  timeScale: fc.oneof(
    { weight: 4, arbitrary: fc.constant(undefined) },
    { weight: 2, arbitrary: fc.double({ min: 0, max: 4, noNaN: true }) },
    { weight: 2, arbitrary: fc.constantFrom(NaN, -1, -0, 0, 1e300, Infinity, -Infinity, 1e-12, 4, 5, 1e-300) },
  ),
  listener: fc.record({
    position: vec(hostileNumber),
    forward: vec(hostileNumber),
    up: vec(hostileNumber),
    velocity: fc.option(vec(hostileNumber), { nil: null }),
  }),
  sources: fc.array(
    fc.record({
      id: fc.oneof({ weight: 6, arbitrary: fc.integer({ min: 0, max: 9 }) }, { weight: 1, arbitrary: fc.constantFrom(NaN, -1, 1e300, Infinity, 0.5) }),
      position: vec(hostileNumber),
      velocity: fc.option(vec(hostileNumber), { nil: null }),
    }),
    { maxLength: 6 },
  ),
  action: fc.constantFrom<Action>('none', 'none', 'none', 'none', 'play', 'play-unknown-group', 'stop', 'regroup', 'ramp', 'ramp-hostile', 'set-voice-hostile', 'tuning'),
  pick: fc.integer({ min: 0, max: 1023 }),
  frames: fc.integer({ min: 16, max: 32 }),
});

/** Tunings swapped in during the run: the default, groups removed, extreme Doppler on a game clock, a low ceiling. */
export function adversarialTunings(): Tuning[] {
  const base = () => JSON.parse(serializeTuning(defaultTuning));
  const fewGroups = base();
  fewGroups.groups = { effects: fewGroups.groups.effects, crowd: { ...fewGroups.groups.ambience, priority: 3 } };
  const extreme = base();
  extreme.doppler = { ...extreme.doppler, factor: 10, maxShiftCents: 2400, velocityClock: 'game', smoothingSeconds: 0, velocitySmoothingSeconds: 0, teleportSpeed: 100000 };
  extreme.smoothing = { ratioSeconds: 0, cutoffSeconds: 0, gainSeconds: 0 };
  extreme.distance = { model: 'linear', refDistance: 0.01, maxDistance: 0.02, rolloffFactor: 100 };
  const low = base();
  low.master = { limiter: true, ceilingDb: -12, gainDb: 12 };
  low.resampler = { tier: 'high' };
  low.distance = { model: 'exponential', refDistance: 0.01, maxDistance: 1e7, rolloffFactor: 100 };
  return [defaultTuning, parseTuning(fewGroups), parseTuning(extreme), parseTuning(low)];
}

const GROUPS = ['effects', 'vehicles', 'ambience', 'interface', 'music', 'crowd'];

/** Figures gathered over a run. */
export interface AdversarialTally {
  snapshots: number;
  frames: number;
  /** Frames whose input carried a value the engine must clamp or refuse. */
  hostileInputs: number;
  /** Of those, how many raised the clamp or refused counters (must equal hostileInputs). */
  hostileCounted: number;
  nonFinite: number;
  overCeiling: number;
  ratioOutOfRange: number;
  voicesChecked: number;
  peak: number;
  clamps: number;
  refused: number;
  steals: number;
  errors: number;
}

const finite3 = (v: Vec3Like) => Number.isFinite(v.x) && Number.isFinite(v.y) && Number.isFinite(v.z);

/** Drives one engine through a sequence of frames, checking every block. */
export class AdversarialDriver {
  readonly engine: Engine;
  readonly tally: AdversarialTally = {
    snapshots: 0, frames: 0, hostileInputs: 0, hostileCounted: 0, nonFinite: 0, overCeiling: 0, ratioOutOfRange: 0,
    voicesChecked: 0, peak: 0, clamps: 0, refused: 0, steals: 0, errors: 0,
  };
  private readonly tunings = adversarialTunings();
  private tuning: Tuning = defaultTuning;
  private readonly sounds: number[] = [];
  private readonly handles: number[] = [];
  private readonly monitors: VoiceMonitor[] = [];
  private readonly left = new Float32Array(32);
  private readonly right = new Float32Array(32);
  private lastTime = 0;
  private lastListener: Vec3Like = { x: 0, y: 0, z: 0 };

  constructor(capacity = 12) {
    this.engine = new Engine({ sampleRate: 48000, capacity, maxSources: 64, tuning: defaultTuning });
    const n = 4800;
    const sine = new Float32Array(n).map((_, i) => Math.sin((2 * Math.PI * 5 * i) / n)); // full scale, whole cycles: loops cleanly
    let seed = 12345;
    const noise = new Float32Array(n).map(() => ((seed = (seed * 1103515245 + 12345) >>> 0) / 2 ** 31 - 1) * 1);
    const square = new Float32Array(n).map((_, i) => (i % 96 < 48 ? 1 : -1));
    this.sounds.push(this.engine.addSound([sine], 48000), this.engine.addSound([noise, sine], 44100), this.engine.addSound([square], 96000));
    for (let i = 0; i < capacity * 4; i++) this.monitors.push({ voice: 0, sourceId: 0, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false });
    for (let i = 0; i < capacity; i++) this.play(i, GROUPS[i % 5]);
  }

  private play(pick: number, group: string): void {
    const sound = this.sounds[pick % this.sounds.length];
    const h = this.engine.play(sound, { loop: true, group, gain: 1 + (pick % 16), sourceId: pick % 10, ratio: pick % 7 === 0 ? 4 : 1 });
    if (h >= 0) this.handles.push(h);
    if (this.handles.length > 64) this.handles.splice(0, this.handles.length - 64);
  }

  /** Builds the snapshot of a frame from the spec and the driver's state. */
  private snapshot(f: FrameSpec): EngineSnapshot {
    const now = this.engine.time;
    let time: number;
    switch (f.time) {
      case 'advance': time = this.lastTime + f.frames / 48000; break;
      case 'repeat': time = this.lastTime; break;
      case 'backwards': time = this.lastTime - 0.5; break;
      case 'nan': time = NaN; break;
      case 'infinite': time = f.pick % 2 ? Infinity : -Infinity; break;
      case 'huge': time = 1e300; break;
      case 'negative-zero': time = -0; break;
      case 'jump': time = this.lastTime + 3600; break;
    }
    if (Number.isFinite(time)) this.lastTime = time;
    const lis = f.kind === 'hostile' ? f.listener : { ...f.listener, position: clampVec(f.listener.position), forward: clampVec(f.listener.forward), up: clampVec(f.listener.up) };
    if (finite3(lis.position)) this.lastListener = lis.position;
    const lp = this.lastListener;
    const sources = f.sources.map((s, i) => {
      switch (f.kind) {
        case 'inside':
          return { id: s.id, position: { ...lp }, velocity: s.velocity ?? undefined };
        case 'zero-distance':
          return { id: s.id, position: { ...lp }, velocity: { x: 0, y: 0, z: 0 } };
        case 'supersonic-approach':
        case 'supersonic-recede': {
          // 1000 m/s (about Mach 3) straight at the listener or away, on a path consistent with the engine clock.
          const sign = f.kind === 'supersonic-approach' ? -1 : 1;
          const d = 50 + sign * 1000 * ((now * 7 + i) % 0.05);
          return { id: s.id, position: { x: lp.x + d, y: lp.y, z: lp.z }, velocity: f.pick % 2 ? { x: sign * 1000, y: 0, z: 0 } : undefined };
        }
        case 'teleport':
          return { id: s.id, position: { x: (f.pick * 997 + i * 131) % 20000 - 10000, y: 0, z: (f.pick % 13) * 1e5 }, velocity: undefined };
        case 'normal':
          return { id: s.id, position: clampVec(s.position), velocity: s.velocity ? clampVec(s.velocity) : undefined };
        default:
          return { id: s.id, position: s.position, velocity: s.velocity ?? undefined };
      }
    });
    return { time, timeScale: f.timeScale, listener: { position: lis.position, forward: lis.forward, up: lis.up, velocity: lis.velocity ?? undefined }, sources };
  }

  /** Whether a snapshot carries anything the engine must clamp (non-finite vectors, bad time scale) or refuse (bad ids). */
  private hostile(s: EngineSnapshot): boolean {
    const l = s.listener;
    if (!finite3(l.position) || !finite3(l.forward) || !finite3(l.up) || (l.velocity && !finite3(l.velocity))) return true;
    if (s.timeScale !== undefined && !(s.timeScale >= 0 && s.timeScale <= 4)) return true;
    for (const src of s.sources) {
      if (!Number.isFinite(src.id)) return true;
      if (!finite3(src.position) || (src.velocity && !finite3(src.velocity))) return true;
    }
    return false;
  }

  private act(f: FrameSpec): boolean {
    const e = this.engine;
    const h = this.handles.length ? this.handles[f.pick % this.handles.length] : -1;
    switch (f.action) {
      case 'play':
        this.play(f.pick, GROUPS[f.pick % GROUPS.length]);
        return false;
      case 'play-unknown-group':
        this.play(f.pick, `no-such-group-${f.pick % 3}`);
        return true;
      case 'stop':
        e.stop(h, (f.pick % 3) * 0.005);
        return false;
      case 'regroup':
        // A sudden group change: the voice stops at once and its sound restarts in another group.
        e.stop(h, 0);
        this.play(f.pick + 1, GROUPS[(f.pick >> 3) % GROUPS.length]);
        return false;
      case 'ramp':
        e.setTimeScale({ target: (f.pick % 9) / 2, rampSeconds: (f.pick % 5) * 0.01, easing: (['linear', 'smooth', 'exponential'] as const)[f.pick % 3] });
        return (f.pick % 9) / 2 > 4;
      case 'ramp-hostile':
        e.setTimeScale({ target: [NaN, -3, 1e300, Infinity][f.pick % 4], rampSeconds: [NaN, -1, Infinity, 0][(f.pick >> 2) % 4], easing: 'exponential', startTime: [NaN, -Infinity, 1e300, undefined][(f.pick >> 4) % 4] });
        return true;
      case 'set-voice-hostile':
        e.setVoice(h, { gain: [NaN, Infinity, -1, 1e300][f.pick % 4], ratio: [NaN, 0, -1, 1e300, Infinity][(f.pick >> 2) % 5] });
        return false; // a stale handle is ignored (nothing to count)
      case 'tuning':
        this.tuning = this.tunings[f.pick % this.tunings.length];
        e.setTuning(this.tuning);
        return false;
      default:
        return false;
    }
  }

  /** Runs one frame: action, snapshot, render, checks. */
  step(f: FrameSpec): void {
    const e = this.engine;
    const t = this.tally;
    const before = e.stats.clamps + e.stats.refused;
    const refusedBefore = e.stats.refused;
    const actionHostile = this.act(f);
    const snap = this.snapshot(f);
    const hostile = actionHostile || this.hostile(snap);
    e.pushSnapshot(snap);
    const l = this.left;
    const r = this.right;
    e.render([l, r], f.frames);
    t.snapshots++;
    t.frames += f.frames;
    const ceiling = this.tuning.master.limiter ? Math.pow(10, this.tuning.master.ceilingDb / 20) : Infinity;
    for (let i = 0; i < f.frames; i++) {
      const a = l[i];
      const b = r[i];
      if (!Number.isFinite(a) || !Number.isFinite(b)) t.nonFinite++;
      const m = Math.max(Math.abs(a), Math.abs(b));
      if (m > ceiling * (1 + 1e-6)) t.overCeiling++;
      if (m > t.peak) t.peak = m;
    }
    const n = e.monitor(this.monitors);
    for (let i = 0; i < n; i++) {
      const m = this.monitors[i];
      const ratio = Math.pow(2, m.ratioCents / 1200);
      t.voicesChecked++;
      if (!(ratio >= MIN_RATIO * (1 - 1e-9) && ratio <= MAX_RATIO * (1 + 1e-9)) || !Number.isFinite(m.cutoffHz) || !Number.isFinite(m.gainDb) || !Number.isFinite(m.distance)) t.ratioOutOfRange++;
    }
    if (hostile) {
      t.hostileInputs++;
      if (e.stats.clamps + e.stats.refused > before || e.stats.refused > refusedBefore) t.hostileCounted++;
    }
    t.clamps = e.stats.clamps;
    t.refused = e.stats.refused;
    t.steals = e.stats.steals;
    t.errors = e.stats.errors;
  }
}

function clampVec(v: Vec3Like): Vec3Like {
  const c = (x: number) => (Number.isFinite(x) ? Math.max(-1e4, Math.min(1e4, x)) : 0);
  return { x: c(v.x), y: c(v.y), z: c(v.z) };
}
