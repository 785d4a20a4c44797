// Host side of the WebAssembly SIMD resample kernel (wasm/resample-kernel.ts): feature detection, instantiation,
// a first-fit allocator with coalescing over the module's memory, and the per-stride contiguous tables of each KernelTable.
import type { KernelTable } from '../kernel-table';
import { MAX_RATIO } from '../quality-tiers';
import { decodeBase64 } from './base64';
import { kernelModuleBase64 } from './kernel-bytes.generated';
import { ModuleHeap, align } from './module-heap';
import { BP_DENSE, BP_DESC, BP_DIFFS, BP_ROWS, BP_STRIDE, BP_TABLE, BP_TOTAL, BUILD_PARAM_BYTES, LOWPASS_PARAM_BYTES, MIX_PARAM_BYTES, MP_FRAMES, MP_GL0, MP_MIX_L, MP_MIX_R, MP_X0, MP_X1, RENDER_PARAM_BYTES } from './kernel-params';

/** Which inner loop a reader runs: the WebAssembly SIMD kernel or the TypeScript reference. */
export type KernelName = 'wasm-simd' | 'typescript';
/** A kernel request: 'auto' takes WebAssembly SIMD when the platform has it, else TypeScript. */
export type KernelPreference = 'auto' | KernelName;

/** The parts of the WebAssembly JavaScript API used here (an ES global in Node and AudioWorkletGlobalScope). */
export interface WasmApi {
  validate(bytes: Uint8Array): boolean;
  Module: new (bytes: Uint8Array) => object;
  Instance: new (module: object, imports: object) => { exports: object };
}

/** The part of WebAssembly.Memory used here. */
export interface WasmMemory {
  readonly buffer: ArrayBuffer;
  grow(pages: number): number;
}

/** The module's exports (byte offsets into its memory as numbers). */
export interface KernelExports {
  memory: WasmMemory;
  heapBase(): number;
  rowFloats(total: number, stride: number): number;
  diffFloats(halfDense: number, stride: number): number;
  /** Lays out one stride of a table as described by the block at `params` (kernel-params.ts, BP_*). */
  buildStride(params: number): void;
  /** Mixes one voice as described by the block at `params` (kernel-params.ts, MP_*); 1 when every input sample was finite. */
  mix(params: number): number;
  /** Low-passes two channels in place as described by the block at `params` (kernel-params.ts, LP_*). */
  lowpass(params: number): void;
  /** `lowpass`, then mixes the filtered block as `mix` does with the block at `mixParams` (its gains and bus); 1 when every filtered sample was finite. */
  lowpassMix(params: number, mixParams: number): number;
  /** Renders a run as described by the block at `params` (kernel-params.ts, RP_*); returns the samples written. */
  render(params: number): number;
  /** Sanitises a run's raw ratios into the f64 ratios `render` reads (kernel-params.ts, RP_*); returns the clamps. */
  sanitize(params: number): number;
  /** Writes a run's linear-ramp ratios where `sanitize` writes (kernel-params.ts, RP_*). */
  ramp(params: number): void;
}

/** Something holding views of module memory: told once after each growth (not polled per render). */
export interface MemoryWatcher {
  /** Rebuilds the holder's views of `kernel`'s memory (called right after it grew). */
  memoryGrew(): void;
}

/** A placed table's bytes copied out of one module instance (`WasmKernel.imageOf`), transferable to another. */
export interface KernelImage {
  /** The region from the table header to the end of its last stride layout. */
  readonly bytes: Uint8Array;
  /** Byte offset the region had in the instance that built it (pointers inside are relative to that placement). */
  readonly origin: number;
}

/** Output samples per kernel call; the source span copied for one call covers at most RUN_FRAMES · MAX_RATIO frames plus the window. */
export const RUN_FRAMES = 512;

// (module (func (result v128) i32.const 0 i8x16.splat)): validates only where SIMD (WebAssembly 2.0 fixed-width SIMD) is on.
const SIMD_PROBE = new Uint8Array([0, 97, 115, 109, 1, 0, 0, 0, 1, 5, 1, 96, 0, 1, 123, 3, 2, 1, 0, 10, 8, 1, 6, 0, 65, 0, 253, 15, 11]);

