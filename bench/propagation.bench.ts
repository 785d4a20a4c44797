// Propagation benchmark: render cost of positioned stereo voices under the 'propagation' motion model (tracks,
// emission-time solve per source, per-sample read ratios, air low-pass) against the 'instant' model in the same run,
// per voice, with the spread of repeated runs; and 256 stereo positioned voices on the WebAssembly kernel as a share
// of one core (goal: at most 50 %).
import { Engine } from '../src/engine';
import { parseTuning, defaultTuning, serializeTuning } from '../src/tuning';
import type { KernelName } from '../src/index';

const SR = 48000;
const BLOCK = 128;

function tone(hz: number, seconds: number): Float32Array[] {
  const n = Math.round(seconds * SR);
  return [0, 1].map((c) => {
    const x = new Float32Array(n);
    for (let i = 0; i < n; i++) x[i] = 0.02 * Math.sin((2 * Math.PI * hz * (1 + 0.01 * c) * i) / SR);
    return x;
  });
}

/** `voices` stereo looping voices on voices/4 sources circling the listener (positions only, 60 Hz snapshots). */
function scene(voices: number, motion: 'propagation' | 'instant', kernel: KernelName, near = false): (blocks: number) => number {
  const json = JSON.parse(serializeTuning(defaultTuning));
  for (const g of Object.values(json.groups) as Record<string, unknown>[]) g.motion = motion;
  const engine = new Engine({ sampleRate: SR, capacity: voices, tuning: parseTuning(json), kernel });
  const sounds = [0, 1, 2, 3].map((k) => engine.addSound(tone(110 * (k + 1), 1 + k * 0.25), SR));
  const sources = Math.max(1, voices / 4);
  for (let i = 0; i < voices; i++) engine.play(sounds[i % 4], { loop: true, gain: 0.2, sourceId: i % sources, group: i % 2 ? 'effects' : 'vehicles', fadeInSeconds: 0 });
  const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };
  const list = Array.from({ length: sources }, (_, id) => ({ id, position: { x: 0, y: 0, z: 0 } }));
  const snap = { time: 0, listener, sources: list };
  const l = new Float32Array(BLOCK);
  const r = new Float32Array(BLOCK);
  let block = 0;
  const every = Math.round(SR / BLOCK / 60);
  return (blocks: number) => {
    const t0 = performance.now();
    for (let b = 0; b < blocks; b++, block++) {
      if (block % every === 0) {
        const t = ((block + every) * BLOCK) / SR;
        snap.time = t;
        for (const s of list) {
          // Far: radii 10…73 m (the air low-pass engages); near: 3…6 m (it does not).
          const radius = near ? 3 + 0.05 * s.id : 10 + s.id;
          const a = (30 / radius) * t + s.id;
          s.position.x = radius * Math.cos(a);
          s.position.z = radius * Math.sin(a);
        }
        engine.pushSnapshot(snap);
      }
      engine.render([l, r], BLOCK);
    }
    return performance.now() - t0;
  };
}

/** Runs the propagation benchmark; prints a table unless `json`. */
export async function run(options: { json: boolean }): Promise<object> {
  const seconds = 0.5;
  const blocks = Math.round((seconds * SR) / BLOCK);
  const rows: { voices: number; kernel: KernelName; near: boolean; propagationUsPerVoice: number[]; instantUsPerVoice: number[]; ratio: number; coreShare: number }[] = [];
  for (const [voices, kernel, near] of [[64, 'typescript', false], [64, 'wasm-simd', false], [256, 'wasm-simd', false], [256, 'wasm-simd', true]] as [number, KernelName, boolean][]) {
    const prop = scene(voices, 'propagation', kernel, near);
    const inst = scene(voices, 'instant', kernel, near);
    prop(200);
    inst(200);
    const p: number[] = [];
    const q: number[] = [];
    for (let k = 0; k < 3; k++) {
      p.push(prop(blocks));
      q.push(inst(blocks));
    }
    // µs of render per voice per second of audio.
    const per = (ms: number) => (1000 * ms) / seconds / voices;
    const pm = Math.min(...p);
    const qm = Math.min(...q);
    rows.push({
      voices, kernel, near,
      propagationUsPerVoice: [per(pm), per(Math.max(...p))],
      instantUsPerVoice: [per(qm), per(Math.max(...q))],
      ratio: pm / qm,
      coreShare: pm / (seconds * 1000),
    });
  }
  if (!options.json) {
    console.log('voices kernel      sources propagation µs/voice/s (min…max)  instant µs/voice/s (min…max)  prop/instant  share of one core (propagation)');
    for (const r of rows)
      console.log(
        `${String(r.voices).padStart(6)} ${r.kernel.padEnd(11)} ${(r.near ? 'near' : 'far').padEnd(7)} ${r.propagationUsPerVoice.map((x) => x.toFixed(0)).join('…').padStart(30)} ${r.instantUsPerVoice.map((x) => x.toFixed(0)).join('…').padStart(29)} ${r.ratio.toFixed(2).padStart(13)} ${(100 * r.coreShare).toFixed(1).padStart(10)} %`,
      );
  }
  return { rows };
}
