// One voice of the engine: a chain of named stages run once per block — envelope (voice-envelope), pitch
// (voice-pitch), source read (voice-source-read), resample (voice-resample), tone (voice-tone), gain and pan
// (voice-gain), mix (voice-mix). The voice only wires them; the engine, pool and controls act on it by intent.
import type { KernelPreference, KernelTable, StreamSourceOptions } from '../dsp';
import { createVoiceTargets, type VoiceTargets } from '../dilation';
import type { Hz, Seconds } from '../units';
import type { StretchStage } from './stretch-stage';
import type { EmissionSolution } from './emission-solver';
import type { BlockClock } from './block-clock';
import { VoiceEnvelope } from './voice-envelope';
import { VoicePitch } from './voice-pitch';
import { SourceRead } from './voice-source-read';
import { resampleBlock, skipBlock } from './voice-resample';
import { VoiceTone } from './voice-tone';
import { VoiceGain, targetAudibility } from './voice-gain';
import { mixBlock } from './voice-mix';
import { copyTargets } from './engine-values';
import { VoiceParams, type VoiceStart, type VoiceSmoothing, type VoiceScratch } from './voice-params';

export { FREEZE_FADE_SECONDS } from './voice-envelope';
export { VIRTUAL_GAIN, RETURN_GAIN, targetAudibility } from './voice-gain';
export { TONE_SUB_BLOCK, TONE_Q } from './voice-tone';
export type { VoiceStart, VoiceSmoothing, VoiceScratch } from './voice-params';

/** Voice state: the slot is free. */
export const VOICE_FREE = 0;
/** Voice state: playing (fading in, sustained, held or thawing). */
export const VOICE_PLAYING = 1;
/** Voice state: fading out after a stop or a steal; the slot frees at the end of the fade. */
export const VOICE_RELEASING = 2;

/** A voice slot: its stages, all allocated once; read-only from outside except through its intent methods. */
export class Voice {
  /** Slot index in the engine's pool (0…2 × capacity − 1). */
  readonly index: number;
  /** Mapped targets of the block: the engine's mapper writes them before `render` (the voice's input, not its state). */
  readonly targets: VoiceTargets = createVoiceTargets();
  /** What the voice plays and how (sound, group, source, base gain and ratio…), set by `start` and the intent methods. */
  readonly params: Readonly<VoiceParams>;
  private readonly own = new VoiceParams();
  private readonly envelope: VoiceEnvelope;
  private readonly pitch: VoicePitch;
  private readonly source: SourceRead;
  private readonly tone: VoiceTone;
  private readonly gain: VoiceGain;
  private lifecycle = VOICE_FREE;
  private isFresh = true;
  private isHeld = false;

  /** Allocates slot `index`'s stages: a 2-channel reader over `table`, the filter and the smoothers. */
  constructor(index: number, table: KernelTable, sampleRate: Hz, smoothing: VoiceSmoothing, kernel: KernelPreference = 'auto') {
    this.index = index;
    this.params = this.own;
    this.envelope = new VoiceEnvelope(sampleRate);
    this.pitch = new VoicePitch(sampleRate, smoothing.ratio, smoothing.doppler);
    this.source = new SourceRead(table, kernel);
    this.tone = new VoiceTone(sampleRate, smoothing.cutoff);
    this.gain = new VoiceGain(sampleRate, smoothing.gain);
  }

