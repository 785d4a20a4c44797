// Streaming bandlimited interpolation over a source buffer (J. O. Smith, "Digital Audio Resampling", CCRMA):
// a fractional read position, a per-sample playback ratio, a kernel stretched by the ratio above 1.
import { KernelTable } from './kernel-table';
import { MAX_RATIO } from './quality-tiers';
import { DspArgumentError } from './dsp-argument-error';
import { WasmKernel, type KernelName, type KernelPreference } from './wasm/wasm-kernel';
import { ReadCursor } from './read-cursor';
import { WasmReadPath } from './wasm-read-path';
import { dotRows, dotStride, fillRows, fillStride } from './kernel-dot';

/** Construction options of a StreamReader. */
export interface StreamReaderOptions {
  /** The kernel table (e.g. `KernelTable.forTier('standard')`). */
  table: KernelTable;
  /** Most source channels this reader will be given (1…32). */
  channels: number;
  /** Inner loop: 'auto' (default) takes the WebAssembly SIMD kernel where available; 'typescript' forces the reference; 'wasm-simd' throws DspArgumentError where it is unavailable. */
  kernel?: KernelPreference;
}

/** How a source is read. */
export interface StreamSourceOptions {
  /** Loop the region [loopStart, loopEnd) (default false: one-shot, silence beyond the ends). */
  loop?: boolean;
  /** Loop region start in source frames (integer, default 0). */
  loopStart?: number;
  /** Loop region end in source frames, exclusive (integer, default the source length). An empty or invalid region loops the whole source. */
  loopEnd?: number;
  /** Initial read position in source frames (fractional allowed, default 0). */
  startFrame?: number;
}

/** Reads a (multichannel) source at a fractional position that advances by a playback ratio per output sample; never allocates after construction. */
export class StreamReader {
  private table!: KernelTable;
  private readonly capacity: number;
  private readonly cur: ReadCursor;
  private readonly scratch: Float32Array[];
  private weights: Float64Array;
  /** The phase fraction in [0] and a dot product in [1] handed to and from kernel-dot (no boxed doubles). */
  private readonly dotIo = new Float64Array(2);
  /** The WebAssembly path, or null (TypeScript reference). */
  private readonly wasm: WasmReadPath | null;

  /** Allocates scratch for `options.channels` channels and the table's widest (ratio 4) window. */
  constructor(options: StreamReaderOptions) {
    const channels = Math.max(1, Math.min(32, Math.floor(options.channels)));
    this.capacity = channels;
    this.cur = new ReadCursor(channels);
    this.scratch = [];
    this.weights = new Float64Array(0);
    const kernel = options.kernel ?? 'auto';
    const shared = kernel === 'typescript' ? null : WasmKernel.shared();
    this.wasm = shared === null ? null : new WasmReadPath(shared, this.cur);
    if (kernel === 'wasm-simd' && this.wasm === null) throw new DspArgumentError('kernel', 'WebAssembly SIMD is not available here');
    this.setTable(options.table);
    for (let c = 0; c < channels; c++) this.scratch.push(new Float32Array(this.weights.length));
  }

  /** Switches the kernel table (tier); allocates only when the new table needs a wider scratch window. */
  setTable(table: KernelTable): void {
    this.table = table;
    if (this.wasm !== null) this.wasm.setTable(table);
    const need = table.maxWindow(MAX_RATIO);
    if (this.weights.length < need) {
      this.weights = new Float64Array(need);
      for (let c = 0; c < this.scratch.length; c++) this.scratch[c] = new Float32Array(need);
    }
  }

  /** Ratios clamped or replaced on the audio path (non-finite, below MIN_RATIO, above MAX_RATIO). */
  get clampCount(): number {
    return this.cur.clamps;
  }

  set clampCount(n: number) {
    this.cur.clamps = n;
  }

