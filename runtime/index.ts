// Public entry of the Web Audio host (main thread): createRalenti and the runtime's types.
export { createRalenti, createRalentiDefaults } from './create-ralenti';
export type { CreateRalentiOptions } from './create-ralenti';
export { Ralenti } from './ralenti';
export type { Sound, SoundData, RalentiVoice, RalentiPlayOptions, RalentiListener, TimeScaleOptions, RalentiAudioError, RalentiInit } from './ralenti';
export type { RalentiVoiceEvent, RalentiVoiceState, StopOptions, GroupState, ClosedReport, KernelMemory } from './ralenti';
export { RalentiSource } from './ralenti-source';
export { RalentiOptionError, RalentiClosedError } from './runtime-error';
export { defaultWorkletUrl, workletBlobUrl } from './worklet-url';
export { decodeAudioFile, DECODE_RATE_RANGE } from './decode-audio-file';
export type { DecodeAudioFileOptions } from './decode-audio-file';
export { audioFileSampleRate } from './audio-file-rate';
export { PROCESSOR_NAME, type RenderLoad } from './protocol';
export type { TableCounters } from './worklet/table-installer';
export { TuningError, defaultTuning, parseTuning, serializeTuning } from '../src/tuning/index';
