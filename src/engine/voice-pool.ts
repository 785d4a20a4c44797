// The engine's fixed voice pool: handles (slot + generation), the stealing choice (lowest priority, then lowest
// audibility, then oldest) and the release and free of voices; twice the capacity in slots so that fades have room.
import type { Seconds } from '../units';
import type { EngineStats } from './engine-types';
import type { SoundBank } from './sound-bank';
import { Voice, VOICE_FREE, VOICE_PLAYING, VOICE_RELEASING } from './voice';
import { EVENT_ENDED, EVENT_STOLEN, type VoiceEventRing } from './voice-events';

/** Voice slots a handle can address: handle = slot + HANDLE_SLOTS × generation. */
const HANDLE_SLOTS = 2048;
const GENERATIONS = 1 << 20;

/** Construction options of a VoicePool. */
export interface VoicePoolOptions {
  /** The voice slots, built up front (2 × capacity, at most HANDLE_SLOTS); `index` set to the slot. */
  voices: Voice[];
  /** Voices that may play at once, not counting releasing ones (1…1024). */
  capacity: number;
  /** The sound bank whose slot references the voices hold. */
  bank: SoundBank;
  /** Ring that receives 'stolen' and 'ended' events, if any. */
  events?: VoiceEventRing;
}

/** Hands out, steals, releases and frees voice slots; never allocates. */
export class VoicePool {
  /** Every voice slot. */
  readonly voices: readonly Voice[];
  /** Voices that may play at once. */
  readonly capacity: number;
  /** Playing (not releasing) voices: raised by `take`, lowered by `release` and `free`. */
  private owned = 0;
  /** Generation of each slot's handle: raised each time the slot frees. */
  private readonly generations: Uint32Array;
  private readonly bank: SoundBank;
  private readonly events: VoiceEventRing | null;

  /** Takes the slots as given. */
  constructor(options: VoicePoolOptions) {
    this.voices = options.voices;
    this.capacity = options.capacity;
    this.bank = options.bank;
    this.events = options.events ?? null;
    this.generations = new Uint32Array(options.voices.length);
  }

  /** True when `capacity` voices are playing. */
  get full(): boolean {
    return this.owned >= this.capacity;
  }

  /** The handle of voice `v` (a non-negative integer). */
  handleOf(v: Voice): number {
    return v.index + HANDLE_SLOTS * this.generations[v.index];
  }

  /** The voice a handle names, or null for an unknown, stale or free one. */
  resolve(handle: number): Voice | null {
    if (!Number.isInteger(handle) || handle < 0) return null;
    const i = handle % HANDLE_SLOTS;
    const v = this.voices[i];
    if (v === undefined || v.state === VOICE_FREE || (handle - i) / HANDLE_SLOTS !== this.generations[i]) return null;
    return v;
  }

  /** Releases a playing voice of lowest priority, then lowest audibility, then oldest, if the newcomer may take its place (true when one was released). */
  steal(priority: number, audibility: number, fadeSeconds: Seconds): boolean {
    let victim: Voice | null = null;
    for (let i = 0; i < this.voices.length; i++) {
      const v = this.voices[i];
      if (v.state !== VOICE_PLAYING) continue;
      if (victim === null || yieldsBefore(v, victim)) victim = v;
    }
    if (victim === null || victim.params.priority > priority || (victim.params.priority === priority && victim.audibility > audibility)) return false;
    // A sounding victim needs a fade slot; with every fade slot busy, making room would cut a voice (a click): refuse.
    if (victim.env !== 0 && !this.hasFreeSlot()) return false;
    this.events?.push(EVENT_STOLEN, this.handleOf(victim));
    this.release(victim, fadeSeconds);
    return true;
  }

  /** Fades a playing voice out over `fadeSeconds` (s, ≥ 0), or frees it at once when silent or the fade is 0. */
  release(v: Voice, fadeSeconds: Seconds): void {
    if (v.env === 0 || !(fadeSeconds > 0)) {
      this.free(v);
      return;
    }
    v.release(fadeSeconds);
    this.owned--;
  }

  /** Frees a voice slot (its handle goes stale) and drops its reference to the sound. */
  free(v: Voice): void {
    if (v.state === VOICE_PLAYING) this.owned--;
    if (v.state !== VOICE_FREE) {
      this.bank.release(v.params.sound, -1);
      this.events?.push(EVENT_ENDED, this.handleOf(v));
    }
    v.free();
    this.generations[v.index] = (this.generations[v.index] + 1) % GENERATIONS;
  }

  /** A free voice slot, marked playing and counted; when every slot is busy, the quietest releasing voice is cut (it is fading out anyway). */
  take(): Voice {
    const v = this.freeOrQuietest();
    v.reserve();
    this.owned++;
    return v;
  }

  /** Sets stats.activeVoices and virtualVoices from the slots; returns the sum of the voices' reader clamp counts. */
  count(stats: EngineStats): number {
    let active = 0;
    let virtual = 0;
    let readerClamps = 0;
    for (let i = 0; i < this.voices.length; i++) {
      const v = this.voices[i];
      readerClamps += v.clampCount;
      if (v.state === VOICE_FREE) continue;
      if (v.virtual) virtual++;
      else active++;
    }
    stats.activeVoices = active;
    stats.virtualVoices = virtual;
    return readerClamps;
  }

  private freeOrQuietest(): Voice {
    let quietest: Voice | null = null;
    for (let i = 0; i < this.voices.length; i++) {
      const v = this.voices[i];
      if (v.state === VOICE_FREE) return v;
      if (v.state === VOICE_RELEASING && (quietest === null || v.env * v.audibility < quietest.env * quietest.audibility)) quietest = v;
    }
    this.free(quietest!);
    return quietest!;
  }

  private hasFreeSlot(): boolean {
    for (let i = 0; i < this.voices.length; i++) if (this.voices[i].state === VOICE_FREE) return true;
    return false;
  }
}

/** Whether `v` is stolen before `w`: lower priority, then lower audibility, then older. */
function yieldsBefore(v: Voice, w: Voice): boolean {
  if (v.params.priority !== w.params.priority) return v.params.priority < w.params.priority;
  const a = v.audibility;
  const b = w.audibility;
  return a !== b ? a < b : v.params.sequence < w.params.sequence;
}