  /** The inner loop this reader runs ('wasm-simd' or 'typescript'). */
  get kernelName(): KernelName {
    return this.wasm === null ? 'typescript' : 'wasm-simd';
  }

  /** The kernel table in use. */
  get kernel(): KernelTable {
    return this.table;
  }

  /** Sets the source (channel arrays of equal length; extra channels beyond capacity are ignored) and rewinds to `startFrame`; no allocation. */
  setSource(channels: readonly Float32Array[], options?: StreamSourceOptions): void {
    const count = Math.min(channels.length, this.capacity);
    let len = count > 0 ? channels[0].length : 0;
    for (let c = 0; c < count; c++) {
      this.cur.sources[c] = channels[c];
      len = Math.min(len, channels[c].length);
    }
    this.cur.clearFrom(count);
    this.cur.channelsInUse = count;
    this.cur.length = len;
    this.wasm?.invalidate();
    this.cur.loop = options?.loop === true && len > 0;
    let ls = Math.floor(options?.loopStart ?? 0);
    let le = Math.floor(options?.loopEnd ?? len);
    if (!(ls >= 0 && le <= len && le > ls)) {
      ls = 0;
      le = len;
    }
    this.cur.loopStart = ls;
    this.cur.loopEnd = le;
    this.cur.loopLength = le - ls;
    this.cur.wrapped = false;
    this.cur.lastRatio = 1;
    this.cur.lastStretch = 1;
    const start = options?.startFrame ?? 0;
    this.position = Number.isFinite(start) ? start : 0;
  }

  /** Read position in source frames (fractional); setting it inside a loop past its end wraps it into the region. */
  get position(): number {
    return this.cur.pos;
  }

  set position(frames: number) {
    let p = Number.isFinite(frames) ? frames : 0;
    if (this.cur.loop && p >= this.cur.loopEnd) {
      p = this.cur.loopStart + ((p - this.cur.loopStart) % this.cur.loopLength);
      this.cur.wrapped = true;
    }
    this.cur.pos = p;
  }

  /** True when a one-shot's position is past its end by the window's half-width (output is silence from here on). */
  get finished(): boolean {
    return !this.cur.loop && this.cur.pos - this.cur.length >= this.table.halfTaps * this.cur.lastStretch;
  }

  /** Writes `frames` samples to out[c][outOffset…] for each source channel; output sample i uses ratio ratioStart + (ratioEnd − ratioStart)·i/frames. */
  read(out: readonly Float32Array[], outOffset: number, frames: number, ratioStart: number, ratioEnd: number): void {
    this.rampStart = ratioStart;
    this.rampEnd = ratioEnd;
    this.readRamp(out, outOffset, frames);
  }

  /**
   * Ratio at the first sample and at the end of the next `readRamp` or `skipRamp` (clamped like `read`'s): the render
   * path sets these, then calls, since V8 boxes a double passed to a call it does not inline (docs/allocation.md).
   */
  rampStart = 0.5;
  /** See rampStart. */
  rampEnd = 0.5;
  // The block loop's ratio ramp (start, change over the block), handed to `render` in fields for the same reason.
  private rs = 0.5;
  private dr = 0.5;

  /** `read` with its ratios in `rampStart`/`rampEnd`. */
  readRamp(out: readonly Float32Array[], outOffset: number, frames: number): void {
    const rs = this.cur.sanitize(this.rampStart);
    const re = this.cur.sanitize(this.rampEnd);
    if (rs === 1 && re === 1 && this.cur.pos === Math.floor(this.cur.pos)) {
      this.cur.copyThrough(out, outOffset, frames);
      return;
    }
    this.rs = rs;
    this.dr = re - rs;
    this.render(out, outOffset, frames, null, 0);
  }

