// Messages between the main thread and the worklet processor, over the AudioWorkletNode's MessagePort.
// Commands go main → worklet, reports come back; snapshots travel as flat Float64Arrays, copied by postMessage's
// structured clone (not transferred), so each side owns its own array.
import type { EngineStats, PlayOptions, Seconds, TimeScaleRequest, Tuning, VoiceMonitor } from '../src/index';
import { controlCommandChecks, type ControlCommand, type MessageFields, type ShapeCheck, type VoiceEventsReport } from './control-commands';
import { isPackedKernelTable, packedTransfer, type PackedKernelTable } from '../src/dsp/index';
import type { TableCounters } from './worklet/table-installer';
import { snapshotSourceCount } from './snapshot-codec';

export {
  SNAPSHOT_HEADER, SNAPSHOT_STRIDE, SNAPSHOT_VERSION, SnapshotDecoder, createSnapshot, decodeSnapshot, encodeSnapshot, snapshotLength, snapshotSourceCount,
} from './snapshot-codec';

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

/**
 * The node is being closed (Ralenti.dispose): the host disposes its engine, answers on `reply` with a ClosedReport, and
 * the processor ends. The reply has its own port because the node's port is closed right after this command is sent.
 */
export interface CloseCommand {
  type: 'close';
  /** Port for the one ClosedReport (transferred; closed by the audio thread once answered); absent: no answer. */
  reply?: MessagePort;
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

/** Module memory of the WebAssembly kernel in the audio thread's realm (shared by every engine of that realm), bytes. */
export interface KernelMemory {
  /** Handed out and not given back, after the close. */
  bytesInUse: number;
  /** Given back by this close (the engine's scratch, mix bus and resident sounds, and the tables installed for it). */
  bytesReleased: number;
  /** Size of the module memory (it never shrinks; what was released is reused by the next engine). */
  memoryBytes: number;
}
/** The audio thread's last word, on the close command's reply port: its engine is disposed and the processor ends. */
export interface ClosedReport {
  type: 'closed';
  /** Context time when the close was handled. */
  contextTime: Seconds;
  /** True when the engine was disposed by this close; false where the processor never built one (its construction failed). */
  engineDisposed: boolean;
  /** The kernel's module memory after the close; null where the engine ran the TypeScript kernel (or none was built). */
  kernel: KernelMemory | null;
}

/** Everything the worklet sends back. */
export type Report = ReadyReport | StatsReport | ErrorReport | SyncedReport | VoiceEventsReport;

/**
 * Transferables of a command, for postMessage's transfer list: a sound's channel buffers, packed kernel tables and the
 * close command's reply port, which the sender can no longer use once posted. A snapshot's array is not listed: it is cloned, so the sender may
 * reuse it for the next snapshot (Ralenti.update does).
 */
export function commandTransfer(command: Command): Transferable[] {
  if (command.type === 'add-sound') return command.channels.map((c) => c.buffer as ArrayBuffer);
  if (command.type === 'tables') return packedTransfer(command.tables);
  if (command.type === 'close' && command.reply !== undefined) return [command.reply];
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
  close: (d) => (d.reply === undefined || (isObject(d.reply) && typeof d.reply.postMessage === 'function') ? null : 'close.reply: expected a MessagePort'),
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
