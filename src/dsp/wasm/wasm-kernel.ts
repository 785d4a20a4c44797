// Host side of the WebAssembly SIMD resample kernel (wasm/resample-kernel.ts): feature detection, instantiation,
// a bump allocator over the module's memory, and the per-stride contiguous tables of each KernelTable.
import type { KernelTable } from '../kernel-table';
import { MAX_RATIO } from '../quality-tiers';
import { decodeBase64 } from './base64';
import { kernelModuleBase64 } from './kernel-bytes.generated';

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
  buildStride(table: number, dense: number, total: number, stride: number, desc: number, rows: number, diffs: number): void;
  mix(x0: number, x1: number, mixL: number, mixR: number, frames: number, gl0: number, dgl: number, gr0: number, dgr: number): number;
  render(table: number, x0: number, x1: number, spanBase: number, out0: number, out1: number, pos: number, iStart: number, iEnd: number, frames: number, rs: number, dr: number, ratios: number, loopEnd: number, state: number): number;
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
  /** Byte offsets of the shared scratch: two source spans, two outputs, ratios (f64). */
  span0 = 0;
  span1 = 0;
  out0 = 0;
  out1 = 0;
  ratios = 0;
  /** Byte offset of the render state written by the kernel: end position (f64), then the last stride (i32). */
  state = 0;
  /** outViews0[n] / outViews1[n]: the first n floats of out0 / out1 (n = 0…RUN_FRAMES), for allocation-free block copies. */
  readonly outViews0: Float32Array[] = [];
  readonly outViews1: Float32Array[] = [];
  /** Floats each span holds. */
  spanFloats = 0;
  /** Counts discards of resident sources: a reader re-reads its pointers when this changed since its setSource. */
  residentEpoch = 0;
  /** Stride layouts built by this instance (`buildStride` calls); an installed image builds none. */
  stridesBuilt = 0;
  private top: number;
  private readonly tables = new Map<KernelTable, number>();
  /** Byte end of each table's region (header … last stride), for `imageOf`. */
  private readonly tableEnds = new Map<KernelTable, number>();
  private readonly installs = new Map<KernelTable, { at: number; copied: number; image: KernelImage }>();
  private readonly resident = new Map<Float32Array, { at: number; bytes: number; users: number }>();
  private readonly freeAt: number[] = [];
  private readonly freeBytes: number[] = [];

  private constructor(exports: KernelExports) {
    this.exports = exports;
    this.top = align(exports.heapBase());
    this.refresh();
    this.out0 = this.alloc(RUN_FRAMES * 4);
    this.out1 = this.alloc(RUN_FRAMES * 4);
    this.ratios = this.alloc(RUN_FRAMES * 8);
    this.state = this.alloc(16);
    this.refreshViews();
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
    const header = this.alloc(32 + 8 * (p + 1));
    const dense = this.alloc(4 * table.dense.length);
    let bytes = 0;
    const halfDense = table.halfTaps * p;
    for (const s of table.strideGrid) bytes += align(32 * s) + align(4 * this.exports.rowFloats(total, s)) + align(4 * this.exports.diffFloats(halfDense, s));
    const block = this.alloc(bytes);
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
      this.exports.buildStride(header, dense, total, s, desc, rows, diffs);
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
      job = { at: this.top, copied: 0, image };
      this.top = align(this.top + image.bytes.length);
      this.installs.set(table, job);
    }
    const n = Math.min(image.bytes.length - job.copied, Math.max(16, maxBytes));
    const end = job.at + job.copied + n;
    const have = this.exports.memory.buffer.byteLength;
    // Grow a few slices ahead (at most to the image's end), so that views are renewed once per 1 MB rather than per slice.
    const ahead = Math.min(job.at + image.bytes.length, Math.max(end, have + (1 << 20)));
    if (end > have) this.exports.memory.grow(Math.ceil((ahead - have) / 65536));
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
      this.span0 = this.alloc(4 * need);
      this.span1 = this.alloc(4 * need);
      this.spanFloats = need;
    }
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

  /** Returns `bytes` at byte offset `at` (from `allocFloats`) for reuse. */
  release(at: number, bytes: number): void {
    this.freeAt.push(at);
    this.freeBytes.push(align(bytes));
  }

  /** First fit among released blocks, else new memory at the top (may grow memory; throws RangeError when it cannot). */
  private take(bytes: number): number {
    for (let k = 0; k < this.freeAt.length; k++) {
      if (this.freeBytes[k] < bytes) continue;
      const at = this.freeAt[k];
      this.freeAt[k] += bytes;
      this.freeBytes[k] -= bytes;
      if (this.freeBytes[k] === 0) {
        this.freeAt.splice(k, 1);
        this.freeBytes.splice(k, 1);
      }
      return at;
    }
    return this.alloc(bytes);
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

  private alloc(bytes: number): number {
    const at = this.top;
    const top = align(at + bytes);
    const mem = this.exports.memory;
    const have = mem.buffer.byteLength;
    // Grow with 25 % headroom so that a run of uploads does not grow (and detach views) every time.
    if (top > have) {
      const need = Math.ceil((top - have) / 65536);
      try {
        mem.grow(Math.max(need, Math.ceil(have / 4 / 65536)));
      } catch {
        mem.grow(need);
      }
    }
    this.top = top;
    this.refresh();
    return at;
  }

  private refresh(): void {
    const buf = this.exports.memory.buffer;
    if (this.f32 !== undefined && this.f32.buffer === buf) return;
    this.f32 = new Float32Array(buf);
    this.f64 = new Float64Array(buf);
    this.i32 = new Int32Array(buf);
    if (this.out1 !== 0) this.refreshViews();
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

function align(n: number): number {
  return (n + 15) & ~15;
}
