// Starting a voice (the command path): group and priority checks, per-play variation, the targets now for the
// stealing decision, a slot from the pool, then `Voice.start` and the voice's controls and stretch stage.
import type { PlayOptions } from './engine-types';
import { DEFAULT_GROUP } from '../tuning';
import { centsToRatio, dbToGain } from '../dsp';
import { clampNumber } from './engine-values';
import { targetAudibility } from './voice';
import { drawVariation, MAX_PITCH_VARIATION_CENTS, MAX_GAIN_VARIATION_DB, MIN_GAIN_VARIATION_DB } from './play-variation';
import { MAX_GROUP_VOLUME_DB, MIN_GROUP_VOLUME_DB } from './group-bus';
import { engineDefaults, type EngineCore } from './engine-core';

/** Starts a voice of `sound`; returns its handle, or −1 if refused (unknown sound, or a full pool of higher priority). */
export function playVoice(core: EngineCore, sound: number, options: PlayOptions): number {
  const stats = core.stats;
  const slot = core.bank.slot(sound);
  if (slot < 0) {
    stats.refused++;
    return -1;
  }
  let group = options.group ?? DEFAULT_GROUP;
  if (!core.mapper.hasGroup(group)) {
    group = DEFAULT_GROUP;
    core.clamps++;
  }
  const compiled = core.mapper.group(group);
  const priority = clampNumber(options.priority ?? compiled.priority, 0, 255, compiled.priority);
  const now = core.time;
  core.events.now = now;
  let gain = options.gainDb !== undefined ? dbToGain(clampNumber(options.gainDb, MIN_GROUP_VOLUME_DB, MAX_GROUP_VOLUME_DB, 0)) : clampNumber(options.gain ?? 1, 0, 16, 1);
  let ratio = 1;
  if (options.ratio !== undefined) {
    if (options.ratio > 0 && options.ratio <= 4) ratio = options.ratio;
    else core.clamps++;
  }
  // Per-play variation, drawn in a fixed order (pitch, then gain) so that both hosts draw the same numbers.
  ratio = clampNumber(ratio * centsToRatio(drawVariation(core.random, options.pitchRange, -MAX_PITCH_VARIATION_CENTS, MAX_PITCH_VARIATION_CENTS)), 1 / 1024, 4, 1);
  gain = clampNumber(gain * dbToGain(drawVariation(core.random, options.gainRange, MIN_GAIN_VARIATION_DB, MAX_GAIN_VARIATION_DB)), 0, 16, 1);
  const sourceId = options.sourceId !== undefined && Number.isFinite(options.sourceId) ? options.sourceId : -1;
  const rate = core.bank.rates[slot];
  // Targets now, for the stealing decision and so that the voice starts at its proper pitch.
  core.snapshots.time = now;
  core.snapshots.interpolate();
  const src = sourceId === -1 ? -1 : core.snapshots.find(sourceId);
  const spatial = sourceId === -1 ? null : (core.controls.spatial.get(sourceId) ?? null);
  core.map(core.probe, group, (ratio * rate) / core.sampleRate, gain, src >= 0 ? core.snapshots.sourceAt(src) : null, spatial, core.timeScaleNow);
  const audibility = targetAudibility(core.probe);
  if (core.pool.full) {
    if (!core.pool.steal(priority, audibility, engineDefaults.stealFadeSeconds)) {
      stats.refused++;
      return -1;
    }
    stats.steals++;
  }
  const v = core.pool.take();
  const offset = clampNumber((options.offsetSeconds ?? 0) * rate, 0, core.bank.frames[slot], 0);
  const from = { loop: options.loop === true, loopStart: options.loopStart, loopEnd: options.loopEnd, startFrame: offset };
  const channelData = core.bank.channels[slot]!;
  v.start({
    sound: slot, channelData, channels: channelData.length, rateFactor: rate / core.sampleRate, group, followsTime: compiled.followsSpeed,
    priority, gain, ratio, sourceId, sourceSlot: src, sequence: core.sequence++,
    // Stretched voices read through their own stage at the same-instant ratio (propagation reads the sound itself).
    propagating: sourceId !== -1 && compiled.motion === 'propagation' && !compiled.stretches,
    startTime: now, fadeInSeconds: options.fadeInSeconds ?? engineDefaults.fadeInSeconds, releaseSeconds: engineDefaults.stopFadeSeconds,
    from, targets: core.probe,
  });
  core.controls.attach(v, compiled.policy === 'exempt');
  if (compiled.stretches) {
    const stage = core.stretches.claim(v.index, core.voices);
    if (stage === null) core.clamps++; // every stage busy: this voice plays tape-style
    else v.readThrough(stage, channelData, from);
  }
  core.bank.release(slot, 1);
  return core.pool.handleOf(v);
}
