// The engine's stereo master bus: the mix buffers voices sum into, a master gain ramped linearly across each block,
// peak metering before and after the safety limiter, and the write to the host's outputs (mono hosts get the mid).
// The blast guard always runs. The tuning switches the limiter: on, no sample leaves above `master.ceilingDb`; off,
// a hard clip at 0 dBFS holds instead (PeakLimiter).
import type { Decibels, Hz } from '../units';
import type { EngineStats } from './engine-types';
import type { MixBus } from './kernel-residency';
import { PeakLimiter } from './peak-limiter';
import { BlastGuard } from './blast-guard';
import { dbToGain } from '../dsp';

/** Construction options of a MasterBus. */
export interface MasterBusOptions {
  /** Output sample rate, Hz (8000…192000). */
  sampleRate: Hz;
  /** Block capacity, frames (1…16384). */
  maxBlockFrames: number;
  /** Limiter ceiling, dBFS (−24…0); holds only while the limiter runs (else 0 dBFS is the hard ceiling). */
  ceilingDb: Decibels;
  /** Whether the limiter runs. */
  limiter: boolean;
  /** Master gain, dB. */
  gainDb: Decibels;
}

/** Mix buffers, master gain, limiter and metering of one engine; creates no objects after construction (what V8 may still box: docs/allocation.md). */
export class MasterBus implements MixBus {
  /** Left mix channel (rebound to module memory on the wasm kernel). */
  left: Float32Array;
  /** Right mix channel (rebound to module memory on the wasm kernel). */
  right: Float32Array;
  /** The safety limiter. */
  readonly limiter: PeakLimiter;
  /** The blast guard (mutes a sustained blast or non-finite mix; cannot be switched off). */
  readonly guard: BlastGuard;
  private master: number;
  private masterPrev: number;

  /** Allocates the two mix channels and the limiter. */
  constructor(options: MasterBusOptions) {
    this.left = new Float32Array(options.maxBlockFrames);
    this.right = new Float32Array(options.maxBlockFrames);
    this.limiter = new PeakLimiter({ sampleRate: options.sampleRate, ceilingDb: options.ceilingDb });
    this.limiter.enabled = options.limiter;
    this.guard = new BlastGuard({ sampleRate: options.sampleRate });
    this.master = this.masterPrev = dbToGain(options.gainDb);
  }

  /** Changes the ceiling (dBFS), the limiter switch and the master gain (dB; glides across the next block). */
  configure(ceilingDb: Decibels, limiter: boolean, gainDb: Decibels): void {
    this.limiter.setCeiling(ceilingDb);
    this.limiter.enabled = limiter;
    this.master = dbToGain(gainDb);
  }

  /** Samples clamped or replaced on the bus: non-finite samples and hard-ceiling clips. */
  get clamps(): number {
    return this.guard.nonFinite + this.limiter.nonFinite + this.limiter.hardClips;
  }

  /** Zeroes the first `n` frames of the mix. */
  clear(n: number): void {
    this.left.fill(0, 0, n);
    this.right.fill(0, 0, n);
  }

  /** Applies gain and limiter to the first `n` mix frames, writes them to outputs at `offset` and raises stats.peakIn / peakOut. */
  finish(outputs: readonly Float32Array[], offset: number, n: number, stats: EngineStats): void {
    const mixL = this.left;
    const mixR = this.right;
    const g0 = this.masterPrev;
    const dg = (this.master - g0) / n;
    this.masterPrev = this.master;
    let peakIn = stats.peakIn;
    for (let i = 0; i < n; i++) {
      const g = g0 + dg * (i + 1);
      const l = mixL[i] * g;
      const r = mixR[i] * g;
      mixL[i] = l;
      mixR[i] = r;
      const a = l < 0 ? -l : l;
      const b = r < 0 ? -r : r;
      if (a > peakIn) peakIn = a;
      if (b > peakIn) peakIn = b;
    }
    stats.peakIn = peakIn;
    this.guard.process(mixL, mixR, n);
    stats.blasts = this.guard.trips;
    this.limiter.process(mixL, mixR, 0, n);
    let peakOut = stats.peakOut;
    const outL = outputs[0];
    const outR = outputs.length > 1 ? outputs[1] : null;
    for (let i = 0; i < n; i++) {
      const l = mixL[i];
      const r = mixR[i];
      if (outR === null) outL[offset + i] = 0.5 * (l + r);
      else {
        outL[offset + i] = l;
        outR[offset + i] = r;
      }
      const a = l < 0 ? -l : l;
      const b = r < 0 ? -r : r;
      if (a > peakOut) peakOut = a;
      if (b > peakOut) peakOut = b;
    }
    stats.peakOut = peakOut;
  }
}
