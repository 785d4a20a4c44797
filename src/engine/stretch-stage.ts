// The time-stretch stage of a 'stretch' voice: a WSOLA StretchReader (src/stretch) reads in place of the voice's
// StreamReader; the read speed is the voice's smoothed ratio, the content's pitch ratio is smoothed in cents apart.
import { OnePoleSmoother, centsToRatioAt, ratioToCentsAt, type KernelPreference, type KernelTable, type StreamSourceOptions } from '../dsp';
import { StretchReader } from '../stretch';
import type { VoiceTargets } from '../dilation';
import type { Hz, Seconds } from '../units';
import { VOICE_FREE } from './voice';

/** One preallocated stretcher with its pitch smoother; lent to one voice at a time. */
export class StretchStage {
  /** The stretcher. */
  readonly reader: StretchReader;
  /** Pitch ratio apart from Doppler, in cents, one-pole smoothed with the ratio's time constant. */
  readonly pitchCents: OnePoleSmoother;
  /** Index of the voice slot this stage was last lent to (−1 = never). */
  owner = -1;
  private fresh = true;
  private startPitch = 1;
  private memoPitch = NaN;
  private memoDoppler = NaN;
  private memoCents = 0;
  /** One slot for the in-place unit conversions. */
  private readonly u = new Float64Array(1);

  /** Allocates the stretcher (2 channels) and the smoother. */
  constructor(table: KernelTable, sampleRate: Hz, ratioSeconds: Seconds, kernel: KernelPreference) {
    this.reader = new StretchReader({ table, channels: 2, sampleRate, kernel });
    this.pitchCents = new OnePoleSmoother({ timeConstantSeconds: ratioSeconds, sampleRate });
  }

  /** Sets the source and start position for a new voice; its first block starts at its target pitch. */
  start(channels: readonly Float32Array[], options: StreamSourceOptions): void {
    this.reader.setSource(channels, options);
    this.fresh = true;
  }

  /**
   * Renders one block: read speed ramping speedStart → speedEnd (the voice's smoothed ratio, Doppler included), pitch
   * ratio ramping from the last block's end to the smoothed target (`targets.pitch`, its Doppler part taken from the
   * voice's smoothed `dopplerCents`).
   */
  read(out: readonly Float32Array[], frames: number, speedStart: number, speedEnd: number, targets: VoiceTargets, dopplerCents: number): void {
    this.speedStart = speedStart;
    this.speedEnd = speedEnd;
    this.dopplerCents = dopplerCents;
    this.readBlock(out, frames, targets);
  }

  /** Advances the position without output (virtual voices). */
  skip(frames: number, speedStart: number, speedEnd: number, targets: VoiceTargets, dopplerCents: number): void {
    this.speedStart = speedStart;
    this.speedEnd = speedEnd;
    this.dopplerCents = dopplerCents;
    this.skipBlock(frames, targets);
  }

  // Doubles handed to the bodies below in fields, not as arguments or return values: V8 boxes a double passed to or
  // returned from a call it does not inline (docs/allocation.md). The render path sets the first three, then calls.
  /** Read speed at the block's start, playback ratio. */
  speedStart = 0.5;
  /** Read speed at the block's end, playback ratio. */
  speedEnd = 0.5;
  /** The voice's smoothed Doppler part, cents. */
  dopplerCents = 0.5;
  private endPitch = 0.5;

  /** `read` with its speeds and Doppler part in the fields above. */
  readBlock(out: readonly Float32Array[], frames: number, targets: VoiceTargets): void {
    this.pitchAt(targets, frames);
    const r = this.reader;
    r.speedStart = this.speedStart;
    r.speedEnd = this.speedEnd;
    r.pitchStart = this.startPitch;
    r.pitchEnd = this.endPitch;
    r.readBlock(out, 0, frames);
    this.startPitch = this.endPitch;
  }

  /** `skip` with its speeds and Doppler part in the fields above. */
  skipBlock(frames: number, targets: VoiceTargets): void {
    this.pitchAt(targets, frames);
    this.startPitch = this.endPitch;
    this.reader.speedStart = this.speedStart;
    this.reader.speedEnd = this.speedEnd;
    this.reader.skipBlock(frames);
  }

  /** True once a one-shot has played out. */
  get finished(): boolean {
    return this.reader.finished;
  }

  /** The pitch ratio at the block's end into `endPitch` (and, for a fresh voice, its start into `startPitch`). */
  private pitchAt(targets: VoiceTargets, frames: number): void {
    const p = targets.pitch ?? targets.ratio;
    if (p !== this.memoPitch || targets.doppler !== this.memoDoppler) {
      this.memoPitch = p;
      this.memoDoppler = targets.doppler;
      const u = this.u;
      u[0] = p / targets.doppler;
      ratioToCentsAt(u, 0, 0);
      this.memoCents = u[0];
    }
    const target = this.memoCents;
    const dopplerCents = this.dopplerCents;
    if (this.fresh) {
      this.fresh = false;
      this.pitchCents.reset(target);
      this.u[0] = target + dopplerCents;
      centsToRatioAt(this.u, 0);
      this.startPitch = this.u[0];
    }
    this.pitchCents.target = target;
    this.pitchCents.step(frames);
    // In place in a Float64Array: V8 boxes a double passed to or returned from a call it does not inline.
    this.u[0] = this.pitchCents.value + dopplerCents;
    centsToRatioAt(this.u, 0);
    this.endPitch = this.u[0];
  }
}

/** The engine's stretch stages; a stage is free when the voice it was lent to no longer holds it. */
export class StretchBank {
  /** Every stage, allocated at construction. */
  readonly stages: StretchStage[] = [];

  /** Allocates `count` (0…1024) stages. */
  constructor(count: number, table: KernelTable, sampleRate: Hz, ratioSeconds: Seconds, kernel: KernelPreference) {
    for (let i = 0; i < count; i++) this.stages.push(new StretchStage(table, sampleRate, ratioSeconds, kernel));
  }

  /** Lends a free stage to voice slot `index` (holders[i] is the stage voice i holds, or null), or returns null when all are busy. */
  claim(index: number, holders: readonly { stretch: StretchStage | null; state: number }[]): StretchStage | null {
    for (let i = 0; i < this.stages.length; i++) {
      const s = this.stages[i];
      const o = s.owner;
      if (o === -1 || o === index || holders[o].stretch !== s || holders[o].state === VOICE_FREE) {
        s.owner = index;
        return s;
      }
    }
    return null;
  }

  /** Speeds and pitch ratios the stages clamped or replaced (added to stats.clamps). */
  get clampCount(): number {
    let n = 0;
    for (let i = 0; i < this.stages.length; i++) n += this.stages[i].reader.clampCount;
    return n;
  }

  /** Switches every stage's kernel table and smoothing time constant (setTuning). */
  configure(table: KernelTable, ratioSeconds: Seconds): void {
    for (const s of this.stages) {
      s.reader.setTable(table);
      s.pitchCents.setTimeConstant(ratioSeconds);
    }
  }
}
