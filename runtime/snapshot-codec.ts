// Snapshots on the wire: one flat Float64Array per snapshot (a 16-slot header, then 8 slots per source), encoded on
// the main thread into one reused array and decoded on the audio thread into one reused object (SnapshotDecoder).
import type { EngineSnapshot, Seconds, SourceState, Vec3Like } from '../src/index';

/** Encoding version stored in the first slot of a snapshot. */
export const SNAPSHOT_VERSION = 1;
/** Slots before the first source: version, time, listener position, forward, up, has-velocity, velocity, count. */
export const SNAPSHOT_HEADER = 16;
/** Slots per source: id, position, has-velocity, velocity. */
export const SNAPSHOT_STRIDE = 8;

/** Number of sources in an encoded snapshot, or −1 if the encoding is malformed. */
export function snapshotSourceCount(data: Float64Array): number {
  if (data.length < SNAPSHOT_HEADER || data[0] !== SNAPSHOT_VERSION) return -1;
  const n = data[15];
  if (!Number.isInteger(n) || n < 0 || data.length < SNAPSHOT_HEADER + n * SNAPSHOT_STRIDE) return -1;
  return n;
}

/** Floats needed to encode a snapshot of `sources` sources. */
export function snapshotLength(sources: number): number {
  return SNAPSHOT_HEADER + sources * SNAPSHOT_STRIDE;
}

/** Encodes a snapshot into `out` (allocated when absent or too short); returns the array written. */
export function encodeSnapshot(s: EngineSnapshot, out?: Float64Array): Float64Array {
  const n = s.sources.length;
  const d = out && out.length >= snapshotLength(n) ? out : new Float64Array(snapshotLength(n));
  const l = s.listener;
  d[0] = SNAPSHOT_VERSION;
  d[1] = s.time;
  d[2] = l.position.x; d[3] = l.position.y; d[4] = l.position.z;
  d[5] = l.forward.x; d[6] = l.forward.y; d[7] = l.forward.z;
  d[8] = l.up.x; d[9] = l.up.y; d[10] = l.up.z;
  d[11] = l.velocity ? 1 : 0;
  d[12] = l.velocity ? l.velocity.x : 0; d[13] = l.velocity ? l.velocity.y : 0; d[14] = l.velocity ? l.velocity.z : 0;
  d[15] = n;
  for (let i = 0; i < n; i++) {
    const src = s.sources[i];
    const o = SNAPSHOT_HEADER + i * SNAPSHOT_STRIDE;
    d[o] = src.id;
    d[o + 1] = src.position.x; d[o + 2] = src.position.y; d[o + 3] = src.position.z;
    d[o + 4] = src.velocity ? 1 : 0;
    d[o + 5] = src.velocity ? src.velocity.x : 0; d[o + 6] = src.velocity ? src.velocity.y : 0; d[o + 7] = src.velocity ? src.velocity.z : 0;
  }
  return d;
}

const vec = (): Vec3Like => ({ x: 0, y: 0, z: 0 });

/** A fresh snapshot object (listener at the origin facing −z, no sources). */
export function createSnapshot(): EngineSnapshot {
  return { time: 0, listener: { position: vec(), forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 }, velocity: undefined }, sources: [] };
}

/** First capacity of the source lists; each next one is twice the last plus this (see SnapshotDecoder). */
const FIRST_LIST = 16;

/**
 * Decodes snapshots into one snapshot object, the same after every decode: its listener, its source states (one per
 * source slot, each with its own position and velocity objects) and its source list are made in the constructor, so a
 * decode writes numbers and references only. A velocity the sender left out reads `undefined` (the engine then
 * estimates it from positions, as for an absent one).
 *
 * The source list must be an array of exactly the snapshot's length, and V8 trims an array's backing store when its
 * length drops below about half its capacity (2n + 16 ≤ capacity) and reallocates it when it grows back. So the decoder
 * keeps one list per band of counts — capacities 16, 48, 112, 240, … (each 2c + 16), the last capped at `maxSources` —
 * and each list only ever serves counts within its band, where setting its length neither trims nor grows it.
 */
export class SnapshotDecoder {
  /** The decoded snapshot: the same object after every decode (valid until the next one). */
  readonly snapshot: EngineSnapshot = createSnapshot();
  /** Sources a snapshot can hold without allocating (beyond it a decode builds a fresh list: a sender never sends more). */
  readonly maxSources: number;
  private readonly states: SourceState[] = [];
  private readonly velocities: Vec3Like[] = [];
  private readonly listenerVelocity = vec();
  private readonly lists: SourceState[][] = [];
  private readonly capacities: number[] = [];

