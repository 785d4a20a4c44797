// Engine benchmark: render cost of 32…256 stereo voices as a fraction of real time, on the TypeScript and the
// WebAssembly SIMD resampler kernels, against a plain copy-mix and the resampler alone measured in the same run
// (engine − resampler alone = the share of render time spent outside the kernel; on the wasm kernel the readers read
// resident sources and write into module memory, as the engine does), and the latency from a
// time-scale change to the output.
import { Engine } from '../src/engine';
import { parseTuning, defaultTuning, serializeTuning } from '../src/tuning';
import { KernelTable, StreamReader, WasmKernel } from '../src/dsp';
import type { KernelName, QualityTierName } from '../src/index';

const SR = 48000;
const BLOCK = 128;

function tone(hz: number, seconds: number, channels: number): Float32Array[] {
  const out: Float32Array[] = [];
  const n = Math.round(seconds * SR);
  for (let c = 0; c < channels; c++) {
    const x = new Float32Array(n);
    for (let i = 0; i < n; i++) x[i] = 0.02 * Math.sin((2 * Math.PI * hz * (1 + c * 0.01) * i) / SR) + 0.005 * Math.sin((2 * Math.PI * 3.1 * hz * i) / SR);
    out.push(x);
  }
  return out;
}

/** Engine with `voices` stereo voices: half loops, half one-shots restarted when they end, half of them in a toned group. */
function scene(voices: number, tier: QualityTierName, kernel: KernelName): { engine: Engine; tick: (block: number) => void } {
  const json = JSON.parse(serializeTuning(defaultTuning));
  json.resampler.tier = tier;
  const tuning = parseTuning(json);
  const engine = new Engine({ sampleRate: SR, capacity: voices, tuning, kernel });
  const sounds = [0, 1, 2, 3].map((k) => engine.addSound(tone(110 * (k + 1), 1.5 + k * 0.5, 2), SR));
  const handles: number[] = [];
  const start = (i: number) =>
    engine.play(sounds[i % 4], {
      loop: i % 2 === 0,
      // 'effects' darkens below time scale 1 (tone on); 'interface' is exempt (tone bypassed): half and half.
      group: i % 4 < 2 ? 'effects' : 'interface',
      ratio: 0.8 + (i % 9) * 0.05,
      gain: 0.5,
      fadeInSeconds: 0.002,
    });
  for (let i = 0; i < voices; i++) handles.push(start(i));
  engine.setTimeScale({ target: 0.6, rampSeconds: 0, easing: 'linear' });
  const tick = (block: number) => {
    // Ratios glide: every 10 blocks, move each voice's base ratio a little.
    if (block % 10 === 0) for (let i = 0; i < voices; i++) engine.setVoice(handles[i], { ratio: 0.8 + ((i + block / 10) % 9) * 0.05 });
    if (block % 50 === 0) for (let i = 1; i < voices; i += 2) if (engine.stats.activeVoices + engine.stats.virtualVoices < voices) handles[i] = start(i);
  };
  return { engine, tick };
}

/** Plain copy-mix of the same number of stereo voices at ratio 1 with a per-block gain: the reference cost. */
function copyMix(voices: number, blocks: number): number {
  const src = tone(220, 2, 2);
  const l = new Float32Array(BLOCK);
  const r = new Float32Array(BLOCK);
  const pos = new Int32Array(voices);
  const t0 = performance.now();
  for (let b = 0; b < blocks; b++) {
    l.fill(0);
    r.fill(0);
    for (let v = 0; v < voices; v++) {
      const g = 0.5 + 0.001 * v;
      let p = pos[v];
      const a = src[0];
      const c = src[1];
      for (let i = 0; i < BLOCK; i++) {
        l[i] += a[p] * g;
        r[i] += c[p] * g;
        p = p + 1 === a.length ? 0 : p + 1;
      }
      pos[v] = p;
    }
  }
  return performance.now() - t0;
}

/** The resampler alone: one StreamReader per voice reading stereo at the same ratios as the engine's voices. */
function readersOnly(voices: number, blocks: number, tier: QualityTierName, kernel: KernelName): number {
  const src = tone(220, 2, 2);
  let out: Float32Array[] = [new Float32Array(BLOCK), new Float32Array(BLOCK)];
  const k = kernel === 'wasm-simd' ? WasmKernel.shared() : null;
  if (k !== null) {
    // As the engine does on this kernel: the source resident in module memory, outputs written there in place.
    for (const x of src) k.upload(x);
    const at = k.allocFloats(2 * BLOCK);
    out = [new Float32Array(k.f32.buffer, at, BLOCK), new Float32Array(k.f32.buffer, at + 4 * BLOCK, BLOCK)];
  }
  const readers = Array.from({ length: voices }, () => {
    const r = new StreamReader({ table: KernelTable.forTier(tier), channels: 2, kernel });
    r.setSource(src, { loop: true });
    return r;
  });
  const t0 = performance.now();
  for (let b = 0; b < blocks; b++)
    for (let v = 0; v < voices; v++) {
      const ratio = 0.6 * (0.8 + ((v + Math.floor(b / 10)) % 9) * 0.05);
      readers[v].read(out, 0, BLOCK, ratio, ratio * 1.0001);
    }
  const ms = performance.now() - t0;
  if (k !== null) for (const x of src) k.discard(x);
  return ms;
}