  /** VOICE_FREE, VOICE_PLAYING or VOICE_RELEASING. */
  get state(): number {
    return this.lifecycle;
  }
  /** Envelope level now, 0…1. */
  get env(): number {
    return this.envelope.level;
  }
  /** Whether the voice is virtual (too quiet to render; its read head still moves). */
  get virtual(): boolean {
    return this.gain.virtual;
  }
  /** True until the voice's first rendered block (it then starts at its targets). */
  get fresh(): boolean {
    return this.isFresh;
  }
  /** Whether a pause or a pending seek holds the voice this block. */
  get held(): boolean {
    return this.isHeld;
  }
  /** Whether the read follows the emission time (propagation model). */
  get propagating(): boolean {
    return this.source.propagating;
  }
  /** Whether the sound has reached the listener (always true unless propagating). */
  get arrived(): boolean {
    return this.source.arrived;
  }
  /** Engine time the voice started, s. */
  get startTime(): Seconds {
    return this.source.startTime;
  }
  /** Game-clock Doppler factor at the end of the last block (propagating voices; 1 otherwise). */
  get dopplerEnd(): number {
    return this.pitch.dopplerEnd;
  }
  /** The time-stretch stage reading for this voice, or null (tape-style). */
  get stretch(): StretchStage | null {
    return this.source.stretch;
  }
  /** Whether the air-absorption low-pass has engaged (it then stays engaged). */
  get airEngaged(): boolean {
    return this.tone.airEngaged;
  }
  /** Read position, source frames. */
  get position(): number {
    return this.source.position;
  }
  /** Ratio clamps counted by the voice's reader. */
  get clampCount(): number {
    return this.source.reader.clampCount;
  }
  /** The reader's kernel ('typescript' or 'wasm-simd'). */
  get kernelName(): StreamReaderKernel {
    return this.source.reader.kernelName;
  }
  /** Target audibility (linear, the louder channel) from the last mapped targets. */
  get audibility(): number {
    return targetAudibility(this.targets);
  }
  /** Current smoothed playback ratio. */
  get currentRatio(): number {
    return this.pitch.current;
  }
  /** Current smoothed Doppler part of the ratio, cents. */
  get currentDopplerCents(): number {
    return this.pitch.dopplerCents.value;
  }
  /** Current smoothed cutoff in Hz (OPEN_CUTOFF_HZ when bypassed). */
  get currentCutoff(): Hz {
    return this.tone.currentCutoff;
  }

  /** Marks the free slot playing (the pool's `take`; `start` follows). */
  reserve(): void {
    this.lifecycle = VOICE_PLAYING;
  }

  /** Starts playing as `s` says: targets, read, envelope and smoothing all start afresh. */
  start(s: Readonly<VoiceStart>): void {
    this.own.assign(s);
    copyTargets(s.targets, this.targets);
    this.source.start(s.channelData, s.from, s.propagating, s.startTime);
    this.envelope.begin(s.fadeInSeconds, s.releaseSeconds);
    this.pitch.setDoppler(1, 1, this.pitch.dopplerMean);
    this.tone.airEngaged = false;
    this.gain.virtual = false;
    this.isFresh = true;
    this.isHeld = false;
  }

  /** Reads through a time-stretch stage from now on ('stretch' groups), from `from` in `channels`. */
  readThrough(stage: StretchStage, channels: readonly Float32Array[], from: StreamSourceOptions): void {
    this.source.readThrough(stage, channels, from);
  }

  /** Fades out over `fadeSeconds` (s); the pool frees the slot once silent. */
  release(fadeSeconds: Seconds): void {
    this.lifecycle = VOICE_RELEASING;
    this.envelope.release(fadeSeconds);
  }

  /** Marks the slot free (the pool's `free`). */
  free(): void {
    this.lifecycle = VOICE_FREE;
  }

  /** Holds the voice this block (pause, pending seek): it fades out and its read head stays. */
  hold(): void {
    this.isHeld = true;
  }

  /** Lets a held voice play again (it fades back in where it was). */
  unhold(): void {
    this.isHeld = false;
  }

  /** After a tuning change: the voice's group (or its fallback), whether it follows time, and its motion model. */
  regroup(group: string, followsTime: boolean, propagating: boolean): void {
    this.own.group = group;
    this.own.followsTime = followsTime;
    if (propagating !== this.source.propagating) {
      // A model switch mid-voice: keep playing from where the read is (no new delay).
      this.source.setPropagating(propagating);
      this.pitch.setDoppler(1, 1, this.pitch.dopplerMean);
    }
  }

  /** Sets the base linear gain (0…16, checked by the caller). */
  setGain(gain: number): void {
    this.own.gain = gain;
  }

  /** Sets the base playback ratio ((0, 4], checked by the caller). */
  setBaseRatio(ratio: number): void {
    this.own.ratio = ratio;
  }

  /** Records the snapshot slot of the voice's source (−1: not in the snapshots). */
  bindSourceSlot(slot: number): void {
    this.own.sourceSlot = slot;
  }