/** The global WebAssembly API, or null where there is none. */
export function globalWasmApi(): WasmApi | null {
  const api = (globalThis as { WebAssembly?: WasmApi }).WebAssembly;
  return api !== undefined && typeof api.validate === 'function' ? api : null;
}

/** True when `api` validates a module that uses v128 (fixed-width SIMD). */
export function wasmSimdSupported(api: WasmApi | null = globalWasmApi()): boolean {
  try {
    return api !== null && api.validate(SIMD_PROBE);
  } catch {
    return false;
  }
}

let shared: WasmKernel | null | undefined;

/** The kernel an 'auto' request gets in this realm: 'wasm-simd' when the module loads, else 'typescript'. */
export function activeKernel(): KernelName {
  return WasmKernel.shared() === null ? 'typescript' : 'wasm-simd';
}

/** One instance of the kernel module with its memory: tables built per KernelTable, one scratch shared by all readers (single thread). */
export class WasmKernel {
  /** The module's exports. */
  readonly exports: KernelExports;
  /** Views of the module memory, renewed after every growth (read them afresh after `tablePointer`). */
  f32!: Float32Array;
  f64!: Float64Array;
  i32!: Int32Array;
  /** Byte offsets of the shared scratch: two source spans, two outputs, sanitised ratios (f64), raw ratios (f32). */
  span0 = 0;
  span1 = 0;
  out0 = 0;
  out1 = 0;
  ratios = 0;
  rawRatios = 0;
  /** Byte offset of the `render` parameter block (kernel-params.ts RP_*), written once per kernel call. */
  renderParams = 0;
  /** Byte offset of the `mix` parameter block (kernel-params.ts MP_*). */
  mixParams = 0;
  /** The gains of the next `mix`, a view of its parameter block: [gl0, dgl, gr0, dgr] (linear; renewed after growth). */
  mixGains: Float64Array = new Float64Array(4);
  /** Byte offset of the `lowpass` parameter block (kernel-params.ts LP_*; written through `f64` and `i32`). */
  lowpassParams = 0;
  /** Byte offset of the `buildStride` parameter block (kernel-params.ts BP_*). */
  private buildParams = 0;
  /** outViews0[n] / outViews1[n]: the first n floats of out0 / out1 (n = 0…RUN_FRAMES), for allocation-free block copies. */
  readonly outViews0: Float32Array[] = [];
  readonly outViews1: Float32Array[] = [];
  /** Floats each span holds. */
  spanFloats = 0;
  /** Counts discards of resident sources: a reader re-reads its pointers when this changed since its setSource. */
  residentEpoch = 0;
  /** Stride layouts built by this instance (`buildStride` calls); an installed image builds none. */
  stridesBuilt = 0;
  private readonly heap: ModuleHeap;
  private readonly watchers: MemoryWatcher[] = [];
  private readonly tables = new Map<KernelTable, number>();
  /** Byte end of each table's region (header … last stride), for `imageOf`. */
  private readonly tableEnds = new Map<KernelTable, number>();
  private readonly installs = new Map<KernelTable, { at: number; copied: number; image: KernelImage }>();
  private readonly resident = new Map<Float32Array, { at: number; bytes: number; users: number }>();

  private constructor(exports: KernelExports) {
    this.exports = exports;
    this.heap = new ModuleHeap(exports.memory, exports.heapBase());
    this.refresh();
    this.out0 = this.take(RUN_FRAMES * 4);
    this.out1 = this.take(RUN_FRAMES * 4);
    this.ratios = this.take(RUN_FRAMES * 8);
    this.rawRatios = this.take(RUN_FRAMES * 4);
    this.renderParams = this.take(RENDER_PARAM_BYTES);
    this.mixParams = this.take(MIX_PARAM_BYTES);
    this.buildParams = this.take(BUILD_PARAM_BYTES);
    this.lowpassParams = this.take(LOWPASS_PARAM_BYTES);
    this.refreshViews();
    this.mixGains = new Float64Array(this.exports.memory.buffer, this.mixParams + MP_GL0, 4);
  }

