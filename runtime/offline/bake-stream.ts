// Streaming variable-speed replay of a long file: the StreamReader's bandlimited interpolation (J. O. Smith,
// "Digital Audio Resampling", CCRMA) over a sliding window of the input, so memory stays bounded for any length.
// The window always covers the kernel's reach around the read position (or ends where the file ends), so the
// output equals a whole-file `resample` up to the rounding of the read position (≈ 1e−9 frame).
import { KernelTable, StreamReader, WasmKernel, type QualityTierName } from '../../src/dsp';

/** Output frames produced per step. */
export const BAKE_BLOCK_FRAMES = 8192;
/** Input frames held per channel beyond what one step needs (the sliding window's slack). */
export const BAKE_WINDOW_FRAMES = 1 << 17;

/** Where a stream bake reads its input: `read(from, frames, out)` fills out[c][0…frames) for each channel. */
export interface BakeSource {
  /** Frames in the input. */
  frames: number;
  /** Channel count. */
  channels: number;
  /** Decodes input frames [from, from + frames) into out[c][0…frames). */
  read(from: number, frames: number, out: readonly Float32Array[]): void;
  /** The file's sample rate, Hz (8000…768000): the kernel is designed for it (docs/resampler-rates.md); absent: 48000. */
  sampleRate?: number;
}

/** Replays a BakeSource at a constant playback ratio, one block of output at a time, with bounded memory. */
export class BakeStream {
  /** Output frames in total: floor(source.frames / ratio). */
  readonly totalFrames: number;
  /** Output frames produced so far. */
  produced = 0;
  /** The current output block (one array per channel; the first `produced − previous` frames are valid). */
  readonly block: Float32Array[];
  private readonly readers: StreamReader[];
  private readonly window: Float32Array[];
  private readonly reach: number;
  private base = 0;
  private held = 0;
  private readonly kernel: WasmKernel | null;
  private resident: Float32Array[] = [];

  /** Prepares readers and buffers for `source` at playback ratio `ratio` (0 < ratio ≤ 4) with tier `tier`. */
  constructor(private readonly source: BakeSource, private readonly ratio: number, tier: QualityTierName) {
    const table = KernelTable.forTier(tier, source.sampleRate ?? 48000);
    this.totalFrames = Math.floor(source.frames / ratio);
    this.reach = Math.ceil(table.maxWindow(Math.max(1, ratio)) / 2) + 4;
    const cap = BAKE_WINDOW_FRAMES + Math.ceil(BAKE_BLOCK_FRAMES * ratio) + 2 * this.reach + 2;
    this.readers = [];
    this.window = [];
    this.block = [];
    for (let c = 0; c < source.channels; c++) {
      this.readers.push(new StreamReader({ table, channels: 1 }));
      this.window.push(new Float32Array(cap));
      this.block.push(new Float32Array(BAKE_BLOCK_FRAMES));
    }
    this.kernel = this.readers[0]?.kernelName === 'wasm-simd' ? WasmKernel.shared() : null;
  }

  /** Renders the next block into `block`; returns its frame count (0 when done). */
  next(): number {
    const n = Math.min(BAKE_BLOCK_FRAMES, this.totalFrames - this.produced);
    if (n <= 0) return 0;
    const pos = this.base + this.readers[0].position; // absolute read position, source frames
    const lo = Math.max(0, Math.floor(pos) - this.reach);
    const hi = Math.min(this.source.frames, Math.floor(pos + n * this.ratio) + this.reach + 2);
    if (this.held === 0 || lo < this.base || hi > this.base + this.held) this.slide(lo, hi, pos);
    for (let c = 0; c < this.readers.length; c++) this.readers[c].read([this.block[c]], 0, n, this.ratio, this.ratio);
    this.produced += n;
    return n;
  }

  /** Refills the window from `lo` (as far as it holds or the file goes) and moves the readers onto it at `pos`. */
  private slide(lo: number, hi: number, pos: number): void {
    const room = this.window[0].length;
    const len = Math.min(this.source.frames - lo, Math.max(hi - lo, room));
    const views = this.window.map((w) => w.subarray(0, len));
    this.source.read(lo, len, views);
    // Place the window in the kernel module's memory (one copy per slide) so the SIMD kernel reads it in place.
    for (const r of this.resident) this.kernel?.discard(r);
    this.resident = this.kernel === null ? [] : views.filter((v) => this.kernel!.upload(v));
    this.base = lo;
    this.held = len;
    // Where the window starts at the file's start (or ends at its end), the reader's silence beyond the ends is the file's.
    for (let c = 0; c < this.readers.length; c++) this.readers[c].setSource([views[c]], { startFrame: pos - lo });
  }

  /** Releases module memory held for the window. */
  dispose(): void {
    for (const r of this.resident) this.kernel?.discard(r);
    this.resident = [];
  }
}
