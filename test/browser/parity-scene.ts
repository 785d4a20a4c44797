// The scene both hosts render for the parity suite: invented content generated in code, and a list of
// steps at render-quantum-aligned frames, expressed as main-thread runtime calls.
import type { Easing, PlayOptions, SourceSpatial, Vec3Like } from '../../src/index';

/** Output sample rate of the parity renders, Hz. */
export const PARITY_RATE = 48000;
/** Web Audio render quantum (Web Audio API §1.1, "render quantum size" 128 by default). */
export const QUANTUM = 128;

/** One action, as the game would call it on the runtime. */
export type SceneAction =
  | { kind: 'play'; voice: number; sound: number; options: Omit<PlayOptions, 'sourceId'>; source?: number }
  | { kind: 'stop'; voice: number; fadeSeconds?: number }
  | { kind: 'set-ratio'; voice: number; ratio: number }
  | { kind: 'time-scale'; target: number; ramp: number; easing: Easing }
  | { kind: 'snapshot'; listener: { position: Vec3Like; forward: Vec3Like; up: Vec3Like }; sources: { id: number; position: Vec3Like; velocity?: Vec3Like }[] }
  | { kind: 'pause'; group?: string }
  | { kind: 'resume'; group?: string }
  | { kind: 'group'; group: string; volumeDb?: number; muted?: boolean; solo?: boolean }
  | { kind: 'seek'; voice: number; seconds: number }
  /** A source's own distance model and cone: the runtime sends it with the next snapshot. */
  | { kind: 'spatial'; source: number; spatial: SourceSpatial };

/** Actions applied when the renders reach `frame` (a multiple of QUANTUM). */
export interface SceneStep {
  frame: number;
  actions: SceneAction[];
}

/** Sounds as plain channel data. */
export interface SceneSound {
  channels: Float32Array[];
  sampleRate: number;
}

/** The whole scene. */
export interface ParityScene {
  frames: number;
  sounds: SceneSound[];
  /** Number of sources the runtime creates (ids 1…sources, in creation order). */
  sources: number;
  steps: SceneStep[];
}

/** Deterministic uniform noise in [−1, 1): 32-bit xorshift (Marsaglia 2003, "Xorshift RNGs"). */
function noise(seed: number): () => number {
  let s = seed >>> 0 || 1;
  return () => {
    s ^= s << 13;
    s >>>= 0;
    s ^= s >>> 17;
    s ^= s << 5;
    s >>>= 0;
    return s / 2147483648 - 1;
  };
}

/** A harmonic hum (engine-like drone) at `f0` Hz, mono. */
function hum(f0: number, seconds: number, rate: number): SceneSound {
  const n = Math.round(seconds * rate);
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / rate;
    let v = 0;
    for (let h = 1; h <= 6; h++) v += Math.sin(2 * Math.PI * f0 * h * t) / h;
    x[i] = 0.2 * v;
  }
  return { channels: [x], sampleRate: rate };
}

/** A stereo burst of filtered noise with a decaying envelope. */
function burst(seconds: number, rate: number, seed: number): SceneSound {
  const n = Math.round(seconds * rate);
  const rnd = noise(seed);
  const l = new Float32Array(n);
  const r = new Float32Array(n);
  let yl = 0;
  let yr = 0;
  for (let i = 0; i < n; i++) {
    const env = Math.exp(-6 * (i / n));
    yl = 0.7 * yl + 0.3 * rnd();
    yr = 0.7 * yr + 0.3 * rnd();
    l[i] = 0.5 * env * yl;
    r[i] = 0.5 * env * yr;
  }
  return { channels: [l, r], sampleRate: rate };
}

/** A pure tone at `hz`, mono. */
function tone(hz: number, seconds: number, rate: number): SceneSound {
  const n = Math.round(seconds * rate);
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) x[i] = 0.3 * Math.sin((2 * Math.PI * hz * i) / rate);
  return { channels: [x], sampleRate: rate };
}

const listenerAt = (x: number) => ({ position: { x, y: 1.6, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } });

/**
 * A drone flying past the listener (source 1, positions sent every 1/24 s, velocity estimated by the engine),
 * a looping hum at a fixed base ratio, a noise burst, an interface blip, a slow-motion ramp and stops.
 */
export function parityScene(seconds = 1.5): ParityScene {
  const frames = Math.round((seconds * PARITY_RATE) / QUANTUM) * QUANTUM;
  const sounds = [hum(110, 1.0, 44100), burst(0.4, 48000, 7), tone(880, 0.3, 32000)];
  const steps: SceneStep[] = [];
  const snapEvery = 2048; // 42.7 ms, the order of an animation frame
  for (let f = 0; f < frames; f += snapEvery) {
    const t = f / PARITY_RATE;
    const actions: SceneAction[] = [
      { kind: 'snapshot', listener: listenerAt(0.5 * t), sources: [{ id: 1, position: { x: -30 + 40 * t, y: 2, z: -4 } }] },
    ];
    if (f === 0) {
      actions.push({ kind: 'play', voice: 1, sound: 0, options: { group: 'vehicles', loop: true, gain: 0.8 }, source: 1 });
      actions.push({ kind: 'play', voice: 2, sound: 0, options: { group: 'ambience', loop: true, gain: 0.3, ratio: 0.75 } });
    }
    steps.push({ frame: f, actions });
  }
  const at = (frame: number, ...actions: SceneAction[]) => {
    const f = Math.round(frame / QUANTUM) * QUANTUM;
    const s = steps.find((x) => x.frame === f);
    if (s) s.actions.push(...actions);
    else steps.push({ frame: f, actions });
  };
  at(0.2 * PARITY_RATE, { kind: 'play', voice: 3, sound: 1, options: { group: 'effects', gain: 1 } });
  at(0.35 * PARITY_RATE, { kind: 'time-scale', target: 0.4, ramp: 0.3, easing: 'smooth' });
  at(0.5 * PARITY_RATE, { kind: 'play', voice: 4, sound: 2, options: { group: 'interface', gain: 0.5 } });
  at(0.8 * PARITY_RATE, { kind: 'set-ratio', voice: 2, ratio: 1.25 });
  at(1.0 * PARITY_RATE, { kind: 'time-scale', target: 1, ramp: 0.2, easing: 'linear' });
  at(1.2 * PARITY_RATE, { kind: 'stop', voice: 2, fadeSeconds: 0.1 });
  steps.sort((a, b) => a.frame - b.frame);
  return { frames, sounds, sources: 1, steps };
}
