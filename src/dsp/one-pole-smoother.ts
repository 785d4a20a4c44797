// Exponential approach to a target, the Web Audio API's AudioParam.setTargetAtTime formula v(t) = V1 + (V0 − V1)·e^(−t/τ).
import type { Hz, Seconds } from '../units';

/** Construction options of a OnePoleSmoother. */
export interface OnePoleSmootherOptions {
  /** Time constant τ in seconds (≥ 0; 0 jumps straight to the target). */
  timeConstantSeconds: Seconds;
  /** Sample rate in Hz (> 0). */
  sampleRate: Hz;
  /** Starting value (default 0). */
  initial?: number;
}

/** Smooths a control value towards a target, sample-accurate over whole blocks; no allocation. */
export class OnePoleSmoother {
  /** Current value (declared with a double: a field that first held `undefined` boxes every store in V8). */
  value = 0.5;
  /** Target that `step` approaches (non-finite: `step` holds the value). */
  target = 0.5;
  private tau: Seconds;
  private readonly sampleRate: Hz;
  /** e^(−frames/(τ·rate)) for `lastFrames` (recomputed only when the frame count or τ changes). */
  private decay = 1;
  private lastFrames = -1;

  /** See OnePoleSmootherOptions. */
  constructor(options: OnePoleSmootherOptions) {
    this.sampleRate = Number.isFinite(options.sampleRate) && options.sampleRate > 0 ? options.sampleRate : 48000;
    this.tau = 0;
    this.setTimeConstant(options.timeConstantSeconds);
    this.value = options.initial ?? 0;
    this.target = this.value;
  }

  /** Sets τ in seconds (negative or non-finite → 0). */
  setTimeConstant(seconds: Seconds): void {
    this.tau = Number.isFinite(seconds) && seconds > 0 ? seconds : 0;
    this.lastFrames = -1;
  }

  /** Jumps to `value` (non-finite → 0). */
  reset(value: number): void {
    this.value = Number.isFinite(value) ? value : 0;
  }

  /** Advances `frames` samples towards `target` and returns the new value: target + (value − target)·exp(−frames/(τ·sampleRate)). */
  advance(target: number, frames: number): number {
    this.target = target;
    this.step(frames);
    return this.value;
  }

  /**
   * Advances `frames` samples towards the `target` field, leaving the result in `value` (the allocation-free form of
   * `advance` for the render path: V8 boxes a double passed to or returned from a call it does not inline).
   */
  step(frames: number): void {
    const target = this.target;
    if (!Number.isFinite(target)) return;
    if (this.tau === 0) {
      this.value = target;
      return;
    }
    if (frames !== this.lastFrames) {
      this.decay = Math.exp(-frames / (this.tau * this.sampleRate));
      this.lastFrames = frames;
    }
    this.value = target + (this.value - target) * this.decay;
  }
}
