// Messages between the main thread and the worklet processor, over the AudioWorkletNode's MessagePort.
// Commands go main → worklet, reports come back; snapshots travel as flat Float64Arrays, copied by postMessage's
// structured clone (not transferred), so each side owns its own array.
import type {
  EngineSnapshot,
  EngineStats,
  PlayOptions,
  Seconds,
  SourceState,
  TimeScaleRequest,
  Tuning,
  VoiceMonitor,
} from '../src/index';
import { controlCommandChecks, type ControlCommand, type MessageFields, type ShapeCheck, type VoiceEventsReport } from './control-commands';
import { isPackedKernelTable, packedTransfer, type PackedKernelTable } from '../src/dsp/index';
import type { TableCounters } from './worklet/table-installer';

/** Name the processor is registered under. */
export const PROCESSOR_NAME = 'ralenti-processor';

/** Options handed to the processor's constructor through AudioWorkletNodeOptions.processorOptions. */
export interface ProcessorOptions {
  /** Voice pool size, 1…1024. */
  capacity: number;
  /** Sound slots, 1…4096. */
  maxSounds: number;
  /** A tuning already validated on the main thread. */
  tuning: Tuning;
  /** Interval between stats reports in seconds of rendered audio (0.05…10). */
  statsIntervalSeconds: Seconds;
  /** Seed of the per-play variation draws (a 32-bit integer; default 1). */
  seed?: number;
  /** Source slots of the engine (1…4096; default 256). */
  maxSources?: number;
  /** Groups with their own output (node outputs 1…k, stereo), at most 8. */
  groupOutputs?: string[];
  /** Kernel tables for the context's rate designed on the main thread (the tuning's tier with its WebAssembly layout, or every tier's samples where there is no SIMD); absent: the audio thread designs its own. */
  tables?: PackedKernelTable[];
}

/** Upload a decoded sound; the channel buffers are transferred, not copied. */
export interface AddSoundCommand {
  type: 'add-sound';
  /** Main-thread sound handle. */
  sound: number;
  channels: Float32Array[];
  sampleRate: number;
}
/** Drop a sound; voices still playing it stop. */
export interface RemoveSoundCommand {
  type: 'remove-sound';
  sound: number;
}
/** Start a voice; `voice` is a main-thread handle chosen by the sender. */
export interface PlayCommand {
  type: 'play';
  voice: number;
  sound: number;
  options: PlayOptions;
}
/** Stop a voice, optionally with a fade. */
export interface StopCommand {
  type: 'stop';
  voice: number;
  fadeSeconds?: Seconds;
}
/** Change a voice's gain and/or base ratio. */
export interface SetVoiceCommand {
  type: 'set-voice';
  voice: number;
  gain?: number;
  ratio?: number;
}
/**
 * One gameplay snapshot, encoded by encodeSnapshot. Its time is on the sender's clock (any one, used consistently: the
 * engine uses only differences between snapshot times). The array is cloned on posting, so the sender may overwrite it.
 */
export interface SnapshotCommand {
  type: 'snapshot';
  data: Float64Array;
}
/** Ramp the time scale; request.startTime, when present, is context time. */
export interface TimeScaleCommand {
  type: 'time-scale';
  request: TimeScaleRequest;
}
/** Replace the tuning (already validated on the main thread). */
export interface TuningCommand {
  type: 'tuning';
  tuning: Tuning;
}
/** Kernel tables designed on the main thread (buffers transferred); their WebAssembly layouts are copied in a slice per render quantum, and a tier waiting for its table switches once it is in. */
export interface TablesCommand {
  type: 'tables';
  tables: PackedKernelTable[];
}
/** Declare that a source jumps: its next snapshot restarts its track (no Doppler sweep across the jump). */
export interface TeleportCommand {
  type: 'teleport';
  source: number;
}
/** Ask for a 'synced' report once every earlier command has been handled. */
export interface SyncCommand {
  type: 'sync';
  id: number;
}

/** The node is being closed (Ralenti.dispose): the host disposes its engine and the processor ends. */
export interface CloseCommand {
  type: 'close';
}

/** Everything the main thread sends. */
export type Command =
  | CloseCommand
  | AddSoundCommand
  | RemoveSoundCommand
  | PlayCommand
  | StopCommand
  | SetVoiceCommand
  | SnapshotCommand
  | TimeScaleCommand
  | TuningCommand
  | TablesCommand
  | TeleportCommand
  | SyncCommand
  | ControlCommand;

