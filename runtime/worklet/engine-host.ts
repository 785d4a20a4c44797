// Hosts one Engine behind the message protocol: decodes commands, maps handles, renders, reports stats and errors.
// Used by the AudioWorkletProcessor; free of worklet globals so that Node tests can drive it directly.
import { Engine } from '../../src/engine/index';
import { parseTuning } from '../../src/tuning/index';
import type { EngineStats, Seconds, VoiceMonitor } from '../../src/index';
import { WasmKernel } from '../../src/dsp/index';
import { decodeCommand, decodeSnapshot, type Command, type ProcessorOptions, type RenderLoad, type Report } from '../protocol';
import { VoiceEventRelay } from './voice-event-relay';
import { TableInstaller } from './table-installer';
import { HandleBook } from './handle-book';

/** A millisecond clock for timing process(), and its name (reported with the load). */
export interface RenderClock {
  /** 'performance.now' or 'Date.now'. */
  name: string;
  /** Current time in milliseconds (any origin). */
  now: () => number;
}

/** What the host needs from its surroundings. */
export interface EngineHostOptions {
  /** Output sample rate in Hz. */
  sampleRate: number;
  /** Context time when the host is created, in seconds (the engine clock starts at 0 there). */
  startContextTime: Seconds;
  processorOptions: ProcessorOptions;
  /** Sends a report to the main thread. */
  post: (report: Report) => void;
  /** Clock that times process() for the render load; absent: the load is reported as null (not measured). */
  clock?: RenderClock;
}

/** Error messages posted per stats interval at most. */
const MAX_ERROR_REPORTS = 4;
/** Voice monitors sent per stats report at most. */
const MAX_MONITORS = 64;
/** Time constant of the render-load average in seconds of audio: long enough to average Date.now's 1 ms steps. */
const LOAD_AVERAGE_SECONDS = 1;

/** One engine plus the main-thread ↔ engine handle maps; `process` never throws. */
export class EngineHost {
  /** The hosted engine. */
  readonly engine: Engine;
  /** Main-thread ↔ engine sound and voice handles. */
  readonly handles = new HandleBook();
  /** Errors caught on the audio thread so far. */
  errors = 0;
  /** True after render threw; output stays silent until the next valid command. */
  faulted = false;
  private readonly post: (report: Report) => void;
  private readonly sampleRate: number;
  private readonly timeOffset: Seconds;
  private readonly scratch: Float32Array[];
  private readonly monitors: VoiceMonitor[] = [];
  private readonly statsIntervalFrames: number;
  private framesSinceStats = 0;
  private reportedErrors = 0;
  /** engine.stats.errors already accounted for (the engine catches its own render exceptions and counts them). */
  private engineErrors = 0;
  private readonly clock: RenderClock | null;
  /** Milliseconds in process() and of audio rendered since the last stats report. */
  private busyMs = 0;
  private audioMs = 0;
  /** Exponentially weighted sums of the same (time constant LOAD_AVERAGE_SECONDS); their ratio is the load. */
  private busyAvgMs = 0;
  private audioAvgMs = 0;
  /** Largest peakIn / peakOut of every render since the last stats report (the engine resets its own per call). */
  private intervalPeakIn = 0;
  private intervalPeakOut = 0;
  private readonly relay: VoiceEventRelay;
  /** The node's routed group outputs of the current block (outputs 1…k; refilled each block, never reallocated). */
  private readonly routed: Float32Array[][];
  /** Longest single call (process or message) since the last stats report, ms. */
  private peakMs = 0;
  private readonly tables: TableInstaller;

  constructor(options: EngineHostOptions) {
    const p = options.processorOptions;
    this.post = options.post;
    this.clock = options.clock ?? null;
    this.sampleRate = options.sampleRate;
    this.timeOffset = options.startContextTime;
    // Tables designed on the main thread: the tuning's tier is installed here, before any audio; others follow in slices.
    this.tables = new TableInstaller(WasmKernel.shared());
    const tables = Array.isArray(p.tables) ? this.tables.receive(p.tables, true) : undefined;
    this.engine = new Engine({
      sampleRate: options.sampleRate, capacity: p.capacity, maxSounds: p.maxSounds, tuning: p.tuning, tables, seed: p.seed,
      maxSources: p.maxSources, groupOutputs: p.groupOutputs,
    });
    this.routed = (p.groupOutputs ?? []).map(() => []);
    this.relay = new VoiceEventRelay(this.engine, this.handles, this.post);
    this.scratch = [new Float32Array(128), new Float32Array(128)];
    for (let i = 0; i < p.capacity; i++) this.monitors.push(emptyMonitor());
    const interval = Math.min(10, Math.max(0.05, Number(p.statsIntervalSeconds) || 0.25));
    this.statsIntervalFrames = Math.round(interval * options.sampleRate);
    this.post({ type: 'ready', sampleRate: options.sampleRate, capacity: p.capacity });
  }

  /** Main-thread voice handles currently mapped to engine voices. */
  get mappedVoices(): number {
    return this.handles.voiceCount;
  }

