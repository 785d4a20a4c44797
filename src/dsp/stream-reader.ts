// Streaming bandlimited interpolation over a source buffer (J. O. Smith, "Digital Audio Resampling", CCRMA):
// a fractional read position, a per-sample playback ratio, a kernel stretched by the ratio above 1.
import { KernelTable } from './kernel-table';
import { MAX_RATIO, MIN_RATIO } from './quality-tiers';
import { DspArgumentError } from './dsp-argument-error';
import { RUN_FRAMES, WasmKernel, halfWindowFor, type KernelName, type KernelPreference } from './wasm/wasm-kernel';

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

const EMPTY = new Float32Array(0);

/** Reads a (multichannel) source at a fractional position that advances by a playback ratio per output sample; never allocates after construction. */
export class StreamReader {
  /** Ratios clamped or replaced on the audio path (non-finite, below MIN_RATIO, above MAX_RATIO). */
  clampCount = 0;
  private table!: KernelTable;
  private readonly capacity: number;
  private readonly sources: Float32Array[];
  private readonly scratch: Float32Array[];
  private weights: Float64Array;
  private channelsInUse = 0;
  private length = 0;
  private loop = false;
  private loopStart = 0;
  private loopEnd = 0;
  private loopLength = 0;
  private wrapped = false;
  private pos = 0;
  private lastRatio = 1;
  private lastStretch = 1;
  private readonly wasm: WasmKernel | null;
  private tablePtr = 0;
  /** Byte offsets of the sources' resident copies in module memory (0 = none; spans are copied), as of `residentEpoch`. */
  private readonly resident: Int32Array;
  private residentEpoch = -1;

  /** Allocates scratch for `options.channels` channels and the table's widest (ratio 4) window. */
  constructor(options: StreamReaderOptions) {
    const channels = Math.max(1, Math.min(32, Math.floor(options.channels)));
    this.capacity = channels;
    this.sources = new Array<Float32Array>(channels).fill(EMPTY);
    this.resident = new Int32Array(channels);
    this.scratch = [];
    this.weights = new Float64Array(0);
    const kernel = options.kernel ?? 'auto';
    this.wasm = kernel === 'typescript' ? null : WasmKernel.shared();
    if (kernel === 'wasm-simd' && this.wasm === null) throw new DspArgumentError('kernel', 'WebAssembly SIMD is not available here');
    this.setTable(options.table);
    for (let c = 0; c < channels; c++) this.scratch.push(new Float32Array(this.weights.length));
  }