  /** Preallocates `maxSources` source states (1…4096) and their lists. */
  constructor(maxSources: number) {
    this.maxSources = Math.max(1, Math.min(4096, Math.floor(maxSources) || 1));
    for (let i = 0; i < this.maxSources; i++) {
      this.states.push({ id: 0, position: vec(), velocity: undefined });
      this.velocities.push(vec());
    }
    this.lists.push([]); // count 0: an empty list never grows
    this.capacities.push(0);
    for (let c = FIRST_LIST; ; c = 2 * c + FIRST_LIST) {
      const cap = Math.min(c, this.maxSources);
      const list: SourceState[] = new Array<SourceState>(cap);
      for (let i = 0; i < cap; i++) list[i] = this.states[i];
      this.lists.push(list);
      this.capacities.push(cap);
      if (cap === this.maxSources) break;
    }
  }

  /** Decodes `d` into `snapshot` and returns it, or null for a malformed encoding; `timeOffset` is subtracted from its time. */
  decode(d: Float64Array, timeOffset: Seconds = 0): EngineSnapshot | null {
    const n = snapshotSourceCount(d);
    if (n < 0) return null;
    const s = this.snapshot;
    s.time = d[1] - timeOffset;
    const l = s.listener;
    put(l.position, d, 2);
    put(l.forward, d, 5);
    put(l.up, d, 8);
    l.velocity = d[11] === 1 ? put(this.listenerVelocity, d, 12) : undefined;
    const list = n <= this.maxSources ? this.listFor(n) : this.freshList(n);
    list.length = n;
    for (let i = 0; i < n; i++) {
      const o = SNAPSHOT_HEADER + i * SNAPSHOT_STRIDE;
      const src = i < this.maxSources ? this.states[i] : list[i];
      src.id = d[o];
      put(src.position, d, o + 1);
      src.velocity = d[o + 4] === 1 ? put(i < this.maxSources ? this.velocities[i] : vec(), d, o + 5) : undefined;
      list[i] = src;
    }
    s.sources = list;
    return s;
  }

  /** The preallocated list whose band holds `n` (capacities[k − 1] < n ≤ capacities[k]). */
  private listFor(n: number): SourceState[] {
    let k = 0;
    while (this.capacities[k] < n) k++;
    return this.lists[k];
  }

  /** A list for an oversized snapshot (more sources than maxSources), allocated: the runtime never sends one. */
  private freshList(n: number): SourceState[] {
    const list: SourceState[] = [];
    for (let i = 0; i < n; i++) list.push(i < this.maxSources ? this.states[i] : { id: 0, position: vec(), velocity: undefined });
    return list;
  }
}

/** Copies slots at..at+2 of `d` into `v`; returns `v`. */
function put(v: Vec3Like, d: Float64Array, at: number): Vec3Like {
  v.x = d[at];
  v.y = d[at + 1];
  v.z = d[at + 2];
  return v;
}

/**
 * Decodes into a fresh snapshot object (nothing shared with earlier results; an absent velocity is left out, not
 * undefined); null for a malformed encoding. For the main thread and tests: the worklet host decodes with a
 * SnapshotDecoder. `timeOffset` is subtracted from the time (sender's clock → engine time).
 */
export function decodeSnapshot(d: Float64Array, timeOffset: Seconds = 0): EngineSnapshot | null {
  const n = snapshotSourceCount(d);
  if (n < 0) return null;
  const s: EngineSnapshot = { time: d[1] - timeOffset, listener: { position: vec(), forward: vec(), up: vec() }, sources: [] };
  const l = s.listener;
  put(l.position, d, 2);
  put(l.forward, d, 5);
  put(l.up, d, 8);
  if (d[11] === 1) l.velocity = put(vec(), d, 12);
  for (let i = 0; i < n; i++) {
    const o = SNAPSHOT_HEADER + i * SNAPSHOT_STRIDE;
    const src: SourceState = { id: d[o], position: put(vec(), d, o + 1) };
    if (d[o + 4] === 1) src.velocity = put(vec(), d, o + 5);
    s.sources.push(src);
  }
  return s;
}
