// A small fake of howler's public API, following the behaviour documented in ../shared/INTEGRATION.md:
// the context is set up lazily by volume() (getter included), unload() closes it and sets up a new one.
import type { HowlLike, HowlerGlobalLike } from '../../runtime/howler/index';

/** A decoded buffer stand-in. */
export function fakeBuffer(frames: number, sampleRate: number): AudioBuffer {
  const data = new Float32Array(frames).fill(0.1);
  return { numberOfChannels: 1, sampleRate, length: frames, getChannelData: () => data } as unknown as AudioBuffer;
}

let contexts = 0;

/** A context stand-in: decodeAudioData gives a one-second mono buffer and records the bytes it saw. */
export function fakeAudioContext() {
  const ctx = {
    serial: ++contexts,
    currentTime: 0,
    sampleRate: 48000,
    closed: false,
    decoded: [] as number[],
    decodeAudioData: async (bytes: ArrayBuffer) => {
      ctx.decoded.push(bytes.byteLength);
      return fakeBuffer(48000, 44100);
    },
    close: async () => {
      ctx.closed = true;
    },
  };
  return ctx;
}

/** The global Howler object. */
export function fakeHowler(options: { usingWebAudio?: boolean } = {}) {
  const codecs: Record<string, boolean> = { ogg: true, mp3: true, wav: true, webm: false };
  const h = {
    ctx: null as AudioContext | null,
    masterGain: null as GainNode | null,
    autoSuspend: true,
    usingWebAudio: options.usingWebAudio ?? true,
    noAudio: false,
    setups: 0,
    _volume: 1,
    _setup() {
      h.setups += 1;
      h.ctx = fakeAudioContext() as unknown as AudioContext;
      h.masterGain = { name: `master-${h.setups}` } as unknown as GainNode;
    },
    volume(v?: number) {
      if (!h.ctx) h._setup();
      if (v === undefined) return h._volume;
      h._volume = v;
      return h;
    },
    mute() {
      return h;
    },
    unload() {
      (h.ctx as unknown as { close(): void } | null)?.close();
      h.ctx = null;
      h._setup();
      return h;
    },
    codecs(ext: string) {
      return codecs[ext.replace(/^x-/, '')] ?? false;
    },
  };
  return h as typeof h & HowlerGlobalLike;
}

/** One Howl: records rate(r, id) calls. */
export function fakeHowl() {
  const calls: [number, number][] = [];
  const howl = {
    calls,
    play: () => 1001,
    rate: (r?: number, id?: number) => {
      if (r === undefined) return calls.at(-1)?.[0] ?? 1;
      calls.push([r, id as number]);
      return howl;
    },
    playing: () => true,
    state: () => 'loaded' as const,
    on: () => howl,
    once: () => howl,
    off: () => howl,
  };
  return howl as typeof howl & HowlLike;
}
