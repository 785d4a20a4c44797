// Public names of src/analysis: YIN pitch estimation and tracking, spectrum helpers, levels, pitch error statistics.
export { YinEstimator, yinPitch, yinDefaults } from './yin';
export type { YinOptions, YinPitchOptions, PitchEstimate } from './yin';
export { PitchTracker, trackPitch, pitchTrackerDefaults } from './pitch-tracker';
export type { PitchTrackerOptions, PitchTrack } from './pitch-tracker';
export { DifferenceFunction } from './difference-function';
export type { DifferenceFunctionOptions } from './difference-function';
export { SpectrumAnalyzer, magnitudeSpectrum, peakFrequency, toneLevelDb, spectrumDefaults } from './spectrum';
export type { SpectrumAnalyzerOptions, SpectrumOptions, SpectrumWindow, SpectralPeak } from './spectrum';
export { rmsLevel, peakLevel, rmsDb, peakDb } from './levels';
export { centsBetween, quantileSorted, pitchErrorStats } from './pitch-error';
export type { PitchErrorStats } from './pitch-error';
export { hannWindow } from './windows';
