// Second-order low-pass from R. Bristow-Johnson's Audio EQ Cookbook (W3C Audio WG Note, 2021), Direct Form 1, per channel.
import type { Hz } from '../units';
import type { WasmKernel } from './wasm/wasm-kernel';
import { LP_COEF, LP_FRAMES, LP_SET_BYTES, LP_STATE, LP_SUB, LP_X0, LP_X1, MP_MIX_L, MP_MIX_R } from './wasm/kernel-params';

/** Construction options of a BiquadLowpass. */
export interface BiquadLowpassOptions {
  /** Channels filtered with shared coefficients (1…32). */
  channels: number;
}

/** Lowest cutoff accepted, in Hz; lower requests are clamped. */
export const BIQUAD_MIN_CUTOFF_HZ: Hz = 10;
/** Highest cutoff as a fraction of the sample rate (below Nyquist, where the design stays stable). */
export const BIQUAD_MAX_CUTOFF_FRACTION = 0.49;
/** Q range accepted (linear Q, not dB); values outside are clamped. */
export const BIQUAD_Q_RANGE: readonly [number, number] = Object.freeze([0.1, 30] as [number, number]);

/** A cookbook low-pass applied in place to several channels with one set of coefficients; no allocation after construction. */
export class BiquadLowpass {
  private readonly channels: number;
  /**
   * x1, x2, y1, y2: of channels 0 and 1 variable by variable ([x1₀, x1₁, x2₀, x2₁, …], the order of the module's
   * `lowpass` block, so that `pair` is copied as one run), of channel c ≥ 2 at 4c…4c + 3.
   */
  private readonly state: Float64Array;
  /** The first 8 of `state`: channels 0 and 1, in the module's order. */
  private readonly pair: Float64Array;
  /** A view of the module's filter state slots, and the memory view it was made from (made again when memory grows). */
  private residentView: Float64Array = new Float64Array(8);
  private residentOf: Float64Array = new Float64Array(0);
  private readonly coef = new Float64Array(5);
  /** Cutoff (Hz), Q (linear) and sample rate (Hz) that `design` reads: the allocation-free form of `setLowpass`. */
  readonly design = new Float64Array(3);

  /** Allocates state for `options.channels` channels; starts as a pass-through-like open filter (cutoff 0.49·48 kHz, Q 1/√2). */
  constructor(options: BiquadLowpassOptions) {
    this.channels = Math.max(1, Math.min(32, Math.floor(options.channels)));
    this.state = new Float64Array(Math.max(8, 4 * this.channels));
    this.pair = this.state.subarray(0, 8);
    BiquadLowpass.coefficients(48000 * BIQUAD_MAX_CUTOFF_FRACTION, Math.SQRT1_2, 48000, this.coef);
  }

  /** Cookbook low-pass coefficients [b0, b1, b2, a1, a2] normalised by a0, for `cutoffHz` (clamped to 10 Hz…0.49·sampleRate) and linear `q` (clamped to 0.1…30). */
  static coefficients(cutoffHz: Hz, q: number, sampleRate: Hz, out: Float64Array): Float64Array {
    const d = DESIGN_SCRATCH;
    d[0] = cutoffHz;
    d[1] = q;
    d[2] = sampleRate;
    designLowpass(d, out);
    return out;
  }

  /** Sets the low-pass cutoff (Hz, clamped to a stable range), Q (linear) and sample rate (Hz); state is kept, so call per block. */
  setLowpass(cutoffHz: Hz, q: number, sampleRate: Hz): void {
    BiquadLowpass.coefficients(cutoffHz, q, sampleRate, this.coef);
  }

  /**
   * Sets the coefficients from `design` [cutoff Hz, Q, sample rate Hz] (clamped as in `coefficients`): `setLowpass`
   * with its doubles in a Float64Array, since V8 boxes a double passed to a call it does not inline.
   */
  applyDesign(): void {
    designLowpass(this.design, this.coef);
  }

  /** Filters channels[c][offset…offset+frames) in place for c < channels. */
  process(channels: readonly Float32Array[], offset: number, frames: number): void {
    const k = this.coef;
    const b0 = k[0];
    const b1 = k[1];
    const b2 = k[2];
    const a1 = k[3];
    const a2 = k[4];
    const n = Math.min(this.channels, channels.length);
    for (let c = 0; c < n; c++) {
      const buf = channels[c];
      // Channel c's x1, x2, y1, y2 at s, s + d, s + 2d, s + 3d (see `state`).
      const s = c < 2 ? c : 4 * c;
      const d = c < 2 ? 2 : 1;
      let x1 = this.state[s];
      let x2 = this.state[s + d];
      let y1 = this.state[s + 2 * d];
      let y2 = this.state[s + 3 * d];
      for (let i = offset; i < offset + frames; i++) {
        const x0 = buf[i];
        let y0 = b0 * x0 + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
        if (y0 > -1e-25 && y0 < 1e-25) y0 = 0; // flush denormals
        buf[i] = y0;
        x2 = x1;
        x1 = x0;
        y2 = y1;
        y1 = y0;
      }
      this.state[s] = x1;
      this.state[s + d] = x2;
      this.state[s + 2 * d] = y1;
      this.state[s + 3 * d] = y2;
    }
  }

