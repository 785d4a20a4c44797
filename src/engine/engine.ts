// The voice engine: a fixed pool of voices over decoded sounds, rendered block by block (control rate = block),
// mixed to a stereo master bus with a safety limiter. One engine, two hosts (AudioWorklet and Node). This class is
// the public face; the work lives by concept in engine-core, engine-play, engine-tuning, block-render, engine-monitor,
// engine-sounds and engine-groups.
import type { Hz, Seconds } from '../units';
import type { EngineOptions, EngineSnapshot, EngineStats, PlayOptions, ShockwaveEvent, VoiceMonitor } from './engine-types';
import type { TimeScaleRequest } from '../dilation';
import type { Tuning } from '../tuning';
import type { KernelTable } from '../dsp';
import { sourceSpatialProblems, type SourceSpatial } from '../dilation';
import { EngineCore, engineDefaults } from './engine-core';
import { playVoice } from './engine-play';
import { addTables, applyTuning } from './engine-tuning';
import { renderFrames } from './block-render';
import { fillMonitors, positionOf, speedOf } from './engine-monitor';
import { clampNumber } from './engine-values';
import { VOICE_PLAYING, FREEZE_FADE_SECONDS } from './voice';
import { addSoundTo, removeSoundFrom } from './engine-sounds';
import { groupBusState, pauseGroups, resumeGroups } from './engine-groups';
import { EngineClosedError } from './engine-closed-error';
import type { VoiceStateName } from './voice-controls';
import type { VoiceEventRing } from './voice-events';

export { engineDefaults } from './engine-core';

/** The outputs of the render call that applies a time-scale request (it renders nothing). */
const NO_OUTPUTS: readonly Float32Array[] = [];

/** Renders voices of decoded sounds with time-scale and Doppler pitch, dilation tone, panning and a master limiter. */
export class Engine {
  /** Counters and levels, updated by every render call (the same object throughout). */
  readonly stats: EngineStats;
  /** Output sample rate, Hz. */
  readonly sampleRate: Hz;
  /** Voice pool size. */
  readonly capacity: number;
  /** Voice events (ended, stolen, virtual, audible) waiting for the host: drain with drainEvents. */
  readonly events: VoiceEventRing;
  private readonly core: EngineCore;
  private closed = false;

  /** Builds every voice, buffer and table up front; throws RangeError naming a bad option. */
  constructor(options: EngineOptions) {
    this.core = new EngineCore(options, this);
    this.stats = this.core.stats;
    this.sampleRate = this.core.sampleRate;
    this.capacity = this.core.capacity;
    this.events = this.core.events;
  }

  /** Engine clock: seconds rendered so far. */
  get time(): Seconds {
    return this.core.time;
  }

  /** The tuning in use. */
  get currentTuning(): Tuning {
    return this.core.tuning;
  }

  /**
   * Stores a decoded sound (1 or 2 channels, equal lengths, any rate up to 768 kHz); returns its id, or −1 (counted in refused).
   * On the wasm kernel the samples are copied into module memory here: later changes to the arrays are not heard.
   */
  addSound(channels: readonly Float32Array[], sampleRate: Hz): number {
    this.live('addSound');
    return addSoundTo(this.core, channels, sampleRate);
  }

  /** Removes a sound; its voices fade out (default stop fade) and the slot frees once they are silent. */
  removeSound(id: number): void {
    this.live('removeSound');
    removeSoundFrom(this.core, id);
  }

  /** Starts a voice; returns its handle, or −1 if refused (unknown sound, or a full pool of higher priority). */
  play(sound: number, options: PlayOptions = {}): number {
    this.live('play');
    return playVoice(this.core, sound, options);
  }

  /** Stops a voice with a fade (s; default 0.01, 0 = at once); unknown or stale handles are ignored. */
  stop(voice: number, fadeSeconds: Seconds = engineDefaults.stopFadeSeconds): void {
    this.live('stop');
    const v = this.core.pool.resolve(voice);
    if (v !== null && v.state === VOICE_PLAYING) this.core.pool.release(v, fadeSeconds);
  }

  /** Changes a playing voice's linear gain (0…16) or base ratio ((0, 4]); changes glide with the tuning's smoothing. */
  setVoice(voice: number, change: { gain?: number; ratio?: number }): void {
    this.live('setVoice');
    const v = this.core.pool.resolve(voice);
    if (v === null) return;
    if (change.gain !== undefined) v.setGain(clampNumber(change.gain, 0, 16, v.params.gain));
    if (change.ratio === undefined) return;
    if (change.ratio > 0 && change.ratio <= 4) v.setBaseRatio(change.ratio);
    else this.core.clamps++;
  }

