import { describe, expect, it } from 'vitest';
import { magnitudeSpectrum, peakDb, peakFrequency, peakLevel, rmsDb, rmsLevel, SpectrumAnalyzer, toneLevelDb } from '../../src/analysis';
import { whiteNoise } from './signals';

const sampleRate = 48000;
const sine = (f: number, amplitude: number, frames: number, phase = 0.3) => {
  const x = new Float32Array(frames);
  for (let i = 0; i < frames; i++) x[i] = amplitude * Math.sin((2 * Math.PI * f * i) / sampleRate + phase);
  return x;
};

const tones = [
  { window: 'hann' as const, f: 100, amplitude: 1 },
  { window: 'hann' as const, f: 997.3, amplitude: 0.5 },
  { window: 'hann' as const, f: 5432.1, amplitude: 0.1 },
  { window: 'kaiser' as const, f: 1000, amplitude: 1 },
  { window: 'kaiser' as const, f: 12345.6, amplitude: 0.01 },
];

describe('spectrum helpers', () => {
  it.each(tones)('finds a $f Hz sine of amplitude $amplitude within 0.01 Hz through a $window window', ({ window, f, amplitude }) => {
    // Quadratic interpolation of the dB peak: J. O. Smith, Spectral Audio Signal Processing (QIFFT), with 4× zero padding.
    const peak = peakFrequency(sine(f, amplitude, 8192), sampleRate, { windowShape: window });
    expect(Math.abs(peak!.frequency - f)).toBeLessThan(0.01);
    expect(peak!.amplitude / amplitude).toBeCloseTo(1, 3);
  });

  it.each(tones)('reads the level of a $f Hz sine of amplitude $amplitude within 0.01 dB ($window)', ({ window, f, amplitude }) => {
    // A sine of amplitude A is 20·log10(A) dB re 1 (definition of the level); main-lobe power by Parseval's theorem.
    expect(toneLevelDb(sine(f, amplitude, 8192), sampleRate, f, { windowShape: window })).toBeCloseTo(20 * Math.log10(amplitude), 2);
  });

  it('measures a tone 80 dB below a louder one through the Kaiser window', () => {
    const x = sine(1000, 1, 16384);
    const quiet = sine(3000, 1e-4, 16384);
    for (let i = 0; i < x.length; i++) x[i] += quiet[i];
    expect(toneLevelDb(x, sampleRate, 3000, { windowShape: 'kaiser' })).toBeCloseTo(-80, 1);
  });

  it('gives a bin-centred cosine its amplitude in its own bin and nothing two bins away (periodic Hann)', () => {
    const x = new Float64Array(1024);
    for (let i = 0; i < x.length; i++) x[i] = 0.25 * Math.cos((2 * Math.PI * 32 * i) / 1024);
    const m = magnitudeSpectrum(x);
    expect(m.length).toBe(513);
    expect(m[32]).toBeCloseTo(0.25, 12);
    expect(m[31]).toBeCloseTo(0.125, 12); // Hann's DFT: −¼ in the neighbouring bins, halved by the 2/Σw scaling.
    expect(m[34]).toBeCloseTo(0, 12);
  });

  it('returns null when the search range holds no bin', () => {
    const analyzer = new SpectrumAnalyzer({ size: 1024 });
    analyzer.analyze(sine(1000, 1, 1024));
    expect(analyzer.peak(sampleRate, 1000, 1010)).toBeNull();
  });

  it('rejects a size that is not a power of two', () => {
    expect(() => new SpectrumAnalyzer({ size: 1000 })).toThrow(RangeError);
  });
});

describe('levels', () => {
  it('gives a full-scale sine an RMS of 1/√2 (−3.01 dB) and a peak of 1 (0 dB)', () => {
    // RMS of A·sin over whole periods is A/√2 (definition); 480 samples = 10 periods of 1 kHz at 48 kHz.
    const x = sine(1000, 1, 480, Math.PI / 2);
    expect(rmsLevel(x)).toBeCloseTo(Math.SQRT1_2, 6);
    expect(rmsDb(x)).toBeCloseTo(-3.0103, 3);
    expect(peakLevel(x)).toBeCloseTo(1, 6);
    expect(peakDb(x)).toBeCloseTo(0, 5);
  });

  it('gives uniform noise in [−a, a) an RMS near a/√3 and reads silence as −Infinity dB', () => {
    // Variance of a uniform distribution on [−a, a) is a²/3 (common practice, textbook statistics).
    expect(rmsLevel(whiteNoise(200000, 5, 0.6))).toBeCloseTo(0.6 / Math.sqrt(3), 2);
    expect(rmsDb(new Float32Array(16))).toBe(-Infinity);
    expect(rmsLevel(new Float32Array(4), 3, 3)).toBe(0);
  });
});

describe('spectrum option alias', () => {
  it("accepts the deprecated 'window' key as windowShape", () => {
    // Kaiser β 12 side lobes sit far below Hann's, so a quiet tone next to a loud one reads differently (common practice).
    const x = new Float32Array(4096);
    for (let i = 0; i < x.length; i++) x[i] = Math.sin((2 * Math.PI * 1000 * i) / sampleRate) + 1e-5 * Math.sin((2 * Math.PI * 1300 * i) / sampleRate);
    const viaAlias = toneLevelDb(x, sampleRate, 1300, { window: 'kaiser' });
    const viaName = toneLevelDb(x, sampleRate, 1300, { windowShape: 'kaiser' });
    const hann = toneLevelDb(x, sampleRate, 1300);
    expect(viaAlias).toBe(viaName);
    expect(Math.abs(hann - viaName)).toBeGreaterThan(1);
  });
});
