// YIN difference function d(τ) = Σ_{j<W} (x_j − x_{j+τ})² (de Cheveigné & Kawahara, JASA 111(4) 2002, eq. 6),
// computed in O(N log N) as e(0) + e(τ) − 2·r(τ) with the cross term r from one FFT correlation (fft.js).
import FFT from 'fft.js';

/** Options of a DifferenceFunction; capacities are fixed at construction. */
export interface DifferenceFunctionOptions {
  /** Integration window W in samples, ≥ 1. */
  windowFrames: number;
  /** Largest lag τ computed, ≥ 1; the frame read is W + maxLag samples long. */
  maxLag: number;
}

/** Computes d(τ) for τ = 0…maxLag over a frame of W + maxLag samples, with preallocated buffers. */
export class DifferenceFunction {
  /** Integration window W in samples. */
  readonly windowFrames: number;
  /** Largest lag computed, in samples. */
  readonly maxLag: number;
  /** FFT size used (power of two ≥ W + maxLag). */
  readonly fftSize: number;
  private readonly fft: FFT;
  private readonly frameBuf: Float64Array;
  private readonly headBuf: Float64Array;
  private readonly specFrame: Float64Array;
  private readonly specHead: Float64Array;
  private readonly product: Float64Array;
  private readonly corr: Float64Array;
  private readonly prefix: Float64Array;

  /** Builds the FFT tables and scratch buffers once. */
  constructor(options: DifferenceFunctionOptions) {
    const w = Math.floor(options.windowFrames);
    const maxLag = Math.floor(options.maxLag);
    if (!(w >= 1) || !(maxLag >= 1)) throw new RangeError('windowFrames and maxLag must be ≥ 1');
    this.windowFrames = w;
    this.maxLag = maxLag;
    let size = 4;
    while (size < w + maxLag) size *= 2;
    this.fftSize = size;
    this.fft = new FFT(size);
    this.frameBuf = new Float64Array(size);
    this.headBuf = new Float64Array(size);
    this.specFrame = new Float64Array(2 * size);
    this.specHead = new Float64Array(2 * size);
    this.product = new Float64Array(2 * size);
    this.corr = new Float64Array(2 * size);
    this.prefix = new Float64Array(w + maxLag + 1);
  }

  /** Number of input samples read per frame: W + maxLag. */
  get frameFrames(): number {
    return this.windowFrames + this.maxLag;
  }

  /**
   * Writes d(τ) for τ = 0…maxLag into out (length ≥ maxLag + 1) from signal[offset … offset + W + maxLag);
   * samples outside the signal read as 0. Returns the window energy e(0) = Σ_{j<W} x_j².
   */
  compute(signal: ArrayLike<number>, offset: number, out: Float64Array): number {
    const w = this.windowFrames;
    const len = w + this.maxLag;
    const frame = this.frameBuf;
    const head = this.headBuf;
    const prefix = this.prefix;
    const n = signal.length;
    prefix[0] = 0;
    for (let i = 0; i < len; i++) {
      const k = offset + i;
      const v = k >= 0 && k < n ? signal[k] : 0;
      frame[i] = v;
      head[i] = i < w ? v : 0;
      prefix[i + 1] = prefix[i] + v * v;
    }
    // Buffers beyond len stay zero from construction (frame) or are re-zeroed here (head beyond w is set above).
    const fft = this.fft;
    fft.realTransform(this.specFrame, frame);
    fft.completeSpectrum(this.specFrame);
    fft.realTransform(this.specHead, head);
    fft.completeSpectrum(this.specHead);
    // r(τ) = Σ_j head_j · frame_{j+τ}  ⇔  R = conj(H)·F, inverse transform.
    const a = this.specFrame;
    const b = this.specHead;
    const p = this.product;
    for (let i = 0; i < 2 * this.fftSize; i += 2) {
      const ar = a[i];
      const ai = a[i + 1];
      const br = b[i];
      const bi = -b[i + 1];
      p[i] = ar * br - ai * bi;
      p[i + 1] = ar * bi + ai * br;
    }
    fft.inverseTransform(this.corr, p);
    const corr = this.corr;
    const e0 = prefix[w];
    for (let tau = 0; tau <= this.maxLag; tau++) {
      const et = prefix[tau + w] - prefix[tau];
      const d = e0 + et - 2 * corr[2 * tau];
      out[tau] = d > 0 ? d : 0;
    }
    out[0] = 0;
    return e0;
  }
}
