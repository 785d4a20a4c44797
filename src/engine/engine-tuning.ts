// Tuning and table changes of a running engine: a new tuning reaches the mapper, snapshots, propagation, air, buses
// and every voice (which glides to its new targets); a tier switch swaps the resampler table of every reader.
import type { Tuning } from '../tuning';
import { DEFAULT_GROUP } from '../tuning';
import { dbToGain, type KernelTable } from '../dsp';
import { speedOfSound } from '../motion';
import type { EngineCore } from './engine-core';
import { VOICE_FREE, type VoiceSmoothing } from './voice';

/** Largest propagation speed used (a Doppler factor near 0): sound then arrives at once with no shift, m/s. */
const MAX_PROPAGATION_SPEED = 1e9;

/**
 * Speed of sound for the propagation model, m/s: the air's, divided by the tuning's Doppler factor — the factor scales
 * the velocities against c as in OpenAL 1.1 §3.5.2 (docs/references.md §1c), so 2 doubles the shift and 0 removes it.
 */
export function propagationSpeed(t: Tuning): number {
  const c = t.air.speedOfSound ?? speedOfSound(t.air.temperatureCelsius);
  const f = t.doppler.factor;
  return f > c / MAX_PROPAGATION_SPEED ? c / f : MAX_PROPAGATION_SPEED;
}

/** The voices' smoothing time constants from a tuning, s. */
export function smoothingOf(t: Tuning): VoiceSmoothing {
  return { ratio: t.smoothing.ratioSeconds, doppler: t.doppler.smoothingSeconds, cutoff: t.smoothing.cutoffSeconds, gain: t.smoothing.gainSeconds };
}

/** Switches `core` to tuning `t` (a parseTuning result): voices keep playing and glide to the new targets. */
export function applyTuning(core: EngineCore, t: Tuning): void {
  core.tuning = t;
  core.mapper.setTuning(t);
  core.snapshots.configure(t.doppler.velocitySmoothingSeconds, t.doppler.teleportSpeed);
  core.stage.speedOfSound = propagationSpeed(t);
  core.air.configure(t.air);
  core.bus.configure(t.master.ceilingDb, t.master.limiter, t.master.gainDb);
  core.routeCeiling = dbToGain(t.master.ceilingDb);
  switchTable(core, core.tableFor(t.resampler.tier));
  const sm = smoothingOf(t);
  core.stretches.configure(core.table, t.smoothing.ratioSeconds);
  for (const v of core.voices) {
    v.setSmoothing(sm);
    if (v.state === VOICE_FREE) continue;
    const group = core.mapper.hasGroup(v.params.group) ? v.params.group : DEFAULT_GROUP;
    const g = core.mapper.group(group);
    v.regroup(group, g.followsSpeed, v.params.sourceId !== -1 && g.motion === 'propagation' && v.stretch === null);
    core.controls.rebind(v, g.policy === 'exempt');
  }
}

/** Adds tables designed elsewhere (by tier name); switches at once if the tuning's tier was waiting for one. */
export function addTables(core: EngineCore, tables: readonly KernelTable[]): void {
  if (core.given === null) return;
  for (const k of tables) core.given.set(k.name, k);
  switchTable(core, core.tableFor(core.tuning.resampler.tier));
}

function switchTable(core: EngineCore, table: KernelTable | null): void {
  if (table === null || table === core.table) return;
  core.table = table;
  for (const v of core.voices) v.setTable(table);
  core.stretches.configure(table, core.tuning.smoothing.ratioSeconds);
  core.stats.tier = table.name as Tuning['resampler']['tier'];
}
