// The TypeScript kernel's paired fast path (two consecutive output samples summed in one loop) keeps every sample:
// a block read gives the samples of the same reads made one frame at a time, which never pair (a one-frame block has
// no second sample), so they run the single-sample code. Samples are compared with Object.is on the float32 values:
// bit-identical for every finite value and ±0, and NaN where the single path gives NaN. A different order of additions
// changes a double sum in its last bits, which float32 output rounding almost always hides: the pair forms of
// kernel-dot are therefore also compared with the single forms on their double results.
import { describe, expect, it } from 'vitest';
import { KernelTable, StreamReader, qualityTiers, type StreamSourceOptions } from '../../src/dsp';
import { dotRowsSplit, dotRowsSplitPair, rowSum, rowSumPair } from '../../src/dsp/kernel-dot';
import { seededRandom } from './resampler-metric';

function reader(tier: (typeof qualityTiers)[number]): StreamReader {
  return new StreamReader({ table: KernelTable.forTier(tier), channels: 1, kernel: 'typescript' });
}

function noise(n: number, seed: number): Float32Array {
  const rand = seededRandom(seed);
  return Float32Array.from({ length: n }, () => rand() * 2 - 1);
}

/** The first index where a and b differ by Object.is, or −1. */
function firstDifference(a: Float32Array, b: Float32Array): number {
  for (let i = 0; i < a.length; i++) if (!Object.is(a[i], b[i])) return i;
  return -1;
}

/** One block's ratios: a constant, a ramp (start, end) as `read` takes it, or per-sample ratios as `readRatios` takes them. */
type Ratios = { ramp: [number, number] } | { each: Float32Array };

/**
 * Reads `blocks` blocks of `frames` frames from two readers on the same source: one in whole blocks, one a frame at a
 * time with each sample's own ratio; expects the same samples, position, clamp count and stretch after every block.
 */
function expectPairedEqualsSingle(x: Float32Array, source: StreamSourceOptions, tier: (typeof qualityTiers)[number], frames: number, blocks: number, ratios: (block: number) => Ratios): void {
  const p = reader(tier);
  const q = reader(tier);
  p.setSource([x], source);
  q.setSource([x], source);
  const a = new Float32Array(frames);
  const b = new Float32Array(frames);
  for (let blk = 0; blk < blocks; blk++) {
    const r = ratios(blk);
    if ('ramp' in r) {
      const [rs, re] = r.ramp;
      p.read([a], 0, frames, rs, re);
      // StreamReader.read's per-sample ratio, for in-range ends: rs + (re − rs)·i/frames.
      const dr = re - rs;
      for (let i = 0; i < frames; i++) {
        const ri = dr === 0 ? rs : rs + (dr * i) / frames;
        q.read([b], i, 1, ri, ri);
      }
    } else {
      p.readRatios([a], 0, frames, r.each, 0);
      for (let i = 0; i < frames; i++) q.readRatios([b], i, 1, r.each, i);
    }
    const d = firstDifference(a, b);
    if (d >= 0) throw new Error(`block ${blk}, sample ${d}: ${a[d]} in a block, ${b[d]} one at a time`);
    expect(p.position).toBe(q.position);
    expect(p.clampCount).toBe(q.clampCount);
    expect(p.finished).toBe(q.finished);
  }
}

