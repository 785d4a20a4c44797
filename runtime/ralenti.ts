// The main-thread runtime: validates requests, keeps handles, and talks to the worklet over its port.
import type { Decibels, Easing, EngineSnapshot, EngineStats, PlayOptions, Seconds, Tuning, Vec3Like, VoiceMonitor } from '../src/index';
import { parseTuning, MAX_TIME_SCALE } from '../src/tuning/index';
import { PauseClock, TimeFlow } from '../src/dilation/index';
import { packKernelTable, wasmSimdSupported } from '../src/dsp/index';
import { commandTransfer, encodeSnapshot, type Command, type RenderLoad, type Report } from './protocol';
import type { TableCounters } from './worklet/table-installer';
import { RalentiClosedError, RalentiOptionError, checkRange } from './runtime-error';
import { RalentiSource } from './ralenti-source';
import type { RalentiVoice, RalentiVoiceEvent, VoiceHandle, VoiceHandleHost } from './ralenti-voice';
import { VoiceRegistry } from './voice-registry';
import { GroupControls, type GroupState } from './group-controls';
import { checkPlayOptions, type RalentiPlayOptions } from './play-options';

export type { RalentiVoice, RalentiVoiceEvent, RalentiVoiceState, StopOptions } from './ralenti-voice';
export type { GroupState } from './group-controls';
export type { RalentiPlayOptions } from './play-options';

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

const EMPTY_STATS: EngineStats = Object.freeze({
  activeVoices: 0, virtualVoices: 0, steals: 0, clamps: 0, refused: 0, peakIn: 0, peakOut: 0, blasts: 0,
  limiterDb: 0, timeScale: 1, time: 0, errors: 0, tier: 'standard',
}) as EngineStats;

/** Error delivered to onError callbacks: from the audio thread (where = 'process' | 'command' | 'construct' | 'processorerror'). */
export interface RalentiAudioError {
  where: string;
  message: string;
  /** Audio-thread error count so far. */
  count: number;
}

