import { describe, expect, it } from 'vitest';
import { KernelTable, StreamReader, resample, MAX_RATIO, qualityTiers, type QualityTierName } from '../../src/dsp';
import { seededRandom, sine } from './resampler-metric';

function reader(tier: QualityTierName = 'standard', channels = 1): StreamReader {
  return new StreamReader({ table: KernelTable.forTier(tier), channels });
}

function noise(n: number, seed: number): Float32Array {
  const rand = seededRandom(seed);
  return Float32Array.from({ length: n }, () => rand() * 2 - 1);
}

describe('StreamReader', () => {
  it('passes samples through bit-exactly at ratio 1 from an integer start offset', () => {
    const x = noise(4000, 1);
    const r = reader();
    r.setSource([x], { startFrame: 1000 });
    const out = new Float32Array(500);
    r.read([out], 0, 500, 1, 1);
    expect(out).toEqual(x.subarray(1000, 1500));
    expect(r.position).toBe(1500);
  });

  it('gives the same samples in arbitrary block sizes as in one block (per-sample ratios)', () => {
    const x = noise(30000, 2);
    const rand = seededRandom(3);
    const ratios = Float32Array.from({ length: 12000 }, (_, i) => 0.4 + 2.2 * (0.5 + 0.5 * Math.sin(i / 700)));
    for (const tier of qualityTiers) {
      const whole = new Float32Array(12000);
      const a = reader(tier);
      a.setSource([x]);
      a.readRatios([whole], 0, 12000, ratios, 0);
      const parts = new Float32Array(12000);
      const b = reader(tier);
      b.setSource([x]);
      for (let o = 0; o < 12000; ) {
        const n = Math.min(12000 - o, 1 + Math.floor(rand() * 300));
        b.readRatios([parts], o, n, ratios, o);
        o += n;
      }
      expect(parts).toEqual(whole);
      expect(b.position).toBe(a.position);
    }
  });

  it('continues a per-block linear ramp without a step: block i ends where block i+1 starts', () => {
    // read() with (start, end) per block equals readRatios with the same per-sample ramp values.
    const x = noise(20000, 4);
    const a = reader();
    a.setSource([x]);
    const b = reader();
    b.setSource([x]);
    const outA = new Float32Array(128 * 40);
    const outB = new Float32Array(128 * 40);
    const ratios = new Float32Array(128);
    for (let blk = 0; blk < 40; blk++) {
      const rs = 0.5 + blk * 0.04;
      const re = rs + 0.04;
      a.read([outA], blk * 128, 128, rs, re);
      for (let i = 0; i < 128; i++) ratios[i] = rs + ((re - rs) * i) / 128;
      b.readRatios([outB], blk * 128, 128, ratios, 0);
    }
    for (let i = 0; i < outA.length; i++) expect(Math.abs(outA[i] - outB[i])).toBeLessThan(1e-6);
  });

  it('advances skip() exactly as read() would', () => {
    const x = noise(20000, 5);
    const a = reader();
    a.setSource([x], { loop: true, loopStart: 100, loopEnd: 5000 });
    const b = reader();
    b.setSource([x], { loop: true, loopStart: 100, loopEnd: 5000 });
    const out = new Float32Array(128);
    for (let blk = 0; blk < 100; blk++) {
      const rs = 0.3 + (blk % 9) * 0.4;
      a.read([out], 0, 128, rs, rs + 0.1);
      b.skip(128, rs, rs + 0.1);
      expect(b.position).toBe(a.position);
    }
  });

  it('reads one set of weights for every channel', () => {
    const x = noise(8000, 6);
    const half = x.map((v) => v * 0.5);
    const r = reader('standard', 2);
    r.setSource([x, half]);
    const l = new Float32Array(3000);
    const rr = new Float32Array(3000);
    r.read([l, rr], 0, 3000, 1.37, 0.61);
    for (let i = 0; i < 3000; i++) expect(Math.abs(rr[i] - 0.5 * l[i])).toBeLessThan(1e-6);
  });

  it('reads silence beyond a one-shot end and reports finished', () => {
    const x = noise(1000, 7);
    const r = reader();
    r.setSource([x], { startFrame: 900 });
    const out = new Float32Array(400).fill(9);
    r.read([out], 0, 400, 1.3, 1.3);
    expect(r.finished).toBe(true);
    for (let i = 300; i < 400; i++) expect(out[i]).toBe(0);
  });

  it('loops seamlessly: a looped region reads like the region tiled end to end', () => {
    // A 1 kHz sine over exactly 48 periods (2304 frames at 48 kHz) tiled is a continuous sine.
    const loopLen = 2304;
    const x = sine(1000, loopLen, 0.5);
    const tiled = new Float32Array(loopLen * 40);
    for (let i = 0; i < tiled.length; i++) tiled[i] = x[i % loopLen];
    for (const ratio of [0.8, 1.7, 3.1]) {
      const r = reader();
      r.setSource([x], { loop: true });
      const n = Math.floor((loopLen * 30) / ratio);
      const looped = new Float32Array(n);
      r.read([looped], 0, n, ratio, ratio);
      const ref = resample(tiled, ratio);
      // After the first pass (history before the loop start is silence then), the looped output equals the tiled one.
      for (let i = Math.ceil((loopLen + 400) / ratio); i < n; i++) expect(Math.abs(looped[i] - ref[i])).toBeLessThan(2e-5);
      expect(r.position).toBeLessThan(loopLen);
    }
  });

  it('counts and clamps out-of-range and non-finite ratios on the audio path', () => {
    const x = noise(50000, 8);
    const r = reader();
    r.setSource([x]);
    const out = new Float32Array(100);
    r.read([out], 0, 100, 8, 8);
    expect(r.clampCount).toBe(2);
    expect(r.position).toBeCloseTo(100 * MAX_RATIO, 9);
    const ratios = Float32Array.from([-1, NaN, 5, 1, Infinity]);
    r.readRatios([out], 0, 5, ratios, 0);
    expect(r.clampCount).toBe(6);
    for (const v of out) expect(Number.isFinite(v)).toBe(true);
  });
});

