// The engine's sound calls: a decoded sound into a bank slot (made resident in module memory on the wasm kernel), and
// a sound's removal, whose voices fade out first.
import { VOICE_PLAYING } from './voice';
import { engineDefaults, type EngineCore } from './engine-core';
import type { Hz } from '../units';

/** Stores a decoded sound; returns its id, or −1 (counted in refused). */
export function addSoundTo(core: EngineCore, channels: readonly Float32Array[], sampleRate: Hz): number {
  const id = core.bank.add(channels, sampleRate);
  if (id < 0) core.stats.refused++;
  else if (core.resident !== null) core.resident.makeResident(core.bank.slot(id));
  return id;
}

/** Removes sound `id`; its voices fade out (default stop fade) and the slot frees once they are silent. */
export function removeSoundFrom(core: EngineCore, id: number): void {
  const s = core.bank.slot(id);
  if (s < 0) return;
  for (let i = 0; i < core.voices.length; i++) {
    const v = core.voices[i];
    if (v.state === VOICE_PLAYING && v.params.sound === s) core.pool.release(v, engineDefaults.stopFadeSeconds);
  }
  core.bank.remove(id);
}
