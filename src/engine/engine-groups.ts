// The engine's group-bus calls: a world pause (every pausable group, and the time scale's transitions) or one group's
// own pause, and a bus's state as a plain object.
import type { EngineCore } from './engine-core';

/** A group bus's state as `Engine.getGroupState` returns it. */
export interface GroupBusState {
  /** Bus volume, dB (−120…24). */
  volumeDb: number;
  muted: boolean;
  solo: boolean;
  /** Paused on its own (a world pause is not shown here). */
  paused: boolean;
}

/** Pauses the world (no group: every pausable group, and the time flow's clock) or one group; click-free. */
export function pauseGroups(core: EngineCore, group: string | undefined): void {
  const controls = core.controls;
  if (group !== undefined) controls.buses.setPaused(group, true);
  else if (!controls.buses.worldPaused) {
    controls.buses.worldPaused = true;
    controls.clock.pause(core.time);
  }
}

/** Resumes the world (no group) or one group paused on its own. */
export function resumeGroups(core: EngineCore, group: string | undefined): void {
  const controls = core.controls;
  if (group !== undefined) controls.buses.setPaused(group, false);
  else if (controls.buses.worldPaused) {
    controls.buses.worldPaused = false;
    controls.clock.resume(core.time);
  }
}

/** `group`'s bus state now. */
export function groupBusState(core: EngineCore, group: string): GroupBusState {
  const b = core.controls.buses.bus(group);
  return { volumeDb: b.volumeDb, muted: b.muted, solo: b.solo, paused: b.paused };
}
