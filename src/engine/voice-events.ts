// Voice events of the engine (ended, stolen, virtual, audible) in a preallocated ring that the host drains:
// the audio path writes numbers into typed arrays and creates no objects; overflow is counted, never thrown.
import type { Seconds } from '../units';

/** Event code: the voice has ended (its slot is free; always the voice's last event). */
export const EVENT_ENDED = 1;
/** Event code: the voice was stolen for a newcomer (it fades out; `ended` follows). */
export const EVENT_STOLEN = 2;
/** Event code: the voice went virtual (below −90 dB: not rendered, read head advancing). */
export const EVENT_VIRTUAL = 3;
/** Event code: the voice is rendered again after being virtual. */
export const EVENT_AUDIBLE = 4;

/** Name of each event code, as the main thread delivers it. */
export type VoiceEventType = 'ended' | 'stolen' | 'virtual' | 'audible';

/** The name of an event code ('ended' for unknown codes). */
export function voiceEventName(code: number): VoiceEventType {
  return code === EVENT_STOLEN ? 'stolen' : code === EVENT_VIRTUAL ? 'virtual' : code === EVENT_AUDIBLE ? 'audible' : 'ended';
}

/** Events the ring holds by default before the host drains it. */
export const VOICE_EVENT_CAPACITY = 1024;

/** A first-in, first-out ring of (code, voice handle, engine time) triples; creates no objects after construction (what V8 may still box: docs/allocation.md). */
export class VoiceEventRing {
  /** Events dropped because the ring was full (the host drains too rarely). */
  dropped = 0;
  /** Engine time stamped on the events pushed next, s (the engine sets it before each block and command). */
  now: Seconds = 0;
  private readonly codes: Int32Array;
  private readonly handles: Float64Array;
  private readonly times: Float64Array;
  private readonly capacity: number;
  private head = 0;
  private size = 0;

  /** Preallocates room for `capacity` events (1…65536). */
  constructor(capacity: number = VOICE_EVENT_CAPACITY) {
    const n = Math.max(1, Math.min(65536, Math.floor(capacity)));
    this.capacity = n;
    this.codes = new Int32Array(n);
    this.handles = new Float64Array(n);
    this.times = new Float64Array(n);
  }

  /** Events waiting. */
  get length(): number {
    return this.size;
  }

  /** Appends an event stamped with `now` (dropped and counted when full). */
  push(code: number, handle: number): void {
    if (this.size === this.capacity) {
      this.dropped++;
      return;
    }
    const i = (this.head + this.size) % this.capacity;
    this.codes[i] = code;
    this.handles[i] = handle;
    this.times[i] = this.now;
    this.size++;
  }

  /**
   * Moves up to `max` events, oldest first, into `out` as flat triples (code, handle, time) from index 0;
   * returns how many events were written (out.length / 3 at most).
   */
  drain(out: Float64Array, max: number = out.length / 3): number {
    const n = Math.min(this.size, Math.floor(max), Math.floor(out.length / 3));
    for (let k = 0; k < n; k++) {
      const i = (this.head + k) % this.capacity;
      out[3 * k] = this.codes[i];
      out[3 * k + 1] = this.handles[i];
      out[3 * k + 2] = this.times[i];
    }
    this.head = (this.head + n) % this.capacity;
    this.size -= n;
    return n;
  }
}
