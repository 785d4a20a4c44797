// Every typed entry of the package by name: tsc checks the published declarations through each one.
import { defaultTuning, parseTuning, resample, type Tuning } from 'ralenti';
import { trackPitch, type PitchTrack } from 'ralenti/analysis';
import { createRalenti, decodeAudioFile, type Ralenti, type Sound } from 'ralenti/runtime';
import { createRalenti as createRalentiInline } from 'ralenti/runtime/inline';
import { ThreeBinding } from 'ralenti/three';
import { HowlerBridge, HowlRateDriver, type HowlerGlobalLike } from 'ralenti/howler';

/** The entries' values, so that none of the imports is elided. */
export const entries = { defaultTuning, parseTuning, resample, trackPitch, createRalenti, decodeAudioFile, createRalentiInline, ThreeBinding, HowlerBridge, HowlRateDriver };
export type EntryTypes = [Tuning, PitchTrack, Ralenti, Sound, HowlerGlobalLike];
