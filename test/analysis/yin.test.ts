import { describe, expect, it } from 'vitest';
import { DifferenceFunction, yinPitch, YinEstimator } from '../../src/analysis';
import { harmonicTone, whiteNoise } from './signals';

const sampleRate = 48000;
const cents = (measured: number, expected: number) => 1200 * Math.log2(measured / expected);

// f0 values and the ±1 cent goal from the test list; tones are synthetic, so the truth is the generator's f0.
// Each nominal f0 also appears detuned by +37 cents so that the period is not a whole number of samples
// (100 and 1000 Hz have integer periods at 48 kHz, where interpolation has nothing to do).
const f0s = [100, 220, 440, 1000].flatMap((f) => [f, f * 2 ** (37 / 1200)]);
const cases = f0s.flatMap((f0) => [
  { f0, harmonics: 1, label: 'sine' },
  { f0, harmonics: 8, label: 'harmonic tone (8 partials, 1/k)' },
]);

describe('yinPitch', () => {
  it.each(cases)('finds $f0 Hz within ±1 cent on a $label', ({ f0, harmonics }) => {
    // YIN steps 2–5: de Cheveigné & Kawahara, JASA 111(4) 2002 (docs/references.md §7); tolerance from the brief.
    const frame = harmonicTone(f0, sampleRate, 4800, harmonics);
    const estimate = yinPitch(frame, sampleRate);
    expect(estimate).not.toBeNull();
    expect(Math.abs(cents(estimate!.frequency, f0))).toBeLessThan(1);
    expect(estimate!.periodicity).toBeGreaterThan(0.99);
  });

  it.each(cases)('stays within ±1 cent at $f0 Hz on a $label with the paper steps alone (no refinement)', ({ f0, harmonics }) => {
    const frame = harmonicTone(f0, sampleRate, 4800, harmonics);
    const estimate = yinPitch(frame, sampleRate, { refine: false });
    expect(Math.abs(cents(estimate!.frequency, f0))).toBeLessThan(1);
  });

  it('refinement brings a 1 kHz + 37 cent sine from tenths of a cent to below 0.02 cent', () => {
    const f0 = 1000 * 2 ** (37 / 1200);
    const frame = harmonicTone(f0, sampleRate, 4800, 1);
    const plain = Math.abs(cents(yinPitch(frame, sampleRate, { refine: false })!.frequency, f0));
    const refined = Math.abs(cents(yinPitch(frame, sampleRate)!.frequency, f0));
    expect(plain).toBeGreaterThan(0.05);
    expect(refined).toBeLessThan(0.02);
  });

  it.each([1, 2, 3])('reports no pitch on seeded white noise (seed %i)', (seed) => {
    const noise = whiteNoise(4800, seed);
    expect(yinPitch(noise, sampleRate)).toBeNull();
  });

  it('reports no pitch on silence', () => {
    expect(yinPitch(new Float32Array(4800), sampleRate)).toBeNull();
  });

  it('reports no pitch when the tone lies below minHz', () => {
    expect(yinPitch(harmonicTone(60, sampleRate, 9600, 1), sampleRate, { minHz: 100 })).toBeNull();
  });

  it('rejects a frame too short for the lag range', () => {
    expect(() => yinPitch(new Float32Array(500), sampleRate)).toThrow(RangeError);
  });
});

describe('YinEstimator', () => {
  it('finds the fundamental, not the octave, of a tone whose second partial is stronger', () => {
    const f0 = 180;
    const x = new Float32Array(6000);
    for (let i = 0; i < x.length; i++) {
      const w = (2 * Math.PI * f0 * i) / sampleRate;
      x[i] = 0.2 * Math.sin(w) + 0.6 * Math.sin(2 * w + 1) + 0.3 * Math.sin(3 * w + 2);
    }
    const yin = new YinEstimator({ sampleRate });
    expect(yin.estimate(x, 0)).toBe(true);
    expect(Math.abs(cents(yin.frequency, f0))).toBeLessThan(1);
  });

  it('stamps an estimate at mid-window plus half the period', () => {
    const yin = new YinEstimator({ sampleRate, windowSeconds: 0.02 });
    yin.estimate(harmonicTone(480, sampleRate, yin.frameFrames, 1), 0);
    expect(yin.centreOffset()).toBeCloseTo((960 - 1) / 2 + 50, 3);
  });
});

describe('DifferenceFunction', () => {
  it('matches the direct sum d(τ) = Σ (x_j − x_{j+τ})² of the paper (eq. 6) on seeded noise', () => {
    const w = 300;
    const maxLag = 200;
    const x = whiteNoise(w + maxLag + 50, 7);
    const df = new DifferenceFunction({ windowFrames: w, maxLag });
    const out = new Float64Array(maxLag + 1);
    const offset = 17;
    df.compute(x, offset, out);
    for (const tau of [1, 2, 50, 123, 200]) {
      let direct = 0;
      for (let j = 0; j < w; j++) direct += (x[offset + j] - x[offset + j + tau]) ** 2;
      expect(out[tau]).toBeCloseTo(direct, 9);
    }
    expect(out[0]).toBe(0);
  });
});
