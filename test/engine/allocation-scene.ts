// The busy scene of the zero-allocation check (docs/allocation.md): 64 looping stereo voices in six groups, 8 sources
// moving on closed-form paths with snapshots pushed as the offline renderer pushes them (60 Hz, one interval ahead),
// and a time-scale ramp down and back every 1,000 blocks. The driver itself allocates nothing per block: one snapshot
// object and two ramp requests are made here and rewritten in place.
import { Engine } from '../../src/engine';
import type { EngineSnapshot, KernelPreference, TimeScaleRequest } from '../../src/index';

/** Output rate of the scene, Hz. */
export const SCENE_RATE = 48000;
/** Frames per rendered block (the Web Audio render quantum). */
export const SCENE_BLOCK = 128;
/** Voices playing (the engine's default capacity: every slot busy). */
export const SCENE_VOICES = 64;
/** Moving sources. */
export const SCENE_SOURCES = 8;
/** Blocks between snapshots: 48,000 / 128 / 60 Hz, rounded as the offline renderer rounds it. */
const SNAP_EVERY = Math.max(1, Math.round(SCENE_RATE / SCENE_BLOCK / 60));
/** Blocks between time-scale requests (alternately down to 0.3 and back to 1). */
const RAMP_EVERY = 1000;
/** Groups of the default tuning, cycled over the voices: propagation ones, a stretched one, an exempt one, tone-only. */
const GROUPS = ['effects', 'vehicles', 'ambience', 'radio', 'interface', 'music', 'effects', 'vehicles'] as const;

/** A seeded stereo tone: two partials and a little noise, `seconds` long at `rate` (loops click-free enough here). */
function stereoTone(hz: number, rate: number, seconds: number, seed: number): Float32Array[] {
  let s = seed >>> 0;
  const out: Float32Array[] = [];
  for (let c = 0; c < 2; c++) {
    const x = new Float32Array(Math.round(seconds * rate));
    for (let i = 0; i < x.length; i++) {
      s = (s * 1664525 + 1013904223) >>> 0;
      const t = i / rate;
      x[i] = 0.2 * Math.sin(2 * Math.PI * (hz + c) * t) + 0.05 * Math.sin(2 * Math.PI * 3 * hz * t) + 0.01 * (s / 4294967296 - 0.5);
    }
    out.push(x);
  }
  return out;
}

/** The scene: an engine with every voice playing, and `run(n)` that renders the next `n` blocks. */
export interface AllocationScene {
  engine: Engine;
  /**
   * Renders `n` more blocks (snapshots and ramps included); allocates nothing of its own once optimised. Call it many
   * times with small `n` while warming up: a call that starts in V8's interpreter boxes its doubles until compiled.
   */
  run(n: number): void;
}

/** Builds the scene on a fresh engine with the given resampler kernel and default tuning. */
export function allocationScene(kernel: KernelPreference): AllocationScene {
  const sr = SCENE_RATE;
  const engine = new Engine({ sampleRate: sr, kernel, seed: 7 });
  const sounds = [
    engine.addSound(stereoTone(220, 44100, 1.3, 1), 44100),
    engine.addSound(stereoTone(330, 48000, 0.9, 2), 48000),
    engine.addSound(stereoTone(510, 22050, 0.7, 3), 22050),
    engine.addSound(stereoTone(140, 32000, 2.1, 4), 32000),
  ];
  const snap: EngineSnapshot = {
    time: 0,
    listener: { position: { x: 0.5, y: 0.5, z: 0.5 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } },
    sources: [],
  };
  for (let i = 0; i < SCENE_SOURCES; i++) snap.sources.push({ id: 10 + i, position: { x: 0.5, y: 0.5, z: 0.5 } });
  // Closed-form paths: circles of different radius and speed, and straight fly-bys that wrap around.
  // The snapshot stamped at the start of block `b` (an integer: no double crosses the call).
  const place = (b: number) => {
    const t = (b * SCENE_BLOCK) / sr;
    snap.time = t;
    snap.listener.position.x = 0.25 + 2 * Math.sin(0.3 * t);
    for (let i = 0; i < SCENE_SOURCES; i++) {
      const p = snap.sources[i].position;
      if (i % 2 === 0) {
        const r = 6 + 4 * i;
        const w = 0.4 + 0.15 * i;
        p.x = r * Math.cos(w * t + i) + 0.25;
        p.y = 1.25 + 0.5 * i;
        p.z = r * Math.sin(w * t + i) + 0.25;
      } else {
        const span = 400;
        const speed = 20 + 12 * i;
        p.x = ((speed * t + 37 * i) % span) - span / 2 + 0.25;
        p.y = 0.75;
        p.z = -3 - i + 0.25;
      }
    }
  };
  place(0);
  engine.pushSnapshot(snap);
  for (let v = 0; v < SCENE_VOICES; v++) {
    const group = GROUPS[v % GROUPS.length];
    const positional = group !== 'music' && group !== 'interface';
    const h = engine.play(sounds[v % sounds.length], {
      group,
      loop: true,
      gainDb: -18,
      sourceId: positional ? 10 + (v % SCENE_SOURCES) : undefined,
      ratio: 0.8 + 0.05 * (v % 7),
    });
    if (h < 0) throw new Error(`voice ${v} refused`);
  }
  const down: TimeScaleRequest = { target: 0.3, rampSeconds: 0.5, easing: 'smooth' };
  const up: TimeScaleRequest = { target: 1, rampSeconds: 0.4, easing: 'linear' };
  const left = new Float32Array(SCENE_BLOCK);
  const right = new Float32Array(SCENE_BLOCK);
  const outputs = [left, right];
  let block = 0;
  const run = (n: number) => {
    for (let k = 0; k < n; k++, block++) {
      if (block % SNAP_EVERY === 0) {
        // One snapshot interval ahead, as the offline renderer does: the engine glides to it over the interval.
        place(block + SNAP_EVERY);
        engine.pushSnapshot(snap);
      }
      if (block % RAMP_EVERY === 0) engine.setTimeScale(Math.floor(block / RAMP_EVERY) % 2 === 0 ? down : up);
      engine.render(outputs, SCENE_BLOCK);
    }
  };
  return { engine, run };
}
