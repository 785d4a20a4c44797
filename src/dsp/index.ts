// Public names of the DSP core: kernel design, streaming resampler, offline resample, biquad low-pass, smoothing, unit helpers.
export { besselI0, kaiserBeta, kaiserTaps, kaiserAt, kaiserWindow } from './kaiser';
export { qualityTiers, defaultQualityTier, MIN_RATIO, MAX_RATIO, AUDIBLE_TOP_HZ, aliasStopFraction, tierDesigns, narrowDesigns, tierDesignAt, isQualityTier } from './quality-tiers';
export type { QualityTierName, TierDesign, RateDesign } from './quality-tiers';
export { KernelTable, STRETCH_GRID_STEP } from './kernel-table';
export type { KernelTableOptions, KernelTableData } from './kernel-table';
export { StreamReader } from './stream-reader';
export type { StreamReaderOptions, StreamSourceOptions } from './stream-reader';
export { wasmSimdSupported, activeKernel, WasmKernel } from './wasm/wasm-kernel';
export type { KernelName, KernelPreference, KernelImage, MemoryWatcher } from './wasm/wasm-kernel';
/** Sub-blocks the module's low-pass filters per call, each with its own staged coefficients (engine-internal). */
export { LP_SETS } from './wasm/kernel-params';
export { packKernelTable, packAllTiers, packedTransfer, isPackedKernelTable, INSTALL_BYTES_PER_QUANTUM } from './table-transfer';
export type { PackedKernelTable } from './table-transfer';
export { resample, resampleChunks } from './resample';
export type { ResampleOptions } from './resample';
export { DspArgumentError } from './dsp-argument-error';
export { BiquadLowpass, BIQUAD_MIN_CUTOFF_HZ, BIQUAD_MAX_CUTOFF_FRACTION, BIQUAD_Q_RANGE } from './biquad-lowpass';
export type { BiquadLowpassOptions } from './biquad-lowpass';
export { OnePoleSmoother } from './one-pole-smoother';
export type { OnePoleSmootherOptions } from './one-pole-smoother';
export { dbToGain, gainToDb, centsToRatio, ratioToCents, gainToDbFloor, dbToGainFloor, dbToGainAt, centsToRatioAt, gainToDbFloorAt, dbToGainFloorAt, ratioToCentsAt, DB_FLOOR } from './conversions';
