// The plain data types of the main-thread runtime's API: sounds, the listener, time-scale options, construction
// options and audio-thread errors.
import type { Seconds, Tuning, Vec3Like, Easing } from '../src/index';

/** A decoded sound held by the worklet. */
export interface Sound {
  /** Main-thread handle. */
  readonly id: number;
  readonly channels: number;
  /** Source sample rate in Hz. */
  readonly sampleRate: number;
  /** Length in source frames. */
  readonly frames: number;
  /** Length in seconds. */
  readonly duration: Seconds;
}

/** Audio data accepted by `load`: an AudioBuffer, or 1–2 equal-length channels plus their sample rate. */
export type SoundData = AudioBuffer | { channels: Float32Array[]; sampleRate: number };


/** The listener as set by the game: position in metres, unit forward and up vectors, optional velocity in m/s. */
export interface RalentiListener {
  position: Vec3Like;
  forward: Vec3Like;
  up: Vec3Like;
  velocity?: Vec3Like;
}

/** Options of a time-scale change. */
export interface TimeScaleOptions {
  /** Ramp time in seconds, 0…60 (default: the tuning's ramp-in when slowing, ramp-out when speeding up). */
  ramp?: Seconds;
  /** Easing of the ramp (default: the tuning's). */
  easing?: Easing;
}

/** Construction options of Ralenti (createRalenti builds the node and calls this). */
export interface RalentiInit {
  context: BaseAudioContext;
  node: AudioWorkletNode;
  tuning: Tuning;
  capacity: number;
  /** Source slots of the engine (1…4096, default 256): update() sends at most this many sources. */
  maxSources?: number;
  /** Groups with their own output (in the node's output order after the main one), for groupOutput(). */
  groupOutputs?: readonly string[];
  /** Tiers whose tables (and WebAssembly layouts) the processor already holds (createRalenti sets it); a switch to another tier first sends that tier's tables, designed here. Absent: the processor designs its own. */
  tableTiers?: readonly string[];
}

/** Error delivered to onError callbacks: from the audio thread (where = 'process' | 'command' | 'construct' | 'processorerror'). */
export interface RalentiAudioError {
  where: string;
  message: string;
  /** Audio-thread error count so far. */
  count: number;
}