/** The processor is constructed and its engine is running. */
export interface ReadyReport {
  type: 'ready';
  sampleRate: number;
  capacity: number;
}
/** Share of the audio time the audio thread spent in the processor's process(), as the host measured it. */
export interface RenderLoad {
  /** Time in process() ÷ audio time rendered, averaged over about `averageSeconds`; 0…, above 1 the thread falls behind. */
  fraction: number;
  /** Clock that timed it: 'performance.now' (sub-millisecond), or 'Date.now' (1 ms steps: right only as an average over many blocks). */
  clock: string;
  /** Time constant of the running average in seconds of audio (1). */
  averageSeconds: Seconds;
  /** Longest single call on the audio thread since the last report (one process() or one message), ms; absent from older hosts. */
  peakMs?: number;
}
/** Periodic counters and voice monitors; VoiceMonitor.voice holds main-thread voice handles (−1 if unknown). */
export interface StatsReport {
  type: 'stats';
  /** Context time at the end of the reported render quantum. */
  contextTime: Seconds;
  stats: EngineStats;
  voices: VoiceMonitor[];
  /** Render load; null or absent where the host has no clock (or has not rendered yet). */
  load?: RenderLoad | null;
  /** Kernel-table work done on the audio thread so far; absent from older hosts. */
  tables?: TableCounters;
}
/** Something failed on the audio thread; it was caught, counted and the output kept safe. */
export interface ErrorReport {
  type: 'error';
  /** Where it happened: 'process', 'command', 'construct'. */
  where: string;
  message: string;
  /** Errors counted so far on the audio thread. */
  count: number;
}
/** Answer to a SyncCommand. */
export interface SyncedReport {
  type: 'synced';
  id: number;
  contextTime: Seconds;
}

/** Everything the worklet sends back. */
export type Report = ReadyReport | StatsReport | ErrorReport | SyncedReport | VoiceEventsReport;

/**
 * Transferable buffers of a command, for postMessage's transfer list: a sound's channel buffers and packed kernel tables,
 * which the sender can no longer read once posted. A snapshot's array is not listed: it is cloned, so the sender may
 * reuse it for the next snapshot (Ralenti.update does).
 */
export function commandTransfer(command: Command): Transferable[] {
  if (command.type === 'add-sound') return command.channels.map((c) => c.buffer as ArrayBuffer);
  if (command.type === 'tables') return packedTransfer(command.tables);
  return [];
}

const isObject = (v: unknown): v is MessageFields => typeof v === 'object' && v !== null;
const isHandle = (v: unknown): v is number => typeof v === 'number' && Number.isInteger(v) && v >= 0;
const isOptionalNumber = (v: unknown): boolean => v === undefined || typeof v === 'number';

/** Command types, the key of every per-type table of the protocol. */
export type CommandType = Command['type'];

/** Shape checks of every command, one per type: a new command without a check does not compile. */
const commandChecks: { readonly [K in CommandType]: ShapeCheck } = {
  'add-sound': (d) => {
    const ch = d.channels;
    if (!isHandle(d.sound)) return 'add-sound.sound: expected a handle';
    if (!Array.isArray(ch) || ch.length < 1 || ch.length > 2 || !ch.every((c) => c instanceof Float32Array))
      return 'add-sound.channels: expected 1 or 2 Float32Arrays';
    if (ch.some((c) => c.length !== ch[0].length || c.length === 0)) return 'add-sound.channels: expected equal non-zero lengths';
    if (typeof d.sampleRate !== 'number' || !(d.sampleRate >= 1000 && d.sampleRate <= 768000)) return 'add-sound.sampleRate: expected 1000…768000 Hz';
    return null;
  },
  'remove-sound': (d) => (isHandle(d.sound) ? null : 'remove-sound.sound: expected a handle'),
  play: (d) => {
    if (!isHandle(d.voice)) return 'play.voice: expected a handle';
    if (!isHandle(d.sound)) return 'play.sound: expected a handle';
    return isObject(d.options) ? null : 'play.options: expected an object';
  },
  stop: (d) => {
    if (!isHandle(d.voice)) return 'stop.voice: expected a handle';
    return isOptionalNumber(d.fadeSeconds) ? null : 'stop.fadeSeconds: expected a number';
  },
  'set-voice': (d) => {
    if (!isHandle(d.voice)) return 'set-voice.voice: expected a handle';
    if (!isOptionalNumber(d.gain)) return 'set-voice.gain: expected a number';
    return isOptionalNumber(d.ratio) ? null : 'set-voice.ratio: expected a number';
  },
  snapshot: (d) => {
    if (!(d.data instanceof Float64Array)) return 'snapshot.data: expected a Float64Array';
    return snapshotSourceCount(d.data) < 0 ? 'snapshot.data: malformed encoding' : null;
  },
  'time-scale': (d) => {
    const r = d.request;
    if (!isObject(r) || typeof r.target !== 'number' || typeof r.rampSeconds !== 'number' || typeof r.easing !== 'string')
      return 'time-scale.request: expected { target, rampSeconds, easing }';
    return isOptionalNumber(r.startTime) ? null : 'time-scale.request.startTime: expected a number';
  },
  tuning: (d) => (isObject(d.tuning) ? null : 'tuning.tuning: expected an object'),
  tables: (d) => (Array.isArray(d.tables) && d.tables.every(isPackedKernelTable) ? null : 'tables.tables: expected packed kernel tables'),
  sync: (d) => (isHandle(d.id) ? null : 'sync.id: expected a handle'),
  close: () => null,
  teleport: (d) => (typeof d.source === 'number' && Number.isFinite(d.source) ? null : 'teleport.source: expected a source id'),
  ...controlCommandChecks,
};

const isCommandType = (t: string): t is CommandType => Object.prototype.hasOwnProperty.call(commandChecks, t);

