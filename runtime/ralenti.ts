// The main-thread runtime: validates requests, keeps handles, and talks to the worklet over its port. Its parts live
// beside it: lifecycle (runtime-lifecycle.ts), the snapshot path (snapshot-sender.ts), the time scale
// (time-scale-control.ts), voice calls (voice-commands.ts), group buses (group-controls.ts), sound upload
// (sound-upload.ts), the kernel tables a tier switch needs (table-tiers.ts) and the stats before the first report
// (initial-stats.ts).
import type { Decibels, EngineStats, PlayOptions, Seconds, Tuning, VoiceMonitor } from '../src/index';
import { parseTuning } from '../src/tuning/index';
import { wasmSimdSupported } from '../src/dsp/index';
import { commandTransfer, type ClosedReport, type Command, type RenderLoad, type Report } from './protocol';
import type { TableCounters } from './worklet/table-installer';
import { RalentiOptionError } from './runtime-error';
import type { RalentiSource } from './ralenti-source';
import type { RalentiVoice, RalentiVoiceEvent } from './ralenti-voice';
import { VoiceRegistry } from './voice-registry';
import { GroupControls, type GroupState } from './group-controls';
import { checkPlayOptions, type RalentiPlayOptions } from './play-options';
import type { RalentiAudioError, RalentiInit, RalentiListener, Sound, SoundData, TimeScaleOptions } from './ralenti-types';
import { RuntimeLifecycle } from './runtime-lifecycle';
import { SnapshotSender } from './snapshot-sender';
import { TimeScaleControl } from './time-scale-control';
import { voiceCommands } from './voice-commands';
import { soundUpload } from './sound-upload';
import { initialStats } from './initial-stats';
import { TableTiers } from './table-tiers';

export type { RalentiVoice, RalentiVoiceEvent, RalentiVoiceState, StopOptions } from './ralenti-voice';
export type { GroupState } from './group-controls';
export type { RalentiPlayOptions } from './play-options';
export type { Sound, SoundData, RalentiListener, TimeScaleOptions, RalentiInit, RalentiAudioError } from './ralenti-types';
export type { ClosedReport, KernelMemory } from './protocol';

/** The runtime: one AudioWorkletNode hosting the engine, and the handles that drive it. */
export class Ralenti {
  /** The audio context the node lives in. */
  readonly context: BaseAudioContext;
  /** The worklet node (stereo output). */
  readonly node: AudioWorkletNode;
  /** Voice pool size of the engine. */
  readonly capacity: number;
  /** Latest counters from the worklet (a few times per second). */
  stats: EngineStats;
  /** Latest voice monitors from the worklet. */
  voices: VoiceMonitor[] = [];
  /** Latest render load measured in the worklet; null until reported, or where the audio thread has no clock. */
  renderLoad: RenderLoad | null = null;
  /** Kernel-table work counted on the audio thread (designs, layouts built, layouts still being copied in); null until reported. */
  tableWork: TableCounters | null = null;
  private current: Tuning;
  /** Sources left out of the last update() because more than maxSources were live (those without voices go first). */
  sourcesLeftOut = 0;
  /** Source slots of the engine: update() sends at most this many sources. */
  readonly maxSources: number;
  private readonly time = new TimeScaleControl();
  private readonly loaded = new Map<number, Sound>();
  private readonly registry: VoiceRegistry;
  private readonly groupControls: GroupControls;
  private readonly life: RuntimeLifecycle;
  private readonly snapshots: SnapshotSender;
  private nextSound = 1;
  private nextVoice = 1;
  private readonly tableTiers: TableTiers;

  /** Wraps an existing node; use createRalenti() instead unless you built the node yourself. */
  constructor(init: RalentiInit) {
    this.context = init.context;
    this.node = init.node;
    this.capacity = init.capacity;
    this.current = init.tuning;
    this.stats = initialStats(init.tuning.resampler.tier, wasmSimdSupported() ? 'wasm-simd' : 'typescript');
    this.maxSources = init.maxSources ?? 256;
    const send = (c: Command) => this.send(c);
    this.life = new RuntimeLifecycle(this.context);
    this.snapshots = new SnapshotSender(this.maxSources, send);
    this.registry = new VoiceRegistry(voiceCommands({ now: () => this.context.currentTime, alive: (what) => this.life.alive(what), send }));
    this.tableTiers = new TableTiers(init.tableTiers, this.context.sampleRate);
    this.groupControls = new GroupControls({ send, tuning: () => this.current, context: this.context, node: this.node, routed: init.groupOutputs ?? [] });
    this.node.port.onmessage = (e: MessageEvent<Report>) => this.receive(e.data);
    this.node.onprocessorerror = () => {
      // A stopped processor answers nothing more: settle the waiting flushes rather than leave them hanging.
      this.life.abandon();
      this.life.emitError({ where: 'processorerror', message: 'the processor failed and stopped', count: -1 });
    };
  }

