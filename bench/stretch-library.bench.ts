// Evaluation of a general-purpose time-stretch library from the registry (signalsmith-stretch 1.3.2, MIT, a
// WebAssembly build) against our WSOLA stretcher (src/stretch), in the same process: CPU per stereo voice, latency,
// memory per instance, quality (mel log-spectral distance to the input, as test/stretch defines it) and a gliding
// ratio. The package is not a dependency: this bench skips unless `npm install --no-save signalsmith-stretch@1.3.2`.
// Its published entry only builds AudioWorkletNodes; the WebAssembly module factory is taken from the package's
// UMD file (the text before its module-registration lines), as its own worklet code does.
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import { KernelTable } from '../src/dsp';
import { StretchReader } from '../src/stretch';
import { melLogSpectralDistance } from '../test/stretch/stretch-metrics';

const SR = 48000;
const BLOCK = 128;

interface StretchModule {
  _presetDefault(channels: number, sampleRate: number): void;
  _setBuffers(channels: number, length: number): number;
  _process(inputFrames: number, outputFrames: number): void;
  _inputLatency(): number;
  _outputLatency(): number;
  _reset(): void;
  _setTransposeSemitones(semitones: number, tonalityLimit: number): void;
  HEAP8: Int8Array;
}

async function loadFactory(): Promise<(() => Promise<StretchModule>) | null> {
  try {
    const require = createRequire(import.meta.url);
    const file = require.resolve('signalsmith-stretch');
    const text = readFileSync(file, 'utf8');
    const cut = text.indexOf("if (typeof exports === 'object' && typeof module === 'object')");
    return new Function(`${text.slice(0, cut)}; return SignalsmithStretch;`)() as () => Promise<StretchModule>;
  } catch {
    return null;
  }
}

function harmonic(f0: number, seconds: number): Float32Array {
  const n = Math.round(seconds * SR);
  const x = new Float32Array(n);
  for (let i = 0; i < n; i++) for (let k = 1; k <= 8; k++) x[i] += (0.4 / k) * Math.sin((2 * Math.PI * k * f0 * i) / SR + 0.7 * k);
  return x;
}

/** Streams `x` (mono, copied to both channels) through the library at speed speedAt(t); returns the left output with its latency removed. */
function libraryStretch(m: StretchModule, x: Float32Array, speedAt: (t: number) => number, outFrames: number): { y: Float32Array; ms: number } {
  m._presetDefault(2, SR);
  // As the library's own worklet does before every block: no transposition, tonality limit 8 kHz.
  m._setTransposeSemitones(0, 8000 / SR);
  const latency = m._inputLatency() + m._outputLatency();
  const cap = 8192;
  const ptr = m._setBuffers(2, cap);
  const inL = ptr / 4;
  const inR = inL + cap;
  const outL = inL + 2 * cap;
  const y = new Float32Array(outFrames + latency);
  let readPos = 0;
  let owed = 0;
  let ms = 0;
  for (let o = 0; o < y.length; o += BLOCK) {
    const s = speedAt(o / SR);
    owed += BLOCK * s;
    const take = Math.floor(owed);
    owed -= take;
    const heap = new Float32Array(m.HEAP8.buffer);
    for (let i = 0; i < take; i++) {
      const v = readPos + i < x.length ? x[readPos + i] : 0;
      heap[inL + i] = v;
      heap[inR + i] = v;
    }
    readPos += take;
    const t0 = performance.now();
    m._process(take, BLOCK);
    ms += performance.now() - t0;
    const h = new Float32Array(m.HEAP8.buffer);
    for (let i = 0; i < BLOCK && o + i < y.length; i++) y[o + i] = h[outL + i];
  }
  return { y, ms };
}

/** Mel LSD at the best alignment (output shifted by 0…maxShift frames in steps of 64): fair to a stretcher with latency. */
function bestLsd(x: Float32Array, y: Float32Array, scale: number, maxShift: number): { lsd: number; shift: number } {
  let best = { lsd: Infinity, shift: 0 };
  for (let k = 0; k <= maxShift; k += 64) {
    const lsd = melLogSpectralDistance(x, y.subarray(k), SR, scale);
    if (lsd < best.lsd) best = { lsd, shift: k };
  }
  return best;
}

