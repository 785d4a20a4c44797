// Hosts one Engine behind the message protocol: decodes commands, maps handles, renders, reports stats and errors.
// Used by the AudioWorkletProcessor; free of worklet globals so that Node tests can drive it directly. Its parts live
// beside it: the render load (render-load.ts), the stats report (host-stats.ts), the close answer (close-report.ts),
// other channel counts (channel-fit.ts), handles (handle-book.ts), voice events (voice-event-relay.ts) and kernel
// tables (table-installer.ts); snapshots are decoded by SnapshotDecoder (../snapshot-codec.ts).
import { Engine } from '../../src/engine/index';
import { parseTuning } from '../../src/tuning/index';
import type { Seconds } from '../../src/index';
import { WasmKernel } from '../../src/dsp/index';
import { SnapshotDecoder } from '../snapshot-codec';
import { decodeCommand, type Command, type ProcessorOptions, type Report } from '../protocol';
import { VoiceEventRelay } from './voice-event-relay';
import { TableInstaller } from './table-installer';
import { HandleBook } from './handle-book';
import { HostStats } from './host-stats';
import { RenderLoadMeter, type RenderClock } from './render-load';
import { ChannelFit, silence } from './channel-fit';
import { ErrorReports, errorMessage } from './error-reports';
import { answerClose, kernelMemory } from './close-report';

export type { RenderClock } from './render-load';
export { errorMessage } from './error-reports';

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

/** One engine plus the main-thread ↔ engine handle maps; `process` never throws. */
export class EngineHost {
  /** The hosted engine. */
  readonly engine: Engine;
  /** Main-thread ↔ engine sound and voice handles. */
  readonly handles = new HandleBook();
  /** True after render threw; output stays silent until the next valid command. */
  faulted = false;
  private readonly post: (report: Report) => void;
  private readonly sampleRate: number;
  private readonly timeOffset: Seconds;
  /** Other channel counts than 2 go through its stereo scratch pair. */
  private readonly fit = new ChannelFit();
  private readonly statsIntervalFrames: number;
  private framesSinceStats = 0;
  private readonly errorReports: ErrorReports;
  /** engine.stats.errors already accounted for (the engine catches its own render exceptions and counts them). */
  private engineErrors = 0;
  /** Render load, timed by the host's clock (null without one: not measured). */
  private readonly load: RenderLoadMeter | null;
  private readonly hostStats: HostStats;
  private readonly relay: VoiceEventRelay;
  /** The node's routed group outputs of the current block (outputs 1…k; refilled each block, never reallocated). */
  private readonly routed: Float32Array[][];
  private readonly tables: TableInstaller;
  /** Snapshots are decoded into its one object (the engine copies the values and keeps no reference). */
  private readonly snapshots: SnapshotDecoder;

  constructor(options: EngineHostOptions) {
    const p = options.processorOptions;
    this.post = options.post;
    this.errorReports = new ErrorReports(this.post, () => this.engine.stats.errors);
    this.load = options.clock === undefined ? null : new RenderLoadMeter(options.clock);
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
    this.hostStats = new HostStats(this.engine, this.handles, p.capacity);
    this.snapshots = new SnapshotDecoder(p.maxSources ?? 256);
    const interval = Math.min(10, Math.max(0.05, Number(p.statsIntervalSeconds) || 0.25));
    this.statsIntervalFrames = Math.round(interval * options.sampleRate);
    this.post({ type: 'ready', sampleRate: options.sampleRate, capacity: p.capacity });
  }

  /** Errors caught by the host on the audio thread so far (the engine's own are in its stats). */
  get errors(): number {
    return this.errorReports.count;
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
    const load = this.load;
    const started = load === null ? 0 : load.clock.now();
    this.handleTimed(data);
    if (load !== null) load.addBusy(load.clock.now() - started); // message time is audio-thread time too
  }

  private handleTimed(data: unknown): void {
    const command = decodeCommand(data);
    if (typeof command === 'string') {
      this.errorReports.fail('command', command);
      return;
    }
    try {
      this.apply(command);
      this.faulted = false;
      this.engineErrors = this.engine.stats.errors;
    } catch (err) {
      this.errorReports.fail('command', `${command.type}: ${errorMessage(err)}`);
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
        // The command carries the change's fields itself (gain, ratio): no object is made for it.
        const v = this.handles.voiceOf(c.voice);
        if (v !== undefined) e.setVoice(v, c);
        return;
      }
      case 'snapshot': {
        const s = this.snapshots.decode(c.data, this.timeOffset);
        if (s) e.pushSnapshot(s);
        return;
      }
      case 'time-scale': {
        // The request is the message's own copy (structured clone): its start time moves to engine time in place.
        const r = c.request;
        if (r.startTime !== undefined) r.startTime = this.toEngineTime(r.startTime);
        e.setTimeScale(r);
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
      case 'close': {
        const kernel = WasmKernel.shared();
        const before = kernel?.bytesInUse ?? 0;
        const contextTime = this.timeOffset + e.time;
        this.dispose();
        answerClose(c.reply, { type: 'closed', contextTime, engineDisposed: e.disposed, kernel: kernelMemory(kernel, before) });
        return;
      }
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
    const load = this.load;
    const started = load === null ? 0 : load.clock.now();
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
        this.fit.render(this.engine, output, frames);
      }
      if (this.engine.stats.errors !== this.engineErrors) {
        // The engine caught an exception inside render (that block is already silent): report it and stay silent.
        this.engineErrors = this.engine.stats.errors;
        silence(output);
        this.faulted = true;
        this.errorReports.report('process', `the engine failed while rendering (${this.engineErrors} so far); silent until the next command`);
      }
    } catch (err) {
      silence(output);
      this.faulted = true;
      this.errorReports.fail('process', errorMessage(err));
    }
    this.hostStats.notePeaks();
    try {
      this.relay.flush(this.timeOffset + this.engine.time);
    } catch (err) {
      this.errorReports.fail('events', errorMessage(err));
    }
    this.framesSinceStats += frames;
    if (this.framesSinceStats >= this.statsIntervalFrames) {
      this.framesSinceStats = 0;
      this.errorReports.newInterval();
      this.sendStats();
    }
    if (load !== null) {
      // Timed after the stats so that their cost counts too (in the next report).
      load.addBusy(load.clock.now() - started);
      load.addAudio((1000 * frames) / this.sampleRate);
    }
    return true;
  }

  /** Posts the current stats and voice monitors now (nothing once disposed). */
  sendStats(): void {
    if (this.engine.disposed) return;
    try {
      const voices = this.hostStats.voices();
      this.relay.flush(this.timeOffset + this.engine.time, true);
      const stats = this.hostStats.take(this.errors, this.timeOffset);
      const load = this.load === null ? null : this.load.take();
      this.post({ type: 'stats', contextTime: this.timeOffset + this.engine.time, stats, voices, load, tables: this.tables.counters() });
    } catch (err) {
      this.errorReports.fail('stats', errorMessage(err));
    }
  }
}

const EMPTY: Float32Array[] = [];
