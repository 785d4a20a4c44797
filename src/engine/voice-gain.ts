// The gain and pan stage of a voice: left and right gains (mapped gain × pan) smoothed in dB (one-pole, the
// setTargetAtTime form), ramped linearly across the block together with the envelope; and the virtual/audible choice.
import { OnePoleSmoother, DB_FLOOR, dbToGain, dbToGainFloor, gainToDbFloor } from '../dsp';
import type { VoiceTargets } from '../dilation';
import type { Hz, Seconds } from '../units';

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

/** A voice's channel gains at the block's ends and the per-sample ramp that mixes it; allocation-free per block. */
export class VoiceGain {
  /** Smoothed left gain, dB (floor −120). */
  readonly leftDb: OnePoleSmoother;
  /** Smoothed right gain, dB (floor −120). */
  readonly rightDb: OnePoleSmoother;
  /** Whether the voice is virtual: too quiet to render (read head advanced, nothing mixed). */
  virtual = false;
  /** Left gain (envelope included) just before the block's first sample, linear. */
  left0 = 0.5;
  /** Left gain change per sample across the block, linear. */
  leftStep = 0.5;
  /** Right gain (envelope included) just before the block's first sample, linear. */
  right0 = 0.5;
  /** Right gain change per sample across the block, linear. */
  rightStep = 0.5;
  /** Target left and right linear gains of the block (mapped gain × pan). */
  targetLeft = 0.5;
  targetRight = 0.5;
  private leftTarget = 0.5;
  private rightTarget = 0.5;
  /** Smoothed left and right gains now (the end of the block just stepped), linear. */
  left = 0.5;
  right = 0.5;
  private fromLeft = 0.5;
  private fromRight = 0.5;
  private memoLeftDb = NaN;
  private memoRightDb = NaN;
  private memoLeft = 0.5;
  private memoRight = 0.5;

  /** Smoothers with time constant `gainSeconds` (s) at `sampleRate` (Hz), starting at the floor. */
  constructor(sampleRate: Hz, gainSeconds: Seconds) {
    this.leftDb = new OnePoleSmoother({ timeConstantSeconds: gainSeconds, sampleRate, initial: DB_FLOOR });
    this.rightDb = new OnePoleSmoother({ timeConstantSeconds: gainSeconds, sampleRate, initial: DB_FLOOR });
    this.targetLeft = NaN;
    this.targetRight = NaN;
    this.left = 0;
    this.right = 0;
  }

  /** Sets the smoothing time constant, s. */
  setSmoothing(gainSeconds: Seconds): void {
    this.leftDb.setTimeConstant(gainSeconds);
    this.rightDb.setTimeConstant(gainSeconds);
  }

  /** Reads the block's targets (the logarithms are kept while the targets repeat). */
  aim(t: VoiceTargets): void {
    const gl = t.gain * t.left;
    const gr = t.gain * t.right;
    if (gl !== this.targetLeft) {
      this.targetLeft = gl;
      this.leftTarget = gainToDbFloor(gl);
    }
    if (gr !== this.targetRight) {
      this.targetRight = gr;
      this.rightTarget = gainToDbFloor(gr);
    }
  }

  /** Jumps to the targets last aimed at (a voice's first block). */
  jump(): void {
    this.leftDb.reset(this.leftTarget);
    this.rightDb.reset(this.rightTarget);
    this.left = dbToGainFloor(this.leftTarget);
    this.right = dbToGainFloor(this.rightTarget);
  }

  /** Smooths `frames` samples towards the targets: the gains go from their values before to `left`/`right`. */
  step(frames: number): void {
    const leftEndDb = this.leftDb.advance(this.leftTarget, frames);
    const rightEndDb = this.rightDb.advance(this.rightTarget, frames);
    if (leftEndDb !== this.memoLeftDb) {
      this.memoLeftDb = leftEndDb;
      this.memoLeft = dbToGainFloor(leftEndDb);
    }
    if (rightEndDb !== this.memoRightDb) {
      this.memoRightDb = rightEndDb;
      this.memoRight = dbToGainFloor(rightEndDb);
    }
    this.fromLeft = this.left;
    this.fromRight = this.right;
    this.left = this.memoLeft;
    this.right = this.memoRight;
  }

  /** The per-sample ramps of the block just stepped, times the envelope going `envStart` → `envEnd` over `frames`. */
  ramp(envStart: number, envEnd: number, frames: number): void {
    this.left0 = this.fromLeft * envStart;
    this.right0 = this.fromRight * envStart;
    this.leftStep = (this.left * envEnd - this.left0) / frames;
    this.rightStep = (this.right * envEnd - this.right0) / frames;
  }

  /** Updates the virtual state from the targets and the smoothed gains; returns true when the voice just became audible. */
  checkVirtual(): boolean {
    const target = this.targetLeft > this.targetRight ? this.targetLeft : this.targetRight;
    const smoothed = this.left > this.right ? this.left : this.right;
    if (!this.virtual && target < VIRTUAL_GAIN && smoothed < VIRTUAL_GAIN) this.virtual = true;
    else if (this.virtual && target > RETURN_GAIN) {
      this.virtual = false;
      return true;
    }
    return false;
  }
}
