// First-fit allocation with coalescing over a WebAssembly module's linear memory (the address bookkeeping only: the
// kernel renews its views when `alloc` reports growth). Free blocks stay sorted by address; neighbours merge on release.

/** The part of WebAssembly.Memory the heap grows. */
export interface GrowableMemory {
  readonly buffer: ArrayBuffer;
  grow(pages: number): number;
}

/** Rounds `n` bytes up to 16 (the v128 alignment every region keeps). */
export function align(n: number): number {
  return (n + 15) & ~15;
}

/** Byte ranges of module memory handed out and given back; growth happens only here and in `growTo`. */
export class ModuleHeap {
  private readonly memory: GrowableMemory;
  private readonly base: number;
  /** First byte never handed out (everything above is free). */
  private top: number;
  private readonly freeAt: number[] = [];
  private readonly freeBytes: number[] = [];

  /** Hands out `memory` from byte `start` (the module's heap base) on. */
  constructor(memory: GrowableMemory, start: number) {
    this.memory = memory;
    this.base = align(start);
    this.top = this.base;
  }

  /** Bytes handed out and not given back. */
  get bytesInUse(): number {
    let free = 0;
    for (let k = 0; k < this.freeBytes.length; k++) free += this.freeBytes[k];
    return this.top - this.base - free;
  }

  /** First fit among released blocks, else new memory at the top (may grow memory; throws RangeError when it cannot). */
  take(bytes: number): number {
    const at = this.takeFree(align(bytes));
    return at >= 0 ? at : this.alloc(bytes);
  }

  /** First fit of `bytes` (a multiple of 16) among released blocks, or −1. */
  takeFree(bytes: number): number {
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
    return -1;
  }

  /** New memory at the top, grown (with 25 % headroom, so that a run of uploads does not grow every time) when needed. */
  alloc(bytes: number): number {
    const at = this.top;
    const top = align(at + bytes);
    const have = this.memory.buffer.byteLength;
    if (top > have) {
      const need = Math.ceil((top - have) / 65536);
      try {
        this.memory.grow(Math.max(need, Math.ceil(have / 4 / 65536)));
      } catch {
        this.memory.grow(need);
      }
    }
    this.top = top;
    return at;
  }

  /** Reserves `bytes` at the top without growing memory (the caller grows it as far as it writes, with `growTo`). */
  reserve(bytes: number): number {
    const at = this.top;
    this.top = align(at + bytes);
    return at;
  }

  /** Grows memory so that byte `end` − 1 exists, by whole pages up to `ahead` (≥ end) at once. */
  growTo(end: number, ahead: number): void {
    const have = this.memory.buffer.byteLength;
    if (end > have) this.memory.grow(Math.ceil((ahead - have) / 65536));
  }

  /** Gives `bytes` at `at` back: merged with free neighbours, the top lowered when the block ends there. */
  release(at: number, bytes: number): void {
    let start = at;
    let end = at + align(bytes);
    let k = 0;
    while (k < this.freeAt.length && this.freeAt[k] < start) k++;
    if (k > 0 && this.freeAt[k - 1] + this.freeBytes[k - 1] === start) {
      k--;
      start = this.freeAt[k];
      this.freeAt.splice(k, 1);
      this.freeBytes.splice(k, 1);
    }
    if (k < this.freeAt.length && this.freeAt[k] === end) {
      end += this.freeBytes[k];
      this.freeAt.splice(k, 1);
      this.freeBytes.splice(k, 1);
    }
    if (end === this.top) {
      this.top = start;
      return;
    }
    this.freeAt.splice(k, 0, start);
    this.freeBytes.splice(k, 0, end - start);
  }
}