/**
 * Marks `d` as the command its type names, once that type's check found nothing wrong (`problem` null). The compiler
 * cannot derive an interface from run-time checks, so this assertion is where a checked message becomes a Command;
 * `commandChecks` holds what it rests on.
 */
function checked(d: MessageFields, problem: null): asserts d is MessageFields & Command {
  void problem;
}

/**
 * Checks the shape of a received command; returns it typed (the same object), or a message saying what is wrong.
 * Values inside (gains, ratios, times) are range-checked by the engine, which clamps and counts.
 */
export function decodeCommand(data: unknown): Command | string {
  if (!isObject(data) || typeof data.type !== 'string') return 'command: expected an object with a string "type"';
  const type = data.type;
  if (!isCommandType(type)) return `command: unknown type "${type}"`;
  const problem = commandChecks[type](data);
  if (problem !== null) return problem;
  checked(data, problem);
  return data;
}

/** Encoding version stored in the first slot of a snapshot. */
export const SNAPSHOT_VERSION = 1;
/** Slots before the first source: version, time, listener position, forward, up, has-velocity, velocity, count. */
export const SNAPSHOT_HEADER = 16;
/** Slots per source: id, position, has-velocity, velocity. */
export const SNAPSHOT_STRIDE = 8;

/** Number of sources in an encoded snapshot, or −1 if the encoding is malformed. */
export function snapshotSourceCount(data: Float64Array): number {
  if (data.length < SNAPSHOT_HEADER || data[0] !== SNAPSHOT_VERSION) return -1;
  const n = data[15];
  if (!Number.isInteger(n) || n < 0 || data.length < SNAPSHOT_HEADER + n * SNAPSHOT_STRIDE) return -1;
  return n;
}

/** Floats needed to encode a snapshot of `sources` sources. */
export function snapshotLength(sources: number): number {
  return SNAPSHOT_HEADER + sources * SNAPSHOT_STRIDE;
}

/** Encodes a snapshot into `out` (allocated when absent or too short); returns the array written. */
export function encodeSnapshot(s: EngineSnapshot, out?: Float64Array): Float64Array {
  const n = s.sources.length;
  const d = out && out.length >= snapshotLength(n) ? out : new Float64Array(snapshotLength(n));
  const l = s.listener;
  d[0] = SNAPSHOT_VERSION;
  d[1] = s.time;
  d[2] = l.position.x; d[3] = l.position.y; d[4] = l.position.z;
  d[5] = l.forward.x; d[6] = l.forward.y; d[7] = l.forward.z;
  d[8] = l.up.x; d[9] = l.up.y; d[10] = l.up.z;
  d[11] = l.velocity ? 1 : 0;
  d[12] = l.velocity ? l.velocity.x : 0; d[13] = l.velocity ? l.velocity.y : 0; d[14] = l.velocity ? l.velocity.z : 0;
  d[15] = n;
  for (let i = 0; i < n; i++) {
    const src = s.sources[i];
    const o = SNAPSHOT_HEADER + i * SNAPSHOT_STRIDE;
    d[o] = src.id;
    d[o + 1] = src.position.x; d[o + 2] = src.position.y; d[o + 3] = src.position.z;
    d[o + 4] = src.velocity ? 1 : 0;
    d[o + 5] = src.velocity ? src.velocity.x : 0; d[o + 6] = src.velocity ? src.velocity.y : 0; d[o + 7] = src.velocity ? src.velocity.z : 0;
  }
  return d;
}

const vec = () => ({ x: 0, y: 0, z: 0 });

/** A fresh snapshot object for decodeSnapshot to fill. */
export function createSnapshot(): EngineSnapshot {
  return { time: 0, listener: { position: vec(), forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } }, sources: [] };
}

/**
 * Decodes into a fresh snapshot object (nothing shared with earlier results); null for a malformed encoding.
 * Engine.pushSnapshot copies the values it needs and keeps no reference to the object, so the receiver owns it
 * afterwards. `timeOffset` is subtracted from the time (sender's clock → engine time).
 */
export function decodeSnapshot(d: Float64Array, timeOffset: Seconds = 0): EngineSnapshot | null {
  const n = snapshotSourceCount(d);
  if (n < 0) return null;
  const s = createSnapshot();
  s.time = d[1] - timeOffset;
  const l = s.listener;
  l.position.x = d[2]; l.position.y = d[3]; l.position.z = d[4];
  l.forward.x = d[5]; l.forward.y = d[6]; l.forward.z = d[7];
  l.up.x = d[8]; l.up.y = d[9]; l.up.z = d[10];
  if (d[11] === 1) l.velocity = { x: d[12], y: d[13], z: d[14] };
  for (let i = 0; i < n; i++) {
    const o = SNAPSHOT_HEADER + i * SNAPSHOT_STRIDE;
    const src: SourceState = { id: d[o], position: { x: d[o + 1], y: d[o + 2], z: d[o + 3] } };
    if (d[o + 4] === 1) src.velocity = { x: d[o + 5], y: d[o + 6], z: d[o + 7] };
    s.sources.push(src);
  }
  return s;
}