function timeEngine(voices: number, seconds: number, tier: QualityTierName, kernel: KernelName): { ms: number; active: number } {
  const { engine, tick } = scene(voices, tier, kernel);
  const l = new Float32Array(BLOCK);
  const r = new Float32Array(BLOCK);
  const blocks = Math.round((seconds * SR) / BLOCK);
  for (let b = 0; b < 50; b++) {
    tick(b);
    engine.render([l, r], BLOCK);
  }
  const t0 = performance.now();
  for (let b = 0; b < blocks; b++) {
    tick(b);
    engine.render([l, r], BLOCK);
  }
  return { ms: performance.now() - t0, active: engine.stats.activeVoices };
}

/** Time from a time-scale step to the output's pitch reaching 90 % of the change (ratio in cents), in ms. */
function latency(): { firstChangeMs: number; ninetyPercentMs: number; quantumMs: number; smoothingMs: number } {
  const engine = new Engine({ sampleRate: SR, capacity: 4 });
  const s = engine.addSound(tone(440, 2, 1), SR);
  engine.play(s, { group: 'effects', loop: true, fadeInSeconds: 0 });
  const l = new Float32Array(BLOCK);
  const r = new Float32Array(BLOCK);
  for (let b = 0; b < 20; b++) engine.render([l, r], BLOCK);
  const t0 = engine.time;
  engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
  const mon = [{ voice: 0, sourceId: 0, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false }];
  let first = -1;
  let ninety = -1;
  for (let b = 0; b < 400 && ninety < 0; b++) {
    engine.render([l, r], BLOCK);
    engine.monitor(mon);
    const dt = (engine.time - t0) * 1000;
    if (first < 0 && mon[0].ratioCents < -0.5) first = dt;
    if (ninety < 0 && mon[0].ratioCents <= -1080) ninety = dt;
  }
  return { firstChangeMs: first, ninetyPercentMs: ninety, quantumMs: (BLOCK / SR) * 1000, smoothingMs: defaultTuning.smoothing.ratioSeconds * 1000 };
}

/** Runs the engine benchmark; prints a table unless `json`. */
export async function run(options: { json: boolean }): Promise<object> {
  const seconds = 0.75;
  type Row = { voices: number; tier: QualityTierName; kernel: KernelName; engineRealTime: number; copyMixRealTime: number; resamplerRealTime: number; ratio: number; outsideKernel: number; active: number };
  const rows: Row[] = [];
  const cases: [number, QualityTierName][] = [[32, 'standard'], [64, 'standard'], [128, 'standard'], [256, 'standard'], [128, 'draft']];
  for (const [voices, tier] of cases) {
    // The two kernels back to back, so that machine load hits both alike.
    for (const kernel of ['typescript', 'wasm-simd'] as const) {
      const blocks = Math.round((seconds * SR) / BLOCK);
      const { ms, active } = timeEngine(voices, seconds, tier, kernel);
      const ref = copyMix(voices, blocks);
      const res = readersOnly(voices, blocks, tier, kernel);
      rows.push({ voices, tier, kernel, engineRealTime: ms / 1000 / seconds, copyMixRealTime: ref / 1000 / seconds, resamplerRealTime: res / 1000 / seconds, ratio: ms / ref, outsideKernel: Math.max(0, 1 - res / ms), active });
    }
  }
  const lat = latency();
  if (!options.json) {
    console.log('voices | tier | kernel | engine (share of one core, real time) | copy-mix reference | engine ÷ copy-mix | resampler alone | engine ÷ resampler | outside the kernel | active');
    for (const r of rows)
      console.log(
        `${r.voices} | ${r.tier} | ${r.kernel} | ${(r.engineRealTime * 100).toFixed(1)} % | ${(r.copyMixRealTime * 100).toFixed(2)} % | ${r.ratio.toFixed(1)}× | ${(r.resamplerRealTime * 100).toFixed(1)} % | ${(r.engineRealTime / r.resamplerRealTime).toFixed(2)}× | ${(r.outsideKernel * 100).toFixed(0)} % | ${r.active}`,
      );
    const at = (voices: number, kernel: KernelName) => rows.find((r) => r.voices === voices && r.tier === 'standard' && r.kernel === kernel) as Row;
    for (const voices of [32, 64, 128, 256]) {
      console.log(`${voices} voices: engine speed-up wasm-simd ÷ typescript ${(at(voices, 'typescript').engineRealTime / at(voices, 'wasm-simd').engineRealTime).toFixed(2)}×`);
    }
    console.log(`goal: 128 voices (standard, typescript) within 50 % of one core → ${at(128, 'typescript').engineRealTime <= 0.5 ? 'met' : 'not met'}`);
    console.log(`goal: 256 voices (standard, wasm-simd) within 50 % of one core → ${at(256, 'wasm-simd').engineRealTime <= 0.5 ? 'met' : 'not met'}`);
    console.log(
      `time-scale step → first output change ${lat.firstChangeMs.toFixed(2)} ms, 90 % of the pitch change ${lat.ninetyPercentMs.toFixed(2)} ms` +
        ` (bound: one quantum ${lat.quantumMs.toFixed(2)} ms + smoothing τ ${lat.smoothingMs.toFixed(0)} ms × ln 10 = ${(lat.quantumMs + lat.smoothingMs * Math.LN10).toFixed(2)} ms)`,
    );
  }
  return { rows, latency: lat };
}
