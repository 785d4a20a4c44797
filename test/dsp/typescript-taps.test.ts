// The TypeScript kernel's shortcuts keep its samples: one stride lookup per constant ratio or per ramp within one
// stride, and one table row (or column) on a table phase.
import { describe, expect, it } from 'vitest';
import { KernelTable, StreamReader, qualityTiers } from '../../src/dsp';
import { seededRandom } from './resampler-metric';

function reader(tier: (typeof qualityTiers)[number] = 'standard'): StreamReader {
  return new StreamReader({ table: KernelTable.forTier(tier), channels: 1, kernel: 'typescript' });
}

function noise(n: number, seed: number): Float32Array {
  const rand = seededRandom(seed);
  return Float32Array.from({ length: n }, () => rand() * 2 - 1);
}

describe('TypeScript kernel', () => {
  // Ramps whose per-sample ratios rs + (dr·i)/128 are exact in float32, so that readRatios sees the same ratios.
  const ramps: [number, number][] = [
    [0.5, 0.5],
    [2, 2],
    [1.5, 1.5 + 1 / 32],
    [1.5, 1.75],
    [0.75, 1.25],
    [3.5, 2.5],
  ];

  it.each(qualityTiers.flatMap((tier) => ramps.map(([a, b]) => [tier, a, b] as const)))('gives a ramp the samples of the same ratios given per sample (%s, %f → %f)', (tier, a, b) => {
    const x = noise(6000, 5);
    const ratios = Float32Array.from({ length: 128 }, (_, i) => a + ((b - a) * i) / 128);
    for (let i = 0; i < 128; i++) expect(ratios[i]).toBe(a + ((b - a) * i) / 128);
    const p = reader(tier);
    const q = reader(tier);
    p.setSource([x], { startFrame: 700 });
    q.setSource([x], { startFrame: 700 });
    const ramp = new Float32Array(128);
    const each = new Float32Array(128);
    for (let blk = 0; blk < 8; blk++) {
      p.read([ramp], 0, 128, a, b);
      q.readRatios([each], 0, 128, ratios, 0);
      expect(ramp).toEqual(each);
      expect(p.position).toBe(q.position);
    }
  });

  // IEEE 754 on the kernel's form y = a0 + f·(a1 − a0), a0 and a1 the sums of the two rows (or points) over the window:
  // a NaN or infinite tap makes both sums NaN or ±∞, and then y is NaN (same-sign infinities subtract to NaN,
  // opposite-sign ones add to NaN, 0·∞ is NaN) — also on a table phase (f = 0), where one row's sum alone would be ±∞.
  it.each([0.5, 0.25, 2, 4, 0.4837, 1.7])('turns a NaN or infinite source sample into NaN in every output whose window covers it (ratio %f)', (r) => {
    const t = KernelTable.forTier('standard');
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY]) {
      const x = noise(4000, 6);
      const m = 2000;
      x[m] = bad;
      const rd = reader();
      rd.setSource([x]);
      const frames = Math.floor(3600 / r);
      const y = new Float32Array(frames);
      for (let o = 0; o < frames; o += 128) rd.read([y], o, Math.min(128, frames - o), r, r);
      const stride = t.strideFor(r);
      let pos = 0; // the reader's position, advanced by r per sample as the reader does
      for (let i = 0; i < frames; i++, pos += r) {
        const n = Math.floor(pos);
        // The window's first and last frames (the stretched window's span, as the kernel takes it).
        const c = Math.floor((pos - n) * stride);
        const half = t.halfTaps * t.phases;
        const lo = stride === t.phases ? n - t.halfTaps + 1 : n - Math.floor((half - 1 - c) / stride);
        const hi = stride === t.phases ? n + t.halfTaps : n + Math.floor((half + c) / stride);
        const covered = m >= lo && m <= hi;
        if (covered ? !Number.isNaN(y[i]) : !Number.isFinite(y[i])) throw new Error(`ratio ${r}, ${bad}: output ${i} (window ${lo}…${hi}) is ${y[i]}`);
      }
    }
  });
});
