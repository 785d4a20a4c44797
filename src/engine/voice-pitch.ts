// The pitch stage of a voice: the playback ratio and its Doppler part smoothed apart in cents (one-pole, the
// setTargetAtTime form), reached at the block's end; plus a propagating voice's Doppler factors from its emission time.
import { OnePoleSmoother, MAX_RATIO, MIN_RATIO, centsToRatioAt, ratioToCentsAt } from '../dsp';
import type { VoiceTargets } from '../dilation';
import type { Hz, Seconds } from '../units';
import type { PropagationStage } from './propagation-stage';
import { EMISSION_NONE, type EmissionSolution } from './emission-solver';

/** A voice's ratio smoothing and the ratio at each end of the block; allocation-free per block. */
export class VoicePitch {
  /** Smoothed ratio without its Doppler part, cents. */
  readonly ratioCents: OnePoleSmoother;
  /** Smoothed Doppler part of the ratio, cents. */
  readonly dopplerCents: OnePoleSmoother;
  /** Playback ratio at the start of the block just stepped (MIN_RATIO…MAX_RATIO). */
  blockStart = 1.5;
  /** Playback ratio at the end of the block just stepped, and the smoothed ratio now (MIN_RATIO…MAX_RATIO). */
  current = 1.5;
  /** Game-clock Doppler factor at the block's start (propagating voices; 1 otherwise). */
  dopplerStart = 1.5;
  /** Game-clock Doppler factor at the block's end (propagating voices; 1 otherwise). */
  dopplerEnd = 1.5;
  /** Mean Doppler factor over the block (NaN: unknown, ramp linearly). */
  dopplerMean = NaN;
  private ratioTarget = 0.5;
  private dopplerTarget = 0.5;
  private memoRatio = NaN;
  /** One slot for the in-place unit conversions. */
  private readonly u = new Float64Array(1);
  private memoDoppler = NaN;
  private readonly minRatio = MIN_RATIO;
  private readonly maxRatio = MAX_RATIO;

  /** Smoothers with time constants `ratioSeconds` and `dopplerSeconds` (s) at `sampleRate` (Hz). */
  constructor(sampleRate: Hz, ratioSeconds: Seconds, dopplerSeconds: Seconds) {
    this.ratioCents = new OnePoleSmoother({ timeConstantSeconds: ratioSeconds, sampleRate });
    this.dopplerCents = new OnePoleSmoother({ timeConstantSeconds: dopplerSeconds, sampleRate });
    this.blockStart = 1;
    this.current = 1;
    this.dopplerStart = 1;
    this.dopplerEnd = 1;
  }

  /** Sets the smoothing time constants, s. */
  setSmoothing(ratioSeconds: Seconds, dopplerSeconds: Seconds): void {
    this.ratioCents.setTimeConstant(ratioSeconds);
    this.dopplerCents.setTimeConstant(dopplerSeconds);
  }

  /** Sets the Doppler factors of a propagating voice's block: at its start, its end and their mean (NaN: unknown). */
  setDoppler(start: number, end: number, mean: number): void {
    this.dopplerStart = start;
    this.dopplerEnd = end;
    this.dopplerMean = mean;
  }

  /**
   * Follows a propagating voice's emission-time solutions at the block's start (`pre`) and end (`sol`): the Doppler
   * factor ramps on from the last block's end (a `fresh` voice starts at the solution's own factor).
   */
  followEmission(pre: EmissionSolution, sol: EmissionSolution, fresh: boolean): void {
    this.dopplerStart = fresh ? (pre.state !== EMISSION_NONE ? pre.doppler : sol.doppler) : this.dopplerEnd;
    if (sol.state !== EMISSION_NONE) this.dopplerEnd = sol.doppler;
    this.dopplerMean = sol.meanDoppler;
  }

  /** A propagating voice with no source in the snapshots: the Doppler factor returns to 1 over the block. */
  loseEmission(): void {
    this.dopplerStart = this.dopplerEnd;
    this.dopplerEnd = 1;
    this.dopplerMean = NaN;
  }

  /** Reads the block's targets (the logarithms are kept while the targets repeat). */
  aim(t: VoiceTargets): void {
    if (t.ratio !== this.memoRatio || t.doppler !== this.memoDoppler) {
      this.memoRatio = t.ratio;
      this.memoDoppler = t.doppler;
      // In place in a Float64Array: V8 boxes a double passed to or returned from a call it does not inline.
      const u = this.u;
      u[0] = t.ratio / t.doppler;
      ratioToCentsAt(u, 0, 0);
      this.ratioTarget = u[0];
      u[0] = t.doppler;
      ratioToCentsAt(u, 0, 0);
      this.dopplerTarget = u[0];
    }
  }

  /** Jumps to the targets last aimed at (a voice's first block, or a resume from silence). */
  jump(t: VoiceTargets): void {
    this.ratioCents.reset(this.ratioTarget);
    this.dopplerCents.reset(this.dopplerTarget);
    this.current = clampRatio(t.ratio);
  }

  /** Smooths `frames` samples towards the targets: the ratio goes from `blockStart` to `current`. */
  step(t: VoiceTargets, frames: number): void {
    this.ratioCents.target = this.ratioTarget;
    this.ratioCents.step(frames);
    this.dopplerCents.target = this.dopplerTarget;
    this.dopplerCents.step(frames);
    const rc = this.ratioCents.value;
    const dc = this.dopplerCents.value;
    this.blockStart = this.current;
    const u = this.u;
    if (rc === this.ratioTarget && dc === this.dopplerTarget) u[0] = t.ratio;
    else {
      u[0] = rc + dc;
      centsToRatioAt(u, 0);
    }
    const r = u[0];
    // Clamped against fields, not the module constants: V8 boxes a double merged with a module constant.
    this.current = r >= this.minRatio ? (r <= this.maxRatio ? r : this.maxRatio) : this.minRatio;
  }

  /** Per-sample read ratios of a propagating voice's block into `ratios` (Doppler in the read); the frames read are left in `stage.rampSum`. */
  fillRatios(stage: PropagationStage, ratios: Float32Array, frames: number): void {
    const q = stage.ramp;
    q[0] = this.blockStart;
    q[1] = this.current;
    q[2] = this.dopplerStart;
    q[3] = this.dopplerEnd;
    q[4] = this.dopplerMean;
    stage.fillRamp(ratios, frames);
  }
}

/** `r` clamped to MIN_RATIO…MAX_RATIO. */
export function clampRatio(r: number): number {
  return r >= MIN_RATIO ? (r <= MAX_RATIO ? r : MAX_RATIO) : MIN_RATIO;
}
