// Public entry of src/engine: the voice engine and its contract types.
export { Engine, engineDefaults, ENGINE_FREEZE_FADE_SECONDS } from './engine';
export { PeakLimiter, peakLimiterDefaults } from './peak-limiter';
export type { PeakLimiterOptions } from './peak-limiter';
export { BlastGuard, blastGuardDefaults } from './blast-guard';
export type { BlastGuardOptions } from './blast-guard';
export { VIRTUAL_GAIN, RETURN_GAIN, FREEZE_FADE_SECONDS, TONE_SUB_BLOCK, TONE_Q } from './voice';
export type * from './engine-types';
