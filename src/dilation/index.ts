// Public entry of src/dilation: time flow, curves, group policies, snapshot → per-voice targets.
export { TimeFlow, timeFlowDefaults, easeValue, EXPONENTIAL_FLOOR } from './time-flow';
export type { TimeFlowOptions } from './time-flow';
export { Curve, fritschCarlsonTangents, MIN_KEY_SPACING } from './curve';
export { CompiledGroup, policyFollowsSpeed, policyAppliesTone } from './group-policy';
export { distanceGain, azimuthDegrees, equalPowerGains, equalPowerFromSine } from './spatial-gains';
export { TargetMapper } from './target-mapper';
export {
  createVoiceTargets,
  MAX_TARGET_RATIO,
  MIN_TARGET_RATIO,
  MAX_VOICE_GAIN,
  MAX_COORDINATE,
  MAX_RADIAL_SPEED,
  GAME_CLOCK_MIN_TIME_SCALE,
  MIN_CUTOFF_HZ,
} from './voice-input';
export type { VoiceInput, TargetMapperOptions } from './voice-input';
export type * from './snapshot-types';
export { coneGain } from './cone-gain';
export { PauseClock } from './pause-clock';
export { sourceSpatialDefaults, sourceSpatialProblems } from './source-spatial';
export type { SourceSpatial } from './source-spatial';
