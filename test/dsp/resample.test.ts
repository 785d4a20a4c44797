import { describe, expect, it } from 'vitest';
import { DspArgumentError, resample, resampleChunks, qualityTiers, defaultQualityTier, type QualityTierName } from '../../src/dsp';
import * as root from '../../src/index';
import { powerSpectrum, seededRandom, sine, METRIC } from './resampler-metric';
import { libsamplerateResample } from '../../bench/resampler-reference';

function peakHz(y: Float32Array): number {
  const p = powerSpectrum(y);
  let best = 1;
  for (let k = 1; k < p.length; k++) if (p[k] > p[best]) best = k;
  return (best * METRIC.sampleRate) / METRIC.fftSize;
}

describe('scaling theorem: speed V multiplies frequency by V and divides duration by V', () => {
  // J. O. Smith, Spectral Audio Signal Processing, "Scaling Theorem" (docs/references.md §9, VERIFIED).
  const rows: [number, number, number][] = [
    [1000, 1.5, 1500],
    [1000, 0.5, 500],
  ];
  const input = sine(1000, 240000, 0.5);
  it.each(rows)('a %d Hz sine at speed %f comes out at %d Hz with the length divided by the speed', (f, v, expected) => {
    const y = resample(input, v);
    expect(y.length).toBe(Math.floor(input.length / v));
    const bin = (METRIC.sampleRate / METRIC.fftSize) * 1.01;
    expect(Math.abs(peakHz(y) - expected)).toBeLessThanOrEqual(bin);
    expect(Math.abs(peakHz(input) - f)).toBeLessThanOrEqual(bin);
  });
});

describe('resample entry point', () => {
  it('is re-exported from the package root with the tier names and default', () => {
    expect(root.resample).toBe(resample);
    expect(root.qualityTiers).toEqual(['draft', 'standard', 'high']);
    expect(root.defaultQualityTier).toBe('standard');
    expect(defaultQualityTier).toBe('standard');
  });

  it('gives one output per ratio when the ratio is an array', () => {
    const ratios = new Float32Array(1234).fill(0.75);
    expect(resample(new Float32Array(5000), ratios).length).toBe(1234);
  });

  it.each([[0.5], [0.8], [1.25], [1.7], [2.5], [4], [3.3]])('returns floor(length / %f) samples', (r) => {
    expect(resample(new Float32Array(10007), r).length).toBe(Math.floor(10007 / r));
  });

  it('reproduces the input exactly at ratio 1 (pass-through)', () => {
    const rand = seededRandom(7);
    const x = Float32Array.from({ length: 5000 }, () => rand() * 2 - 1);
    for (const q of qualityTiers) expect(resample(x, 1, { quality: q })).toEqual(x);
  });

  const bad: [string, unknown][] = [
    ['zero', 0],
    ['negative', -1],
    ['NaN', NaN],
    ['Infinity', Infinity],
    ['above 4', 4.5],
  ];
  it.each(bad)('throws a RangeError naming "ratio" for a %s ratio', (_, r) => {
    let err: unknown;
    try {
      resample(new Float32Array(100), r as number);
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(DspArgumentError);
    expect(err).toBeInstanceOf(RangeError);
    expect((err as DspArgumentError).argument).toBe('ratio');
  });

  it('names the offending element of a ratio array', () => {
    const ratios = new Float32Array(10).fill(1);
    ratios[6] = -2;
    expect(() => resample(new Float32Array(100), ratios)).toThrow(/ratio\[6\]/);
  });

  it('throws a RangeError naming "quality" for an unknown tier', () => {
    expect(() => resample(new Float32Array(10), 1, { quality: 'ultra' })).toThrow(DspArgumentError);
    expect(() => resample(new Float32Array(10), 1, { quality: 'ultra' })).toThrow(/quality/);
  });
});

describe('agreement with libsamplerate (SRC_SINC_BEST_QUALITY) in the passband', () => {
  // Reference: libsamplerate-js 2.1.2, the wasm port of libsamplerate (E. de Castro Lopo); its best converter is far
  // below our figures, so the difference measures our error. Bound: the tier's rejection figure (issue goals).
  const figure: Record<QualityTierName, number> = { draft: 60, standard: 100, high: 120 };
  const x = new Float32Array(48000);
  const a = sine(440, 48000, 0.3);
  const b = sine(3000, 48000, 0.2);
  for (let i = 0; i < x.length; i++) x[i] = a[i] + b[i];
  const rows: [QualityTierName, number][] = [];
  for (const q of qualityTiers) for (const r of [0.8, 1.25]) rows.push([q, r]);
  it.each(rows)('%s tier differs from it by less than its rejection figure at ratio %f', async (q, r) => {
    const ours = resample(x, r, { quality: q });
    const theirs = await libsamplerateResample(x, r, 0);
    let e = 0;
    let s = 0;
    for (let i = 2000; i < Math.min(ours.length, theirs.length) - 2000; i++) {
      e += (ours[i] - theirs[i]) ** 2;
      s += ours[i] ** 2;
    }
    expect(10 * Math.log10(e / s)).toBeLessThan(-figure[q]);
  });
});

describe('resampleChunks', () => {
  it.each([[1.7, 4096], [0.37, 1000], [4, 1]])('yields exactly resample()’s samples in bounded chunks at ratio %f, chunk %i', (r, chunk) => {
    const x = sine(700, 22050, 0.2);
    const whole = resample(x, r, { sampleRate: 22050 });
    const parts: Float32Array[] = [];
    for (const c of resampleChunks(x, r, { sampleRate: 22050 }, chunk)) {
      expect(c.length).toBeLessThanOrEqual(chunk);
      parts.push(c.slice());
    }
    const joined = new Float32Array(parts.reduce((n, p) => n + p.length, 0));
    parts.reduce((at, p) => (joined.set(p, at), at + p.length), 0);
    expect(joined).toEqual(whole);
    expect(joined.length).toBe(Math.floor(x.length / r));
  });

  it('throws a RangeError naming "chunkFrames" for a chunk outside 1…65536', () => {
    expect(() => [...resampleChunks(new Float32Array(10), 1, {}, 0)]).toThrow(/chunkFrames/);
  });
});
