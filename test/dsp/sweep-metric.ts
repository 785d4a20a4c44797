// Sweep rejection at any output rate (issue 19): a logarithmic sine sweep played at speed r with input and output at
// the same rate fs, analysed by a short-time Fourier transform (fft.js, Kaiser β = 20 window). Shared by test/dsp and
// bench/resampler-rates.bench.ts.
//
// The measure, defined here (a logarithmic sweep read by short-time spectra; docs/references.md §20):
// - Input: a log sweep of amplitude 0.5 from 20 Hz to 0.95 · fs/2 lasting r · 2 s, so that the heard sweep
//   (every frequency × r) always lasts 2 s; 10 ms raised-cosine fades at both ends. (0.95 of Nyquist: content
//   at Nyquist itself has its image at Nyquist, which no resampler can separate.)
// - Output: frames of ~43 ms (a power of two), hop a quarter frame, each wholly inside the output's steady part.
// - In each frame, the bins the heard sweep covers during the frame, widened by 24 bins either side, are the signal;
//   every other component in the audible band, 20 Hz to min(20 kHz, fs/2), is a spur (power summed over ±8 bins, so
//   that a sine of amplitude A reads A; the 17 bins summed lie wholly inside the band).
// - Rejection = −20·log10(worst spur over all frames / 0.5), in dB.
// - Passband: a sine heard at 0.9 · min(20 kHz, fs/2) (input frequency ≤ 0.9 of that when r < 1), its gain in dB.
import FFT from 'fft.js';
import { besselI0 } from '../../src/dsp';

/** Measure constants. */
export const SWEEP = Object.freeze({
  amplitude: 0.5,
  startHz: 20,
  audibleTopHz: 20000,
  heardSeconds: 2,
  fadeSeconds: 0.01,
  contentFraction: 0.95,
  windowBeta: 20,
  guardBins: 24,
  sumBins: 8,
});

/** Top of the audible band at output rate `fs`: min(20 kHz, fs/2), Hz. */
export function audibleTop(fs: number): number {
  return Math.min(SWEEP.audibleTopHz, fs / 2);
}

/** Top of the sweep at input rate `fs`: 0.95 · fs/2, Hz. */
export function sweepTop(fs: number): number {
  return (SWEEP.contentFraction * fs) / 2;
}

/** The input sweep for speed `r` at rate `fs` (Float32, r · 2 s long). */
export function sweepInput(fs: number, r: number): Float32Array {
  const n = Math.round(r * SWEEP.heardSeconds * fs);
  const f0 = SWEEP.startHz;
  const k = Math.log(sweepTop(fs) / f0);
  const tIn = n / fs;
  const fade = Math.round(SWEEP.fadeSeconds * fs);
  const out = new Float32Array(n);
  for (let i = 0; i < n; i++) {
    const t = i / fs;
    // Phase of f(t) = f0·e^(k·t/T): 2π·f0·T/k·(e^(k·t/T) − 1).
    const phase = ((2 * Math.PI * f0 * tIn) / k) * (Math.exp((k * t) / tIn) - 1);
    let g = SWEEP.amplitude;
    if (i < fade) g *= 0.5 - 0.5 * Math.cos((Math.PI * i) / fade);
    else if (i >= n - fade) g *= 0.5 - 0.5 * Math.cos((Math.PI * (n - 1 - i)) / fade);
    out[i] = g * Math.sin(phase);
  }
  return out;
}

/** Heard frequency (Hz) at output sample `i` of the sweep played at speed `r`. */
function heardHz(fs: number, r: number, i: number): number {
  const tIn = (r * i) / fs;
  const T = r * SWEEP.heardSeconds;
  return r * SWEEP.startHz * Math.exp((Math.log(sweepTop(fs) / SWEEP.startHz) * tIn) / T);
}

/** FFT size for rate `fs`: the power of two nearest 43 ms. */
export function frameSize(fs: number): number {
  return 1 << Math.round(Math.log2(0.043 * fs));
}

interface Analyser {
  n: number;
  fft: FFT;
  win: Float64Array;
  winPower: number;
  buf: Float64Array;
  spec: number[];
  power: Float64Array;
}

