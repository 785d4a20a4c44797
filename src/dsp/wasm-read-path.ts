// A StreamReader's WebAssembly path: the same bandlimited interpolation (J. O. Smith, "Digital Audio Resampling",
// CCRMA) run by the SIMD kernel module, fed with resident sources in place or with spans copied into module memory.
import type { KernelTable } from './kernel-table';
import type { ReadCursor } from './read-cursor';
import { RUN_FRAMES, WasmKernel, halfWindowFor } from './wasm/wasm-kernel';
import { RP_COUNT, RP_DR, RP_FRAMES, RP_HI, RP_I_END, RP_I_START, RP_LAST, RP_LOOP_END, RP_OUT0, RP_OUT1, RP_POS, RP_RATIOS, RP_RAW, RP_RS, RP_SPAN_BASE, RP_STRIDE, RP_TABLE, RP_X0, RP_X1 } from './wasm/kernel-params';

const NO_OUTPUTS: readonly Float32Array[] = [];

/** One block's read request, filled in place by the reader before `WasmReadPath.render` (no object per block). */
export class ReadBlock {
  /** Output channels (one per source channel in use). */
  out: readonly Float32Array[] = NO_OUTPUTS;
  /** First output sample written, frames. */
  offset = 0;
  /** Output samples, frames (≥ 0). */
  frames = 0;
  /** Ratio of sample 0 when `ratios` is null (sanitised, MIN_RATIO…MAX_RATIO). */
  ratioStart = 1;
  /** Ratio change across the block when `ratios` is null (sample i reads ratioStart + ratioDelta·i/frames). */
  ratioDelta = 0;
  /** One playback ratio per output sample (sanitised by the module, as ReadCursor.sanitize does), or null for the linear ramp. */
  ratios: Float32Array | null = null;
  /** Index of sample 0's ratio in `ratios`. */
  ratiosOffset = 0;
}

/** Renders a cursor's source through the WebAssembly kernel; never allocates after construction. */
export class WasmReadPath {
  /** The shared kernel module. */
  readonly kernel: WasmKernel;
  /** The request `render` carries out: the reader fills it in place. */
  readonly block = new ReadBlock();
  private readonly cur: ReadCursor;
  private table: KernelTable | null = null;
  private tablePtr = 0;
  /** Byte offsets of the sources' resident copies in module memory (0 = none; spans are copied), as of `residentEpoch`. */
  private readonly resident: Int32Array;
  private residentEpoch = -1;
  /** Infinity as a field: a double merged with the global `Infinity` in a branch is boxed by V8 (docs/allocation.md). */
  private readonly noLoopEnd = Infinity;
  /**
   * Per slot (output channels, then the ratios): the array last seen there and its byte offset in module memory (−1:
   * not a view of it), valid while the kernel's f32 view is `seenMemory` (reading `.buffer` calls into the runtime).
   */
  private readonly seen: (Float32Array | null)[];
  private readonly seenAt: Int32Array;
  private seenMemory: Float32Array | null = null;

  /** Reads `cursor` (its source, loop and position); room for its channels' resident source offsets. */
  constructor(kernel: WasmKernel, cursor: ReadCursor) {
    this.kernel = kernel;
    this.cur = cursor;
    this.resident = new Int32Array(cursor.sources.length);
    this.seen = new Array<Float32Array | null>(cursor.sources.length + 1).fill(null);
    this.seenAt = new Int32Array(cursor.sources.length + 1);
  }

  /** Places `table` in module memory (once per table) for later renders. */
  setTable(table: KernelTable): void {
    this.tablePtr = this.kernel.tablePointer(table);
    this.table = table;
  }

  /** Forgets which sources are resident (call when the source changes). */
  invalidate(): void {
    this.residentEpoch = -1;
  }

