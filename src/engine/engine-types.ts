// The engine's public contract, shared by its two hosts (AudioWorklet and the Node offline renderer).
import type { Decibels, Hz, Seconds } from '../units';
import type { Easing, QualityTierName, Tuning } from '../tuning/tuning-types';
import type { ListenerState, SourceState } from '../dilation/snapshot-types';
import type { KernelName, KernelPreference, KernelTable } from '../dsp';

/** Engine construction options; capacities are fixed here for the engine's lifetime. */
export interface EngineOptions {
  /** Output sample rate in Hz (8000…192000). */
  sampleRate: Hz;
  /** Voice pool size (1…1024), default 64. */
  capacity?: number;
  /** Sound slots (decoded buffers) the engine can hold (1…4096), default 256. */
  maxSounds?: number;
  /** Source slots for positions and velocities from snapshots (1…4096), default 256. */
  maxSources?: number;
  /** Trajectory knots kept per source for the propagation model (16…4096, default 256: ≈ 4.3 s of 60 Hz snapshots). */
  trackKnots?: number;
  /** Largest block `render` accepts in one call without splitting (default 128, the Web Audio render quantum). */
  maxBlockFrames?: number;
  /** A parsed tuning; defaults to the built-in tuning. */
  tuning?: Tuning;
  /** Voices of 'stretch' groups that can play at once, 0…1024 (default 32; more play tape-style, counted in clamps). */
  maxStretchVoices?: number;
  /** Resampler inner loop: 'auto' (default: WebAssembly SIMD where available), 'typescript' (reference), 'wasm-simd' (throws where unavailable). */
  kernel?: KernelPreference;
  /**
   * Kernel tables designed elsewhere (e.g. on the main thread, `KernelTable.fromData`), one per tier name. When given,
   * the engine designs none: a tier without a table here keeps the table in use until `useTables` brings one.
   */
  tables?: readonly KernelTable[];
}

/** Options of one play request. */
export interface PlayOptions {
  /** Group name from the tuning; unknown names fall back to 'effects' and are counted. */
  group?: string;
  /** Loop the sound (whole sound, or the loop region when given). */
  loop?: boolean;
  /** Loop region start in source frames (default 0). */
  loopStart?: number;
  /** Loop region end in source frames, exclusive (default: sound length). */
  loopEnd?: number;
  /** Start offset into the sound in seconds of source time (default 0). */
  offsetSeconds?: Seconds;
  /** Linear gain, 0…16 (default 1). */
  gain?: number;
  /** Base playback ratio before time scale and Doppler, (0, 4] (default 1). */
  ratio?: number;
  /** Stealing priority override (default: the group's priority). */
  priority?: number;
  /** Source id from the snapshots for position and velocity; absent = non-positional (centred, no Doppler). */
  sourceId?: number;
  /** Fade-in time (default: a short click-free fade of a few milliseconds). */
  fadeInSeconds?: Seconds;
}

/** Counters and levels reported by the engine; the audio path clamps and counts rather than throws. */
export interface EngineStats {
  activeVoices: number;
  virtualVoices: number;
  steals: number;
  /** Ratios, positions, velocities, time scales or gains that were clamped or replaced. */
  clamps: number;
  /** Requests refused for lack of capacity (sound slots full, bad ids). */
  refused: number;
  /** Peak absolute output sample of the last render call, before and after the limiter (a host's stats report carries the peak over its whole report interval). */
  peakIn: number;
  peakOut: number;
  /** Times the blast guard muted the output (sustained level far above full scale, or non-finite samples). */
  blasts: number;
  /** Limiter gain reduction at the end of the last render call, in dB (≤ 0). */
  limiterDb: Decibels;
  /** Current time scale as the engine evaluates it. */
  timeScale: number;
  /** Engine clock: seconds rendered so far. */
  time: Seconds;
  /** Errors caught by a host (e.g. the worklet) — the engine itself never throws from render. */
  errors: number;
  /** Resampler tier in use. */
  tier: QualityTierName;
  /** Resampler inner loop in use: 'wasm-simd' or 'typescript' (the fallback where WebAssembly SIMD is unavailable). */
  kernel: KernelName;
  /** Per-sample read ratios of propagating voices clamped to the resampler's range (e.g. at a Mach cone); also in `clamps`. */
  ratioClamps: number;
  /** Source teleports: jumps away from the position predicted from the recent motion, and explicit `teleport` calls. */
  teleports: number;
  /** Mach-cone arrivals (shockwaves) so far; the last one's engine time (s, NaN before any) and source id (−1 before any). */
  shockwaves: number;
  lastShockwaveTime: Seconds;
  lastShockwaveSource: number;
}

/** A supersonic source's Mach cone reached the listener (read with `Engine.drainShockwaves`). */
export interface ShockwaveEvent {
  /** Engine time of the arrival, s. */
  time: Seconds;
  /** Game time of the arrival (∫ time scale dt), s. */
  gameTime: Seconds;
  /** The source's id. */
  sourceId: number;
}

/** Per-voice state for monitors (editor), filled without allocation into caller-owned objects. */
export interface VoiceMonitor {
  voice: number;
  sourceId: number;
  group: string;
  /** Smoothed playback ratio actually used, in cents relative to 1. */
  ratioCents: number;
  dopplerCents: number;
  radialSpeed: number;
  distance: number;
  cutoffHz: Hz;
  gainDb: Decibels;
  virtual: boolean;
}

/** A time-scale transition request: ramp from the current value to target. */
export interface TimeScaleRequest {
  target: number;
  rampSeconds: Seconds;
  easing: Easing;
  /** Engine time the ramp starts at (default: now). */
  startTime?: Seconds;
}

/** A gameplay snapshot as pushed to the engine: timeScale, when present, sets the time flow at once. */
export interface EngineSnapshot {
  time: Seconds;
  timeScale?: number;
  listener: ListenerState;
  sources: SourceState[];
}