  /** The running tuning (validated). */
  get tuning(): Tuning {
    return this.current;
  }

  /** Time scale now, evaluated on the main thread from the same transition the worklet runs. */
  get timeScale(): number {
    return this.time.valueAt(this.context.currentTime);
  }

  /** True after dispose() or once the AudioContext is closed: every call then throws RalentiClosedError. */
  get closed(): boolean {
    return this.life.closed;
  }

  /** True while the whole world is paused (pause() without a group). */
  get paused(): boolean {
    return this.time.paused;
  }

  /** Uploads a sound to the worklet (channel data is copied, then transferred). */
  load(data: SoundData): Sound {
    this.life.alive('load');
    const { channels, sampleRate, sound } = soundUpload(data, this.nextSound);
    this.nextSound++;
    this.send({ type: 'add-sound', sound: sound.id, channels, sampleRate });
    this.loaded.set(sound.id, sound);
    return sound;
  }

  /** Frees a sound in the worklet; its voices stop. */
  unload(sound: Sound): void {
    this.life.alive('unload');
    this.loaded.delete(sound.id);
    this.send({ type: 'remove-sound', sound: sound.id });
  }

  /** Starts a voice; throws RalentiOptionError naming the bad option (unloaded sound, unknown group, range), and then starts nothing. */
  play(sound: Sound, options: RalentiPlayOptions = {}): RalentiVoice {
    this.life.alive('play');
    // By id (a rebuilt runtime reloads the same sounds under the same ids, e.g. the howler bridge), with the same shape.
    const known = this.loaded.get(sound?.id);
    if (!known || known.frames !== sound.frames || known.sampleRate !== sound.sampleRate) throw new RalentiOptionError('play.sound', 'not a loaded sound of this runtime (load() it first; unload() ends it)');
    const o: PlayOptions = checkPlayOptions(options, sound, this.current);
    const source = options.source ?? null;
    if (source) o.sourceId = this.snapshots.liveId('play.source', source);
    const id = this.nextVoice++;
    this.send({ type: 'play', voice: id, sound: sound.id, options: o });
    const rate = sound.sampleRate;
    const loop = o.loop === true ? { start: (o.loopStart ?? 0) / rate, end: (o.loopEnd ?? sound.frames) / rate } : null;
    return this.registry.add(id, sound.duration, loop, o.offsetSeconds ?? 0, source);
  }

  /** Calls `cb` for every voice event of this runtime, in order; returns an unsubscribe function. */
  onVoiceEvent(cb: (e: RalentiVoiceEvent) => void): () => void {
    return this.registry.listen(cb);
  }

  /**
   * Pauses the whole world (no group) or one group, click-free (20 ms fade; read heads hold). A world pause also holds
   * the time scale's transitions; groups whose policy is 'exempt' (or marked with setGroupPausable) keep playing.
   */
  pause(group?: string): void {
    this.life.alive('pause');
    if (group !== undefined) this.groupControls.check('pause.group', group);
    else this.time.pause(this.context.currentTime);
    this.send({ type: 'pause', group });
  }

  /** Resumes the whole world (no group) or one group paused on its own; voices fade back in where they were. */
  resume(group?: string): void {
    this.life.alive('resume');
    if (group !== undefined) this.groupControls.check('resume.group', group);
    else this.time.resume(this.context.currentTime);
    this.send({ type: 'resume', group });
  }

  /** Whether a world pause holds `group` (default: yes, unless its policy is 'exempt'). */
  setGroupPausable(group: string, pausable: boolean): void {
    this.life.alive('setGroupPausable');
    this.groupControls.setPausable(group, pausable);
  }

  /** Sets a group's volume in dB (−120…24); glides with the tuning's gain smoothing. */
  setGroupVolume(group: string, db: Decibels): void {
    this.life.alive('setGroupVolume');
    this.groupControls.setVolume(group, db);
  }

  /** Mutes or unmutes a group (its voices go virtual and keep time). */
  setGroupMute(group: string, muted: boolean): void {
    this.life.alive('setGroupMute');
    this.groupControls.setMute(group, muted);
  }

