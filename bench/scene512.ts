// The 512-voice scene of issue 17 (compute-limit bench, the A/B harness `bench/ab-scene512.mjs`): 512 stereo loops on
// 256 sources circling the listener at 10…265 m and 30 m/s, positions at 60 Hz, half 'effects' and half 'vehicles',
// base ratios 0.8…1.2, default tuning, the time scale gliding between 1 and 0.6 over each call.
import { Engine } from '../src/engine';
import { parseTuning, defaultTuning, serializeTuning } from '../src/tuning';

const SR = 48000;
const BLOCK = 128;
/** Voices of the scene. */
export const VOICES_512 = 512;

/** A rendering scene: `render(blocks)` renders that many 128-frame blocks; `hash` is an FNV-1a hash of every output sample's bits so far. */
export interface Scene512 {
  render(blocks: number): void;
  readonly hash: number;
}

/** A quiet two-partial stereo tone of `seconds` at SR (the channels 1 % apart), the benches' source. */
export function tone(hz: number, seconds: number): Float32Array[] {
  const n = Math.round(seconds * SR);
  return [0, 1].map((c) => {
    const x = new Float32Array(n);
    for (let i = 0; i < n; i++) x[i] = 0.02 * Math.sin((2 * Math.PI * hz * (1 + 0.01 * c) * i) / SR) + 0.005 * Math.sin((2 * Math.PI * 3.1 * hz * i) / SR);
    return x;
  });
}

/** The scene with the groups' motion `motion` ('propagation': the default tuning); `hashing` adds each block's output to `hash`. */
export function createScene512(motion: 'propagation' | 'instant', hashing = false): Scene512 {
  const json = JSON.parse(serializeTuning(defaultTuning));
  if (motion !== 'propagation') for (const g of Object.values(json.groups) as Record<string, unknown>[]) g.motion = motion;
  const engine = new Engine({ sampleRate: SR, capacity: VOICES_512, tuning: parseTuning(json) });
  const sounds = [0, 1, 2, 3].map((k) => engine.addSound(tone(110 * (k + 1), 1.5 + k * 0.5), SR));
  const sources = VOICES_512 / 2;
  for (let i = 0; i < VOICES_512; i++) {
    engine.play(sounds[i % 4], { loop: true, gain: 0.2, ratio: 0.8 + (i % 9) * 0.05, sourceId: i % sources, group: i % 2 ? 'effects' : 'vehicles', fadeInSeconds: 0 });
  }
  const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };
  const list = Array.from({ length: sources }, (_, id) => ({ id, position: { x: 0, y: 0, z: 0 } }));
  const snap = { time: 0, listener, sources: list };
  const l = new Float32Array(BLOCK);
  const r = new Float32Array(BLOCK);
  const lb = new Uint32Array(l.buffer);
  const rb = new Uint32Array(r.buffer);
  const every = Math.round(SR / BLOCK / 60);
  let block = 0;
  let ramp = 0;
  const scene = {
    hash: 0x811c9dc5,
    render(blocks: number): void {
      // Each call glides the time scale (1 → 0.6 or back) over its length, so every voice's ratio moves.
      engine.setTimeScale({ target: ramp++ % 2 === 0 ? 0.6 : 1, rampSeconds: (blocks * BLOCK) / SR, easing: 'linear' });
      for (let b = 0; b < blocks; b++, block++) {
        if (block % every === 0) {
          const t = ((block + every) * BLOCK) / SR;
          snap.time = t;
          for (const s of list) {
            const radius = 10 + s.id;
            const a = (30 / radius) * t + s.id;
            s.position.x = radius * Math.cos(a);
            s.position.z = radius * Math.sin(a);
          }
          engine.pushSnapshot(snap);
        }
        engine.render([l, r], BLOCK);
        if (hashing) {
          let h = scene.hash;
          for (let i = 0; i < BLOCK; i++) {
            h = Math.imul(h ^ lb[i], 0x01000193) >>> 0;
            h = Math.imul(h ^ rb[i], 0x01000193) >>> 0;
          }
          scene.hash = h;
        }
      }
    },
  };
  return scene;
}
