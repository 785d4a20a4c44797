import { describe, expect, it } from 'vitest';
import { PeakLimiter } from '../../src/engine';

describe('PeakLimiter', () => {
  // Soft-knee gain computer with ratio ∞ (Giannoulis, Massberg & Reiss, JAES 60(6) 2012, knee formula from memory):
  // y = x below T − W/2; y = x − (x − T + W/2)²/(2W) inside the knee; y = T above. Here T = ceiling, so a loud
  // input settles at the ceiling itself.
  it.each([
    [-20, -20],
    [-3, -3], // knee starts at ceiling − W/2 = −3 dBFS
    [-1, -1.5], // at T: x − (W/2)²/(2W) = −1 − 4/8
    [1, -1], // knee end: T
    [6, -1],
  ])('maps an input level of %s dB to %s dB (ceiling −1 dBFS, knee 4 dB)', (x, y) => {
    const l = new PeakLimiter({ sampleRate: 48000, ceilingDb: -1, kneeDb: 4 });
    expect(l.curveDb(x)).toBeCloseTo(y, 12);
  });

  it('is continuous with slope 1 at the knee start and slope 0 at its end', () => {
    const l = new PeakLimiter({ sampleRate: 48000, ceilingDb: -1, kneeDb: 4 });
    const h = 1e-6;
    expect((l.curveDb(-3 + h) - l.curveDb(-3 - h)) / (2 * h)).toBeCloseTo(1, 4);
    expect((l.curveDb(1 + h) - l.curveDb(1 - h)) / (2 * h)).toBeCloseTo(0, 4);
  });

  it('releases back to unity gain with its time constant after a loud burst', () => {
    const sr = 48000;
    const l = new PeakLimiter({ sampleRate: sr, ceilingDb: -1, releaseSeconds: 0.05 });
    const a = new Float32Array(sr).fill(0.1);
    const b = new Float32Array(sr).fill(0.1);
    a[100] = 8;
    b[100] = 8;
    l.process(a, b, 0, sr);
    // Gain just after the burst: 10^((−1 − 18.06)/20) ≈ 0.112; one time constant later (2400 samples) 63 % back:
    // a one-pole release is v1 + (v0 − v1)·e^(−t/τ), the form of Web Audio setTargetAtTime (docs/references.md §5, VERIFIED; 1τ → 63.21 %).
    const g0 = 10 ** ((-1 - 20 * Math.log10(8)) / 20);
    const expected = 1 - (1 - g0) * Math.exp(-1);
    expect(a[100 + 2400] / 0.1).toBeCloseTo(expected, 2);
    expect(a[sr - 1]).toBeCloseTo(0.1, 6);
    expect(l.reductionDb).toBe(0);
  });
});
