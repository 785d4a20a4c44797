// Helpers of the propagation suites: scripted motion, a render loop that pushes 60 Hz snapshots one interval ahead
// (as the offline renderer does), and the emission-time physics written here, independently of the engine.
import { Engine } from '../../src/engine';
import type { EngineOptions, PlayOptions, Tuning } from '../../src/index';
import { PitchTracker } from '../../src/analysis';

/** A point moving along a path: position and velocity at time t (s). */
export type Path = (t: number) => { p: [number, number, number]; v: [number, number, number] };

/** Straight line through `at` (position at time 0) with constant velocity `v`. */
export function line(at: [number, number, number], v: [number, number, number]): Path {
  return (t) => ({ p: [at[0] + v[0] * t, at[1] + v[1] * t, at[2] + v[2] * t], v });
}

/** Circle in the x–z plane around `centre`, radius r (m), speed (m/s), starting at angle 0. */
export function circle(centre: [number, number, number], r: number, speed: number): Path {
  const w = speed / r;
  return (t) => ({
    p: [centre[0] + r * Math.cos(w * t), centre[1], centre[2] + r * Math.sin(w * t)],
    v: [-r * w * Math.sin(w * t), 0, r * w * Math.cos(w * t)],
  });
}

/** Options of a scripted render. */
export interface Scene {
  source: Path;
  listener: Path;
  /** Seconds to render. */
  seconds: number;
  /** Whether snapshots carry the exact velocities (else positions only, as the three.js binding sends). */
  exactVelocities: boolean;
  /** Sound: mono samples and their rate. */
  sound: Float32Array;
  soundRate: number;
  play?: PlayOptions;
  tuning?: Tuning;
  engine?: Partial<EngineOptions>;
  /** Snapshots per second (default 60). */
  snapshotRate?: number;
  /** Time scale per block start (default 1). */
  timeScale?: number;
  /** Replaces a snapshot's source position (bad-input tests); return null to leave the source out. */
  mangle?: (t: number, p: { x: number; y: number; z: number }) => { x: number; y: number; z: number } | null;
  /** Game time of the world at wall time t (default timeScale·t): where the paths are evaluated. */
  worldClock?: (t: number) => number;
  /** Engine time the voice starts at, s (default 0). */
  playAt?: number;
  /** Runs before each block with the engine (events, teleports …). */
  each?: (engine: Engine, time: number) => void;
}

/** Renders a scene at 48 kHz; returns the left+right sum and the engine. */
export function renderScene(scene: Scene): { out: Float32Array; left: Float32Array; right: Float32Array; engine: Engine } {
  const sr = 48000;
  const block = 128;
  const engine = new Engine({ sampleRate: sr, tuning: scene.tuning, ...scene.engine });
  const sound = engine.addSound([scene.sound], scene.soundRate);
  const rate = scene.snapshotRate ?? 60;
  const every = Math.max(1, Math.round(sr / block / rate));
  const interval = (every * block) / sr;
  const scale = scene.timeScale ?? 1;
  const snap = (t: number) => {
    // Stamped with wall time; the world has moved by the game time s·t.
    const g = scene.worldClock ? scene.worldClock(t) : scale * t;
    const s = scene.source(g);
    const l = scene.listener(g);
    let sp: { x: number; y: number; z: number } | null = { x: s.p[0], y: s.p[1], z: s.p[2] };
    if (scene.mangle) sp = scene.mangle(t, sp);
    return {
      time: t,
      listener: {
        position: { x: l.p[0], y: l.p[1], z: l.p[2] },
        forward: { x: 0, y: 0, z: -1 },
        up: { x: 0, y: 1, z: 0 },
        velocity: scene.exactVelocities ? { x: l.v[0], y: l.v[1], z: l.v[2] } : undefined,
      },
      sources: sp === null ? [] : [{ id: 7, position: sp, velocity: scene.exactVelocities ? { x: s.v[0], y: s.v[1], z: s.v[2] } : undefined }],
    };
  };
  engine.pushSnapshot(snap(0));
  if (scene.timeScale !== undefined) engine.setTimeScale({ target: scene.timeScale, rampSeconds: 0, easing: 'linear' });
  const n = Math.round(scene.seconds * sr);
  const left = new Float32Array(n);
  const right = new Float32Array(n);
  const l = new Float32Array(block);
  const r = new Float32Array(block);
  let played = false;
  for (let b = 0, o = 0; o < n; b++, o += block) {
    const t0 = o / sr;
    if (b % every === 0) engine.pushSnapshot(snap(t0 + interval));
    if (!played && t0 >= (scene.playAt ?? 0)) {
      engine.play(sound, { loop: true, sourceId: 7, fadeInSeconds: 0, ...scene.play });
      played = true;
    }
    scene.each?.(engine, t0);
    const m = Math.min(block, n - o);
    engine.render([l, r], m);
    left.set(l.subarray(0, m), o);
    right.set(r.subarray(0, m), o);
  }
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) out[i] = left[i] + right[i];
  return { out, left, right, engine };
}