describe('TypeScript kernel, paired samples', () => {
  // On table phases (multiples of 1/256 for the 256-phase tiers, 1/64, 1/128 in general), off them, and stretched.
  const constants = [0.5, 0.25, 0.75, 0.125, 0.5 + 1 / 256, 0.7, 0.3, 0.999, 0.5000001, 1.25, 1.7];
  const starts = [700, 700.5, 700.25, 700.3];
  it.each(qualityTiers.flatMap((tier) => constants.map((r) => [tier, r] as const)))('gives a constant ratio the samples of the single-sample path (%s, ratio %f), odd and even blocks, several start phases', (tier, r) => {
    const x = noise(4000, 21);
    for (const start of starts) for (const frames of [128, 127, 63, 3, 2]) expectPairedEqualsSingle(x, { startFrame: start }, tier, frames, 6, () => ({ ramp: [r, r] }));
  });

  const ramps: [number, number][] = [
    [0.4, 0.9],
    [0.5, 0.25],
    [0.8, 1.3],
    [1.2, 0.6],
    [0.99, 1.01],
  ];
  it.each(ramps)('gives a ramp %f → %f the samples of its per-sample ratios read one at a time', (rs, re) => {
    const x = noise(5000, 22);
    for (const tier of qualityTiers) for (const frames of [128, 65]) expectPairedEqualsSingle(x, { startFrame: 600.5 }, tier, frames, 8, () => ({ ramp: [rs, re] }));
  });

  it('gives per-sample ratios with hostile values (NaN, ±Infinity, 0, negative, huge, tiny) the single-sample samples and clamp count', () => {
    const x = noise(6000, 23);
    const rand = seededRandom(24);
    const hostile = [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY, 0, -3, 1e30, 1e-30, 0.5, 0.75, 4, 5];
    for (const frames of [128, 127]) {
      const each = new Float32Array(frames);
      expectPairedEqualsSingle(x, { startFrame: 800 }, 'standard', frames, 12, (blk) => {
        for (let i = 0; i < frames; i++) {
          const u = rand();
          // Runs of table-phase ratios (pairs form), gliding ones, and a hostile value now and then.
          each[i] = u < 0.15 ? hostile[Math.floor(rand() * hostile.length)] : blk % 3 === 0 ? 0.5 : blk % 3 === 1 ? 0.25 + 0.5 * rand() : 0.5 + 0.002 * Math.sin(i);
        }
        return { each };
      });
    }
  });

  it('keeps the samples across loop seams (region reads wrapping several times)', () => {
    const x = noise(3000, 25);
    for (const r of [0.5, 0.75, 0.7, 0.25, 1.3]) {
      for (const frames of [128, 101]) expectPairedEqualsSingle(x, { loop: true, loopStart: 400, loopEnd: 1150, startFrame: 1000.5 }, 'standard', frames, 30, () => ({ ramp: [r, r] }));
    }
  });

  it('keeps the samples at a one-shot start and past its end (windows leaving the source)', () => {
    const x = noise(500, 26);
    for (const r of [0.5, 0.75, 0.7, 0.25]) {
      for (const frames of [128, 33]) expectPairedEqualsSingle(x, {}, 'standard', frames, Math.ceil(620 / r / frames), () => ({ ramp: [r, r] }));
    }
  });

  it('keeps the samples around a NaN or infinite source sample (the full form replaces the one-row shortcut)', () => {
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      const x = noise(3000, 27);
      x[1500] = bad;
      for (const r of [0.5, 0.75, 0.7, 0.25]) {
        for (const frames of [128, 127]) expectPairedEqualsSingle(x, { startFrame: 1300.5 }, 'standard', frames, Math.ceil(500 / r / frames), () => ({ ramp: [r, r] }));
      }
    }
  });
});

describe('kernel-dot pair forms', () => {
  const t = KernelTable.forTier('standard');
  const rand = seededRandom(28);
  // Samples of magnitudes 1e-3…1e3: any change in the order of additions shows in the double sums.
  const x = Float32Array.from({ length: 4000 }, () => (rand() * 2 - 1) * 10 ** (6 * rand() - 3));
  const io = new Float64Array(4);
  const one = new Float64Array(4);

  it('gives each sample of rowSumPair the double of rowSum (shared and separate windows)', () => {
    for (let k = 0; k < 2000; k++) {
      const [p0, p1] = [Math.floor(rand() * t.phases), Math.floor(rand() * t.phases)];
      const m0 = Math.floor(rand() * 3000);
      const m1 = k % 2 === 0 ? m0 : m0 + 1 + Math.floor(rand() * 3);
      rowSumPair(t.phaseMajor, p0 * t.taps, p1 * t.taps, t.taps, x, m0, m1, io);
      rowSum(t.phaseMajor, p0 * t.taps, t.taps, x, m0, one);
      expect(Object.is(io[2], one[2])).toBe(true);
      rowSum(t.phaseMajor, p1 * t.taps, t.taps, x, m1, one);
      expect(Object.is(io[3], one[2])).toBe(true);
    }
  });

  it('gives each sample of dotRowsSplitPair the double of dotRowsSplit (shared and separate windows)', () => {
    for (let k = 0; k < 2000; k++) {
      const [p0, p1] = [Math.floor(rand() * t.phases), Math.floor(rand() * t.phases)];
      const [f0, f1] = [rand(), rand()];
      const m0 = Math.floor(rand() * 3000);
      const m1 = k % 2 === 0 ? m0 : m0 + 1 + Math.floor(rand() * 3);
      io[0] = f0;
      io[1] = f1;
      dotRowsSplitPair(t.phaseMajor, p0 * t.taps, p1 * t.taps, t.taps, x, m0, m1, io);
      one[0] = f0;
      dotRowsSplit(t.phaseMajor, p0 * t.taps, t.taps, x, m0, one);
      expect(Object.is(io[2], one[1])).toBe(true);
      one[0] = f1;
      dotRowsSplit(t.phaseMajor, p1 * t.taps, t.taps, x, m1, one);
      expect(Object.is(io[3], one[1])).toBe(true);
    }
  });
});
