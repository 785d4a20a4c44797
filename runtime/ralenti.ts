// The main-thread runtime: validates requests, keeps handles, and talks to the worklet over its port.
import type { Easing, EngineSnapshot, EngineStats, PlayOptions, Seconds, Tuning, Vec3Like, VoiceMonitor } from '../src/index';
import { parseTuning, MAX_TIME_SCALE } from '../src/tuning/index';
import { TimeFlow } from '../src/dilation/index';
import { packKernelTable, wasmSimdSupported } from '../src/dsp/index';
import { commandTransfer, encodeSnapshot, type Command, type RenderLoad, type Report } from './protocol';
import type { TableCounters } from './worklet/table-installer';
import { RalentiOptionError, checkRange } from './runtime-error';
import { RalentiSource } from './ralenti-source';

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

/** Play options on the main thread: the engine's PlayOptions, with a source object instead of its id. */
export type RalentiPlayOptions = Omit<PlayOptions, 'sourceId'> & { source?: RalentiSource };

/** A playing voice; every call is a message to the worklet. */
export interface RalentiVoice {
  /** Main-thread handle (VoiceMonitor.voice in `Ralenti.voices`). */
  readonly id: number;
  /** Stops the voice, fading out over `fadeSeconds` (default: a short click-free fade). */
  stop(fadeSeconds?: Seconds): void;
  /** Sets the linear gain, 0…16. */
  setGain(gain: number): void;
  /** Sets the base playback ratio, (0, 4]. */
  setRatio(ratio: number): void;
}

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
  private readonly flow = new TimeFlow({ initial: 1 });
  private readonly sources: RalentiSource[] = [];
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
    this.tableTiers = init.tableTiers === undefined ? null : new Set(init.tableTiers);
    this.snapshot = { time: 0, listener: this.listener, sources: [] };
    this.node.port.onmessage = (e: MessageEvent) => this.receive(e.data as Report);
    this.node.onprocessorerror = () => this.emitError({ where: 'processorerror', message: 'the processor failed and stopped', count: -1 });
  }

  /** The running tuning (validated). */
  get tuning(): Tuning {
    return this.current;
  }

  /** Time scale now, evaluated on the main thread from the same transition the worklet runs. */
  get timeScale(): number {
    return this.flow.valueAt(this.context.currentTime);
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
    return sound;
  }

  /** Frees a sound in the worklet; its voices stop. */
  unload(sound: Sound): void {
    this.send({ type: 'remove-sound', sound: sound.id });
  }

  /** Starts a voice; throws RalentiOptionError naming the bad option (the voice is then not started). */
  play(sound: Sound, options: RalentiPlayOptions = {}): RalentiVoice {
    this.alive('play');
    const { source, ...rest } = options;
    const o: PlayOptions = { ...rest };
    if (o.group !== undefined && !Object.prototype.hasOwnProperty.call(this.current.groups, o.group))
      throw new RalentiOptionError('play.group', `unknown group "${o.group}" (tuning has: ${Object.keys(this.current.groups).join(', ')})`);
    if (o.gain !== undefined) checkRange('play.gain', o.gain, 0, 16);
    if (o.ratio !== undefined) checkRatio('play.ratio', o.ratio);
    if (o.offsetSeconds !== undefined) checkRange('play.offsetSeconds', o.offsetSeconds, 0, sound.duration);
    if (o.fadeInSeconds !== undefined) checkRange('play.fadeInSeconds', o.fadeInSeconds, 0, 60);
    if (o.priority !== undefined) checkRange('play.priority', o.priority, 0, 255);
    if (o.loopStart !== undefined) checkRange('play.loopStart', o.loopStart, 0, sound.frames - 1);
    if (o.loopEnd !== undefined) checkRange('play.loopEnd', o.loopEnd, (o.loopStart ?? 0) + 1, sound.frames);
    if (source) {
      if (!source.alive || this.sources.indexOf(source) < 0) throw new RalentiOptionError('play.source', 'not a live source of this runtime');
      o.sourceId = source.id;
    }
    const id = this.nextVoice++;
    this.send({ type: 'play', voice: id, sound: sound.id, options: o });
    return {
      id,
      stop: (fadeSeconds?: Seconds) => {
        if (fadeSeconds !== undefined) checkRange('stop.fadeSeconds', fadeSeconds, 0, 60);
        this.send({ type: 'stop', voice: id, fadeSeconds });
      },
      setGain: (gain: number) => this.send({ type: 'set-voice', voice: id, gain: checkRange('setGain.gain', gain, 0, 16) }),
      setRatio: (ratio: number) => this.send({ type: 'set-voice', voice: id, ratio: checkRatio('setRatio.ratio', ratio) }),
    };
  }

  /** A new positioned source; voices follow it via `play(sound, { source })`. */
  createSource(): RalentiSource {
    const s = new RalentiSource(this.nextSource++, (source) => this.send({ type: 'teleport', source }));
    this.sources.push(s);
    return s;
  }

  /** Sets the listener (copied); sent with the next update(). */
  setListener(l: RalentiListener): void {
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
    this.flow.set(request, now);
    this.send({ type: 'time-scale', request });
  }

  /** Validates and applies a tuning document; throws TuningError and keeps the running tuning on failure. */
  setTuning(json: unknown): Tuning {
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

  /** Sends one gameplay snapshot (listener and live sources) stamped with `time` (context time, default now). */
  update(time: Seconds = this.context.currentTime): void {
    if (this.disposed) return;
    const list = this.snapshot.sources;
    list.length = 0;
    let w = 0;
    for (let i = 0; i < this.sources.length; i++) {
      const s = this.sources[i];
      if (!s.alive) continue;
      this.sources[w++] = s;
      list.push(s.snapshotState());
    }
    this.sources.length = w;
    this.snapshot.time = time;
    this.encoded = encodeSnapshot(this.snapshot, this.encoded);
    this.send({ type: 'snapshot', data: this.encoded });
  }

  /** Resolves once the worklet has handled every command sent before this call. */
  flush(): Promise<void> {
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
    this.disposed = true;
    try {
      this.node.disconnect();
    } catch {
      // Already disconnected or its context closed: nothing left to release.
    }
    this.node.port.onmessage = null;
    this.node.port.close();
    for (const resolve of this.syncWaiters.values()) resolve();
    this.syncWaiters.clear();
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

  private emitError(e: RalentiAudioError): void {
    for (const cb of this.errorListeners) cb(e);
  }

  private send(c: Command): void {
    if (this.disposed) return;
    this.node.port.postMessage(c, commandTransfer(c));
  }

  private alive(what: string): void {
    if (this.disposed) throw new RalentiOptionError(what, 'the runtime was disposed');
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
