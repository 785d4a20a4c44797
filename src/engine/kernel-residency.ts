// An engine's share of the WebAssembly kernel's memory: the voice scratch, per-sample ratios and mix bus placed in module
// memory and the decoded sounds kept resident there, all handed back by `release` (Engine.dispose) for the next engine to reuse.
import type { MemoryWatcher, WasmKernel } from '../dsp';
import type { SoundBank } from './sound-bank';
import type { VoiceScratch } from './voice';

/** The two mix-bus channels an engine sums its voices into (views of module memory once bound). */
export interface MixBus {
  /** Left channel, maxBlockFrames floats. */
  left: Float32Array;
  /** Right channel, maxBlockFrames floats. */
  right: Float32Array;
}

/** Construction options of a KernelResidency. */
export interface KernelResidencyOptions {
  /** The shared kernel the engine's voices run on. */
  kernel: WasmKernel;
  /** The engine's block capacity, frames (1…16384). */
  maxBlockFrames: number;
  /** The engine's sound bank (its slots are mirrored here). */
  bank: SoundBank;
  /** The engine's voice scratch: its `stereo`/`mono` buffers and its `ratios` become views of module memory. */
  scratch: VoiceScratch;
  /** The engine's mix bus: its channels become views of module memory. */
  bus: MixBus;
  /** The object whose collection gives the memory back if `release` was never called (the engine). */
  owner: object;
}

/** Floats per block frame the engine places in module memory: two scratch channels, the ratios, two bus channels. */
const FLOATS_PER_FRAME = 5;

// Safety net only: an engine dropped without dispose() still gives its regions back once it is collected.
const forgotten = typeof FinalizationRegistry === 'function' ? new FinalizationRegistry<KernelResidency>((r) => r.release()) : null;

/** Places an engine's scratch, per-sample ratios and mix bus in module memory and keeps its sounds resident there; allocates only off the audio path. */
export class KernelResidency implements MemoryWatcher {
  /** The shared kernel. */
  readonly kernel: WasmKernel;
  private readonly bank: SoundBank;
  private readonly maxBlock: number;
  private readonly scratch: VoiceScratch;
  private readonly bus: MixBus;
  /** Byte offset of the voice scratch, ratios and mix bus in module memory (5 × maxBlockFrames floats); −1 once released. */
  private scratchAt: number;
  /** Per sound slot: the bank's channel list whose arrays were uploaded (residentKept) to module memory, until the slot is freed or reused. */
  private readonly residentSounds: (readonly Float32Array[] | null)[];
  private readonly residentKept: Float32Array[][];

  /** Reserves 5 × maxBlockFrames floats of module memory, binds the scratch, ratios and bus there and watches for growth. */
  constructor(options: KernelResidencyOptions) {
    const slots = options.bank.channels.length;
    this.kernel = options.kernel;
    this.bank = options.bank;
    this.maxBlock = options.maxBlockFrames;
    this.scratch = options.scratch;
    this.bus = options.bus;
    this.residentSounds = new Array(slots).fill(null);
    this.residentKept = Array.from({ length: slots }, () => []);
    this.scratchAt = this.kernel.allocFloats(FLOATS_PER_FRAME * this.maxBlock);
    this.bind();
    this.kernel.watch(this);
    forgotten?.register(options.owner, this, this);
  }

  /** True once `release` ran: nothing of the engine is left in module memory. */
  get released(): boolean {
    return this.scratchAt < 0;
  }

  /** Uploads slot `s`'s channels to module memory (read in place by the kernel), dropping those of freed slots first. */
  makeResident(s: number): void {
    const k = this.kernel;
    for (let i = 0; i < this.residentSounds.length; i++) {
      const held = this.residentSounds[i];
      if (held === null || this.bank.channels[i] === held) continue;
      this.drop(i);
    }
    const chans = this.bank.channels[s]!;
    for (const x of chans) if (k.upload(x)) this.residentKept[s].push(x);
    this.residentSounds[s] = chans;
  }

  /** The kernel grew its memory (views detached): rebinds the scratch, ratios and bus. */
  memoryGrew(): void {
    if (this.scratchAt >= 0) this.bind();
  }

  /**
   * Hands every region back to the kernel (resident sounds, scratch, ratios and bus) and stops watching it; idempotent.
   * The scratch, ratios and bus then point at memory another engine may reuse: the engine must not render into them again.
   */
  release(): void {
    if (this.scratchAt < 0) return;
    for (let i = 0; i < this.residentSounds.length; i++) this.drop(i);
    this.kernel.release(this.scratchAt, 4 * FLOATS_PER_FRAME * this.maxBlock);
    this.scratchAt = -1;
    this.kernel.unwatch(this);
    forgotten?.unregister(this);
  }

  private drop(slot: number): void {
    for (const x of this.residentKept[slot]) this.kernel.discard(x);
    this.residentKept[slot].length = 0;
    this.residentSounds[slot] = null;
  }

  /**
   * (Re)creates the views of the scratch, ratios and mix bus in module memory (at construction and after memory grew).
   * The ratios there are read in place by the read path (src/dsp/wasm-read-path.ts), with no copy per voice and block.
   */
  private bind(): void {
    const k = this.kernel;
    const buf = k.f32.buffer;
    const n = this.maxBlock;
    const at = this.scratchAt;
    const scratch = this.scratch;
    scratch.stereo[0] = new Float32Array(buf, at, n);
    scratch.stereo[1] = new Float32Array(buf, at + 4 * n, n);
    scratch.mono[0] = scratch.stereo[0];
    scratch.ratios = new Float32Array(buf, at + 8 * n, n);
    this.bus.left = new Float32Array(buf, at + 12 * n, n);
    this.bus.right = new Float32Array(buf, at + 16 * n, n);
    scratch.wasm = k;
  }
}
