// What the engine reports about its voices: the monitor rows a tuning editor draws (ratio, Doppler, cutoff, gain per
// voice) and a voice's position and speed in source time.
import type { Seconds } from '../units';
import type { VoiceMonitor } from './engine-types';
import { gainToDbFloor, ratioToCents, MAX_RATIO, MIN_RATIO } from '../dsp';
import { VOICE_FREE, type Voice } from './voice';
import type { EngineCore } from './engine-core';

/** Fills `out` with the playing voices of `core` (up to out.length) and returns how many were written. */
export function fillMonitors(core: EngineCore, out: VoiceMonitor[]): number {
  let k = 0;
  const voices = core.voices;
  for (let i = 0; i < voices.length && k < out.length; i++) {
    const v = voices[i];
    if (v.state === VOICE_FREE) continue;
    const m = out[k++];
    m.voice = core.pool.handleOf(v);
    m.sourceId = v.params.sourceId;
    m.group = v.params.group;
    // The ratio in use: a propagating voice's read includes the Doppler factor, clamped as the propagation stage's fillRamp clamps it.
    const r = v.propagating ? v.currentRatio * v.dopplerEnd : v.currentRatio;
    m.ratioCents = ratioToCents(r < MIN_RATIO ? MIN_RATIO : r > MAX_RATIO ? MAX_RATIO : r);
    m.dopplerCents = v.propagating ? ratioToCents(v.dopplerEnd) : v.currentDopplerCents;
    m.radialSpeed = v.targets.radialSpeed;
    m.distance = v.targets.distance;
    m.cutoffHz = v.currentCutoff;
    m.gainDb = gainToDbFloor(v.targets.gain);
    m.virtual = v.virtual;
  }
  return k;
}

/** A voice's read position in seconds of source time, or −1 for null (ended). */
export function positionOf(core: EngineCore, v: Voice | null): Seconds {
  return v === null ? -1 : v.position / (v.params.rateFactor * core.sampleRate);
}

/** Source seconds a voice advances per output second now (its smoothed ratio; 0 while held silent), or 0 for null. */
export function speedOf(v: Voice | null): number {
  return v === null || (v.held && v.env === 0) ? 0 : v.currentRatio / v.params.rateFactor;
}
