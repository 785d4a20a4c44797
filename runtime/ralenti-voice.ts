// A playing voice as the game holds it: state and position kept from the worklet's reports, events delivered in
// order, and the calls (stop, seek, gain, ratio) sent as messages.
import type { Decibels, Seconds, VoiceEventType } from '../src/index';
import { checkRange } from './runtime-error';

/** A voice's state: 'playing', 'virtual' (inaudible, not rendered, keeping time), 'stopping' (fading out) or 'ended'. */
export type RalentiVoiceState = 'playing' | 'virtual' | 'stopping' | 'ended';

/** One voice event as delivered on the main thread. */
export interface RalentiVoiceEvent {
  type: VoiceEventType;
  voice: RalentiVoice;
  /** Context time the audio thread saw it at, s. */
  contextTime: Seconds;
}

/** Options of RalentiVoice.stop. */
export interface StopOptions {
  /** Fade-out in seconds, 0…60 (default: a short click-free fade of 10 ms; 0 = at once). */
  fade?: Seconds;
}

/** A playing voice; every call is a message to the worklet, and calls on an ended voice do nothing. */
export interface RalentiVoice {
  /** Main-thread handle (VoiceMonitor.voice in `Ralenti.voices`). */
  readonly id: number;
  /** State as last reported (stop() makes it 'stopping' at once). */
  readonly state: RalentiVoiceState;
  /** Read position in seconds of source time, from the last report moved on by the reported speed. */
  readonly position: Seconds;
  /** Stops the voice, fading out over `options.fade` seconds. */
  stop(options?: StopOptions): void;
  /** Moves the read head to `seconds` (0…the sound's duration) after a 20 ms fade, fading back in there. */
  seek(seconds: Seconds): void;
  /** Sets the voice's gain in dB (−120…24); glides with the tuning's gain smoothing. */
  setGain(db: Decibels): void;
  /** Sets the base playback ratio, (0, 4]. */
  setRatio(ratio: number): void;
  /** Calls `cb` for each event of this voice ('ended', 'stolen', 'virtual', 'audible'), in order; returns an unsubscribe function. */
  on(type: VoiceEventType, cb: (e: RalentiVoiceEvent) => void): () => void;
}

/** What a handle needs from its runtime. */
export interface VoiceHandleHost {
  now(): Seconds;
  stop(h: VoiceHandle, fade: Seconds | undefined): void;
  seek(h: VoiceHandle, seconds: Seconds): void;
  setGain(h: VoiceHandle, db: Decibels): void;
  setRatio(h: VoiceHandle, ratio: number): void;
}

/** The main-thread side of one voice. */
export class VoiceHandle implements RalentiVoice {
  state: RalentiVoiceState = 'playing';
  private pos: Seconds;
  private speed = 0;
  private at: Seconds;
  private readonly listeners = new Map<VoiceEventType, Set<(e: RalentiVoiceEvent) => void>>();

  constructor(
    readonly id: number,
    private readonly host: VoiceHandleHost,
    /** Sound length, s. */
    private readonly duration: Seconds,
    /** Loop region in seconds, or null for a one-shot. */
    private readonly loop: { start: Seconds; end: Seconds } | null,
    offset: Seconds,
  ) {
    this.pos = offset;
    this.at = host.now();
  }

  get position(): Seconds {
    if (this.state === 'ended') return this.pos;
    let p = this.pos + Math.max(0, this.host.now() - this.at) * this.speed;
    const l = this.loop;
    if (l !== null && p >= l.end && l.end > l.start) p = l.start + ((p - l.start) % (l.end - l.start));
    return Math.min(p, this.duration);
  }

  stop(options: StopOptions = {}): void {
    if (this.state === 'ended') return;
    this.host.stop(this, options.fade);
    this.state = 'stopping';
  }

  seek(seconds: Seconds): void {
    if (this.state === 'ended') return;
    checkRange('seek.seconds', seconds, 0, this.duration);
    this.host.seek(this, seconds);
    this.pos = seconds;
    this.at = this.host.now();
  }

  setGain(db: Decibels): void {
    if (this.state !== 'ended') this.host.setGain(this, db);
  }

  setRatio(ratio: number): void {
    if (this.state !== 'ended') this.host.setRatio(this, ratio);
  }

  on(type: VoiceEventType, cb: (e: RalentiVoiceEvent) => void): () => void {
    let set = this.listeners.get(type);
    if (!set) this.listeners.set(type, (set = new Set()));
    set.add(cb);
    return () => set.delete(cb);
  }

  /** Takes a reported position (s) and speed (source s per s) at context time `at`. */
  report(position: Seconds, speed: number, at: Seconds): void {
    if (this.state === 'ended' || !(position >= 0)) return;
    this.pos = position;
    this.speed = speed;
    this.at = at;
  }

  /** Applies an event's state change and calls this voice's listeners. */
  deliver(e: RalentiVoiceEvent): void {
    if (e.type === 'ended') {
      this.pos = this.position;
      this.state = 'ended';
    } else if (e.type === 'stolen') this.state = 'stopping';
    else if (this.state !== 'stopping') this.state = e.type === 'virtual' ? 'virtual' : 'playing';
    for (const cb of this.listeners.get(e.type) ?? []) cb(e);
  }
}