/**
 * Emission time on straight paths, written from the physics (docs/references.md §11): with S(τ) = S0 + vS·τ and the
 * listener at L(t), |L(t) − S0 − vS·τ| = c·(t − τ) is the quadratic (|vS|² − c²)τ² + 2(c²t − D·vS)τ + |D|² − c²t² = 0,
 * D = L(t) − S0; the latest root τ ≤ t is the sound heard at t (NaN when none: outside a Mach cone).
 */
export function straightEmissionTime(S0: number[], vS: number[], L: number[], t: number, c: number): number {
  const D = [L[0] - S0[0], L[1] - S0[1], L[2] - S0[2]];
  const vv = vS[0] * vS[0] + vS[1] * vS[1] + vS[2] * vS[2];
  const dv = D[0] * vS[0] + D[1] * vS[1] + D[2] * vS[2];
  const dd = D[0] * D[0] + D[1] * D[1] + D[2] * D[2];
  const a = vv - c * c;
  const b = 2 * (c * c * t - dv);
  const k = dd - c * c * t * t;
  if (Math.abs(a) < 1e-12) return -k / b;
  const disc = b * b - 4 * a * k;
  if (disc < 0) return NaN;
  const r1 = (-b - Math.sqrt(disc)) / (2 * a);
  const r2 = (-b + Math.sqrt(disc)) / (2 * a);
  const ok = (x: number) => x <= t + 1e-12;
  if (ok(r1) && ok(r2)) return Math.max(r1, r2);
  if (ok(r1)) return r1;
  if (ok(r2)) return r2;
  return NaN;
}

/** Heard over emitted frequency at t: dτ/dt of an emission-time function, by a central difference (h = 10 µs). */
export function dopplerAt(tau: (t: number) => number, t: number): number {
  const h = 1e-5;
  return (tau(t + h) - tau(t - h)) / (2 * h);
}

/** Tracker settings of the propagation suites: 15 ms YIN window, 5 ms hop, 60…8000 Hz. */
export const TRACK_WINDOW_SECONDS = 0.015;

/**
 * The reference signal, written from the physics: a tone of f0 emitted at τ and heard at t, sin(2π·f0·τ(t)), with the
 * inverse-distance gain 1/(c·(t − τ)) of the default distance model (docs/references.md §5); silent where τ < 0 or none.
 */
export function referenceSignal(n: number, sr: number, f0: number, tau: (t: number) => number, c: number): Float32Array {
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / sr;
    const e = tau(t);
    if (!(e >= 0)) continue;
    const d = Math.max(1, c * (t - e));
    x[i] = (0.25 / d) * Math.sin(2 * Math.PI * f0 * e);
  }
  return x;
}

/**
 * Cents between the tracked pitch of `out` and that of `reference`, on frames where both are voiced (periodicity ≥
 * `voiced`) and the reference is at least 100 Hz: both go through the same tracker, so its own bias on fast glides cancels and what remains is the
 * engine's departure from the physics.
 */
export function pitchErrors(out: Float32Array, reference: Float32Array, sr: number, voiced = 0.95, from = 0): number[] {
  const tracker = new PitchTracker({ sampleRate: sr, minHz: 60, maxHz: 8000, hopSeconds: 0.005, windowSeconds: TRACK_WINDOW_SECONDS });
  const a = tracker.track(out);
  const b = tracker.track(reference);
  const errs: number[] = [];
  for (let i = 0; i < a.times.length; i++) {
    if (a.times[i] < from || !(a.periodicities[i] >= voiced) || !(b.periodicities[i] >= voiced)) continue;
    // At least 1.5 periods in the 15 ms window: below 100 Hz the tracker itself is not trusted.
    if (!(a.frequencies[i] > 0) || !(b.frequencies[i] >= 100)) continue;
    errs.push(1200 * Math.log2(a.frequencies[i] / b.frequencies[i]));
  }
  return errs;
}

/** The q-quantile (0…1) of |values|. */
export function absQuantile(values: number[], q: number): number {
  const a = values.map(Math.abs).sort((x, y) => x - y);
  return a.length === 0 ? NaN : a[Math.min(a.length - 1, Math.floor(q * (a.length - 1) + 0.5))];
}

/** A looped-safe sine: `hz` at `rate` for `seconds` (choose whole periods). */
export function tone(hz: number, rate: number, seconds: number, amp = 0.25): Float32Array {
  const n = Math.round(seconds * rate);
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) x[i] = amp * Math.sin((2 * Math.PI * hz * i) / rate);
  return x;
}
