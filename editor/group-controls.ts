// The one adapter between the panel and the runtime's group buses: mute, solo, volume and state per group, used
// only when the runtime has them (feature-detected, so the editor also runs on a runtime without group buses).
import type { Ralenti } from '../runtime';
import { dbToGain } from '../src';

/** A group's bus state as the panel shows it. */
export interface GroupBusState {
  muted: boolean;
  solo: boolean;
  /** Bus volume, dB. */
  volumeDb: number;
  /** Peak of the group's bus over the last report interval (linear, ≥ 0), when the runtime measures it; else null. */
  peak: number | null;
}

interface GroupBusRuntime {
  setGroupMute(group: string, muted: boolean): void;
  setGroupSolo(group: string, solo: boolean): void;
  setGroupVolume(group: string, db: number): void;
  getGroupState(group: string): unknown;
}

function hasGroupBuses(r: unknown): r is GroupBusRuntime {
  const x = r as Partial<Record<keyof GroupBusRuntime, unknown>>;
  return typeof x.setGroupMute === 'function' && typeof x.setGroupSolo === 'function' && typeof x.setGroupVolume === 'function' && typeof x.getGroupState === 'function';
}

function numberField(o: Record<string, unknown>, ...names: string[]): number | null {
  for (const n of names) if (typeof o[n] === 'number' && Number.isFinite(o[n])) return o[n] as number;
  return null;
}

/** Mute, solo and volume per group through the runtime's group buses; `available` is false where it has none. */
export class GroupControls {
  /** True when the runtime has group buses (setGroupMute, setGroupSolo, setGroupVolume, getGroupState). */
  readonly available: boolean;
  private readonly runtime: GroupBusRuntime | null;

  constructor(ralenti: Ralenti) {
    this.runtime = hasGroupBuses(ralenti) ? ralenti : null;
    this.available = this.runtime !== null;
  }

  /** Mutes or unmutes a group (no-op without group buses). */
  setMute(group: string, muted: boolean): void {
    this.runtime?.setGroupMute(group, muted);
  }

  /** Solos or un-solos a group (no-op without group buses). */
  setSolo(group: string, solo: boolean): void {
    this.runtime?.setGroupSolo(group, solo);
  }

  /** Sets a group's bus volume in dB (no-op without group buses). */
  setVolume(group: string, db: number): void {
    this.runtime?.setGroupVolume(group, db);
  }

  /** The group's state, or null without group buses (or when the runtime does not know the group). */
  state(group: string): GroupBusState | null {
    if (!this.runtime) return null;
    let s: unknown;
    try {
      s = this.runtime.getGroupState(group);
    } catch {
      return null;
    }
    if (typeof s !== 'object' || s === null) return null;
    const o = s as Record<string, unknown>;
    const peakDb = numberField(o, 'peakDb');
    return {
      muted: o.muted === true,
      solo: o.solo === true,
      volumeDb: numberField(o, 'volumeDb', 'db', 'volume') ?? 0,
      peak: numberField(o, 'peak', 'peakLevel') ?? (peakDb !== null ? dbToGain(peakDb) : null),
    };
  }
}