const analysers = new Map<number, Analyser>();
function analyser(n: number): Analyser {
  let a = analysers.get(n);
  if (a) return a;
  const fft = new FFT(n);
  const win = new Float64Array(n);
  const i0 = besselI0(SWEEP.windowBeta);
  for (let i = 0; i < n; i++) {
    const x = (2 * i) / (n - 1) - 1;
    win[i] = besselI0(SWEEP.windowBeta * Math.sqrt(Math.max(0, 1 - x * x))) / i0;
  }
  a = { n, fft, win, winPower: win.reduce((s, v) => s + v * v, 0), buf: new Float64Array(n), spec: fft.createComplexArray() as number[], power: new Float64Array(n / 2 + 1) };
  analysers.set(n, a);
  return a;
}

/** One-sided power of out[start…start+n) through the Kaiser window, into the analyser's `power`. */
function framePower(a: Analyser, out: Float32Array, start: number): Float64Array {
  for (let i = 0; i < a.n; i++) a.buf[i] = out[start + i] * a.win[i];
  a.fft.realTransform(a.spec, a.buf);
  for (let k = 0; k <= a.n / 2; k++) a.power[k] = a.spec[2 * k] * a.spec[2 * k] + a.spec[2 * k + 1] * a.spec[2 * k + 1];
  return a.power;
}

/** Amplitude of the component at `bin` from the power summed over ±8 bins. */
function amplitudeAt(a: Analyser, p: Float64Array, bin: number): number {
  let s = 0;
  for (let k = Math.max(0, bin - SWEEP.sumBins); k <= Math.min(p.length - 1, bin + SWEEP.sumBins); k++) s += p[k];
  return Math.sqrt((4 * s) / (a.n * a.winPower));
}

/** Sweep rejection (dB) of `out`, the sweep of `sweepInput(fs, r)` played at speed `r`; `latency` = output samples of delay (0 for ours). */
export function sweepRejectionDb(out: Float32Array, fs: number, r: number, latency = 0): number {
  const a = analyser(frameSize(fs));
  const n = a.n;
  const binHz = fs / n;
  // Each component's ±8-bin sum lies wholly inside the audible band.
  const top = Math.floor(audibleTop(fs) / binHz) - SWEEP.sumBins;
  const lowBin = Math.ceil(SWEEP.startHz / binHz) + SWEEP.sumBins;
  const heardLen = Math.round(SWEEP.heardSeconds * fs);
  const edge = Math.round(0.05 * fs); // skip the fades and the kernel's reach
  let worst = 0;
  for (let s = edge; s + n <= Math.min(out.length - latency, heardLen) - edge; s += n / 4) {
    const p = framePower(a, out, s + latency);
    const gLo = heardHz(fs, r, s) / binHz - SWEEP.guardBins;
    const gHi = heardHz(fs, r, s + n) / binHz + SWEEP.guardBins;
    for (let b = lowBin; b <= top; b++) {
      if (b >= gLo && b <= gHi) continue;
      const v = amplitudeAt(a, p, b);
      if (v > worst) worst = v;
    }
  }
  return -20 * Math.log10(Math.max(worst, 1e-30) / SWEEP.amplitude);
}

/** Input frequency of the passband sine at speed `r`: heard at 0.9 · audibleTop(fs), or 0.9 · audibleTop(fs) itself when r < 1. */
export function passbandInputHz(fs: number, r: number): number {
  return (0.9 * audibleTop(fs)) / Math.max(1, r);
}

/** The passband input sine for speed `r` at rate `fs` (amplitude 0.5, long enough for one analysis frame after the edge). */
export function passbandSine(fs: number, r: number): Float32Array {
  const n = Math.ceil(r * (frameSize(fs) + 0.2 * fs));
  const w = (2 * Math.PI * passbandInputHz(fs, r)) / fs;
  return Float32Array.from({ length: n }, (_, i) => SWEEP.amplitude * Math.sin(w * i + 0.3));
}

/** Gain (dB) of the passband sine in `out` (the sine of `passbandSine(fs, r)` played at speed `r`). */
export function passbandDb(out: Float32Array, fs: number, r: number, latency = 0): number {
  const a = analyser(frameSize(fs));
  const p = framePower(a, out, Math.round(0.1 * fs) + latency);
  const bin = Math.round((r * passbandInputHz(fs, r) * a.n) / fs);
  return 20 * Math.log10(amplitudeAt(a, p, bin) / SWEEP.amplitude);
}
