// The latest two gameplay snapshots, copied into preallocated storage, and the listener and source
// states interpolated between them (linear interpolation across the snapshot interval).
import type { Seconds, Vec3Like } from '../units';
import type { EngineSnapshot } from './engine-types';
import { VelocityEstimator } from '../motion';
import type { ListenerState, SourceState } from '../dilation';

/** The engine clock as frames rendered at a sample rate (engine time = frameCount / sampleRate, s). */
export interface FrameClock {
  readonly frameCount: number;
  readonly sampleRate: number;
}

/** Options of SnapshotStore. */
export interface SnapshotStoreOptions {
  /** Where `push` reads the engine time (the engine's core: read there, no double crosses the call). */
  clock: FrameClock;
  /** Source slots (1…4096). */
  maxSources: number;
  /** Velocity estimator smoothing (s) and teleport speed (m/s). */
  velocitySmoothingSeconds: Seconds;
  teleportSpeed: number;
}

/** Source slots not seen for this many snapshots may be reused for new ids. */
const STALE_PUSHES = 120;

/** Listener and source states from the last two snapshots; creates no objects after construction (what V8 may still box: docs/allocation.md). */
export class SnapshotStore {
  /** Snapshots received. */
  pushes = 0;
  /** Source ids refused because every slot was in use, and non-finite values replaced. */
  refused = 0;
  clamps = 0;
  /** Interpolated listener (position, forward, up, velocity) after `interpolate`. */
  readonly listener: ListenerState & { velocity: Vec3Like } = { position: v(0, 0, 0), forward: v(0, 0, -1), up: v(0, 1, 0), velocity: v(0, 0, 0) };
  /** Scratch source state filled by `sourceAt` (its id declared with a double, as it is read from a Float64Array; set to 0 in the constructor). */
  readonly source: SourceState & { velocity: Vec3Like } = { id: 0.5, position: v(0, 0, 0), velocity: v(0, 0, 0) };
  private readonly capacity: number;
  private readonly ids: Float64Array;
  private readonly used: Uint8Array;
  private readonly seen: Float64Array;
  private readonly prev: Float64Array; // per slot: position x,y,z, velocity x,y,z
  private readonly next: Float64Array;
  private readonly estimators: VelocityEstimator[];
  private readonly hash: Int32Array;
  private readonly mask: number;
  private readonly lis = new Float64Array(24); // prev pos, fwd, up, vel; next pos, fwd, up, vel
  private readonly lisEstimator: VelocityEstimator;
  /** Engine time of the last `push`, s. */
  arrival: Seconds = 0.5;
  /** Snapshot-time gap between the last two snapshots, s (0 for the first or a non-increasing time). */
  interval: Seconds = 0.5;
  private lastTime: Seconds = NaN;
  private readonly clock: FrameClock;
  private alpha = 0.5;
  /** The weight `lerp3` reads (a field: V8 boxes a double passed to a call it does not inline). */
  private weight = 0.5;
  /** The interpolation point of `interpolate`, engine s (a field: V8 boxes a double passed to a call it does not inline). */
  time: Seconds = 0.5;

  /** Preallocates `maxSources` slots. */
  constructor(options: SnapshotStoreOptions) {
    const n = Math.max(1, Math.min(4096, Math.floor(options.maxSources)));
    this.capacity = n;
    this.clock = options.clock;
    this.arrival = 0;
    this.interval = 0;
    this.alpha = 1;
    this.source.id = 0;
    this.ids = new Float64Array(n);
    this.used = new Uint8Array(n);
    this.seen = new Float64Array(n);
    this.prev = new Float64Array(6 * n);
    this.next = new Float64Array(6 * n);
    let size = 1;
    while (size < 2 * n) size *= 2;
    this.hash = new Int32Array(size).fill(-1);
    this.mask = size - 1;
    const est = { smoothingSeconds: options.velocitySmoothingSeconds, teleportSpeed: options.teleportSpeed };
    this.estimators = [];
    for (let i = 0; i < n; i++) this.estimators.push(new VelocityEstimator(est));
    this.lisEstimator = new VelocityEstimator(est);
    this.lis[4] = this.lis[16] = -1; // forward −z
    this.lis[6 + 1] = this.lis[18 + 1] = 1; // up +y
  }

  /** Changes the velocity estimators' smoothing (s) and teleport speed (m/s). */
  configure(velocitySmoothingSeconds: Seconds, teleportSpeed: number): void {
    const o = { smoothingSeconds: velocitySmoothingSeconds, teleportSpeed };
    for (const e of this.estimators) e.configure(o);
    this.lisEstimator.configure(o);
  }

  /**
   * Copies a snapshot in; positions glide from the previous snapshot over the time between the two, starting now (the
   * clock's engine time). It takes no double: called once per snapshot, its caller may run unoptimised for minutes,
   * and unoptimised code boxes every double it reads or computes (docs/allocation.md).
   */
  push(s: EngineSnapshot): void {
    const t = s.time;
    this.interval = Number.isFinite(t) && Number.isFinite(this.lastTime) && t > this.lastTime ? t - this.lastTime : 0;
    if (Number.isFinite(t)) this.lastTime = t;
    this.arrival = this.clock.frameCount / this.clock.sampleRate;
    this.pushes++;
    const L = this.lis;
    for (let k = 0; k < 12; k++) L[k] = L[12 + k];
    const l = s.listener;
    this.put3(L, 12, l.position);
    this.put3(L, 15, l.forward);
    this.put3(L, 18, l.up);
    // The estimators read the time from their field: V8 boxes a double passed to a call it does not inline.
    const le = this.lisEstimator;
    le.at = t;
    this.put3(L, 21, l.velocity ?? le.updateAt(l.position));
    if (this.pushes === 1) for (let k = 0; k < 12; k++) L[k] = L[12 + k];
    const list = s.sources;
    for (let i = 0; i < list.length; i++) {
      const src = list[i];
      let slot = this.find(src.id);
      const fresh = slot < 0;
      if (fresh) slot = this.insert(src.id);
      if (slot < 0) {
        this.refused++;
        continue;
      }
      const o = 6 * slot;
      const wasSeen = !fresh && this.seen[slot] === this.pushes - 1;
      for (let k = 0; k < 6; k++) this.prev[o + k] = this.next[o + k];
      this.put3(this.next, o, src.position);
      const e = this.estimators[slot];
      e.at = t;
      this.put3(this.next, o + 3, src.velocity ?? e.updateAt(src.position));
      if (!wasSeen) for (let k = 0; k < 6; k++) this.prev[o + k] = this.next[o + k];
      this.seen[slot] = this.pushes;
    }
  }

