import { describe, expect, it } from 'vitest';
import { BiquadLowpass, OnePoleSmoother, centsToRatio, dbToGain, gainToDb, ratioToCents } from '../../src/dsp';

function responseDb(c: Float64Array, f: number, fs: number): number {
  const w = (2 * Math.PI * f) / fs;
  const re = (a0: number, a1: number, a2: number) => a0 + a1 * Math.cos(-w) + a2 * Math.cos(-2 * w);
  const im = (a1: number, a2: number) => a1 * Math.sin(-w) + a2 * Math.sin(-2 * w);
  const nr = re(c[0], c[1], c[2]);
  const ni = im(c[1], c[2]);
  const dr = re(1, c[3], c[4]);
  const di = im(c[3], c[4]);
  return 10 * Math.log10((nr * nr + ni * ni) / (dr * dr + di * di));
}

describe('BiquadLowpass (Audio EQ Cookbook low-pass)', () => {
  // docs/references.md §4a: W3C Audio EQ Cookbook; worked numbers COMPUTED in double precision (= scipy butter to 12 digits).
  const rows: [number, number, number, number, number, number, number, number][] = [
    [48000, 1000, Math.SQRT1_2, 0.00391612666055, 0.00783225332109, -1.8153410827, 0.831005589347, -47.3389],
    [44100, 1000, Math.SQRT1_2, 0.00460399847502, 0.00920799695004, -1.79909640948, 0.817512403385, -45.8622],
    [48000, 5000, Math.SQRT1_2, 0.0722308753258, 0.144461750652, -1.10922879262, 0.398152293921, -18.826],
  ];
  it.each(rows)('matches the cookbook coefficients at fs %d, f0 %d', (fs, f0, q, b0, b1, a1, a2, atQuarter) => {
    const c = BiquadLowpass.coefficients(f0, q, fs, new Float64Array(5));
    expect(Math.abs(c[0] - b0)).toBeLessThan(1e-11);
    expect(Math.abs(c[1] - b1)).toBeLessThan(1e-11);
    expect(Math.abs(c[2] - b0)).toBeLessThan(1e-11);
    expect(Math.abs(c[3] - a1)).toBeLessThan(1e-9);
    expect(Math.abs(c[4] - a2)).toBeLessThan(1e-11);
    expect(responseDb(c, f0, fs)).toBeCloseTo(-3.0103, 4);
    expect(responseDb(c, fs / 4, fs)).toBeCloseTo(atQuarter, 3);
  });

  it.each([[0.5], [1], [2], [8]])('has gain exactly Q at the cutoff (Q = %f)', (q) => {
    // docs/references.md §4a identity: |H(f0)| = Q.
    const c = BiquadLowpass.coefficients(2000, q, 48000, new Float64Array(5));
    expect(responseDb(c, 2000, 48000)).toBeCloseTo(20 * Math.log10(q), 6);
    expect(responseDb(c, 0, 48000)).toBeCloseTo(0, 9);
  });

  it('filters in place with the same gain as its transfer function and clamps absurd cutoffs', () => {
    const f = new BiquadLowpass({ channels: 2 });
    f.setLowpass(1000, Math.SQRT1_2, 48000);
    const a = Float32Array.from({ length: 48000 }, (_, i) => Math.sin((2 * Math.PI * 4000 * i) / 48000));
    const b = a.slice();
    f.process([a, b], 0, a.length);
    let power = 0;
    for (let i = 24000; i < 48000; i++) power += a[i] * a[i];
    const peak = Math.sqrt((2 * power) / 24000); // amplitude from RMS over 2000 whole periods
    const c = BiquadLowpass.coefficients(1000, Math.SQRT1_2, 48000, new Float64Array(5));
    expect(20 * Math.log10(peak)).toBeCloseTo(responseDb(c, 4000, 48000), 2);
    expect(b).toEqual(a);
    const hi = BiquadLowpass.coefficients(1e9, 1, 48000, new Float64Array(5));
    expect(hi).toEqual(BiquadLowpass.coefficients(0.49 * 48000, 1, 48000, new Float64Array(5)));
    for (const v of BiquadLowpass.coefficients(NaN, NaN, 48000, new Float64Array(5))) expect(Number.isFinite(v)).toBe(true);
  });
});

describe('OnePoleSmoother (Web Audio setTargetAtTime)', () => {
  // docs/references.md §5: v(t) = V1 + (V0 − V1)·exp(−(t − T0)/τ); fractions reached (COMPUTED) 1τ 63.21 %, 2τ 86.47 %, 3τ 95.02 %, 4.6052τ 99 %.
  const rows: [number, number][] = [
    [1, 0.6321],
    [2, 0.8647],
    [3, 0.9502],
    [4.6052, 0.99],
    [6.9078, 0.999],
  ];
  it.each(rows)('reaches the published fraction after %f time constants', (n, fraction) => {
    const s = new OnePoleSmoother({ timeConstantSeconds: 0.01, sampleRate: 48000, initial: 0 });
    const frames = Math.round(n * 0.01 * 48000);
    expect(s.advance(1, frames)).toBeCloseTo(1 - Math.exp(-frames / 480), 12);
    expect(Math.abs(s.value - fraction)).toBeLessThan(1e-4);
  });

  it('gives the same value whether advanced in one block or many', () => {
    const a = new OnePoleSmoother({ timeConstantSeconds: 0.02, sampleRate: 48000, initial: -3 });
    const b = new OnePoleSmoother({ timeConstantSeconds: 0.02, sampleRate: 48000, initial: -3 });
    a.advance(5, 1280);
    for (let i = 0; i < 10; i++) b.advance(5, 128);
    expect(b.value).toBeCloseTo(a.value, 12);
  });
});

describe('unit helpers', () => {
  it('converts dB and cents both ways', () => {
    // Amplitude decibels are 20·log10(gain) (common practice): −20 dB = 0.1, a halving = −6.0206 dB.
    expect(dbToGain(-20)).toBeCloseTo(0.1, 12);
    expect(gainToDb(0.5)).toBeCloseTo(-6.0206, 4);
    // docs/references.md §9: V = 0.5 → −1200 cents; §10: 5 cents = 1.0028923 (COMPUTED).
    expect(ratioToCents(0.5)).toBeCloseTo(-1200, 9);
    expect(centsToRatio(5)).toBeCloseTo(1.0028923, 7);
    expect(centsToRatio(1200)).toBeCloseTo(2, 12);
  });
});