  /**
   * Stages the current coefficients as those of sub-block `set` (0…LP_SETS − 1) of the next `processResident` call.
   */
  stageResident(kernel: WasmKernel, set: number): void {
    const f = kernel.f64;
    const k = this.coef;
    const c = (kernel.lowpassParams + LP_COEF + set * LP_SET_BYTES) >> 3;
    f[c] = k[0];
    f[c + 1] = k[1];
    f[c + 2] = k[2];
    f[c + 3] = k[3];
    f[c + 4] = k[4];
  }

  /**
   * Filters `frames` samples (at most LP_SETS sub-blocks of `subFrames`, each with the coefficients staged for it) of
   * two channels in `kernel`'s memory in place (x0 and x1: byte addresses of their first sample) through the module's
   * `lowpass`, for a filter of two or more channels (its first two): the samples of `process` on each sub-block, since
   * the module runs the same operations in the same order with the channels in the two f64 lanes of one vector — one
   * recurrence where `process` runs two one after the other, and one call for the sub-blocks.
   */
  processResident(kernel: WasmKernel, x0: number, x1: number, frames: number, subFrames: number): void {
    // Called only where a block needs a crossfade, this runs unoptimised: the state moves by TypedArray.set, which
    // makes no JavaScript double (an element read one by one there is boxed; docs/allocation.md).
    this.params(kernel, x0, x1, frames, subFrames);
    const slots = this.residentSlots(kernel);
    slots.set(this.pair);
    kernel.exports.lowpass(kernel.lowpassParams);
    this.pair.set(slots);
  }

  /**
   * `processResident` over a whole block, mixing the filtered samples as the module's `mix` would with its parameter
   * block (gains in `kernel.mixGains`) into the bus at byte addresses mixL and mixR: the mix's arithmetic runs while
   * the recurrence waits. Returns false when a filtered sample was not finite (as `mix`).
   */
  processResidentMix(kernel: WasmKernel, x0: number, x1: number, mixL: number, mixR: number, frames: number, subFrames: number): boolean {
    this.enter(kernel, x0, x1, frames, subFrames);
    const m = kernel.mixParams;
    const i32 = kernel.i32;
    i32[(m + MP_MIX_L) >> 2] = mixL;
    i32[(m + MP_MIX_R) >> 2] = mixR;
    const finite = kernel.exports.lowpassMix(kernel.lowpassParams, m) !== 0;
    this.leave(kernel);
    return finite;
  }

  /** Writes the `lowpass` block's addresses, sizes and this filter's state (channels 0 and 1, in the module's order). */
  private enter(kernel: WasmKernel, x0: number, x1: number, frames: number, subFrames: number): void {
    this.params(kernel, x0, x1, frames, subFrames);
    const f = kernel.f64;
    const st = this.state;
    const s = (kernel.lowpassParams + LP_STATE) >> 3;
    for (let i = 0; i < 8; i++) f[s + i] = st[i];
  }

  /** Writes the `lowpass` block's addresses and sizes (integers). */
  private params(kernel: WasmKernel, x0: number, x1: number, frames: number, subFrames: number): void {
    const p = kernel.lowpassParams;
    const i32 = kernel.i32;
    i32[(p + LP_X0) >> 2] = x0;
    i32[(p + LP_X1) >> 2] = x1;
    i32[(p + LP_FRAMES) >> 2] = frames;
    i32[(p + LP_SUB) >> 2] = subFrames;
  }

  /** Reads the state the module left back into this filter. */
  private leave(kernel: WasmKernel): void {
    const f = kernel.f64;
    const st = this.state;
    const s = (kernel.lowpassParams + LP_STATE) >> 3;
    for (let i = 0; i < 8; i++) st[i] = f[s + i];
  }

  /** A view of the module's 8 filter state slots, made again when the module's memory (its `f64` view) changed. */
  private residentSlots(kernel: WasmKernel): Float64Array {
    const f = kernel.f64;
    if (this.residentOf !== f) {
      this.residentView = new Float64Array(f.buffer, kernel.lowpassParams + LP_STATE, 8);
      this.residentOf = f;
    }
    return this.residentView;
  }

  /** Clears the filter memory (silence in, silence out). */
  reset(): void {
    this.state.fill(0);
  }
}

/** The doubles of `coefficients` handed to designLowpass. */
const DESIGN_SCRATCH = new Float64Array(3);

/**
 * The cookbook design of `coefficients` from `d` = [cutoff Hz, Q, sample rate Hz] into `out`: too large for V8 to
 * inline, so its doubles come in a Float64Array (a double passed to a call V8 does not inline is boxed).
 */
function designLowpass(d: Float64Array, out: Float64Array): void {
  const fs = Number.isFinite(d[2]) && d[2] > 0 ? d[2] : 48000;
  const f0 = Math.min(fs * BIQUAD_MAX_CUTOFF_FRACTION, Math.max(BIQUAD_MIN_CUTOFF_HZ, Number.isFinite(d[0]) ? d[0] : fs));
  const qq = Math.min(BIQUAD_Q_RANGE[1], Math.max(BIQUAD_Q_RANGE[0], Number.isFinite(d[1]) ? d[1] : Math.SQRT1_2));
  const w0 = (2 * Math.PI * f0) / fs;
  const cosw = Math.cos(w0);
  const alpha = Math.sin(w0) / (2 * qq);
  const a0 = 1 + alpha;
  out[0] = (1 - cosw) / 2 / a0;
  out[1] = (1 - cosw) / a0;
  out[2] = out[0];
  out[3] = (-2 * cosw) / a0;
  out[4] = (1 - alpha) / a0;
}