  /** Moves the interpolation point to engine time `time` (set it first) and fills `listener`. */
  interpolate(): void {
    const a = this.interval > 0 ? (this.time - this.arrival) / this.interval : 1;
    this.alpha = a < 0 ? 0 : a > 1 ? 1 : a;
    const L = this.lis;
    this.weight = this.alpha;
    this.lerp3(this.listener.position, L, 0, 12, L);
    this.lerp3(this.listener.forward, L, 3, 15, L);
    this.lerp3(this.listener.up, L, 6, 18, L);
    this.lerp3(this.listener.velocity, L, 9, 21, L);
  }

  /** Slot of source `id`, or −1 when no snapshot has named it. */
  find(id: number): number {
    if (!Number.isFinite(id)) return -1;
    let h = this.slotHash(id);
    for (let probe = 0; probe <= this.mask; probe++) {
      const s = this.hash[h];
      if (s < 0) return -1;
      if (this.ids[s] === id) return s;
      h = (h + 1) & this.mask;
    }
    return -1;
  }

  /** Whether slot `slot` still holds source `id` (slots are reused for new ids once stale). */
  holds(slot: number, id: number): boolean {
    return slot >= 0 && slot < this.capacity && this.used[slot] === 1 && this.ids[slot] === id;
  }

  /** Fills `source` with slot `slot`'s interpolated state (a source missing from the latest snapshot holds still). */
  sourceAt(slot: number): SourceState & { velocity: Vec3Like } {
    const o = 6 * slot;
    // Each branch stores its own weight: a merge of the field's double with the constant 1 would be boxed.
    if (this.seen[slot] === this.pushes) this.weight = this.alpha;
    else this.weight = 1;
    const s = this.source;
    s.id = this.ids[slot];
    this.lerp3(s.position, this.prev, o, o, this.next);
    this.lerp3(s.velocity, this.prev, o + 3, o + 3, this.next);
    if (this.seen[slot] !== this.pushes) {
      s.velocity.x = 0;
      s.velocity.y = 0;
      s.velocity.z = 0;
    }
    return s;
  }

  private slotHash(id: number): number {
    return (Math.imul((id | 0) ^ ((id * 4096) | 0), 0x9e3779b1) >>> 0) & this.mask;
  }

  private insert(id: number): number {
    if (!Number.isFinite(id)) return -1;
    let slot = this.freeSlot();
    if (slot < 0) {
      this.evictStale();
      slot = this.freeSlot();
      if (slot < 0) return -1;
    }
    this.used[slot] = 1;
    this.ids[slot] = id;
    this.estimators[slot].reset();
    let h = this.slotHash(id);
    while (this.hash[h] >= 0) h = (h + 1) & this.mask;
    this.hash[h] = slot;
    return slot;
  }

  private freeSlot(): number {
    for (let i = 0; i < this.capacity; i++) if (this.used[i] === 0) return i;
    return -1;
  }

  private evictStale(): void {
    for (let i = 0; i < this.capacity; i++) if (this.pushes - this.seen[i] > STALE_PUSHES) this.used[i] = 0;
    this.hash.fill(-1);
    for (let i = 0; i < this.capacity; i++) {
      if (this.used[i] === 0) continue;
      let h = this.slotHash(this.ids[i]);
      while (this.hash[h] >= 0) h = (h + 1) & this.mask;
      this.hash[h] = i;
    }
  }

  /**
   * out = a[ia…ia+2] + (b[ib…ib+2] − a[ia…ia+2])·weight. The weight comes in a field: passed as an argument, V8 boxed it
   * on every call whenever it had compiled the caller before this function had type feedback of its own and so did
   * not inline it (≈107 B/block for a whole run, docs/allocation.md).
   */
  private lerp3(out: Vec3Like, a: Float64Array, ia: number, ib: number, b: Float64Array): void {
    const w = this.weight;
    out.x = a[ia] + (b[ib] - a[ia]) * w;
    out.y = a[ia + 1] + (b[ib + 1] - a[ia + 1]) * w;
    out.z = a[ia + 2] + (b[ib + 2] - a[ia + 2]) * w;
  }

  private put3(a: Float64Array, o: number, p: Vec3Like): void {
    const x = p.x;
    const y = p.y;
    const z = p.z;
    if (Number.isFinite(x) && Number.isFinite(y) && Number.isFinite(z)) {
      a[o] = x;
      a[o + 1] = y;
      a[o + 2] = z;
    } else this.clamps++; // keep the previous value
  }
}

/**
 * A vector (x, y, z) whose fields are created with doubles: created with small integers, they would change the layout of
 * every such object when the first interpolated double arrives, throwing away optimised code (docs/allocation.md).
 */
function v(x: number, y: number, z: number): Vec3Like {
  const out = { x: 0.5, y: 0.5, z: 0.5 };
  out.x = x;
  out.y = y;
  out.z = z;
  return out;
}