  /** Solos or unsolos a group: while any group is soloed, only soloed groups are heard. */
  setGroupSolo(group: string, solo: boolean): void {
    this.life.alive('setGroupSolo');
    this.groupControls.setSolo(group, solo);
  }

  /** A group's bus state as set on this runtime: volume in dB, mute, solo. */
  getGroupState(group: string): GroupState {
    this.life.alive('getGroupState');
    return { ...this.groupControls.state(group) };
  }

  /**
   * The AudioNode carrying `group`'s own output (stereo, after its volume/mute/solo, before the master gain and
   * limiter): route it through your effects to a destination. Only groups named in createRalenti's groupOutputs.
   */
  groupOutput(group: string): AudioNode {
    this.life.alive('groupOutput');
    return this.groupControls.output(group);
  }

  /** A new positioned source; voices follow it via `play(sound, { source })`. */
  createSource(): RalentiSource {
    this.life.alive('createSource');
    return this.snapshots.createSource(this.registry.voiced);
  }

  /** Sets the listener (copied); sent with the next update(). */
  setListener(l: RalentiListener): void {
    this.life.alive('setListener');
    this.snapshots.setListener(l);
  }

  /** Ramps the time scale to `target` (0…4); throws RalentiOptionError for bad values. */
  setTimeScale(target: number, options: TimeScaleOptions = {}): void {
    this.life.alive('setTimeScale');
    const request = this.time.ramp(target, options, this.current, this.context.currentTime);
    this.send({ type: 'time-scale', request });
  }

  /** Validates and applies a tuning document; throws TuningError and keeps the running tuning on failure. */
  setTuning(json: unknown): Tuning {
    this.life.alive('setTuning');
    const t = parseTuning(json);
    this.current = t;
    const tables = this.tableTiers.tablesFor(t.resampler.tier);
    if (tables !== null) this.send(tables);
    this.send({ type: 'tuning', tuning: t });
    return t;
  }

  /**
   * Sends one gameplay snapshot (listener and live sources) stamped with `time` (default: context time now). Any one
   * clock will do as long as every call uses it: the engine maps snapshot time onto its own and uses only differences,
   * so stamp with the clock the positions were read on (the three.js binding passes its frame time).
   * Beyond maxSources live sources, only sources with voices are sent (up to maxSources; the rest counted in
   * sourcesLeftOut) — decided here, before encoding. Changed spatial settings go out first.
   */
  update(time: Seconds = this.context.currentTime): void {
    this.life.alive('update');
    this.sourcesLeftOut = this.snapshots.sendSnapshot(time, this.registry.voiced);
  }

  /** Resolves once the worklet has handled every command sent before this call; at once after dispose() or close. */
  flush(): Promise<void> {
    return this.life.flush((c) => this.send(c));
  }

  /** Connects the runtime's stereo output to `destination`. */
  connect(destination: AudioNode): void {
    this.node.connect(destination);
  }

  /** Disconnects the output from everything. */
  disconnect(): void {
    this.node.disconnect();
  }

  /** Calls `cb` for every error the audio thread reports; returns a function that unsubscribes. */
  onError(cb: (e: RalentiAudioError) => void): () => void {
    return this.life.onError(cb);
  }

  /**
   * Disconnects and closes the port; the runtime is unusable afterwards (at once: every call throws RalentiClosedError).
   * The worklet disposes its engine (its module memory goes back at once) and ends; the promise resolves with its last
   * report once it has (the same promise on later calls), or with null where it cannot answer (a closed context, a
   * failed processor). Awaiting it is optional.
   */
  dispose(): Promise<ClosedReport | null> {
    return this.life.close(this.node, (c) => this.send(c));
  }

  /** Handles one report from the worklet (called by the port; exposed for hosts that relay messages). */
  receive(r: Report): void {
    switch (r?.type) {
      case 'stats':
        this.stats = r.stats;
        this.voices = r.voices;
        this.renderLoad = r.load ?? null;
        this.tableWork = r.tables ?? null;
        return;
      case 'error':
        this.life.emitError({ where: r.where, message: r.message, count: r.count });
        return;
      case 'voice-events':
        this.registry.receive(r);
        return;
      case 'synced':
        this.life.synced(r.id);
        return;
      default:
        return;
    }
  }

  private send(c: Command): void {
    if (this.life.disposed) return;
    this.node.port.postMessage(c, commandTransfer(c));
  }
}
