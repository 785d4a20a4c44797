// What Ralenti.stats holds before the worklet's first report: every counter at its start, and the tier and kernel
// the engine is expected to start with.
import type { EngineStats, KernelName, QualityTierName } from '../src/index';

/** Stats of an engine that has rendered nothing yet, with resampler tier `tier` and inner loop `kernel` (frozen). */
export function initialStats(tier: QualityTierName, kernel: KernelName): Readonly<EngineStats> {
  return Object.freeze({
    activeVoices: 0, virtualVoices: 0, steals: 0, clamps: 0, refused: 0, peakIn: 0, peakOut: 0, blasts: 0,
    limiterDb: 0, timeScale: 1, time: 0, errors: 0, tier, kernel,
    ratioClamps: 0, teleports: 0, shockwaves: 0, lastShockwaveTime: NaN, lastShockwaveSource: -1,
  } satisfies EngineStats);
}
