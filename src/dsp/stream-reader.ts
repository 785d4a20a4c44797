// Streaming bandlimited interpolation over a source buffer (J. O. Smith, "Digital Audio Resampling", CCRMA):
// a fractional read position, a per-sample playback ratio, a kernel stretched by the ratio above 1.
import { KernelTable } from './kernel-table';
import { DspArgumentError } from './dsp-argument-error';
import { WasmKernel, type KernelName, type KernelPreference } from './wasm/wasm-kernel';
import { ReadCursor } from './read-cursor';
import { WasmReadPath } from './wasm-read-path';
import { TypeScriptTaps } from './typescript-taps';

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
  /** The WebAssembly path, or null (TypeScript reference). */
  private readonly wasm: WasmReadPath | null;
  /** The TypeScript path (also the WebAssembly reader's, with no source set). */
  private readonly taps: TypeScriptTaps;

  /** Allocates scratch for `options.channels` channels and the table's widest (ratio 4) window. */
  constructor(options: StreamReaderOptions) {
    const channels = Math.max(1, Math.min(32, Math.floor(options.channels)));
    this.capacity = channels;
    this.cur = new ReadCursor(channels);
    const kernel = options.kernel ?? 'auto';
    const shared = kernel === 'typescript' ? null : WasmKernel.shared();
    this.wasm = shared === null ? null : new WasmReadPath(shared, this.cur);
    if (kernel === 'wasm-simd' && this.wasm === null) throw new DspArgumentError('kernel', 'WebAssembly SIMD is not available here');
    this.taps = new TypeScriptTaps(this.cur, channels, options.table);
    this.setTable(options.table);
  }

  /** Switches the kernel table (tier); allocates only when the new table needs a wider scratch window. */
  setTable(table: KernelTable): void {
    this.table = table;
    if (this.wasm !== null) this.wasm.setTable(table);
    this.taps.setTable(table);
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

  /** rampStart and rampEnd sanitised (in that order) into the cursor's ratioIo[0] and [1]: no double crosses a call. */
  private sanitizeRamp(): Float64Array {
    const q = this.cur.ratioIo;
    q[0] = this.rampStart;
    q[1] = this.rampEnd;
    this.cur.sanitizeAt(q, 0);
    this.cur.sanitizeAt(q, 1);
    return q;
  }

  /** `read` with its ratios in `rampStart`/`rampEnd`. */
  readRamp(out: readonly Float32Array[], outOffset: number, frames: number): void {
    const q = this.sanitizeRamp();
    const rs = q[0];
    const re = q[1];
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

  /** The block loop: ratio per sample from (rs, dr) or from `ratios`, on the WebAssembly path or the TypeScript one. */
  private render(out: readonly Float32Array[], o: number, frames: number, ratios: Float32Array | null, ro: number): void {
    // With no source set there is nothing to hand the module: the reference path reads its defined silence.
    if (this.wasm !== null && this.cur.channelsInUse > 0) {
      const b = this.wasm.block;
      b.out = out;
      b.offset = o;
      b.frames = frames;
      b.ratioStart = this.rs;
      b.ratioDelta = this.dr;
      b.ratios = ratios;
      b.ratiosOffset = ro;
      this.wasm.render();
      return;
    }
    this.taps.rs = this.rs;
    this.taps.dr = this.dr;
    this.taps.render(out, o, frames, ratios, ro);
  }

  /** Advances the position exactly as `read` with the same arguments would, without output (virtual voices). */
  skip(frames: number, ratioStart: number, ratioEnd: number): void {
    this.rampStart = ratioStart;
    this.rampEnd = ratioEnd;
    this.skipRamp(frames);
  }

  /** `skip` with its ratios in `rampStart`/`rampEnd`. */
  skipRamp(frames: number): void {
    const q = this.sanitizeRamp();
    const rs = q[0];
    const re = q[1];
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
}
