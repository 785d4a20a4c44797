// The gain and pan stage of a voice: left and right gains (mapped gain × pan) smoothed in dB (one-pole, the
// setTargetAtTime form), ramped linearly across the block together with the envelope; and the virtual/audible choice.
import { OnePoleSmoother, DB_FLOOR, dbToGain, dbToGainFloorAt, gainToDbFloorAt } from '../dsp';
import type { VoiceTargets } from '../dilation';
import type { Hz, Seconds } from '../units';
import type { VoiceEnvelope } from './voice-envelope';

/** Below this linear gain (−90 dB) a voice becomes virtual; it comes back above RETURN_GAIN (−84 dB). */
export const VIRTUAL_GAIN = dbToGain(-90);
/** Linear gain (−84 dB) above which a virtual voice is rendered again. */
export const RETURN_GAIN = dbToGain(-84);

/** Target audibility of mapped targets: linear gain of the louder channel, 0…16. */
export function targetAudibility(t: VoiceTargets): number {
  const l = t.gain * t.left;
  const r = t.gain * t.right;
  return l > r ? l : r;
}

// Slots of VoiceGain's state (doubles live in a Float64Array: a store into an object field boxes a new number in V8);
// the floored conversions read and write its slots in place (a double returned from a call V8 does not inline is boxed).
const LEFT0 = 0;
const LEFT_STEP = 1;
const RIGHT0 = 2;
const RIGHT_STEP = 3;
const TARGET_LEFT = 4;
const TARGET_RIGHT = 5;
const LEFT_TARGET_DB = 6;
const RIGHT_TARGET_DB = 7;
const LEFT = 8;
const RIGHT = 9;
const FROM_LEFT = 10;
const FROM_RIGHT = 11;
const MEMO_LEFT_DB = 12;
const MEMO_RIGHT_DB = 13;
const MEMO_LEFT = 14;
const MEMO_RIGHT = 15;
const SLOTS = 16;

/** A voice's channel gains at the block's ends and the per-sample ramp that mixes it; allocation-free per block. */
export class VoiceGain {
  /** Smoothed left gain, dB (floor −120). */
  readonly leftDb: OnePoleSmoother;
  /** Smoothed right gain, dB (floor −120). */
  readonly rightDb: OnePoleSmoother;
  /** Whether the voice is virtual: too quiet to render (read head advanced, nothing mixed). */
  virtual = false;
  private readonly f = new Float64Array(SLOTS);
  /**
   * The block's ramp as [left0, leftStep, right0, rightStep] (a view of the state): the mix reads it here, since a
   * getter V8 does not inline boxes the double it returns (docs/allocation.md).
   */
  readonly rampGains = this.f.subarray(LEFT0, RIGHT_STEP + 1);

  /** Smoothers with time constant `gainSeconds` (s) at `sampleRate` (Hz), starting at the floor. */
  constructor(sampleRate: Hz, gainSeconds: Seconds) {
    this.leftDb = new OnePoleSmoother({ timeConstantSeconds: gainSeconds, sampleRate, initial: DB_FLOOR });
    this.rightDb = new OnePoleSmoother({ timeConstantSeconds: gainSeconds, sampleRate, initial: DB_FLOOR });
    const f = this.f;
    f[TARGET_LEFT] = NaN;
    f[TARGET_RIGHT] = NaN;
    f[MEMO_LEFT_DB] = NaN;
    f[MEMO_RIGHT_DB] = NaN;
  }

  /** Left gain (envelope included) just before the block's first sample, linear. */
  get left0(): number {
    return this.f[LEFT0];
  }
  /** Left gain change per sample across the block, linear. */
  get leftStep(): number {
    return this.f[LEFT_STEP];
  }
  /** Right gain (envelope included) just before the block's first sample, linear. */
  get right0(): number {
    return this.f[RIGHT0];
  }
  /** Right gain change per sample across the block, linear. */
  get rightStep(): number {
    return this.f[RIGHT_STEP];
  }
  /** Smoothed left gain now (the end of the block just stepped), linear. */
  get left(): number {
    return this.f[LEFT];
  }
  /** Smoothed right gain now, linear. */
  get right(): number {
    return this.f[RIGHT];
  }