  /** The kernel of this realm (created on first call), or null when WebAssembly SIMD is not available or fails to load. */
  static shared(): WasmKernel | null {
    if (shared === undefined) shared = WasmKernel.create(globalWasmApi());
    return shared;
  }

  /** A new kernel instance through `api`, or null when SIMD is unsupported or the module does not compile. */
  static create(api: WasmApi | null): WasmKernel | null {
    if (api === null || !wasmSimdSupported(api)) return null;
    try {
      const bytes = decodeBase64(kernelModuleBase64);
      if (!api.validate(bytes)) return null;
      const instance = new api.Instance(new api.Module(bytes), {});
      return new WasmKernel(instance.exports as KernelExports);
    } catch {
      return null; // e.g. a host that forbids synchronous compilation
    }
  }

  /** Byte offset of `table`'s header in module memory, building its per-stride rows on first use (allocates; not on the audio path). */
  tablePointer(table: KernelTable): number {
    const known = this.tables.get(table);
    if (known !== undefined) return known;
    const p = table.phases;
    const total = table.taps * p;
    const headerBytes = align(32 + 8 * (p + 1));
    const denseBytes = align(4 * table.dense.length);
    let bytes = 0;
    const halfDense = table.halfTaps * p;
    for (const s of table.strideGrid) bytes += align(32 * s) + align(4 * this.exports.rowFloats(total, s)) + align(4 * this.exports.diffFloats(halfDense, s));
    // One region (header, dense, stride layouts), so that imageOf copies it whole and dropTable hands it back whole.
    const header = this.take(headerBytes + denseBytes + bytes);
    const dense = header + headerBytes;
    const block = dense + denseBytes;
    const h = header >> 2;
    this.i32[h] = p;
    this.i32[h + 1] = table.halfTaps * p;
    this.f64[(header + 8) >> 3] = table.stretchPerRatio;
    this.i32[h + 4] = header + 32;
    this.i32[h + 5] = header + 32 + 4 * (p + 1);
    this.i32.set(table.gridFloor, h + 8);
    this.f32.set(table.dense, dense >> 2);
    let at = block;
    for (const s of table.strideGrid) {
      const desc = at;
      const rows = desc + align(32 * s);
      const diffs = rows + align(4 * this.exports.rowFloats(total, s));
      at = diffs + align(4 * this.exports.diffFloats(halfDense, s));
      const bp = this.buildParams >> 2;
      const i32 = this.i32;
      i32[bp + (BP_TABLE >> 2)] = header;
      i32[bp + (BP_DENSE >> 2)] = dense;
      i32[bp + (BP_TOTAL >> 2)] = total;
      i32[bp + (BP_STRIDE >> 2)] = s;
      i32[bp + (BP_DESC >> 2)] = desc;
      i32[bp + (BP_ROWS >> 2)] = rows;
      i32[bp + (BP_DIFFS >> 2)] = diffs;
      this.exports.buildStride(this.buildParams);
      this.stridesBuilt++;
    }
    this.tableEnds.set(table, at);
    this.ensureSpans(table);
    this.tables.set(table, header);
    return header;
  }

  /** True when `table` is placed in module memory (built or installed): `tablePointer` then costs a map lookup. */
  hasTable(table: KernelTable): boolean {
    return this.tables.has(table);
  }

  /** A copy of `table`'s placed region (built here first if needed), to install into another instance of the module. */
  imageOf(table: KernelTable): KernelImage {
    const header = this.tablePointer(table);
    const end = this.tableEnds.get(table) ?? header;
    return { bytes: new Uint8Array(this.exports.memory.buffer).slice(header, end), origin: header };
  }