/** The runtime: one AudioWorkletNode hosting the engine, and the handles that drive it. */
export class Ralenti {
  /** The audio context the node lives in. */
  readonly context: BaseAudioContext;
  /** The worklet node (stereo output). */
  readonly node: AudioWorkletNode;
  /** Voice pool size of the engine. */
  readonly capacity: number;
  /** Latest counters from the worklet (a few times per second). */
  stats: EngineStats = EMPTY_STATS;
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
  private readonly flow = new TimeFlow({ initial: 1 });
  private readonly pauseClock = new PauseClock();
  private readonly sources = new Set<RalentiSource>();
  private readonly loaded = new Map<number, Sound>();
  private readonly registry: VoiceRegistry;
  private readonly groupControls: GroupControls;
  private contextClosed = false;
  private readonly listener: Required<Omit<RalentiListener, 'velocity'>> & { velocity?: Vec3Like } = {
    position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 },
  };
  private readonly snapshot: EngineSnapshot;
  private encoded: Float64Array = new Float64Array(0);
  private readonly errorListeners = new Set<(e: RalentiAudioError) => void>();
  private readonly syncWaiters = new Map<number, () => void>();
  private nextSound = 1;
  private nextVoice = 1;
  private nextSource = 1;
  private nextSync = 1;
  private disposed = false;
  /** Tiers the processor has tables for, or null when it designs its own. */
  private readonly tableTiers: Set<string> | null;

  /** Wraps an existing node; use createRalenti() instead unless you built the node yourself. */
  constructor(init: RalentiInit) {
    this.context = init.context;
    this.node = init.node;
    this.capacity = init.capacity;
    this.current = init.tuning;
    this.maxSources = init.maxSources ?? 256;
    this.registry = new VoiceRegistry(this.voiceHost);
    this.tableTiers = init.tableTiers === undefined ? null : new Set(init.tableTiers);
    this.snapshot = { time: 0, listener: this.listener, sources: [] };
    this.groupControls = new GroupControls({ send: (c) => this.send(c), tuning: () => this.current, context: this.context, node: this.node, routed: init.groupOutputs ?? [] });
    // A closed context answers no more messages: settle every waiting flush() then.
    const ctx = this.context as BaseAudioContext & { addEventListener?: (t: string, cb: () => void) => void };
    ctx.addEventListener?.('statechange', () => {
      if (this.context.state === 'closed') this.settleWaiters();
    });
    this.node.port.onmessage = (e: MessageEvent) => this.receive(e.data as Report);
    this.node.onprocessorerror = () => {
      // A stopped processor answers nothing more: settle the waiting flushes rather than leave them hanging.
      this.settleWaiters();
      this.emitError({ where: 'processorerror', message: 'the processor failed and stopped', count: -1 });
    };
  }

  /** The running tuning (validated). */
  get tuning(): Tuning {
    return this.current;
  }

  /** Time scale now, evaluated on the main thread from the same transition the worklet runs. */
  get timeScale(): number {
    return this.flow.valueAt(this.pauseClock.flowTime(this.context.currentTime));
  }

  /** True after dispose() or once the AudioContext is closed: every call then throws RalentiClosedError. */
  get closed(): boolean {
    return this.disposed || this.isClosed();
  }

  /** True while the whole world is paused (pause() without a group). */
  get paused(): boolean {
    return this.pauseClock.isPaused;
  }

  /** Uploads a sound to the worklet (channel data is copied, then transferred). */
  load(data: SoundData): Sound {
    this.alive('load');
    let channels: Float32Array[];
    let sampleRate: number;
    if (isAudioBuffer(data)) {
      if (!(data.numberOfChannels >= 1 && data.numberOfChannels <= 2))
        throw new RalentiOptionError('load.channels', `expected a mono or stereo AudioBuffer, got ${data.numberOfChannels} channels (downmix it first)`);
      channels = [];
      for (let c = 0; c < data.numberOfChannels; c++) channels.push(data.getChannelData(c).slice());
      sampleRate = data.sampleRate;
    } else {
      if (!Array.isArray(data.channels) || data.channels.length < 1 || data.channels.length > 2)
        throw new RalentiOptionError('load.channels', 'expected 1 or 2 Float32Arrays');
      const n = data.channels[0].length;
      if (n === 0 || data.channels.some((c) => !(c instanceof Float32Array) || c.length !== n))
        throw new RalentiOptionError('load.channels', 'expected Float32Arrays of one non-zero length');
      channels = data.channels.map((c) => c.slice());
      sampleRate = data.sampleRate;
    }
    checkRange('load.sampleRate', sampleRate, 1000, 768000);
    const sound: Sound = Object.freeze({
      id: this.nextSound++, channels: channels.length, sampleRate, frames: channels[0].length,
      duration: channels[0].length / sampleRate,
    });
    this.send({ type: 'add-sound', sound: sound.id, channels, sampleRate });
    this.loaded.set(sound.id, sound);
    return sound;
  }

  /** Frees a sound in the worklet; its voices stop. */
  unload(sound: Sound): void {
    this.alive('unload');
    this.loaded.delete(sound.id);
    this.send({ type: 'remove-sound', sound: sound.id });
  }

  /** Starts a voice; throws RalentiOptionError naming the bad option (unloaded sound, unknown group, range), and then starts nothing. */
  play(sound: Sound, options: RalentiPlayOptions = {}): RalentiVoice {
    this.alive('play');
    // By id (a rebuilt runtime reloads the same sounds under the same ids, e.g. the howler bridge), with the same shape.
    const known = this.loaded.get(sound?.id);
    if (!known || known.frames !== sound.frames || known.sampleRate !== sound.sampleRate) throw new RalentiOptionError('play.sound', 'not a loaded sound of this runtime (load() it first; unload() ends it)');
    const o: PlayOptions = checkPlayOptions(options, sound, this.current);
    const source = options.source ?? null;
    if (source) {
      if (!source.alive || !this.sources.has(source)) throw new RalentiOptionError('play.source', 'not a live source of this runtime');
      o.sourceId = source.id;
    }
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
    this.alive('pause');
    if (group !== undefined) this.groupControls.check('pause.group', group);
    else this.pauseClock.pause(this.context.currentTime);
    this.send({ type: 'pause', group });
  }

  /** Resumes the whole world (no group) or one group paused on its own; voices fade back in where they were. */
  resume(group?: string): void {
    this.alive('resume');
    if (group !== undefined) this.groupControls.check('resume.group', group);
    else this.pauseClock.resume(this.context.currentTime);
    this.send({ type: 'resume', group });
  }

  /** Whether a world pause holds `group` (default: yes, unless its policy is 'exempt'). */
  setGroupPausable(group: string, pausable: boolean): void {
    this.alive('setGroupPausable');
    this.groupControls.setPausable(group, pausable);
  }

  /** Sets a group's volume in dB (−120…24); glides with the tuning's gain smoothing. */
  setGroupVolume(group: string, db: Decibels): void {
    this.alive('setGroupVolume');
    this.groupControls.setVolume(group, db);
  }

  /** Mutes or unmutes a group (its voices go virtual and keep time). */
  setGroupMute(group: string, muted: boolean): void {
    this.alive('setGroupMute');
    this.groupControls.setMute(group, muted);
  }

  /** Solos or unsolos a group: while any group is soloed, only soloed groups are heard. */
  setGroupSolo(group: string, solo: boolean): void {
    this.alive('setGroupSolo');
    this.groupControls.setSolo(group, solo);
  }

  /** A group's bus state as set on this runtime: volume in dB, mute, solo. */
  getGroupState(group: string): GroupState {
    this.alive('getGroupState');
    return { ...this.groupControls.state(group) };
  }

  /**
   * The AudioNode carrying `group`'s own output (stereo, after its volume/mute/solo, before the master gain and
   * limiter): route it through your effects to a destination. Only groups named in createRalenti's groupOutputs.
   */
  groupOutput(group: string): AudioNode {
    this.alive('groupOutput');
    return this.groupControls.output(group);
  }

  /** A new positioned source; voices follow it via `play(sound, { source })`. */
  createSource(): RalentiSource {
    this.alive('createSource');
    const s = new RalentiSource(this.nextSource++, (source) => this.send({ type: 'teleport', source }));
    this.sources.add(s);
    s.onDispose = () => {
      this.sources.delete(s);
      this.registry.voiced.delete(s);
    };
    return s;
  }

  /** Sets the listener (copied); sent with the next update(). */
  setListener(l: RalentiListener): void {
    this.alive('setListener');
    copy(this.listener.position, l.position);
    copy(this.listener.forward, l.forward);
    copy(this.listener.up, l.up);
    if (l.velocity) this.listener.velocity = copy(this.listener.velocity ?? { x: 0, y: 0, z: 0 }, l.velocity);
    else delete this.listener.velocity;
  }

  /** Ramps the time scale to `target` (0…4); throws RalentiOptionError for bad values. */
  setTimeScale(target: number, options: TimeScaleOptions = {}): void {
    this.alive('setTimeScale');
    checkRange('setTimeScale.target', target, 0, MAX_TIME_SCALE);
    const now = this.context.currentTime;
    const tf = this.current.timeFlow;
    const rampSeconds = options.ramp ?? (target < this.flow.valueAt(now) ? tf.rampInSeconds : tf.rampOutSeconds);
    checkRange('setTimeScale.ramp', rampSeconds, 0, 60);
    const easing = options.easing ?? tf.easing;
    if (easing !== 'linear' && easing !== 'smooth' && easing !== 'exponential')
      throw new RalentiOptionError('setTimeScale.easing', `expected 'linear', 'smooth' or 'exponential', got ${String(easing)}`);
    const request = { target, rampSeconds, easing, startTime: now };
    this.flow.set({ ...request, startTime: this.pauseClock.requestTime(now, now) }, this.pauseClock.flowTime(now));
    this.send({ type: 'time-scale', request });
  }

  /** Validates and applies a tuning document; throws TuningError and keeps the running tuning on failure. */
  setTuning(json: unknown): Tuning {
    this.alive('setTuning');
    const t = parseTuning(json);
    this.current = t;
    const tier = t.resampler.tier;
    if (this.tableTiers !== null && !this.tableTiers.has(tier)) {
      // Designed here, off the audio thread; the worklet copies the layout in slices and switches when it is in.
      this.send({ type: 'tables', tables: [packKernelTable(tier, this.context.sampleRate, wasmSimdSupported())] });
      this.tableTiers.add(tier);
    }
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
    this.alive('update');
    const list = this.snapshot.sources;
    list.length = 0;
    const all = this.sources.size <= this.maxSources;
    const pool = all ? this.sources : this.registry.voiced;
    for (const s of pool) {
      if (s.spatialChanged) this.send({ type: 'source-spatial', source: s.id, spatial: s.takeSpatial() });
      if (list.length < this.maxSources) list.push(s.snapshotState());
    }
    this.sourcesLeftOut = this.sources.size - list.length;
    this.snapshot.time = time;
    this.encoded = encodeSnapshot(this.snapshot, this.encoded);
    this.send({ type: 'snapshot', data: this.encoded });
  }

  /** Resolves once the worklet has handled every command sent before this call; at once after dispose() or close. */
  flush(): Promise<void> {
    if (this.disposed || this.isClosed()) return Promise.resolve();
    const id = this.nextSync++;
    return new Promise((resolve) => {
      this.syncWaiters.set(id, resolve);
      this.send({ type: 'sync', id });
    });
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
    this.errorListeners.add(cb);
    return () => this.errorListeners.delete(cb);
  }

  /** Disconnects and closes the port; the runtime is unusable afterwards. */
  dispose(): void {
    if (this.disposed) return;
    this.send({ type: 'close' }); // the worklet disposes its engine (module memory back at once) and ends the processor
    this.disposed = true;
    try {
      this.node.disconnect();
    } catch {
      // Already disconnected or its context closed: nothing left to release.
    }
    this.node.port.onmessage = null;
    this.node.port.close();
    this.settleWaiters();
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
        this.emitError({ where: r.where, message: r.message, count: r.count });
        return;
      case 'voice-events':
        this.registry.receive(r);
        return;
      case 'synced': {
        const w = this.syncWaiters.get(r.id);
        this.syncWaiters.delete(r.id);
        w?.();
        return;
      }
      default:
        return;
    }
  }

  private readonly voiceHost: VoiceHandleHost = {
    now: () => this.context.currentTime,
    stop: (h: VoiceHandle, fade: Seconds | undefined) => {
      this.alive('stop');
      if (fade !== undefined) checkRange('stop.fade', fade, 0, 60);
      this.send({ type: 'stop', voice: h.id, fadeSeconds: fade });
    },
    seek: (h: VoiceHandle, seconds: Seconds) => {
      this.alive('seek');
      this.send({ type: 'seek', voice: h.id, seconds });
    },
    setGain: (h: VoiceHandle, db: Decibels) => {
      this.alive('setGain');
      this.send({ type: 'set-voice', voice: h.id, gain: Math.pow(10, checkRange('setGain.db', db, -120, 24) / 20) });
    },
    setRatio: (h: VoiceHandle, ratio: number) => {
      this.alive('setRatio');
      this.send({ type: 'set-voice', voice: h.id, ratio: checkRatio('setRatio.ratio', ratio) });
    },
  };

  private settleWaiters(): void {
    for (const resolve of this.syncWaiters.values()) resolve();
    this.syncWaiters.clear();
  }

  private isClosed(): boolean {
    if (!this.contextClosed && this.context.state === 'closed') this.contextClosed = true;
    return this.contextClosed;
  }

  private emitError(e: RalentiAudioError): void {
    for (const cb of this.errorListeners) cb(e);
  }

  private send(c: Command): void {
    if (this.disposed) return;
    this.node.port.postMessage(c, commandTransfer(c));
  }

  /** Throws RalentiClosedError naming call `what` after dispose() or once the context is closed. */
  private alive(what: string): void {
    if (this.disposed) throw new RalentiClosedError(what, 'disposed');
    if (this.isClosed()) throw new RalentiClosedError(what, 'closed');
  }
}

function checkRatio(field: string, ratio: number): number {
  checkRange(field, ratio, 0, 4);
  if (ratio <= 0) throw new RalentiOptionError(field, 'expected a ratio above 0');
  return ratio;
}

function copy(out: Vec3Like, v: Vec3Like): Vec3Like {
  out.x = v.x;
  out.y = v.y;
  out.z = v.z;
  return out;
}

function isAudioBuffer(d: SoundData): d is AudioBuffer {
  return typeof (d as AudioBuffer).getChannelData === 'function';
}