  /** Switches the kernel table (tier); allocates only when the new table needs a wider scratch window. */
  setTable(table: KernelTable): void {
    this.table = table;
    if (this.wasm !== null) this.tablePtr = this.wasm.tablePointer(table);
    const need = table.maxWindow(MAX_RATIO);
    if (this.weights.length < need) {
      this.weights = new Float64Array(need);
      for (let c = 0; c < this.scratch.length; c++) this.scratch[c] = new Float32Array(need);
    }
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
      this.sources[c] = channels[c];
      len = Math.min(len, channels[c].length);
    }
    for (let c = count; c < this.capacity; c++) this.sources[c] = EMPTY;
    this.channelsInUse = count;
    this.length = len;
    this.residentEpoch = -1;
    this.loop = options?.loop === true && len > 0;
    let ls = Math.floor(options?.loopStart ?? 0);
    let le = Math.floor(options?.loopEnd ?? len);
    if (!(ls >= 0 && le <= len && le > ls)) {
      ls = 0;
      le = len;
    }
    this.loopStart = ls;
    this.loopEnd = le;
    this.loopLength = le - ls;
    this.wrapped = false;
    this.lastRatio = 1;
    this.lastStretch = 1;
    const start = options?.startFrame ?? 0;
    this.position = Number.isFinite(start) ? start : 0;
  }

  /** Read position in source frames (fractional); setting it inside a loop past its end wraps it into the region. */
  get position(): number {
    return this.pos;
  }

  set position(frames: number) {
    let p = Number.isFinite(frames) ? frames : 0;
    if (this.loop && p >= this.loopEnd) {
      p = this.loopStart + ((p - this.loopStart) % this.loopLength);
      this.wrapped = true;
    }
    this.pos = p;
  }

  /** True when a one-shot's position is past its end by the window's half-width (output is silence from here on). */
  get finished(): boolean {
    return !this.loop && this.pos - this.length >= this.table.halfTaps * this.lastStretch;
  }

  /** Writes `frames` samples to out[c][outOffset…] for each source channel; output sample i uses ratio ratioStart + (ratioEnd − ratioStart)·i/frames. */
  read(out: readonly Float32Array[], outOffset: number, frames: number, ratioStart: number, ratioEnd: number): void {
    const rs = this.sanitize(ratioStart);
    const re = this.sanitize(ratioEnd);
    if (rs === 1 && re === 1 && this.pos === Math.floor(this.pos)) {
      this.copyThrough(out, outOffset, frames);
      return;
    }
    this.render(out, outOffset, frames, rs, re - rs, null, 0);
  }

  /** Like `read`, with one ratio per output sample from ratios[ratiosOffset…]. */
  readRatios(out: readonly Float32Array[], outOffset: number, frames: number, ratios: Float32Array, ratiosOffset: number): void {
    let allOne = this.pos === Math.floor(this.pos);
    for (let i = 0; allOne && i < frames; i++) allOne = ratios[ratiosOffset + i] === 1;
    if (allOne) {
      this.copyThrough(out, outOffset, frames);
      return;
    }
    this.render(out, outOffset, frames, 0, 0, ratios, ratiosOffset);
  }

  /** The block loop: ratio per sample from (rs, dr) or from `ratios`; a mono in-range fast path, the general path otherwise. */
  private render(out: readonly Float32Array[], o: number, frames: number, rs: number, dr: number, ratios: Float32Array | null, ro: number): void {
    // With no source set there is nothing to hand the module: the reference path reads its defined silence.
    if (this.wasm !== null && this.channelsInUse > 0) {
      this.renderWasm(this.wasm, out, o, frames, rs, dr, ratios, ro);
      return;
    }
    const t = this.table;
    const taps = t.taps | 0;
    const phases = t.phases | 0;
    const halfTaps = t.halfTaps | 0;
    const halfDense = (halfTaps * phases) | 0;
    const pm = t.phaseMajor;
    const dense = t.dense;
    const mono = this.channelsInUse === 1;
    const x = this.sources[0];
    const y = out[0];
    const hi = this.loop ? this.loopEnd : this.length;
    let lo = this.loop && this.wrapped ? this.loopStart : 0;
    for (let i = 0; i < frames; i++) {
      const r = ratios === null ? rs + (dr * i) / frames : this.sanitize(ratios[ro + i]);
      const stride = t.strideFor(r) | 0;
      const pos = this.pos;
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
          this.lastStretch = 1;
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
          this.lastStretch = phases / stride;
        } else this.renderOne(out, o + i, stride);
      }
      let p = pos + r;
      if (this.loop && p >= this.loopEnd) {
        while (p >= this.loopEnd) p -= this.loopLength;
        this.wrapped = true;
        lo = this.loopStart;
      }
      this.pos = p;
    }
  }

  /**
   * The same block through the WebAssembly kernel: per run of ≤ RUN_FRAMES samples the ratios are sanitised once; the
   * kernel reads a source in place when it is resident (WasmKernel.upload) and the span the run can touch lies inside
   * the readable region, else that span is copied (wrapped or silent as `mapIndex` says) into module memory; outputs
   * that are views of module memory are written in place. The kernel runs until the run ends or a loop wraps (the wrap
   * and the next span are handled here, as the reference does).
   */
  private renderWasm(k: WasmKernel, out: readonly Float32Array[], o: number, frames: number, rs: number, dr: number, ratios: Float32Array | null, ro: number): void {
    const t = this.table;
    const chans = this.channelsInUse;
    const halfDense = t.halfTaps * t.phases;
    const loopEnd = this.loop ? this.loopEnd : Infinity;
    const reMax = rs + dr > rs ? rs + dr : rs;
    if (this.residentEpoch !== k.residentEpoch) {
      for (let c = 0; c < chans; c++) this.resident[c] = k.residentOf(this.sources[c]);
      this.residentEpoch = k.residentEpoch;
    }
    for (let run = 0; run < frames; ) {
      const runEnd = frames - run < RUN_FRAMES ? frames : run + RUN_FRAMES;
      let rmax = reMax;
      if (ratios !== null) {
        const f64 = k.f64;
        const rb = k.ratios >> 3;
        rmax = 0;
        for (let i = run; i < runEnd; i++) {
          const r = this.sanitize(ratios[ro + i]);
          f64[rb + i - run] = r;
          if (r > rmax) rmax = r;
        }
      }
      const halfW = halfWindowFor(halfDense, t.strideFor(rmax));
      for (let i = run; i < runEnd; ) {
        const lower = Math.floor(this.pos) - halfW;
        const upper = Math.floor(this.pos + (runEnd - i) * rmax + 1) + halfW + 10;
        const dp = ratios === null ? 0 : k.ratios + 8 * (i - run);
        const inside = lower >= (this.loop && this.wrapped ? this.loopStart : 0) && upper <= (this.loop ? this.loopEnd : this.length);
        const mem = k.f32.buffer;
        let done = 0;
        for (let c = 0; c < chans; c += 2) {
          const pair = c + 1 < chans;
          const r0 = inside ? this.resident[c] : 0;
          const r1 = pair && inside ? this.resident[c + 1] : 0;
          let x0 = k.span0;
          let x1 = pair ? k.span1 : 0;
          let base = lower;
          if (r0 !== 0 && (!pair || r1 !== 0)) {
            x0 = r0;
            x1 = r1;
            base = 0;
          } else {
            this.copySpan(k.f32, k.span0 >> 2, this.sources[c], lower, upper);
            if (pair) this.copySpan(k.f32, k.span1 >> 2, this.sources[c + 1], lower, upper);
          }
          const y0 = out[c];
          const y1 = pair ? out[c + 1] : y0;
          const direct0 = y0.buffer === mem;
          const direct1 = y1.buffer === mem;
          const o0 = direct0 ? y0.byteOffset + 4 * (o + i) : k.out0;
          const o1 = direct1 ? y1.byteOffset + 4 * (o + i) : k.out1;
          done = k.exports.render(this.tablePtr, x0, x1, base, o0, o1, this.pos, i, runEnd, frames, rs, dr, dp, loopEnd, k.state);
          if (!direct0) y0.set(k.outViews0[done], o + i);
          if (pair && !direct1) y1.set(k.outViews1[done], o + i);
        }
        let p = k.f64[k.state >> 3];
        if (this.loop && p >= this.loopEnd) {
          while (p >= this.loopEnd) p -= this.loopLength;
          this.wrapped = true;
        }
        this.pos = p;
        this.lastStretch = t.phases / k.i32[(k.state >> 2) + 2];
        if (done <= 0) {
          // The module made no progress (it never should): output silence for the rest of the run rather than spin.
          for (let c = 0; c < chans; c++) out[c].fill(0, o + i, o + runEnd);
          this.clampCount++;
          break;
        }
        i += done;
      }
      run = runEnd;
    }
  }

  /** Copies source frames lower…upper−1 of `x` into f32[at…], mapped (wrapped, or 0 outside) as the reference reads them. */
  private copySpan(f32: Float32Array, at: number, x: Float32Array, lower: number, upper: number): void {
    const hi = this.loop ? this.loopEnd : this.length;
    const lo = this.loop && this.wrapped ? this.loopStart : 0;
    const d = at - lower;
    if (lower >= lo && upper <= hi) {
      for (let m = lower; m < upper; m++) f32[d + m] = x[m];
      return;
    }
    for (let m = lower; m < upper; m++) {
      const mi = this.mapIndex(m);
      f32[d + m] = mi < 0 ? 0 : x[mi];
    }
  }

  /** Advances the position exactly as `read` with the same arguments would, without output (virtual voices). */
  skip(frames: number, ratioStart: number, ratioEnd: number): void {
    const rs = this.sanitize(ratioStart);
    const re = this.sanitize(ratioEnd);
    if (rs === 1 && re === 1 && this.pos === Math.floor(this.pos)) {
      for (let i = 0; i < frames; i++) this.advance(1);
      return;
    }
    const dr = re - rs;
    for (let i = 0; i < frames; i++) {
      const r = rs + (dr * i) / frames;
      this.lastStretch = this.table.phases / this.table.strideFor(r);
      this.advance(r);
    }
  }

  private sanitize(r: number): number {
    if (r >= MIN_RATIO && r <= MAX_RATIO) {
      this.lastRatio = r;
      return r;
    }
    this.clampCount++;
    if (r !== r || r === Infinity || r === -Infinity) return this.lastRatio;
    const c = r > MAX_RATIO ? MAX_RATIO : MIN_RATIO;
    this.lastRatio = c;
    return c;
  }

  private advance(r: number): void {
    let p = this.pos + r;
    if (this.loop && p >= this.loopEnd) {
      while (p >= this.loopEnd) p -= this.loopLength;
      this.wrapped = true;
    }
    this.pos = p;
  }

  /** Source index for frame m after loop wrapping, or −1 for silence. */
  private mapIndex(m: number): number {
    if (this.loop) {
      if (m >= this.loopEnd) m = this.loopStart + ((m - this.loopStart) % this.loopLength);
      else if (m < this.loopStart && this.wrapped) m = this.loopEnd - 1 - ((this.loopStart - 1 - m) % this.loopLength);
    }
    return m >= 0 && m < this.length ? m : -1;
  }

  private copyThrough(out: readonly Float32Array[], o: number, frames: number): void {
    const chans = this.channelsInUse;
    for (let i = 0; i < frames; i++) {
      const m = this.mapIndex(this.pos);
      for (let c = 0; c < chans; c++) out[c][o + i] = m < 0 ? 0 : this.sources[c][m];
      this.advance(1);
    }
    this.lastStretch = 1;
  }

  /** Fills scratch with the window mLo…mLo+count−1 (wrapped or silent); returns false when it is all silence. */
  private gather(mLo: number, count: number): boolean {
    let any = false;
    const chans = this.channelsInUse;
    for (let j = 0; j < count; j++) {
      const m = this.mapIndex(mLo + j);
      if (m >= 0) any = true;
      for (let c = 0; c < chans; c++) this.scratch[c][j] = m < 0 ? 0 : this.sources[c][m];
    }
    return any;
  }

  private renderOne(out: readonly Float32Array[], o: number, strideIn: number): void {
    const t = this.table;
    const chans = this.channelsInUse;
    const n = Math.floor(this.pos);
    const frac = this.pos - n;
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
      this.lastStretch = 1;
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
      this.lastStretch = t.phases / stride;
    }
    const lo = this.loop ? (this.wrapped ? this.loopStart : 0) : 0;
    const hi = this.loop ? this.loopEnd : this.length;
    let useScratch = false;
    if (mLo < lo || mLo + count > hi) {
      if (!this.gather(mLo, count)) {
        for (let c = 0; c < chans; c++) out[c][o] = 0;
        return;
      }
      useScratch = true;
    }
    const base = useScratch ? 0 : mLo;
    if (chans === 1) {
      const x = useScratch ? this.scratch[0] : this.sources[0];
      out[0][o] = scale * (stride === 0 ? dotRows(t.phaseMajor, k0, t.taps, x, base, f) : dotStride(t.dense, k0, stride, x, base, count, f));
      return;
    }
    const w = this.weights;
    if (stride === 0) fillRows(w, t.phaseMajor, k0, t.taps, f);
    else fillStride(w, t.dense, k0, stride, count, f);
    for (let c = 0; c < chans; c++) {
      const x = useScratch ? this.scratch[c] : this.sources[c];
      let acc = 0;
      for (let j = 0; j < count; j++) acc += w[j] * x[base + j];
      out[c][o] = scale * acc;
    }
  }
}

