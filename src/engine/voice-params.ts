// What a voice plays and how: the per-play values fixed at its start (a few change later by intent), the start
// request the engine hands to `Voice.start`, its smoothing times and the scratch buffers all voices share.
import type { StreamSourceOptions, WasmKernel } from '../dsp';
import type { PropagationStage } from './propagation-stage';
import type { VoiceTargets } from '../dilation';
import type { Seconds } from '../units';

/** Scratch buffers shared by all voices of an engine (one voice renders at a time). */
export interface VoiceScratch {
  /** Resampled channels (2 × maxBlockFrames). */
  stereo: Float32Array[];
  /** Only the first channel of `stereo`, for mono sounds. */
  mono: Float32Array[];
  /** Copy of the unfiltered signal for the bypass crossfade (2 × maxBlockFrames). */
  dry: Float32Array[];
  /** The WebAssembly kernel when `stereo` and the mix bus are views of its memory (the mix then runs in the module), else null. */
  wasm: WasmKernel | null;
  /** Per-sample read ratios of a propagating voice (maxBlockFrames). */
  ratios: Float32Array;
  /** The engine's propagation stage (fills and counts the ratios), or null. */
  stage: PropagationStage | null;
}

/** Smoothing time constants of a voice's stages, s (0 = none). */
export interface VoiceSmoothing {
  /** Playback ratio (cents), s. */
  ratio: Seconds;
  /** Doppler part of the ratio (cents), s. */
  doppler: Seconds;
  /** Tone cutoff (log frequency), s. */
  cutoff: Seconds;
  /** Channel gains (dB), s. */
  gain: Seconds;
}

/** A voice's per-play values; read-only outside the voice (`Voice.params`). */
export class VoiceParams {
  /** Sound slot in the engine's bank (−1: none). */
  sound = -1;
  /** Channels of the sound, 1 or 2. */
  channels = 1;
  /** Source sample rate over output sample rate (folded into the ratio). */
  rateFactor = 1.5;
  /** Group name (a tuning group). */
  group = '';
  /** Whether the group follows the time scale (freezes at time scale 0). */
  followsTime = true;
  /** Stealing priority, 0…255. */
  priority = 0;
  /** Base linear gain, 0…16. */
  gain = 1.5;
  /** Base playback ratio, (0, 4]. */
  ratio = 1.5;
  /** Snapshot source id, or −1 (not positioned). */
  sourceId = -1;
  /** Snapshot slot of the source, or −1. */
  sourceSlot = -1;
  /** Start order, for deterministic stealing among equals. */
  sequence = 0;

  /** Values as in a fresh slot. */
  constructor() {
    this.rateFactor = 1;
    this.gain = 1;
    this.ratio = 1;
  }

  /** Copies the per-play values of a start request. */
  assign(s: Readonly<VoiceStart>): void {
    this.sound = s.sound;
    this.channels = s.channels;
    this.rateFactor = s.rateFactor;
    this.group = s.group;
    this.followsTime = s.followsTime;
    this.priority = s.priority;
    this.gain = s.gain;
    this.ratio = s.ratio;
    this.sourceId = s.sourceId;
    this.sourceSlot = s.sourceSlot;
    this.sequence = s.sequence;
  }
}

/** Everything a voice needs to start (the engine fills one, command path). */
export interface VoiceStart {
  /** Sound slot in the engine's bank. */
  sound: number;
  /** The sound's channel data (1 or 2 arrays of equal length). */
  channelData: readonly Float32Array[];
  /** Channels of the sound, 1 or 2. */
  channels: number;
  /** Source sample rate over output sample rate. */
  rateFactor: number;
  /** Group name (known to the tuning). */
  group: string;
  /** Whether the group follows the time scale. */
  followsTime: boolean;
  /** Stealing priority, 0…255. */
  priority: number;
  /** Base linear gain, 0…16. */
  gain: number;
  /** Base playback ratio, (0, 4]. */
  ratio: number;
  /** Snapshot source id, or −1. */
  sourceId: number;
  /** Snapshot slot of the source, or −1. */
  sourceSlot: number;
  /** Start order. */
  sequence: number;
  /** Whether the read follows the emission time (propagation model). */
  propagating: boolean;
  /** Engine time of the start, s. */
  startTime: Seconds;
  /** Fade-in, s (0 = starts at full level). */
  fadeInSeconds: Seconds;
  /** Default release fade, s. */
  releaseSeconds: Seconds;
  /** Where and how to read: start frame, loop. */
  from: StreamSourceOptions;
  /** The targets mapped at the start (the first block starts at them). */
  targets: VoiceTargets;
}