  /** Like `read`, with one ratio per output sample from ratios[ratiosOffset…]. */
  readRatios(out: readonly Float32Array[], outOffset: number, frames: number, ratios: Float32Array, ratiosOffset: number): void {
    let allOne = this.cur.pos === Math.floor(this.cur.pos);
    for (let i = 0; allOne && i < frames; i++) allOne = ratios[ratiosOffset + i] === 1;
    if (allOne) {
      this.cur.copyThrough(out, outOffset, frames);
      return;
    }
    this.rs = 0;
    this.dr = 0;
    this.render(out, outOffset, frames, ratios, ratiosOffset);
  }

  /** The block loop: ratio per sample from (rs, dr) or from `ratios`; a mono in-range fast path, the general path otherwise. */
  private render(out: readonly Float32Array[], o: number, frames: number, ratios: Float32Array | null, ro: number): void {
    const rs = this.rs;
    const dr = this.dr;
    // With no source set there is nothing to hand the module: the reference path reads its defined silence.
    const cur = this.cur;
    if (this.wasm !== null && cur.channelsInUse > 0) {
      const b = this.wasm.block;
      b.out = out;
      b.offset = o;
      b.frames = frames;
      b.ratioStart = rs;
      b.ratioDelta = dr;
      b.ratios = ratios;
      b.ratiosOffset = ro;
      this.wasm.render();
      return;
    }
    const t = this.table;
    const taps = t.taps | 0;
    const phases = t.phases | 0;
    const halfTaps = t.halfTaps | 0;
    const halfDense = (halfTaps * phases) | 0;
    const pm = t.phaseMajor;
    const dense = t.dense;
    const mono = cur.channelsInUse === 1;
    const x = cur.sources[0];
    const y = out[0];
    const hi = cur.loop ? cur.loopEnd : cur.length;
    let lo = cur.loop && cur.wrapped ? cur.loopStart : 0;
    for (let i = 0; i < frames; i++) {
      const r = ratios === null ? rs + (dr * i) / frames : cur.sanitize(ratios[ro + i]);
      const stride = t.strideFor(r) | 0;
      const pos = cur.pos;
      const n = Math.floor(pos) | 0;
      const frac = pos - n;
      if (stride === phases) {
        const mLo = (n - halfTaps + 1) | 0;
        if (mono && mLo >= lo && mLo + taps <= hi) {
          const ph = frac * phases;
          const phi = ph | 0;
          const k0 = (phi * taps) | 0;
          const k1 = (k0 + taps) | 0;
          let a0 = 0;
          let a1 = 0;
          let b0 = 0;
          let b1 = 0;
          for (let j = 0; j < taps; j += 2) {
            const s0 = x[mLo + j];
            const s1 = x[mLo + j + 1];
            a0 += pm[k0 + j] * s0;
            a1 += pm[k1 + j] * s0;
            b0 += pm[k0 + j + 1] * s1;
            b1 += pm[k1 + j + 1] * s1;
          }
          a0 += b0;
          y[o + i] = a0 + (ph - phi) * (a1 + b1 - a0);
          cur.lastStretch = 1;
        } else this.renderOne(out, o + i, stride);
      } else {
        const c = frac * stride;
        const ci = c | 0;
        const a1n = ((halfDense - 1 - ci) / stride) | 0;
        const mLo = (n - a1n) | 0;
        const count = (a1n + ((halfDense + ci) / stride) + 1) | 0;
        if (mono && mLo >= lo && mLo + count <= hi) {
          let k = (a1n * stride + halfDense + ci) | 0;
          let a0 = 0;
          let a1 = 0;
          let b0 = 0;
          let b1 = 0;
          const stride2 = stride * 2;
          const even = count & ~1;
          let j = 0;
          for (; j < even; j += 2) {
            const s0 = x[mLo + j];
            const s1 = x[mLo + j + 1];
            const k2 = k - stride;
            a0 += dense[k] * s0;
            a1 += dense[k + 1] * s0;
            b0 += dense[k2] * s1;
            b1 += dense[k2 + 1] * s1;
            k -= stride2;
          }
          if (j < count) {
            const s0 = x[mLo + j];
            a0 += dense[k] * s0;
            a1 += dense[k + 1] * s0;
          }
          a0 += b0;
          y[o + i] = (stride / phases) * (a0 + (c - ci) * (a1 + b1 - a0));
          cur.lastStretch = phases / stride;
        } else this.renderOne(out, o + i, stride);
      }
      cur.moveTo(pos + r);
      if (cur.wrapped) lo = cur.loopStart;
    }
  }

