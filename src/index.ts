// Public entry of the pure core ("ralenti"): exports grow as the layers land.
export type { Hz, Seconds, Cents, Decibels, MetersPerSecond, Meters, Celsius, Vec3Like } from './units';
export type * from './tuning/tuning-types';
export type * from './dilation/snapshot-types';
export type * from './engine/engine-types';
// Control-rate core (motion, dilation, tuning).
export { speedOfSound, dopplerRatio, VelocityEstimator, createDopplerStats, DOPPLER_RATIO_CAP } from './motion';
export type { DopplerStats, DopplerOptions, MovingPoint, VelocityEstimatorOptions } from './motion';
export { TimeFlow, Curve, TargetMapper, createVoiceTargets, distanceGain, equalPowerGains, MIN_TARGET_RATIO, MAX_TARGET_RATIO } from './dilation';
export type { VoiceInput, TargetMapperOptions, TimeFlowOptions } from './dilation';
export { coneGain, PauseClock, sourceSpatialDefaults, sourceSpatialProblems } from './dilation';
export type { SourceSpatial } from './dilation';
export type { VoiceStateName, VoiceEventType } from './engine';
export { parseTuning, serializeTuning, TuningError, defaultTuning, TUNING_VERSION, DEFAULT_GROUP, tuningLimits, OPEN_CUTOFF_HZ, MAX_TIME_SCALE } from './tuning';
export type { TuningIssue } from './tuning';
// Analysis (pitch tracking, spectrum, levels) needs fft.js: it is its own entry, 'ralenti/analysis' (src/analysis/index.ts).
// DSP (resampler, kernel tables, biquad low-pass, smoothing, unit helpers).
export { resample, resampleChunks, qualityTiers, defaultQualityTier, MIN_RATIO, MAX_RATIO, KernelTable, StreamReader, DspArgumentError, BiquadLowpass, OnePoleSmoother, dbToGain, gainToDb, centsToRatio, ratioToCents } from './dsp';
export { wasmSimdSupported, activeKernel } from './dsp';
export type { KernelName, KernelPreference } from './dsp';
export type { ResampleOptions, StreamReaderOptions, StreamSourceOptions, KernelTableOptions, TierDesign, BiquadLowpassOptions, OnePoleSmootherOptions } from './dsp';
// Time-scale modification (WSOLA grains read by the band-limited resampler).
export { StretchReader, stretchReaderDefaults } from './stretch';
export type { StretchReaderOptions } from './stretch';