  /**
   * Installs an image from `imageOf` (of the same module and table) by copying at most `maxBytes` per call; true once
   * installed (pointers relocated, `tablePointer` ready without building). Grows memory only as far as the copy has got,
   * so that each call's cost stays bounded (for the audio thread: one call per render quantum).
   */
  installStep(table: KernelTable, image: KernelImage, maxBytes: number): boolean {
    if (this.tables.has(table)) return true;
    let job = this.installs.get(table);
    if (job === undefined || job.image !== image) {
      // A released region that fits (e.g. a closed engine's table) is reused; else the copy grows memory slice by slice.
      const bytes = align(image.bytes.length);
      let at = this.heap.takeFree(bytes);
      if (at < 0) at = this.heap.reserve(bytes);
      job = { at, copied: 0, image };
      this.installs.set(table, job);
    }
    const n = Math.min(image.bytes.length - job.copied, Math.max(16, maxBytes));
    const end = job.at + job.copied + n;
    const have = this.exports.memory.buffer.byteLength;
    // Grow a few slices ahead (at most to the image's end), so that views are renewed once per 1 MB rather than per slice.
    this.heap.growTo(end, Math.min(job.at + image.bytes.length, Math.max(end, have + (1 << 20))));
    this.refresh();
    new Uint8Array(this.exports.memory.buffer, job.at + job.copied, n).set(image.bytes.subarray(job.copied, job.copied + n));
    job.copied += n;
    if (job.copied < image.bytes.length) return false;
    this.installs.delete(table);
    this.relocate(table, job.at, job.at - image.origin);
    this.tableEnds.set(table, job.at + image.bytes.length);
    this.ensureSpans(table);
    this.tables.set(table, job.at);
    return true;
  }

  /** Adds `delta` to every pointer of the table region at `header` (header fields, stride descriptors and their rows). */
  private relocate(table: KernelTable, header: number, delta: number): void {
    const i32 = this.i32;
    const h = header >> 2;
    i32[h + 4] += delta;
    i32[h + 5] += delta;
    const byStride = i32[h + 5] >> 2;
    for (const s of table.strideGrid) {
      i32[byStride + s] += delta;
      const d0 = i32[byStride + s] >> 2;
      for (let ci = 0; ci < s; ci++) {
        const d = d0 + 8 * ci;
        i32[d] += delta;
        i32[d + 1] += delta;
        i32[d + 4] += delta;
      }
    }
  }

  private ensureSpans(table: KernelTable): void {
    const smallest = table.strideGrid[table.strideGrid.length - 1];
    const need = spanFloatsFor(table.halfTaps * table.phases, smallest);
    if (need > this.spanFloats) {
      if (this.spanFloats > 0) {
        this.release(this.span0, 4 * this.spanFloats);
        this.release(this.span1, 4 * this.spanFloats);
      }
      this.span0 = this.take(4 * need);
      this.span1 = this.take(4 * need);
      this.spanFloats = need;
    }
  }

  /**
   * Hands `table`'s region back (built or installed here) for reuse; the caller guarantees no reader still uses it
   * (e.g. the worklet host drops the tables it installed when its engine is disposed). Unknown tables are ignored.
   */
  dropTable(table: KernelTable): void {
    const job = this.installs.get(table);
    if (job !== undefined) {
      this.installs.delete(table);
      this.release(job.at, job.image.bytes.length);
    }
    const header = this.tables.get(table);
    if (header === undefined) return;
    this.release(header, (this.tableEnds.get(table) ?? header) - header);
    this.tables.delete(table);
    this.tableEnds.delete(table);
  }

  /**
   * Mixes one voice in module memory (byte offsets) with the gains written into `mixGains` first; 0 when an input
   * sample was not finite. Only small integers pass through the call: doubles passed to a call that is not inlined
   * would be boxed, one allocation per voice and block.
   */
  mix(x0: number, x1: number, mixL: number, mixR: number, frames: number): number {
    const p = this.mixParams;
    const i32 = this.i32;
    i32[(p + MP_X0) >> 2] = x0;
    i32[(p + MP_X1) >> 2] = x1;
    i32[(p + MP_MIX_L) >> 2] = mixL;
    i32[(p + MP_MIX_R) >> 2] = mixR;
    i32[(p + MP_FRAMES) >> 2] = frames;
    return this.exports.mix(p);
  }

  /** Tells `w` after every growth of module memory, until `unwatch(w)`. */
  watch(w: MemoryWatcher): void {
    if (!this.watchers.includes(w)) this.watchers.push(w);
  }