describe('ratio ramp 0.5 → 2 over one second', () => {
  const fs = 48000;
  const f0 = 100;
  const x = sine(f0, 3 * fs, 0.5);
  const ratios = Float32Array.from({ length: fs }, (_, i) => 0.5 + (1.5 * i) / fs);
  const y = resample(x, ratios);

  it('has no click: every sample-to-sample step stays within the sine slope bound', () => {
    // Largest step of A·sin(2π f t) at the top of the ramp is A·2π·(2 f0)/fs (common practice bound, 5 % margin).
    const bound = 0.5 * 2 * Math.PI * (2 * f0) / fs * 1.05;
    let worst = 0;
    for (let i = 200; i < y.length - 1; i++) worst = Math.max(worst, Math.abs(y[i + 1] - y[i]));
    expect(worst).toBeLessThanOrEqual(bound);
  });

  it('follows the ramp: the instantaneous frequency is f0 times the ratio (within 1 %)', () => {
    // Scaling theorem (J. O. Smith, SASP): frequency × playback ratio; measured from rising zero crossings.
    let last = -1;
    let checked = 0;
    for (let i = 200; i < y.length - 1; i++) {
      if (y[i] < 0 && y[i + 1] >= 0) {
        const t = i + y[i] / (y[i] - y[i + 1]);
        if (last > 0) {
          const mid = Math.round((t + last) / 2);
          const expected = f0 * ratios[mid];
          expect(Math.abs(fs / (t - last) - expected) / expected).toBeLessThan(0.01);
          checked++;
        }
        last = t;
      }
    }
    expect(checked).toBeGreaterThan(100);
  });
});
