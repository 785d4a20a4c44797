// The agreed resampler quality metric (issue "The metric"): a 20-tone multisine at 48 kHz, Kaiser β = 20 window,
// real FFT (fft.js), component power summed over ±8 bins; shared by test/dsp and bench/resampler.bench.ts.
import FFT from 'fft.js';
import { besselI0 } from '../../src/dsp';
import { seededRandom } from '../../src/random';

/** Metric constants: sample rate, signal length, skip, FFT size, tone amplitude. */
export const METRIC = Object.freeze({
  sampleRate: 48000,
  seconds: 10,
  skip: 12000,
  fftSize: 131072,
  toneAmplitude: 0.04,
  tones: 20,
  passbandAmplitude: 0.5,
  windowBeta: 20,
});

/** Frequencies f_k = 100·228^(k/19) Hz, k = 0…19. */
export const metricFrequencies: readonly number[] = Object.freeze(
  Array.from({ length: METRIC.tones }, (_, k) => 100 * Math.pow(228, k / (METRIC.tones - 1))),
);

/** Seeded uniform generator in [0, 1) (mulberry32, common practice). */
export { seededRandom };

let multisineCache: Float32Array | null = null;

/** The 10 s metric input (20 sines of amplitude 0.04, phases from seed 2024); built once and shared. */
export function metricMultisine(): Float32Array {
  if (multisineCache) return multisineCache;
  const n = METRIC.sampleRate * METRIC.seconds;
  const rand = seededRandom(2024);
  const acc = new Float64Array(n);
  for (const f of metricFrequencies) {
    const w = (2 * Math.PI * f) / METRIC.sampleRate;
    const ph = 2 * Math.PI * rand();
    for (let i = 0; i < n; i++) acc[i] += METRIC.toneAmplitude * Math.sin(w * i + ph);
  }
  multisineCache = Float32Array.from(acc);
  return multisineCache;
}

/** A sine of `amplitude` at `hz` (48 kHz), `length` samples, phase 0.3 rad. */
export function sine(hz: number, length: number, amplitude: number, sampleRate = METRIC.sampleRate): Float32Array {
  const out = new Float32Array(length);
  const w = (2 * Math.PI * hz) / sampleRate;
  for (let i = 0; i < length; i++) out[i] = amplitude * Math.sin(w * i + 0.3);
  return out;
}

/** Input frames needed so that output samples skip…skip+fftSize−1 at `ratio` are all computed from real input. */
export function inputFramesNeeded(ratio: number): number {
  return Math.min(METRIC.sampleRate * METRIC.seconds, Math.ceil((METRIC.skip + METRIC.fftSize) * ratio) + 2048);
}

const fft = new FFT(METRIC.fftSize);
const windowed = new Float64Array(METRIC.fftSize);
const spectrum = fft.createComplexArray() as number[];
const win = (() => {
  const m = METRIC.fftSize - 1;
  const w = new Float64Array(METRIC.fftSize);
  const i0 = besselI0(METRIC.windowBeta);
  for (let n = 0; n <= m; n++) {
    const x = (2 * n) / m - 1;
    w[n] = besselI0(METRIC.windowBeta * Math.sqrt(Math.max(0, 1 - x * x))) / i0;
  }
  return w;
})();
const winPower = win.reduce((s, v) => s + v * v, 0);

/** One-sided power per bin (bins 0…fftSize/2) of output[skip…skip+fftSize), Kaiser β = 20 window. */
export function powerSpectrum(output: Float32Array): Float64Array {
  const n = METRIC.fftSize;
  if (output.length < METRIC.skip + n) throw new Error(`output too short for the metric: ${output.length}`);
  for (let i = 0; i < n; i++) windowed[i] = output[METRIC.skip + i] * win[i];
  fft.realTransform(spectrum, windowed);
  const p = new Float64Array(n / 2 + 1);
  for (let k = 0; k <= n / 2; k++) p[k] = spectrum[2 * k] * spectrum[2 * k] + spectrum[2 * k + 1] * spectrum[2 * k + 1];
  return p;
}

/** Amplitude of a component centred at `bin`, from the power summed over ±8 bins (a sine of amplitude A reads A). */
export function componentAmplitude(p: Float64Array, bin: number): number {
  let s = 0;
  for (let k = Math.max(0, bin - 8); k <= Math.min(p.length - 1, bin + 8); k++) s += p[k];
  return Math.sqrt((4 * s) / (METRIC.fftSize * winPower));
}

/** Bin nearest to `hz`. */
export function binOf(hz: number): number {
  return Math.round((hz * METRIC.fftSize) / METRIC.sampleRate);
}

/** Rejection in dB of a resampled multisine at `ratio`: −20·log10(worst non-legitimate component in 10 Hz–20 kHz / 0.04). */
export function rejectionDb(output: Float32Array, ratio: number): number {
  const p = powerSpectrum(output);
  const excluded = new Uint8Array(p.length);
  for (const f of metricFrequencies) {
    if (f * ratio >= METRIC.sampleRate / 2) continue;
    const b = binOf(f * ratio);
    for (let k = Math.max(0, b - 16); k <= Math.min(p.length - 1, b + 16); k++) excluded[k] = 1;
  }
  let worst = 0;
  for (let b = Math.max(binOf(10), 0); b <= binOf(20000); b++) {
    if (excluded[b]) continue;
    worst = Math.max(worst, componentAmplitude(p, b));
  }
  return -20 * Math.log10(Math.max(worst, 1e-30) / METRIC.toneAmplitude);
}

/** Passband test frequency (input Hz) at `ratio`: 0.9·min(24000, 24000/ratio). */
export function passbandHz(ratio: number): number {
  return 0.9 * Math.min(METRIC.sampleRate / 2, METRIC.sampleRate / 2 / ratio);
}

/** Passband gain in dB of a resampled 0.5-amplitude sine at passbandHz(ratio). */
export function passbandGainDb(output: Float32Array, ratio: number): number {
  const p = powerSpectrum(output);
  return 20 * Math.log10(componentAmplitude(p, binOf(passbandHz(ratio) * ratio)) / METRIC.passbandAmplitude);
}

/** The passband input sine at `ratio`, long enough for the metric. */
export function passbandInput(ratio: number): Float32Array {
  return sine(passbandHz(ratio), inputFramesNeeded(ratio), METRIC.passbandAmplitude);
}

/** Rejection and passband error of a resampler function at `ratio`. */
export function measure(resampler: (input: Float32Array, ratio: number) => Float32Array, ratio: number): { rejectionDb: number; passbandDb: number } {
  const ms = metricMultisine().subarray(0, inputFramesNeeded(ratio));
  return {
    rejectionDb: rejectionDb(resampler(ms, ratio), ratio),
    passbandDb: passbandGainDb(resampler(passbandInput(ratio), ratio), ratio),
  };
}