  /** Switches tuning (a parseTuning result); voices keep playing and glide to the new targets. */
  setTuning(t: Tuning): void {
    this.live('setTuning');
    applyTuning(this.core, t);
  }

  /** Adds tables designed elsewhere (by tier name, replacing any of the same name); switches at once if the tuning's tier was waiting for one. */
  useTables(tables: readonly KernelTable[]): void {
    this.live('useTables');
    addTables(this.core, tables);
  }

  /** Stores a gameplay snapshot; positions glide from the previous one across the snapshot interval. */
  pushSnapshot(s: EngineSnapshot): void {
    this.live('pushSnapshot');
    const c = this.core;
    try {
      if (s.timeScale !== undefined) c.flow.jump(s.timeScale, c.controls.flowTime(c.time));
      // No double here: called once per snapshot, this may run unoptimised for minutes, boxing any (docs/allocation.md).
      c.snapshots.push(s);
      c.stage.push(s, c.snapshots);
    } catch {
      this.stats.errors++;
    }
  }

  /** Starts a time-scale ramp (startTime defaults to now, engine time); the request is read during the call. */
  setTimeScale(request: TimeScaleRequest): void {
    this.live('setTimeScale');
    const c = this.core;
    if (typeof request !== 'object' || request === null) {
      this.setTimeScaleFrom(request);
      return;
    }
    // Applied at once by the render code, which is optimised (called for every block) where this method is not (called
    // once per ramp, it would box every double it read, ≈350 bytes a call; docs/allocation.md). In time-flow time,
    // which stops while the world is paused: a ramp asked for during a pause starts on resume.
    c.timeRequest = request;
    c.timePending = true;
    try {
      renderFrames(c, NO_OUTPUTS, 0, undefined);
    } finally {
      c.timeRequest = c.restingRequests[0];
      c.timePending = false;
    }
  }

  /** `setTimeScale` of a request that is not an object (from JavaScript): read here, as before (null throws TypeError). */
  private setTimeScaleFrom(request: TimeScaleRequest): void {
    const c = this.core;
    const now = c.time;
    const startTime = c.controls.clock.requestTime(request.startTime ?? now, now);
    c.flow.set({ target: request.target, rampSeconds: request.rampSeconds, easing: request.easing, startTime }, c.controls.flowTime(now));
  }

  /**
   * Declares that source `sourceId` jumps: its next snapshot restarts its track (no Doppler sweep across the jump;
   * voices on it keep playing without a jump in their read). Unknown ids are ignored.
   */
  teleport(sourceId: number): void {
    this.live('teleport');
    this.core.stage.teleport(sourceId);
  }

  /** Copies pending Mach-cone arrivals (oldest first, up to out.length) into `out`; returns how many. */
  drainShockwaves(out: ShockwaveEvent[]): number {
    this.live('drainShockwaves');
    return this.core.stage.drainShockwaves(out);
  }

  /**
   * Renders `frames` stereo frames into outputs[0] (left) and outputs[1] (right), and each routed group (EngineOptions
   * .groupOutputs, in order) into groupOutputs[k][0|1] when given; never throws, never allocates.
   */
  render(outputs: readonly Float32Array[], frames: number, groupOutputs?: readonly (readonly Float32Array[])[]): void {
    if (this.closed) {
      this.renderDisposed(outputs, frames, groupOutputs);
      return;
    }
    renderFrames(this.core, outputs, frames, groupOutputs);
  }

  /**
   * Releases what the engine holds outside its own objects (its regions of the WebAssembly kernel's memory: voice
   * scratch, mix bus, resident sounds), at once, for the next engine to reuse; idempotent. Afterwards `render` outputs
   * silence (each call counted in stats.refused) and every other method throws EngineClosedError.
   */
  dispose(): void {
    if (this.closed) return;
    this.closed = true;
    this.core.resident?.release();
  }

  /** True after `dispose()`. */
  get disposed(): boolean {
    return this.closed;
  }

  /** Throws EngineClosedError naming `call` once the engine is disposed. */
  private live(call: string): void {
    if (this.closed) throw new EngineClosedError(`Engine.${call}`);
  }