  /** Sets the smoothing time constant, s. */
  setSmoothing(gainSeconds: Seconds): void {
    this.leftDb.setTimeConstant(gainSeconds);
    this.rightDb.setTimeConstant(gainSeconds);
  }

  /** Reads the block's targets (the logarithms are kept while the targets repeat). */
  aim(t: VoiceTargets): void {
    const f = this.f;
    const gl = t.gain * t.left;
    const gr = t.gain * t.right;
    if (gl !== f[TARGET_LEFT]) {
      f[TARGET_LEFT] = gl;
      gainToDbFloorAt(f, TARGET_LEFT, LEFT_TARGET_DB);
    }
    if (gr !== f[TARGET_RIGHT]) {
      f[TARGET_RIGHT] = gr;
      gainToDbFloorAt(f, TARGET_RIGHT, RIGHT_TARGET_DB);
    }
  }

  /** Jumps to the targets last aimed at (a voice's first block). */
  jump(): void {
    const f = this.f;
    this.leftDb.reset(f[LEFT_TARGET_DB]);
    this.rightDb.reset(f[RIGHT_TARGET_DB]);
    dbToGainFloorAt(f, LEFT_TARGET_DB, LEFT);
    dbToGainFloorAt(f, RIGHT_TARGET_DB, RIGHT);
  }

  /** Smooths `frames` samples towards the targets: the gains go from their values before to `left`/`right`. */
  step(frames: number): void {
    const f = this.f;
    this.leftDb.target = f[LEFT_TARGET_DB];
    this.leftDb.step(frames);
    this.rightDb.target = f[RIGHT_TARGET_DB];
    this.rightDb.step(frames);
    const leftEndDb = this.leftDb.value;
    const rightEndDb = this.rightDb.value;
    if (leftEndDb !== f[MEMO_LEFT_DB]) {
      f[MEMO_LEFT_DB] = leftEndDb;
      dbToGainFloorAt(f, MEMO_LEFT_DB, MEMO_LEFT);
    }
    if (rightEndDb !== f[MEMO_RIGHT_DB]) {
      f[MEMO_RIGHT_DB] = rightEndDb;
      dbToGainFloorAt(f, MEMO_RIGHT_DB, MEMO_RIGHT);
    }
    f[FROM_LEFT] = f[LEFT];
    f[FROM_RIGHT] = f[RIGHT];
    f[LEFT] = f[MEMO_LEFT];
    f[RIGHT] = f[MEMO_RIGHT];
  }

  /** The per-sample ramps of the block just stepped over `frames`, times the envelope's levels at the block's two ends. */
  ramp(envelope: VoiceEnvelope, frames: number): void {
    const f = this.f;
    const envStart = envelope.start;
    const envEnd = envelope.level;
    f[LEFT0] = f[FROM_LEFT] * envStart;
    f[RIGHT0] = f[FROM_RIGHT] * envStart;
    f[LEFT_STEP] = (f[LEFT] * envEnd - f[LEFT0]) / frames;
    f[RIGHT_STEP] = (f[RIGHT] * envEnd - f[RIGHT0]) / frames;
  }

  /** Updates the virtual state from the targets and the smoothed gains; returns true when the voice just became audible. */
  checkVirtual(): boolean {
    const f = this.f;
    const target = f[TARGET_LEFT] > f[TARGET_RIGHT] ? f[TARGET_LEFT] : f[TARGET_RIGHT];
    const smoothed = f[LEFT] > f[RIGHT] ? f[LEFT] : f[RIGHT];
    if (!this.virtual && target < VIRTUAL_GAIN && smoothed < VIRTUAL_GAIN) this.virtual = true;
    else if (this.virtual && target > RETURN_GAIN) {
      this.virtual = false;
      return true;
    }
    return false;
  }
}
