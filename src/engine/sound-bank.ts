// Sound slots of the engine: decoded buffers (mono or stereo) with their sample rates, generation-tagged ids.
import type { Hz } from '../units';

/** Highest sample rate of a sound, Hz. */
export const MAX_SOUND_RATE: Hz = 768000;
const ID_SLOTS = 4096;

/** Fixed-capacity table of sounds; ids are slot + 4096 × generation, so a removed id never plays a newer sound. */
export class SoundBank {
  readonly channels: (readonly Float32Array[] | null)[];
  readonly rates: Float64Array;
  readonly frames: Float64Array;
  /** Voices currently playing each slot. */
  readonly users: Int32Array;
  private readonly removed: Uint8Array;
  private readonly generations: Int32Array;
  private readonly capacity: number;

  /** Creates `capacity` (1…4096) empty slots. */
  constructor(capacity: number) {
    this.capacity = Math.max(1, Math.min(ID_SLOTS, Math.floor(capacity)));
    this.channels = new Array(this.capacity).fill(null);
    this.rates = new Float64Array(this.capacity);
    this.frames = new Float64Array(this.capacity);
    this.users = new Int32Array(this.capacity);
    this.removed = new Uint8Array(this.capacity);
    this.generations = new Int32Array(this.capacity);
  }

  /** Stores a sound (1 or 2 channels of equal, non-zero length; rate 1…768000 Hz); returns its id, or −1 if invalid or full. */
  add(channels: readonly Float32Array[], sampleRate: Hz): number {
    if (!Array.isArray(channels) || channels.length < 1) return -1;
    const used = channels.length >= 2 ? [channels[0], channels[1]] : [channels[0]];
    const n = used[0] instanceof Float32Array ? used[0].length : 0;
    if (n < 1 || used.some((c) => !(c instanceof Float32Array) || c.length !== n)) return -1;
    if (!(sampleRate >= 1 && sampleRate <= MAX_SOUND_RATE)) return -1;
    for (let i = 0; i < this.capacity; i++) {
      if (this.channels[i] !== null) continue;
      this.channels[i] = used;
      this.rates[i] = sampleRate;
      this.frames[i] = n;
      this.removed[i] = 0;
      this.users[i] = 0;
      return i + ID_SLOTS * this.generations[i];
    }
    return -1;
  }

  /** Slot of a live id, or −1. */
  slot(id: number): number {
    if (!Number.isInteger(id) || id < 0) return -1;
    const s = id % ID_SLOTS;
    if (s >= this.capacity || this.channels[s] === null || this.removed[s] === 1) return -1;
    return (id - s) / ID_SLOTS === this.generations[s] ? s : -1;
  }

  /** Marks a sound removed; its slot is freed once no voice uses it. Returns the slot, or −1 for an unknown id. */
  remove(id: number): number {
    const s = this.slot(id);
    if (s < 0) return -1;
    this.removed[s] = 1;
    this.generations[s] = (this.generations[s] + 1) % 100000;
    this.release(s, 0);
    return s;
  }

  /** Adjusts the user count of slot `s` by `delta` and frees it when removed and unused. */
  release(s: number, delta: number): void {
    this.users[s] += delta;
    if (this.removed[s] === 1 && this.users[s] <= 0) {
      this.channels[s] = null;
      this.users[s] = 0;
      this.removed[s] = 0;
    }
  }
}