  /**
   * A propagating voice's coming block of `n` frames from engine time `now` (s): its Doppler factors and its arrival
   * follow its source's emission-time solutions at the block's start (`pre`) and end (`sol`).
   */
  followEmission(pre: EmissionSolution, sol: EmissionSolution, n: number, clock: BlockClock): void {
    this.pitch.followEmission(pre, sol, this.isFresh);
    this.source.arriveFrom(pre, sol, n, clock);
  }

  /** A propagating voice whose source is not in the snapshots: no Doppler, and after `waitSeconds` (s) it plays without waiting. */
  loseEmission(clock: BlockClock, waitSeconds: Seconds): void {
    this.source.waitForSource(clock, waitSeconds);
    this.pitch.loseEmission();
  }

  /** Engages the air-absorption low-pass for the rest of the voice's life. */
  engageAir(): void {
    this.tone.airEngaged = true;
  }

  /** Moves the read head to `frame` (source frames). */
  seekTo(frame: number): void {
    this.source.seek(frame);
  }

  /** Reads with `table` from now on (a tier switch). */
  setTable(table: KernelTable): void {
    this.source.reader.setTable(table);
  }

  /** Sets the smoothing time constants (s). */
  setSmoothing(smoothing: VoiceSmoothing): void {
    this.pitch.setSmoothing(smoothing.ratio, smoothing.doppler);
    this.tone.setSmoothing(smoothing.cutoff);
    this.gain.setSmoothing(smoothing.gain);
  }

  /**
   * Renders one block of `frames` (≤ scratch length) after `targets` were mapped, mixing into mixL/mixR from `offset`.
   * Returns false when the voice has ended (released to silence or a finished one-shot) and should be freed.
   */
  render(mixL: Float32Array, mixR: Float32Array, offset: number, frames: number, scratch: VoiceScratch): boolean {
    const source = this.source;
    // Not yet arrived (propagation delay, or outside a Mach cone): silent, read head at the start.
    if (!source.arrived) return this.lifecycle !== VOICE_RELEASING;
    const t = this.targets;
    const pitch = this.pitch;
    const tone = this.tone;
    const gain = this.gain;
    const envelope = this.envelope;
    const resumed = envelope.step((t.frozen === true && this.own.followsTime) || this.isHeld, frames);
    pitch.aim(t);
    tone.aim(t);
    gain.aim(t);
    if (this.isFresh) {
      this.isFresh = false;
      pitch.jump(t);
      tone.jump();
      gain.jump();
    }
    // Resuming from a hold: start at the current pitch (masked by the resume fade) rather than gliding up from ~0.
    if (resumed) pitch.jump(t);
    pitch.step(t, frames);
    gain.step(frames);
    const envStart = envelope.start;
    const envEnd = envelope.level;
    let advance = 0;
    const ratios = scratch.ratios;
    const silentFrames = source.silentFrames;
    if (source.propagating && scratch.stage !== null) {
      pitch.fillRatios(scratch.stage, ratios, frames);
      advance = scratch.stage.rampSum;
      source.arrive(ratios);
    }
    if (envStart === 0 && envEnd === 0) {
      // Held (frozen group) or silent: the read head stays where it is.
      if (this.lifecycle === VOICE_RELEASING) return false;
      tone.idle(frames);
      return true;
    }
    if (gain.checkVirtual()) tone.clear();
    if (gain.virtual) {
      skipBlock(source, pitch, frames, advance, t);
      tone.idle(frames);
      return this.alive();
    }
    const mono = this.own.channels === 1;
    const bufs = mono ? scratch.mono : scratch.stereo;
    resampleBlock(source, pitch, bufs, frames, ratios, silentFrames, t);
    // In module memory the low-pass of a whole block is left to the mix, which filters and mixes in one pass.
    tone.process(bufs, scratch.dry, frames, scratch.wasm, true);
    gain.ramp(envelope, frames);
    // A non-finite input must not live on in the filter state.
    if (!mixBlock(bufs[0], mono ? bufs[0] : bufs[1], mixL, mixR, offset, frames, gain, scratch.wasm, tone.pendingIn())) tone.clear();
    return this.alive();
  }

  private alive(): boolean {
    if (this.lifecycle === VOICE_RELEASING && this.envelope.level === 0) return false;
    return !this.source.finished;
  }
}

type StreamReaderKernel = SourceRead['reader']['kernelName'];
