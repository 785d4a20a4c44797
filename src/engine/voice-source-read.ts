// The source-read stage of a voice: where its read head is in the sound (the StreamReader's cursor and loop, or a
// 'stretch' group's stage), and a propagating voice's delay — silent until the sound arrives, then started so that
// its first frame plays at the arrival sample (retarded time, docs/physics.md).
import { StreamReader, type KernelPreference, type KernelTable, type StreamSourceOptions } from '../dsp';
import type { Hz, Seconds } from '../units';
import { EMISSION_NONE, type EmissionSolution } from './emission-solver';
import type { StretchStage } from './stretch-stage';

/** A voice's read head and propagation arrival; allocation-free per block. */
export class SourceRead {
  /** The band-limited reader (2 channels) over the voice's sound. */
  readonly reader: StreamReader;
  /** The time-stretch stage reading in place of `reader` ('stretch' groups), or null (tape-style). */
  stretch: StretchStage | null = null;
  /** Propagation model: the read follows the emission time (delay and emission-time Doppler). */
  propagating = false;
  /** Whether the sound has reached the listener (a propagating voice is silent and holds until it does). */
  arrived = true;
  /** Engine time the voice started (its sound's emission began), s. */
  startTime: Seconds = 0.5;
  /** Frames of the arrival block before the sound arrives (consumed by the next `arrive`). */
  private arrivalFrames = 0;
  /** Emission frames the arrival jumped over (a Mach cone; consumed by the next `arrive`). */
  private arrivalSkipFrames = 0.5;

  /** A reader of 2 channels over `table` with the `kernel` preference. */
  constructor(table: KernelTable, kernel: KernelPreference) {
    this.reader = new StreamReader({ table, channels: 2, kernel });
    this.startTime = 0;
    this.arrivalSkipFrames = 0;
  }

  /** Starts reading `channels` as `from` says; a propagating voice started at `startTime` (s) waits for its sound. */
  start(channels: readonly Float32Array[], from: StreamSourceOptions, propagating: boolean, startTime: Seconds): void {
    this.propagating = propagating;
    this.arrived = !propagating;
    this.startTime = startTime;
    this.arrivalFrames = 0;
    this.arrivalSkipFrames = 0;
    this.reader.setSource(channels, from);
    this.stretch = null;
  }

  /** Reads through a time-stretch stage from now on, started on `channels` as `from` says. */
  readThrough(stage: StretchStage, channels: readonly Float32Array[], from: StreamSourceOptions): void {
    this.stretch = stage;
    stage.start(channels, from);
  }

  /** Switches the motion model mid-voice: the read goes on from where it is (no new delay). */
  setPropagating(propagating: boolean): void {
    this.propagating = propagating;
    this.arrived = true;
  }

  /** The sound reaches the listener `frames` into the next block, having jumped `skipFrames` of emission (a Mach cone). */
  arriveAt(frames: number, skipFrames: number): void {
    this.arrived = true;
    this.arrivalFrames = frames;
    this.arrivalSkipFrames = skipFrames;
  }

  /** A voice whose source never appears in the snapshots plays, not positioned, once `waitSeconds` have passed since its start (engine time `now`, s). */
  waitForSource(now: Seconds, waitSeconds: Seconds): void {
    if (!this.arrived && now - this.startTime >= waitSeconds) this.arrived = true;
  }

  /**
   * The sound arrives when the emission time `sol.tau` at the end of the block starting at engine time `now` (s) passes
   * the voice's start: at the sample where the emission time crosses it (interpolated from `pre`, the block's start), or
   * for a Mach cone at the cone's estimated arrival, skipping the emission it jumped over.
   */
  arriveFrom(pre: EmissionSolution, sol: EmissionSolution, n: number, now: Seconds, sampleRate: Hz): void {
    const start = this.startTime;
    if (this.arrived || sol.state === EMISSION_NONE || sol.tau < start) return;
    const span = sol.tau - pre.tau;
    const block = n / sampleRate;
    if (pre.state !== EMISSION_NONE && pre.tau < start && span > 0 && span < 8 * block) {
      const k = Math.floor((n * (start - pre.tau)) / span);
      this.arriveAt(k < 0 ? 0 : k >= n ? n - 1 : k, 0);
    } else {
      const k = Math.floor((sol.coneTime - now) * sampleRate);
      this.arriveAt(k > 0 ? (k < n ? k : n - 1) : 0, sol.tau - start > block ? (sol.tau - start) * sampleRate : 0);
    }
  }

  /** Frames at the start of this block before the sound arrives (0 once it has). */
  get silentFrames(): number {
    return this.arrivalFrames;
  }

  /** In the block the sound arrives: moves the read so that its first frame plays at the arrival sample (`ratios`: the block's per-sample ratios). */
  arrive(ratios: Float32Array): void {
    const reader = this.reader;
    if (this.arrivalFrames > 0) {
      let early = 0;
      for (let i = 0; i < this.arrivalFrames; i++) early += ratios[i];
      reader.position = reader.position - early;
      this.arrivalFrames = 0;
    }
    if (this.arrivalSkipFrames > 0) {
      reader.position = reader.position + this.arrivalSkipFrames * ratios[0];
      this.arrivalSkipFrames = 0;
    }
  }

  /** Read position in source frames (the stretch stage's when it reads). */
  get position(): number {
    return this.stretch !== null ? this.stretch.reader.position : this.reader.position;
  }

  /** Moves the read head to `frame` (source frames), in the stretch stage too. */
  seek(frame: number): void {
    this.reader.position = frame;
    if (this.stretch !== null) this.stretch.reader.seek(frame);
  }

  /** Whether a one-shot read has passed the sound's end. */
  get finished(): boolean {
    return this.stretch !== null ? this.stretch.finished : this.reader.finished;
  }
}
