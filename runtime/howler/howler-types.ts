// The small, public subset of howler 2.2.4 that the adapter calls (the package ships no typings).
// Facts from goldfire/howler.js src/howler.core.js, restated in ../shared/INTEGRATION.md.

/** Event names a Howl accepts in on/once/off; other names throw inside howler. */
export type HowlEventName =
  | 'load' | 'loaderror' | 'playerror' | 'play' | 'end' | 'pause' | 'stop'
  | 'mute' | 'volume' | 'rate' | 'seek' | 'fade' | 'unlock';

/** The global `Howler` object. */
export interface HowlerGlobalLike {
  /** Shared context; created lazily by the first Howl or any volume() call; replaced by unload(). */
  ctx: AudioContext | null;
  /** Master GainNode to the destination (after setup; null before). */
  masterGain: GainNode | null;
  /** Suspends the context 30 s after howler's own last voice when true (default true). */
  autoSuspend: boolean;
  readonly usingWebAudio: boolean;
  readonly noAudio: boolean;
  /** Master volume 0…1 (getter); any call sets up the context. */
  volume(): number;
  volume(volume: number): HowlerGlobalLike;
  /** Mutes or unmutes everything. */
  mute(muted: boolean): HowlerGlobalLike;
  /** Unloads all Howls, closes the context and sets up a new one. */
  unload(): HowlerGlobalLike;
  /** Whether the browser plays the given extension (e.g. 'ogg'). */
  codecs(ext: string): boolean;
}

/** One `Howl` (a sound file and its voices, addressed by numeric ids). */
export interface HowlLike {
  /** Starts a new voice (or resumes `id`); returns its id. */
  play(spriteOrId?: string | number): number;
  /** Rate of the first voice. */
  rate(): number;
  /** Sets the playback rate of voice `id` (a step, no ramp). */
  rate(rate: number, id: number): HowlLike;
  /** Whether voice `id` (or any voice) is playing. */
  playing(id?: number): boolean;
  /** Load state. */
  state(): 'unloaded' | 'loading' | 'loaded';
  on(event: HowlEventName, fn: (id: number, message?: unknown) => void, id?: number): HowlLike;
  once(event: HowlEventName, fn: (id: number, message?: unknown) => void, id?: number): HowlLike;
  off(event: HowlEventName, fn?: (id: number, message?: unknown) => void, id?: number): HowlLike;
}