  /** True after `dispose()` (the node was closed): process() outputs silence and returns false. */
  get disposed(): boolean {
    return this.engine.disposed;
  }

  /**
   * Ends the host (its node was closed): disposes the engine (its module memory goes back at once), drops the kernel
   * tables installed for it and forgets every handle; idempotent. Later messages are ignored.
   */
  dispose(): void {
    if (this.engine.disposed) return;
    this.engine.dispose();
    this.tables.dispose();
    this.handles.clear();
  }

  /** Context time → engine time: the engine clock started at the host's creation. */
  toEngineTime(contextTime: Seconds): Seconds {
    return contextTime - this.timeOffset;
  }

  /** Handles one message from the port; malformed or failing commands are reported, never thrown. */
  handle(data: unknown): void {
    if (this.engine.disposed) return;
    const started = this.clock ? this.clock.now() : 0;
    this.handleTimed(data);
    if (this.clock) this.addBusy(this.clock.now() - started); // message time is audio-thread time too
  }

  private handleTimed(data: unknown): void {
    const command = decodeCommand(data);
    if (typeof command === 'string') {
      this.fail('command', command);
      return;
    }
    try {
      this.apply(command);
      this.faulted = false;
      this.engineErrors = this.engine.stats.errors;
    } catch (err) {
      this.fail('command', `${command.type}: ${errorMessage(err)}`);
    }
  }

  private apply(c: Command): void {
    const e = this.engine;
    switch (c.type) {
      case 'add-sound': {
        const old = this.handles.unbindSound(c.sound);
        if (old !== undefined) e.removeSound(old);
        const id = e.addSound(c.channels, c.sampleRate);
        if (id < 0) throw new Error('no free sound slot');
        this.handles.bindSound(c.sound, id);
        return;
      }
      case 'remove-sound': {
        const id = this.handles.unbindSound(c.sound);
        if (id !== undefined) e.removeSound(id);
        return;
      }
      case 'play': {
        const id = this.handles.soundOf(c.sound);
        if (id === undefined) throw new Error(`unknown sound ${c.sound}`);
        const v = e.play(id, c.options);
        if (v >= 0) this.handles.bindVoice(c.voice, v);
        else this.relay.refuse(c.voice);
        return;
      }
      case 'stop': {
        const v = this.handles.voiceOf(c.voice);
        if (v === undefined) return;
        // The handle stays mapped until the engine reports the voice ended (after its fade).
        e.stop(v, c.fadeSeconds);
        return;
      }
      case 'set-voice': {
        const v = this.handles.voiceOf(c.voice);
        if (v !== undefined) e.setVoice(v, { gain: c.gain, ratio: c.ratio });
        return;
      }
      case 'snapshot': {
        const s = decodeSnapshot(c.data, this.timeOffset);
        if (s) e.pushSnapshot(s);
        return;
      }
      case 'time-scale': {
        const r = c.request;
        const startTime = r.startTime === undefined ? undefined : this.toEngineTime(r.startTime);
        e.setTimeScale({ target: r.target, rampSeconds: r.rampSeconds, easing: r.easing, startTime });
        return;
      }
      case 'tuning':
        // Validated again here: a malformed document must be refused whole, not half-applied to the engine.
        e.setTuning(parseTuning(c.tuning));
        return;
      case 'tables': {
        const ready = this.tables.receive(c.tables, false);
        if (ready.length > 0) e.useTables(ready);
        return;
      }
      case 'sync':
        this.relay.flush(this.timeOffset + e.time, true);
        this.post({ type: 'synced', id: c.id, contextTime: this.timeOffset + e.time });
        return;
      case 'teleport':
        e.teleport(c.source);
        return;
      case 'close':
        this.dispose();
        return;
      default:
        this.relay.apply(c);
        return;
    }
  }

  /**
   * Renders one block into `output` (the node's first output, one Float32Array per channel).
   * Never throws: on failure the block is silent, the error counted and reported. Returns true (keep alive), false once disposed.
   */
  process(output: Float32Array[] | undefined, all?: Float32Array[][]): boolean {
    if (this.engine.disposed) {
      if (output) silence(output);
      if (all) for (let k = 1; k < all.length; k++) silence(all[k]);
      return false; // the node was closed: let the processor go
    }
    if (!output || output.length === 0) return true;
    for (let k = 0; k < this.routed.length; k++) this.routed[k] = all?.[k + 1] ?? EMPTY;
    const started = this.clock ? this.clock.now() : 0;
    const frames = output[0].length;
    try {
      if (this.tables.installing > 0) {
        const done = this.tables.step();
        if (done !== null) this.engine.useTables([done]);
      }
      if (this.faulted) {
        silence(output);
      } else if (output.length === 2) {
        this.engine.render(output, frames, this.routed);
      } else {
        this.renderVia(output, frames);
      }
      if (this.engine.stats.errors !== this.engineErrors) {
        // The engine caught an exception inside render (that block is already silent): report it and stay silent.
        this.engineErrors = this.engine.stats.errors;
        silence(output);
        this.faulted = true;
        this.report('process', `the engine failed while rendering (${this.engineErrors} so far); silent until the next command`);
      }
    } catch (err) {
      silence(output);
      this.faulted = true;
      this.fail('process', errorMessage(err));
    }
    const st = this.engine.stats;
    if (st.peakIn > this.intervalPeakIn) this.intervalPeakIn = st.peakIn;
    if (st.peakOut > this.intervalPeakOut) this.intervalPeakOut = st.peakOut;
    try {
      this.relay.flush(this.timeOffset + this.engine.time);
    } catch (err) {
      this.fail('events', errorMessage(err));
    }
    this.framesSinceStats += frames;
    if (this.framesSinceStats >= this.statsIntervalFrames) {
      this.framesSinceStats = 0;
      this.reportedErrors = 0;
      this.sendStats();
    }
    if (this.clock) {
      // Timed after the stats so that their cost counts too (in the next report).
      this.addBusy(this.clock.now() - started);
      this.audioMs += (1000 * frames) / this.sampleRate;
    }
    return true;
  }