  private renderDisposed(outputs: readonly Float32Array[], frames: number, groupOutputs?: readonly (readonly Float32Array[])[]): void {
    this.stats.refused++;
    for (const o of outputs) o.fill(0, 0, Math.min(frames, o.length));
    if (groupOutputs !== undefined) for (const g of groupOutputs) for (const o of g) o.fill(0, 0, Math.min(frames, o.length));
  }

  /** Pauses the whole world (no group: every pausable group, and the time scale's transitions) or one group; click-free. */
  pause(group?: string): void {
    this.live('pause');
    pauseGroups(this.core, group);
  }

  /** Resumes the whole world (no group) or one group paused on its own; held voices fade back in where they were. */
  resume(group?: string): void {
    this.live('resume');
    resumeGroups(this.core, group);
  }

  /** Whether a world pause holds `group` (default: every group whose policy is not 'exempt'). */
  setGroupPausable(group: string, pausable: boolean): void {
    this.live('setGroupPausable');
    this.core.controls.buses.setPausable(group, pausable === true);
  }

  /** Sets a group's bus volume in dB (−120…24, clamped and counted); changes glide with the gain smoothing. */
  setGroupVolume(group: string, db: number): void {
    this.live('setGroupVolume');
    if (!this.core.controls.buses.setVolume(group, db)) this.core.clamps++;
  }

  /** Mutes or unmutes a group's bus (its voices go virtual and keep time). */
  setGroupMute(group: string, muted: boolean): void {
    this.live('setGroupMute');
    this.core.controls.buses.setMute(group, muted);
  }

  /** Solos or unsolos a group's bus: while any group is soloed, only soloed groups are heard. */
  setGroupSolo(group: string, solo: boolean): void {
    this.live('setGroupSolo');
    this.core.controls.buses.setSolo(group, solo);
  }

  /** A group bus's state: volume in dB, mute, solo and its own pause. */
  getGroupState(group: string): { volumeDb: number; muted: boolean; solo: boolean; paused: boolean } {
    this.live('getGroupState');
    return groupBusState(this.core, group);
  }

  /** Moves a voice's read head to `seconds` of source time (clamped to the sound) after a short fade; stale handles are ignored. */
  seek(voice: number, seconds: Seconds): void {
    this.live('seek');
    const c = this.core;
    const v = c.pool.resolve(voice);
    if (v === null || v.state !== VOICE_PLAYING) return;
    const rate = v.params.rateFactor * c.sampleRate;
    const frames = c.bank.frames[v.params.sound];
    if (!(seconds >= 0 && seconds * rate <= frames)) c.clamps++;
    c.controls.seek(v, clampNumber(seconds * rate, 0, frames, 0));
  }

  /** A voice's state: 'playing', 'virtual', 'stopping' (fading out after stop or steal) or 'ended'. */
  voiceState(voice: number): VoiceStateName {
    this.live('voiceState');
    return this.core.controls.stateOf(this.core.pool.resolve(voice));
  }

  /** A voice's read position in seconds of source time, or −1 once it has ended. */
  voicePosition(voice: number): Seconds {
    this.live('voicePosition');
    return positionOf(this.core, this.core.pool.resolve(voice));
  }

  /** Source seconds a voice advances per output second now (its smoothed ratio; 0 while held), or 0 once ended. */
  voiceSpeed(voice: number): number {
    this.live('voiceSpeed');
    return speedOf(this.core.pool.resolve(voice));
  }

  /** Sets (null: clears) a source's own distance model and cone; an invalid object is refused whole (counted in refused). */
  setSourceSpatial(sourceId: number, spatial: SourceSpatial | null): void {
    this.live('setSourceSpatial');
    if (spatial !== null && sourceSpatialProblems(spatial).length > 0) {
      this.stats.refused++;
      return;
    }
    this.core.controls.setSourceSpatial(sourceId, spatial, this.core.voices);
  }

  /** Moves waiting voice events into `out` as (code, voice handle, engine time) triples; returns the event count. */
  drainEvents(out: Float64Array): number {
    this.live('drainEvents');
    return this.core.events.drain(out);
  }

  /** Fills `out` with the playing voices (up to out.length) and returns how many were written. */
  monitor(out: VoiceMonitor[]): number {
    this.live('monitor');
    return fillMonitors(this.core, out);
  }
}

/** Freeze fade of groups at time scale 0, s (re-exported for hosts and tests). */
export const ENGINE_FREEZE_FADE_SECONDS = FREEZE_FADE_SECONDS;
