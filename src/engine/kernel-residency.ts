// Engine bookkeeping of the shared WebAssembly kernel's memory: the voice scratch and mix bus placed in module memory,
// decoded sounds kept resident there, and both given back when the owning engine is collected.
import type { WasmKernel } from '../dsp';
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
  /** The object whose collection gives the memory back (the engine). */
  owner: object;
}

/** What an engine holds in the shared kernel's memory, given back when the engine is collected. */
interface KernelHold {
  kernel: WasmKernel;
  scratchAt: number;
  scratchBytes: number;
  kept: Float32Array[][];
}
const kernelHolds =
  typeof FinalizationRegistry === 'function'
    ? new FinalizationRegistry<KernelHold>((h) => {
        for (const list of h.kept) for (const x of list) h.kernel.discard(x);
        h.kernel.release(h.scratchAt, h.scratchBytes);
      })
    : null;

/** Places an engine's scratch and mix bus in module memory and keeps its sounds resident there; allocates only off the audio path (and on memory growth). */
export class KernelResidency {
  /** The shared kernel. */
  readonly kernel: WasmKernel;
  private readonly bank: SoundBank;
  private readonly maxBlock: number;
  /** Byte offset of the voice scratch and mix bus in module memory (4 × maxBlockFrames floats). */
  private readonly scratchAt: number;
  /** Per sound slot: the bank's channel list whose arrays were uploaded (residentKept) to module memory, until the slot is freed or reused. */
  private readonly residentSounds: (readonly Float32Array[] | null)[];
  private readonly residentKept: Float32Array[][];

  /** Reserves 4 × maxBlockFrames floats of module memory and registers their release with the owner's collection. */
  constructor(options: KernelResidencyOptions) {
    const slots = options.bank.channels.length;
    this.kernel = options.kernel;
    this.bank = options.bank;
    this.maxBlock = options.maxBlockFrames;
    this.residentSounds = new Array(slots).fill(null);
    this.residentKept = Array.from({ length: slots }, () => []);
    this.scratchAt = this.kernel.allocFloats(4 * this.maxBlock);
    kernelHolds?.register(options.owner, { kernel: this.kernel, scratchAt: this.scratchAt, scratchBytes: 16 * this.maxBlock, kept: this.residentKept });
  }

  /** True when the bus is not (or no longer, after memory grew) a view of module memory. */
  stale(bus: MixBus): boolean {
    return bus.left.buffer !== this.kernel.f32.buffer;
  }

  /** Uploads slot `s`'s channels to module memory (read in place by the kernel), dropping those of freed slots first; rebinds. */
  makeResident(s: number, scratch: VoiceScratch, bus: MixBus): void {
    const k = this.kernel;
    for (let i = 0; i < this.residentSounds.length; i++) {
      const held = this.residentSounds[i];
      if (held === null || this.bank.channels[i] === held) continue;
      for (const x of this.residentKept[i]) k.discard(x);
      this.residentKept[i].length = 0;
      this.residentSounds[i] = null;
    }
    const chans = this.bank.channels[s]!;
    for (const x of chans) if (k.upload(x)) this.residentKept[s].push(x);
    this.residentSounds[s] = chans;
    this.bind(scratch, bus);
  }

  /** (Re)creates the views of the scratch and mix bus in module memory (after construction and after memory grew). */
  bind(scratch: VoiceScratch, bus: MixBus): void {
    const k = this.kernel;
    if (scratch.wasm !== null && bus.left.buffer === k.f32.buffer) return;
    const buf = k.f32.buffer;
    const n = this.maxBlock;
    const at = this.scratchAt;
    scratch.stereo[0] = new Float32Array(buf, at, n);
    scratch.stereo[1] = new Float32Array(buf, at + 4 * n, n);
    scratch.mono[0] = scratch.stereo[0];
    bus.left = new Float32Array(buf, at + 8 * n, n);
    bus.right = new Float32Array(buf, at + 12 * n, n);
    scratch.wasm = k;
  }
}