  private addBusy(elapsed: number): void {
    if (!(elapsed > 0 && elapsed < 1e4)) return; // a clock step backwards or a huge jump is not render time
    this.busyMs += elapsed;
    if (elapsed > this.peakMs) this.peakMs = elapsed;
  }

  /** Folds the time since the last report into the running average; null without a clock or before any audio. */
  private renderLoad(): RenderLoad | null {
    if (!this.clock || this.audioMs <= 0) return null;
    const keep = Math.exp(-this.audioMs / (1000 * LOAD_AVERAGE_SECONDS));
    this.busyAvgMs = this.busyAvgMs * keep + this.busyMs;
    this.audioAvgMs = this.audioAvgMs * keep + this.audioMs;
    this.busyMs = 0;
    this.audioMs = 0;
    const peakMs = this.peakMs;
    this.peakMs = 0;
    return { fraction: this.busyAvgMs / this.audioAvgMs, clock: this.clock.name, averageSeconds: LOAD_AVERAGE_SECONDS, peakMs };
  }

  /** Renders through the stereo scratch pair when the node has a channel count other than 2 (no allocation). */
  private renderVia(output: Float32Array[], frames: number): void {
    const s = this.scratch;
    if (s[0].length < frames) throw new Error(`block of ${frames} frames exceeds 128`);
    this.engine.render(s, frames);
    const l = s[0];
    const r = s[1];
    if (output.length === 1) for (let i = 0; i < frames; i++) output[0][i] = 0.5 * (l[i] + r[i]);
    else {
      for (let i = 0; i < frames; i++) {
        output[0][i] = l[i];
        output[1][i] = r[i];
      }
      for (let c = 2; c < output.length; c++) output[c].fill(0);
    }
  }

  /** Posts the current stats and voice monitors now (nothing once disposed). */
  sendStats(): void {
    if (this.engine.disposed) return;
    try {
      const count = this.engine.monitor(this.monitors);
      const voices: VoiceMonitor[] = [];
      for (let i = 0; i < count && voices.length < MAX_MONITORS; i++) {
        const m = this.monitors[i];
        voices.push({ ...m, voice: this.handles.ownerOf(m.voice) ?? -1 });
      }
      this.relay.flush(this.timeOffset + this.engine.time, true);
      // Peaks over the whole report interval (true peak of every sample since the last report), not the last block's;
      // the last shockwave's time goes out in context time, as every time the main thread sees.
      const st = this.engine.stats;
      const stats: EngineStats = {
        ...st, errors: st.errors + this.errors, lastShockwaveTime: this.timeOffset + st.lastShockwaveTime, peakIn: this.intervalPeakIn, peakOut: this.intervalPeakOut,
      };
      this.intervalPeakIn = 0;
      this.intervalPeakOut = 0;
      this.post({ type: 'stats', contextTime: this.timeOffset + this.engine.time, stats, voices, load: this.renderLoad(), tables: this.tables.counters() });
    } catch (err) {
      this.fail('stats', errorMessage(err));
    }
  }

  private fail(where: string, message: string): void {
    this.errors += 1;
    this.report(where, message);
  }

  /** Posts an error already counted (in `errors` or the engine's stats). */
  private report(where: string, message: string): void {
    // At most a few messages per stats interval; the count in the stats carries the rest.
    if (this.reportedErrors < MAX_ERROR_REPORTS) {
      this.reportedErrors += 1;
      this.post({ type: 'error', where, message, count: this.errors + this.engine.stats.errors });
    }
  }
}

const EMPTY: Float32Array[] = [];

function silence(output: Float32Array[]): void {
  for (const ch of output) ch.fill(0);
}

/** The message of a thrown value (an Error's message, else its string form). */
export function errorMessage(err: unknown): string {
  return err instanceof Error ? err.message : String(err);
}

function emptyMonitor(): VoiceMonitor {
  return { voice: -1, sourceId: -1, group: '', ratioCents: 0, dopplerCents: 0, radialSpeed: 0, distance: 0, cutoffHz: 0, gainDb: 0, virtual: false };
}