function oursStretch(x: Float32Array, speedAt: (t: number) => number, outFrames: number): { y: Float32Array; ms: number } {
  const r = new StretchReader({ table: KernelTable.forTier('standard'), channels: 2, sampleRate: SR });
  r.setSource([x, x]);
  const y = new Float32Array(outFrames);
  const out = [new Float32Array(BLOCK), new Float32Array(BLOCK)];
  let ms = 0;
  for (let o = 0; o + BLOCK <= outFrames; o += BLOCK) {
    const s0 = speedAt(o / SR);
    const s1 = speedAt((o + BLOCK) / SR);
    const t0 = performance.now();
    r.read(out, 0, BLOCK, s0, s1, 1, 1);
    ms += performance.now() - t0;
    y.set(out[0], o);
  }
  return { y, ms };
}

function maxStep(y: Float32Array, from: number, to: number): number {
  let m = 0;
  for (let i = from + 1; i < to; i++) m = Math.max(m, Math.abs(y[i] - y[i - 1]));
  return m;
}

/** Runs the evaluation; prints a table unless `json`. */
export async function run(options: { json: boolean }): Promise<object> {
  const factory = await loadFactory();
  if (factory === null) {
    if (!options.json) console.log('signalsmith-stretch is not installed: skipped (npm install --no-save signalsmith-stretch@1.3.2)');
    return { skipped: true };
  }
  const m = await factory();
  m._presetDefault(2, SR);
  const latencyFrames = m._inputLatency() + m._outputLatency();
  const heapBytes = m.HEAP8.length;
  const tone = harmonic(180, 1.2);
  const rows: Array<{ scale: number; oursLsd: number; libLsd: number; libShift: number; oursCpu: number; libCpu: number }> = [];
  // Warm-up of both (compilers), not timed.
  oursStretch(tone, () => 0.5, SR);
  libraryStretch(m, tone, () => 0.5, SR);
  for (const s of [0.5, 0.25]) {
    const frames = Math.floor((tone.length / s) * 0.9);
    const ours = oursStretch(tone, () => s, frames);
    const lib = libraryStretch(m, tone, () => s, frames);
    const aligned = bestLsd(tone, lib.y, s, 2 * Math.ceil(latencyFrames / s));
    rows.push({
      scale: s,
      oursLsd: melLogSpectralDistance(tone, ours.y, SR, s),
      libLsd: aligned.lsd,
      libShift: aligned.shift,
      oursCpu: ours.ms / 1000 / (frames / SR),
      libCpu: lib.ms / 1000 / (frames / SR),
    });
  }
  // Gliding ratio 1 → 0.25 → 1 on one sine: the largest sample step against the sine-slope bound.
  const sine = new Float32Array(2 * SR).map((_, i) => 0.4 * Math.sin((2 * Math.PI * 220 * i) / SR));
  const glide = (t: number) => (t < 0.5 ? 1 - 1.5 * t : t < 1 ? 0.25 + 1.5 * (t - 0.5) : 1);
  const bound = 0.4 * ((2 * Math.PI * 220) / SR) * 1.05;
  const gOurs = oursStretch(sine, glide, Math.round(1.5 * SR));
  const gLib = libraryStretch(m, sine, (t) => glide(Math.max(0, t - latencyFrames / SR)), Math.round(1.5 * SR));
  const stepOurs = maxStep(gOurs.y, 0.05 * SR, 1.4 * SR);
  const stepLib = maxStep(gLib.y, latencyFrames + 0.05 * SR, 1.4 * SR);
  if (!options.json) {
    console.log(`library latency ${latencyFrames} frames (${((1000 * latencyFrames) / SR).toFixed(1)} ms) at 48 kHz; ours 0 (reads ahead in the stored sound); WebAssembly memory per library instance ${(heapBytes / 1048576).toFixed(1)} MiB`);
    console.log('time scale | mel LSD ours | mel LSD library (best alignment) | CPU ours (stereo, share of one core) | CPU library | library ÷ ours');
    for (const r of rows) console.log(`${r.scale} | ${r.oursLsd.toFixed(2)} dB | ${r.libLsd.toFixed(2)} dB at ${((1000 * r.libShift) / SR).toFixed(0)} ms | ${(r.oursCpu * 100).toFixed(2)} % | ${(r.libCpu * 100).toFixed(2)} % | ${(r.libCpu / r.oursCpu).toFixed(1)}×`);
    console.log(`glide 1 → 0.25 → 1 on a 220 Hz sine: largest step ours ${stepOurs.toFixed(4)}, library ${stepLib.toFixed(4)} (bound ${bound.toFixed(4)})`);
  }
  return { latencyFrames, heapBytes, rows, glide: { stepOurs, stepLib, bound } };
}
