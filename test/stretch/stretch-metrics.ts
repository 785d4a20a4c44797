// Measures of the stretch checks, defined here: pitch error on voiced frames at matching source positions, a
// log-spectral distance on mel bands (docs/references.md §12, §18), and transient smearing on a click train.
import FFT from 'fft.js';
import { YinEstimator, pitchErrorStats, type PitchErrorStats } from '../../src/analysis';

/**
 * Pitch error (cents) of `y` against `x`: output frames every 10 ms, each compared with the input frame centred at the
 * source position `positionAt(outputCentre)`; frames kept when both are voiced (YIN periodicity ≥ 0.9) and, when
 * `stableCents` is given, the input pitch 20 ms either side stays within that many cents (steady voiced frames).
 */
export function pitchErrorAgainstSource(x: Float32Array, y: Float32Array, sampleRate: number, positionAt: (frame: number) => number, stableCents = Infinity): PitchErrorStats {
  const a = new YinEstimator({ sampleRate, minHz: 60, maxHz: 800 });
  const b = new YinEstimator({ sampleRate, minHz: 60, maxHz: 800 });
  const F = a.frameFrames;
  const hop = Math.round(0.01 * sampleRate);
  const d = Math.round(0.02 * sampleRate);
  const expected: number[] = [];
  const measured: number[] = [];
  for (let o = 0; o + F <= y.length; o += hop) {
    const src = Math.round(positionAt(o + (F >> 1)) - F / 2);
    if (src - d < 0 || src + d + F > x.length) continue;
    if (!a.estimate(y, o) || a.periodicity < 0.9) continue;
    if (Number.isFinite(stableCents)) {
      if (!b.estimate(x, src - d)) continue;
      const before = b.frequency;
      if (!b.estimate(x, src + d)) continue;
      const after = b.frequency;
      if (!b.estimate(x, src) || b.periodicity < 0.9) continue;
      if (Math.abs(1200 * Math.log2(before / b.frequency)) > stableCents || Math.abs(1200 * Math.log2(after / b.frequency)) > stableCents) continue;
    } else if (!b.estimate(x, src) || b.periodicity < 0.9) continue;
    expected.push(b.frequency);
    measured.push(a.frequency);
  }
  return pitchErrorStats(expected, measured);
}

/** Dynamic range of the log-spectral distance, dB: band levels further below a frame's loudest band are floored. */
export const FLOOR_DB = 60;

/** Mel scale (O'Shaughnessy's formula, common practice): 2595·log10(1 + f/700). */
function mel(f: number): number {
  return 2595 * Math.log10(1 + f / 700);
}

/**
 * Log-spectral distance on mel bands, dB: frames of ~43 ms (power of two), Hann window, hop a quarter frame,
 * 40 triangular mel bands from 60 Hz to min(8 kHz, Nyquist); output frame at time t against the input frame at
 * t·scale; band powers in dB floored at 60 dB below the frame's loudest band (what lies further down is not compared);
 * per frame the RMS over bands of the difference; the mean over frames whose input frame is within 40 dB of the loudest.
 */
export function melLogSpectralDistance(x: Float32Array, y: Float32Array, sampleRate: number, scale: number): number {
  let n = 1024;
  while (n < 0.043 * sampleRate) n *= 2;
  const hop = n / 4;
  const fft = new FFT(n);
  const win = new Float64Array(n);
  for (let i = 0; i < n; i++) win[i] = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n);
  const bands = 40;
  const lo = mel(60);
  const hi = mel(Math.min(8000, sampleRate / 2));
  const edges = Array.from({ length: bands + 2 }, (_, k) => 700 * (Math.pow(10, (lo + ((hi - lo) * k) / (bands + 1)) / 2595) - 1));
  const frame = new Float64Array(n);
  const spec = fft.createComplexArray() as number[];
  const bandDb = (s: Float32Array, start: number, out: Float64Array): number => {
    let total = 0;
    for (let i = 0; i < n; i++) frame[i] = (s[start + i] ?? 0) * win[i];
    fft.realTransform(spec, Array.from(frame));
    out.fill(0);
    for (let k = 1; k < n / 2; k++) {
      const f = (k * sampleRate) / n;
      const p = spec[2 * k] ** 2 + spec[2 * k + 1] ** 2;
      total += p;
      for (let b = 0; b < bands; b++) {
        const l = edges[b];
        const c = edges[b + 1];
        const r = edges[b + 2];
        if (f <= l || f >= r) continue;
        out[b] += p * (f < c ? (f - l) / (c - l) : (r - f) / (r - c));
      }
    }
    let top = -Infinity;
    for (let b = 0; b < bands; b++) {
      out[b] = 10 * Math.log10(out[b] + 1e-10);
      if (out[b] > top) top = out[b];
    }
    for (let b = 0; b < bands; b++) if (out[b] < top - FLOOR_DB) out[b] = top - FLOOR_DB;
    return total;
  };
  const ex = new Float64Array(bands);
  const ey = new Float64Array(bands);
  const rows: Array<{ energy: number; d: number }> = [];
  for (let o = 0; o + n <= y.length; o += hop) {
    const src = Math.round((o + n / 2) * scale - n / 2);
    if (src < 0 || src + n > x.length) continue;
    const energy = bandDb(x, src, ex);
    bandDb(y, o, ey);
    let s = 0;
    for (let b = 0; b < bands; b++) s += (ex[b] - ey[b]) ** 2;
    rows.push({ energy, d: Math.sqrt(s / bands) });
  }
  const top = Math.max(...rows.map((r) => r.energy));
  const kept = rows.filter((r) => r.energy >= top * 1e-4);
  return kept.reduce((a, r) => a + r.d, 0) / kept.length;
}

/** A click train: 1 ms Hann-shaped 3 kHz bursts every `periodSeconds`, `count` clicks, first at 50 ms. */
export function clickTrain(sampleRate: number, count: number, periodSeconds: number): { x: Float32Array; clicks: number[] } {
  const len = Math.round((0.1 + count * periodSeconds) * sampleRate);
  const x = new Float32Array(len);
  const w = Math.round(0.001 * sampleRate);
  const clicks: number[] = [];
  for (let c = 0; c < count; c++) {
    const at = Math.round((0.05 + c * periodSeconds) * sampleRate);
    clicks.push(at + w / 2);
    for (let i = 0; i < w; i++) x[at + i] = 0.8 * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / w)) * Math.sin((2 * Math.PI * 3000 * i) / sampleRate);
  }
  return { x, clicks };
}

/**
 * Transient smearing, ms: the energy-weighted RMS distance of the output's samples from the nearest expected click
 * time (click ÷ scale); an ideal stretch leaves the click's own half-width (about 0.3 ms for a 1 ms click).
 */
export function smearingMs(y: Float32Array, sampleRate: number, clicks: readonly number[], scale: number): number {
  const expected = clicks.map((c) => c / scale);
  let num = 0;
  let den = 0;
  let k = 0;
  for (let i = 0; i < y.length; i++) {
    const e = y[i] * y[i];
    if (e === 0) continue;
    while (k + 1 < expected.length && Math.abs(expected[k + 1] - i) < Math.abs(expected[k] - i)) k++;
    num += e * (i - expected[k]) ** 2;
    den += e;
  }
  return den > 0 ? (1000 * Math.sqrt(num / den)) / sampleRate : 0;
}