/** Dot product of x[base…] with phase rows at k0 and k0+taps, linearly interpolated by f. */
function dotRows(pm: Float32Array, k0: number, taps: number, x: Float32Array, base: number, f: number): number {
  let a0 = 0;
  let a1 = 0;
  const k1 = k0 + taps;
  for (let j = 0; j < taps; j++) {
    const s = x[base + j];
    a0 += pm[k0 + j] * s;
    a1 += pm[k1 + j] * s;
  }
  return a0 + f * (a1 - a0);
}

/** Dot product of x[base…] with the dense kernel read at k0, k0 − stride, …, linearly interpolated by f. */
function dotStride(d: Float32Array, k0: number, stride: number, x: Float32Array, base: number, count: number, f: number): number {
  let a0 = 0;
  let a1 = 0;
  let k = k0;
  for (let j = 0; j < count; j++) {
    const s = x[base + j];
    a0 += d[k] * s;
    a1 += d[k + 1] * s;
    k -= stride;
  }
  return a0 + f * (a1 - a0);
}

function fillRows(w: Float64Array, pm: Float32Array, k0: number, taps: number, f: number): void {
  const k1 = k0 + taps;
  for (let j = 0; j < taps; j++) w[j] = pm[k0 + j] + f * (pm[k1 + j] - pm[k0 + j]);
}

function fillStride(w: Float64Array, d: Float32Array, k0: number, stride: number, count: number, f: number): void {
  let k = k0;
  for (let j = 0; j < count; j++) {
    w[j] = d[k] + f * (d[k + 1] - d[k]);
    k -= stride;
  }
}
