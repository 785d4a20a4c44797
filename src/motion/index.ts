// Public entry of src/motion: vectors, speed of sound, Doppler ratio, velocity estimation.
export { vec3, setVec3, copyVec3, subVec3, scaleVec3, dotVec3, crossVec3, lengthVec3, normalizeVec3, isFiniteVec3 } from './vec3';
export { speedOfSound, SPEED_OF_SOUND_0C, ZERO_CELSIUS_KELVIN } from './speed-of-sound';
export {
  dopplerRatio,
  dopplerFromSpeeds,
  dopplerFromSpeedsAt,
  createDopplerStats,
  globalDopplerStats,
  DOPPLER_RATIO_CAP,
  DOPPLER_MIN_DISTANCE,
} from './doppler';
export type { DopplerStats, DopplerOptions, MovingPoint } from './doppler';
export { VelocityEstimator, velocityEstimatorDefaults } from './velocity-estimator';
export type { VelocityEstimatorOptions } from './velocity-estimator';
export { airAbsorptionDbPerMeter, AirAbsorption, AIR_CUTOFF_LOSS_DB, REFERENCE_PRESSURE_KPA } from './air-absorption';
export type { AirState } from './air-absorption';