  /** Stops telling `w` about growth. */
  unwatch(w: MemoryWatcher): void {
    const i = this.watchers.indexOf(w);
    if (i >= 0) this.watchers.splice(i, 1);
  }

  /** Bytes of module memory handed out and not given back (tables, scratch, resident sources, parameter blocks). */
  get bytesInUse(): number {
    return this.heap.bytesInUse;
  }

  /**
   * Copies `x` into module memory (followed by 16 zeros) so that the kernel reads it in place; counted per caller.
   * False (nothing kept) when `x` holds a non-finite sample or memory cannot grow: readers then copy spans as before.
   * Allocates; not on the audio path. Later changes to `x` are not seen by the resident copy.
   */
  upload(x: Float32Array): boolean {
    const known = this.resident.get(x);
    if (known !== undefined) {
      known.users++;
      return true;
    }
    for (let i = 0; i < x.length; i++) if (!(x[i] - x[i] === 0)) return false;
    const bytes = align(4 * (x.length + 16));
    let at: number;
    try {
      at = this.take(bytes);
    } catch {
      return false; // memory.grow refused (RangeError): keep the span copies
    }
    this.f32.set(x, at >> 2);
    this.f32.fill(0, (at >> 2) + x.length, (at + bytes) >> 2);
    this.resident.set(x, { at, bytes, users: 1 });
    return true;
  }

  /** Drops one use of `x`'s resident copy (from `upload`); its memory is reused once no caller holds it. */
  discard(x: Float32Array): void {
    const r = this.resident.get(x);
    if (r === undefined || --r.users > 0) return;
    this.resident.delete(x);
    this.release(r.at, r.bytes);
    this.residentEpoch++;
  }

  /** Returns `bytes` at byte offset `at` (from `allocFloats`) for reuse; merged with free neighbours. */
  release(at: number, bytes: number): void {
    this.heap.release(at, bytes);
  }

  /** First fit among released blocks, else new memory at the top (may grow memory, renewing the views; throws RangeError when it cannot). */
  private take(bytes: number): number {
    const at = this.heap.take(bytes);
    this.refresh();
    return at;
  }

  /** Byte offset of `x`'s resident copy, or 0 when it has none. */
  residentOf(x: Float32Array): number {
    const r = this.resident.get(x);
    return r === undefined ? 0 : r.at;
  }

  /** Byte offset of `floats` new zeroed floats in module memory (allocates; views of it detach when memory grows: compare their `.buffer` with `f32.buffer`). */
  allocFloats(floats: number): number {
    const at = this.take(align(4 * floats));
    this.f32.fill(0, at >> 2, (at >> 2) + floats);
    return at;
  }

  /** Renews the views after a growth (called by the allocator, which is where memory grows) and tells the watchers. */
  private refresh(): void {
    const buf = this.exports.memory.buffer;
    if (this.f32 !== undefined && this.f32.buffer === buf) return;
    this.f32 = new Float32Array(buf);
    this.f64 = new Float64Array(buf);
    this.i32 = new Int32Array(buf);
    if (this.out1 !== 0) this.refreshViews();
    if (this.mixParams !== 0) this.mixGains = new Float64Array(buf, this.mixParams + MP_GL0, 4);
    for (let k = 0; k < this.watchers.length; k++) this.watchers[k].memoryGrew();
  }

  private refreshViews(): void {
    const buf = this.exports.memory.buffer;
    for (let n = 0; n <= RUN_FRAMES; n++) {
      this.outViews0[n] = new Float32Array(buf, this.out0, n);
      this.outViews1[n] = new Float32Array(buf, this.out1, n);
    }
  }
}

/** Half-width in source frames (either side of the position) that a stride's window can reach, with one frame to spare. */
export function halfWindowFor(halfDense: number, stride: number): number {
  return Math.ceil(halfDense / stride) + 1;
}

function spanFloatsFor(halfDense: number, smallestStride: number): number {
  return RUN_FRAMES * MAX_RATIO + 2 * halfWindowFor(halfDense, smallestStride) + 16;
}

