// Public entry of src/engine: the voice engine and its contract types.
export { Engine, engineDefaults, ENGINE_FREEZE_FADE_SECONDS } from './engine';
export { EngineClosedError } from './engine-closed-error';
export { PeakLimiter, peakLimiterDefaults } from './peak-limiter';
export type { PeakLimiterOptions } from './peak-limiter';
export { BlastGuard, blastGuardDefaults } from './blast-guard';
export type { BlastGuardOptions } from './blast-guard';
export { VIRTUAL_GAIN, RETURN_GAIN, FREEZE_FADE_SECONDS, TONE_SUB_BLOCK, TONE_Q } from './voice';
export type * from './engine-types';
export { VoiceEventRing, voiceEventName, EVENT_ENDED, EVENT_STOLEN, EVENT_VIRTUAL, EVENT_AUDIBLE, VOICE_EVENT_CAPACITY } from './voice-events';
export type { VoiceEventType } from './voice-events';
export type { VoiceStateName } from './voice-controls';
export { MIN_GROUP_VOLUME_DB, MAX_GROUP_VOLUME_DB } from './group-bus';
export { MAX_PITCH_VARIATION_CENTS, MIN_GAIN_VARIATION_DB, MAX_GAIN_VARIATION_DB } from './play-variation';
export { MAX_GROUP_OUTPUTS } from './group-routes';