  /** Advances the position exactly as `read` with the same arguments would, without output (virtual voices). */
  skip(frames: number, ratioStart: number, ratioEnd: number): void {
    this.rampStart = ratioStart;
    this.rampEnd = ratioEnd;
    this.skipRamp(frames);
  }

  /** `skip` with its ratios in `rampStart`/`rampEnd`. */
  skipRamp(frames: number): void {
    const rs = this.cur.sanitize(this.rampStart);
    const re = this.cur.sanitize(this.rampEnd);
    if (rs === 1 && re === 1 && this.cur.pos === Math.floor(this.cur.pos)) {
      for (let i = 0; i < frames; i++) this.cur.advance(1);
      return;
    }
    const dr = re - rs;
    for (let i = 0; i < frames; i++) {
      const r = rs + (dr * i) / frames;
      this.cur.lastStretch = this.table.phases / this.table.strideFor(r);
      this.cur.advance(r);
    }
  }

  private renderOne(out: readonly Float32Array[], o: number, strideIn: number): void {
    const t = this.table;
    const chans = this.cur.channelsInUse;
    const n = Math.floor(this.cur.pos);
    const frac = this.cur.pos - n;
    let mLo: number;
    let count: number;
    let stride: number;
    let k0: number;
    let f: number;
    let scale: number;
    if (strideIn === t.phases) {
      const ph = frac * t.phases;
      const phi = Math.floor(ph);
      f = ph - phi;
      mLo = n - t.halfTaps + 1;
      count = t.taps;
      stride = 0;
      k0 = phi * t.taps;
      scale = 1;
      this.cur.lastStretch = 1;
    } else {
      stride = strideIn;
      const half = t.halfTaps * t.phases;
      const c = frac * stride;
      const i = Math.floor(c);
      f = c - i;
      const a1 = Math.floor((half - 1 - i) / stride);
      const a0 = Math.floor((half + i) / stride);
      mLo = n - a1;
      count = a1 + a0 + 1;
      k0 = a1 * stride + half + i;
      scale = stride / t.phases;
      this.cur.lastStretch = t.phases / stride;
    }
    const lo = this.cur.loop ? (this.cur.wrapped ? this.cur.loopStart : 0) : 0;
    const hi = this.cur.loop ? this.cur.loopEnd : this.cur.length;
    let useScratch = false;
    if (mLo < lo || mLo + count > hi) {
      if (!this.cur.gather(this.scratch, mLo, count)) {
        for (let c = 0; c < chans; c++) out[c][o] = 0;
        return;
      }
      useScratch = true;
    }
    const base = useScratch ? 0 : mLo;
    const io = this.dotIo;
    io[0] = f;
    if (chans === 1) {
      const x = useScratch ? this.scratch[0] : this.cur.sources[0];
      if (stride === 0) dotRows(t.phaseMajor, k0, t.taps, x, base, io);
      else dotStride(t.dense, k0, stride, x, base, count, io);
      out[0][o] = scale * io[1];
      return;
    }
    const w = this.weights;
    if (stride === 0) fillRows(w, t.phaseMajor, k0, t.taps, io);
    else fillStride(w, t.dense, k0, stride, count, io);
    for (let c = 0; c < chans; c++) {
      const x = useScratch ? this.scratch[c] : this.cur.sources[c];
      let acc = 0;
      for (let j = 0; j < count; j++) acc += w[j] * x[base + j];
      out[c][o] = scale * acc;
    }
  }
}
