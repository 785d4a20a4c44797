// What a game controls beyond the mapping, per voice slot: its group bus (volume, mute, solo, pause), its source's
// own spatial settings, pending seeks, and the voice events those and the pool produce. Allocation-free per block.
import type { Seconds } from '../units';
import { PauseClock, type SourceSpatial } from '../dilation';
import { GroupBuses, type GroupBus } from './group-bus';
import type { VoiceEventRing } from './voice-events';
import type { GroupRoutes } from './group-routes';
import { VOICE_FREE, VOICE_RELEASING, type Voice } from './voice';

/** A voice's state as a game reads it. */
export type VoiceStateName = 'playing' | 'virtual' | 'stopping' | 'ended';

/** Per-slot controls of an engine's voices, its group buses, world pause clock, source spatial table and event ring. */
export class VoiceControls {
  /** Group buses and the world pause. */
  readonly buses = new GroupBuses();
  /** Time-flow clock: stops while the world is paused. */
  readonly clock = new PauseClock();
  /** Events for the host to drain. */
  readonly events: VoiceEventRing;
  /** Source id → its own spatial settings. */
  readonly spatial = new Map<number, SourceSpatial>();
  private readonly bus: GroupBus[];
  private readonly sourceSpatial: (SourceSpatial | null)[];
  private readonly exempt: Uint8Array;
  private readonly route: Int8Array;
  private readonly routes: GroupRoutes | null;
  /** Pending seek per slot in source frames, −1 = none. */
  private readonly seekFrame: Float64Array;

  /** Preallocates the per-slot arrays for `slots` voice slots. */
  constructor(slots: number, events: VoiceEventRing, routes: GroupRoutes | null = null) {
    this.events = events;
    this.routes = routes;
    this.route = new Int8Array(slots).fill(-1);
    const none = this.buses.bus('');
    this.bus = Array.from({ length: slots }, () => none);
    this.sourceSpatial = Array.from({ length: slots }, () => null);
    this.exempt = new Uint8Array(slots);
    this.seekFrame = new Float64Array(slots).fill(-1);
  }

  /** Binds slot `v` to its group's bus and its source's spatial settings (command path: may create the bus). */
  attach(v: Voice, exempt: boolean): void {
    this.rebind(v, exempt);
    this.sourceSpatial[v.index] = v.params.sourceId === -1 ? null : (this.spatial.get(v.params.sourceId) ?? null);
    this.seekFrame[v.index] = -1;
    v.unhold();
  }

  /** Rebinds slot `v` to its (possibly changed) group's bus after a tuning change. */
  rebind(v: Voice, exempt: boolean): void {
    this.bus[v.index] = this.buses.bus(v.params.group);
    this.exempt[v.index] = exempt ? 1 : 0;
    this.route[v.index] = this.routes === null ? -1 : this.routes.indexOf(v.params.group);
  }

  /** Routed output index of slot `v`'s group, or −1 for the master bus. */
  routeOf(v: Voice): number {
    return this.route[v.index];
  }

  /** The spatial settings of slot `v`'s source, or null for the tuning's. */
  spatialOf(v: Voice): SourceSpatial | null {
    return this.sourceSpatial[v.index];
  }

  /** Stores (or with null clears) a source's spatial settings and rebinds the voices that follow it. */
  setSourceSpatial(sourceId: number, s: SourceSpatial | null, voices: readonly Voice[]): void {
    if (s === null) this.spatial.delete(sourceId);
    else this.spatial.set(sourceId, s);
    for (let i = 0; i < voices.length; i++) if (voices[i].state !== VOICE_FREE && voices[i].params.sourceId === sourceId) this.sourceSpatial[i] = s;
  }

  /** Asks slot `v` to move its read head to `frame` (source frames) after a short fade out; it fades back in there. */
  seek(v: Voice, frame: number): void {
    this.seekFrame[v.index] = frame;
  }

  /** Before rendering slot `v`: multiplies its mapped gain by the bus gain and holds it while paused or seeking. */
  beforeRender(v: Voice): void {
    const b = this.bus[v.index];
    v.targets.gain *= this.buses.gainOf(b);
    if (this.seekFrame[v.index] >= 0 || this.buses.heldOf(b, this.exempt[v.index] === 1)) v.hold();
    else v.unhold();
  }

  /** After rendering slot `v`: completes a pending seek once the voice is silent. */
  afterRender(v: Voice): void {
    const f = this.seekFrame[v.index];
    if (f >= 0 && v.env === 0) {
      v.seekTo(f);
      this.seekFrame[v.index] = -1;
    }
  }

  /** The state name of a voice slot (or 'ended' for null). */
  stateOf(v: Voice | null): VoiceStateName {
    if (v === null || v.state === VOICE_FREE) return 'ended';
    if (v.state === VOICE_RELEASING) return 'stopping';
    return v.virtual ? 'virtual' : 'playing';
  }

  /** Engine time → time-flow time (held while the world is paused), s. */
  flowTime(t: Seconds): Seconds {
    return this.clock.flowTime(t);
  }
}