  /**
   * Carries out `block` (filled by the reader) on the cursor given at construction through the WebAssembly kernel: per
   * run of ≤ RUN_FRAMES samples the module first writes the run's ratios (the per-sample ones sanitised, or the ramp's),
   * with the run's cursor state (last ratio, clamps) carried over; the kernel reads a source in place when it is resident (WasmKernel.upload) and the span the run can touch lies inside
   * the readable region, else that span is copied (wrapped or silent as `mapIndex` says) into module memory; outputs
   * that are views of module memory are written in place. The kernel runs until the run ends or a loop wraps (the wrap
   * and the next span are handled here, as the reference does).
   */
  render(): void {
    const t = this.table;
    if (t === null) return;
    const k = this.kernel;
    const cur = this.cur;
    const req = this.block;
    const out = req.out;
    const o = req.offset;
    const frames = req.frames;
    const rs = req.ratioStart;
    const dr = req.ratioDelta;
    const ratios = req.ratios;
    const ro = req.ratiosOffset;
    const chans = cur.channelsInUse;
    const halfDense = t.halfTaps * t.phases;
    let loopEnd = this.noLoopEnd;
    if (cur.loop) loopEnd = cur.loopEnd;
    const reMax = rs + dr > rs ? rs + dr : rs;
    if (this.residentEpoch !== k.residentEpoch) {
      for (let c = 0; c < chans; c++) this.resident[c] = k.residentOf(cur.sources[c]);
      this.residentEpoch = k.residentEpoch;
    }
    // The fields that stay the same for the whole block are written once.
    const pb = k.renderParams;
    k.i32[(pb + RP_TABLE) >> 2] = this.tablePtr;
    k.f64[(pb + RP_FRAMES) >> 3] = frames;
    k.f64[(pb + RP_RS) >> 3] = rs;
    k.f64[(pb + RP_DR) >> 3] = dr;
    k.f64[(pb + RP_LOOP_END) >> 3] = loopEnd;
    // Byte address of ratios[0] in module memory: read in place when they are there, else copied whole when they fit
    // the scratch (a block copy; an element loop costs about 1.5 ns per ratio), else −1: copied run by run below.
    let rawAt = -1;
    if (ratios !== null) {
      rawAt = this.placed(ratios, this.seen.length - 1);
      if (rawAt < 0 && ratios.length <= RUN_FRAMES) {
        k.f32.set(ratios, k.rawRatios >> 2);
        rawAt = k.rawRatios;
      }
    }
    for (let run = 0; run < frames; ) {
      const runEnd = frames - run < RUN_FRAMES ? frames : run + RUN_FRAMES;
      let rmax = reMax;
      if (ratios !== null) {
        // The module sanitises the run's ratios as ReadCursor.sanitize would, read in place when they are in its memory.
        let raw = rawAt + 4 * (ro + run);
        if (rawAt < 0) {
          raw = k.rawRatios;
          const f32 = k.f32;
          const rb = (raw >> 2) - ro - run;
          for (let q = ro + run; q < ro + runEnd; q++) f32[rb + q] = ratios[q];
        }
        const i32 = k.i32;
        const f64 = k.f64;
        i32[(pb + RP_RAW) >> 2] = raw;
        i32[(pb + RP_COUNT) >> 2] = runEnd - run;
        i32[(pb + RP_RATIOS) >> 2] = k.ratios;
        f64[(pb + RP_LAST) >> 3] = cur.lastRatio;
        cur.clamps += k.exports.sanitize(pb);
        cur.lastRatio = f64[(pb + RP_LAST) >> 3];
        rmax = f64[(pb + RP_HI) >> 3];
      } else {
        // The ramp's ratios for the run, computed by the module as its loop would: the same per-sample path follows.
        const i32 = k.i32;
        i32[(pb + RP_I_START) >> 2] = run;
        i32[(pb + RP_I_END) >> 2] = runEnd;
        i32[(pb + RP_RATIOS) >> 2] = k.ratios;
        k.exports.ramp(pb);
      }
      // strideFor's field form: a double passed to a call V8 does not inline is boxed (docs/allocation.md).
      t.strideRatio = rmax;
      const halfW = halfWindowFor(halfDense, t.strideForQuery());
      for (let i = run; i < runEnd; ) {
        const lower = Math.floor(cur.pos) - halfW;
        const upper = Math.floor(cur.pos + (runEnd - i) * rmax + 1) + halfW + 10;
        const dp = k.ratios + 8 * (i - run);
        const inside = lower >= (cur.loop && cur.wrapped ? cur.loopStart : 0) && upper <= (cur.loop ? cur.loopEnd : cur.length);
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
            copySpan(cur, k.f32, k.span0 >> 2, cur.sources[c], lower, upper);
            if (pair) copySpan(cur, k.f32, k.span1 >> 2, cur.sources[c + 1], lower, upper);
          }
          const y0 = out[c];
          const y1 = pair ? out[c + 1] : y0;
          const at0 = this.placed(y0, c);
          const at1 = pair ? this.placed(y1, c + 1) : at0;
          const o0 = at0 >= 0 ? at0 + 4 * (o + i) : k.out0;
          const o1 = at1 >= 0 ? at1 + 4 * (o + i) : k.out1;
          const i32 = k.i32;
          i32[(pb + RP_X0) >> 2] = x0;
          i32[(pb + RP_X1) >> 2] = x1;
          i32[(pb + RP_SPAN_BASE) >> 2] = base;
          i32[(pb + RP_OUT0) >> 2] = o0;
          i32[(pb + RP_OUT1) >> 2] = o1;
          i32[(pb + RP_I_START) >> 2] = i;
          i32[(pb + RP_I_END) >> 2] = runEnd;
          i32[(pb + RP_RATIOS) >> 2] = dp;
          // Every channel pair starts from the same position (the kernel overwrites it with the end position).
          k.f64[(pb + RP_POS) >> 3] = cur.pos;
          done = k.exports.render(pb);
          if (at0 < 0) y0.set(k.outViews0[done], o + i);
          if (pair && at1 < 0) y1.set(k.outViews1[done], o + i);
        }
        // moveTo's field form, for the same reason: past a loop's end wraps back by whole loop lengths.
        cur.pos = k.f64[(pb + RP_POS) >> 3];
        cur.wrapPos();
        cur.lastStretch = t.phases / k.i32[(pb + RP_STRIDE) >> 2];
        if (done <= 0) {
          // The module made no progress (it never should): output silence for the rest of the run rather than spin.
          for (let c = 0; c < chans; c++) out[c].fill(0, o + i, o + runEnd);
          cur.clamps++;
          break;
        }
        i += done;
      }
      run = runEnd;
    }
  }

  /** Byte offset of `x` in module memory, or −1 when it is not a view of it, remembered for `slot`. */
  private placed(x: Float32Array, slot: number): number {
    const f32 = this.kernel.f32;
    if (f32 !== this.seenMemory) {
      // Memory grew (views of the old memory are detached): ask again.
      this.seen.fill(null);
      this.seenMemory = f32;
    }
    if (x !== this.seen[slot]) {
      this.seen[slot] = x;
      this.seenAt[slot] = x.buffer === f32.buffer ? x.byteOffset : -1;
    }
    return this.seenAt[slot];
  }
}

/** Copies source frames lower…upper−1 of `x` into f32[at…], mapped (wrapped, or 0 outside) as the reference reads them. */
function copySpan(cur: ReadCursor, f32: Float32Array, at: number, x: Float32Array, lower: number, upper: number): void {
  const hi = cur.loop ? cur.loopEnd : cur.length;
  const lo = cur.loop && cur.wrapped ? cur.loopStart : 0;
  const d = at - lower;
  if (lower >= lo && upper <= hi) {
    for (let m = lower; m < upper; m++) f32[d + m] = x[m];
    return;
  }
  for (let m = lower; m < upper; m++) {
    const mi = cur.mapIndex(m);
    f32[d + m] = mi < 0 ? 0 : x[mi];
  }
}
