// Group buses of the engine: per-group volume (dB), mute and solo, and pause state (the whole world and per group).
// A voice's bus gain is volume × (muted or soloed-out ? 0 : 1); the voice's own dB smoothing makes every change glide.
import type { Decibels } from '../units';
import { dbToGain } from '../dsp';

/** Lowest group volume accepted, dB (quieter is clamped); −Infinity is not a volume, use mute. */
export const MIN_GROUP_VOLUME_DB: Decibels = -120;
/** Highest group volume accepted, dB. */
export const MAX_GROUP_VOLUME_DB: Decibels = 24;

/** One group's bus state; the object lives as long as the engine and survives tuning changes. */
export class GroupBus {
  /** Group name. */
  readonly name: string;
  /** Volume in dB (MIN_GROUP_VOLUME_DB…MAX_GROUP_VOLUME_DB). */
  volumeDb: Decibels = 0;
  /** Linear form of volumeDb. */
  volumeGain = 1;
  /** Muted: its voices go silent (and virtual) but keep time. */
  muted = false;
  /** Soloed: while any group is soloed, only soloed groups are heard. */
  solo = false;
  /** Paused on its own (pause(group)). */
  paused = false;
  /** Whether a world pause holds it: null = the default (held unless its policy is 'exempt'). */
  pausable: boolean | null = null;

  /** A bus at 0 dB, unmuted, not soloed, not paused. */
  constructor(name: string) {
    this.name = name;
  }
}

/** The buses of every group named so far, the world pause and the solo count; creates no objects on the audio path (docs/allocation.md). */
export class GroupBuses {
  /** True while the whole world is paused. */
  worldPaused = false;
  private readonly buses = new Map<string, GroupBus>();
  private soloCount = 0;

  /** The bus of `group`, created on first use (call on the command path, not per block). */
  bus(group: string): GroupBus {
    let b = this.buses.get(group);
    if (b === undefined) {
      b = new GroupBus(group);
      this.buses.set(group, b);
    }
    return b;
  }

  /** Sets a group's volume in dB, clamped to MIN_GROUP_VOLUME_DB…MAX_GROUP_VOLUME_DB; NaN is ignored. Returns false when clamped or ignored. */
  setVolume(group: string, db: Decibels): boolean {
    if (!(db === db)) return false;
    const b = this.bus(group);
    const v = db < MIN_GROUP_VOLUME_DB ? MIN_GROUP_VOLUME_DB : db > MAX_GROUP_VOLUME_DB ? MAX_GROUP_VOLUME_DB : db;
    b.volumeDb = v;
    b.volumeGain = v <= MIN_GROUP_VOLUME_DB ? 0 : dbToGain(v);
    return v === db;
  }

  /** Mutes or unmutes a group. */
  setMute(group: string, muted: boolean): void {
    this.bus(group).muted = muted === true;
  }

  /** Solos or unsolos a group. */
  setSolo(group: string, solo: boolean): void {
    const b = this.bus(group);
    const want = solo === true;
    if (b.solo === want) return;
    b.solo = want;
    this.soloCount += want ? 1 : -1;
  }

  /** Pauses (true) or resumes (false) one group on its own. */
  setPaused(group: string, paused: boolean): void {
    this.bus(group).paused = paused === true;
  }

  /** Sets whether a world pause holds the group (null = default by policy). */
  setPausable(group: string, pausable: boolean | null): void {
    this.bus(group).pausable = pausable;
  }

  /** Linear gain of bus `b` now: volume, mute and solo (0…~16). */
  gainOf(b: GroupBus): number {
    if (b.muted || (this.soloCount > 0 && !b.solo)) return 0;
    return b.volumeGain;
  }

  /** Whether voices on bus `b` are held (paused): paused on its own, or by the world pause when pausable (`exempt`: the group's policy is 'exempt'). */
  heldOf(b: GroupBus, exempt: boolean): boolean {
    if (b.paused) return true;
    if (!this.worldPaused) return false;
    return b.pausable === null ? !exempt : b.pausable;
  }
}
