// Per-source trajectory history: a bounded ring of snapshot knots (engine time, position, velocity) per source slot,
// read back by cubic Hermite interpolation (velocities as tangents: given, else the derivative of the quadratic
// through three neighbouring knots, i.e. Catmull-Rom for uneven spacing), with a teleport guard that compares each
// knot with the position predicted from the recent motion.
import type { Seconds, Vec3Like } from '../units';

/** Knots kept per source by default (about 4.3 s of history at 60 snapshots per second). */
export const TRACK_KNOTS = 256;
/** A knot farther than this from the predicted position (plus half the predicted step) is a teleport, m. */
export const TELEPORT_TOLERANCE_METERS = 4;
/** Largest coordinate accepted, m; beyond (or non-finite) the knot is dropped and counted. */
export const TRACK_MAX_COORDINATE = 1e7;
/** Past the newest knot a track extrapolates along its last velocity for at most this long, then holds still, s. */
export const TRACK_EXTRAPOLATE_SECONDS = 0.1;

/** Where an evaluation time fell: inside the history, before its first knot, or after its last. */
export const TRACK_INSIDE = 0;
/** Evaluation before the first knot: the source holds its first position (velocity 0). */
export const TRACK_BEFORE = -1;
/** Evaluation after the last knot: extrapolated briefly, then held. */
export const TRACK_AFTER = 1;

/** Result of appending a knot. */
export const APPEND_OK = 0;
/** The knot was a teleport: the track restarted at it. */
export const APPEND_TELEPORT = 1;
/** The knot was dropped (non-finite or absurd position, or time not after the last knot). */
export const APPEND_DROPPED = -1;

/** Trajectory rings for `slots` sources; creates no objects after construction; its bodies take and return no doubles (docs/allocation.md). */
export class SourceTracks {
  /** Knots dropped (bad positions, time going backwards) and explicit velocities ignored as non-finite. */
  dropped = 0;
  /** Teleports detected (prediction) or requested. */
  teleports = 0;
  /** Knots per slot. */
  readonly knots: number;
  private readonly time: Float64Array;
  private readonly pos: Float64Array;
  private readonly vel: Float64Array;
  private readonly given: Uint8Array;
  private readonly first: Int32Array;
  private readonly count: Int32Array;
  /** Per slot, the segment `evaluate` found last, and the one it found before that. */
  private readonly hint: Int32Array;
  private readonly hintBefore: Int32Array;
  /** Restart counter per slot (a teleport or reset starts a new epoch). */
  readonly epoch: Int32Array;
  /** Largest speed seen per slot since its last restart, m/s (engine clock). */
  readonly maxSpeed: Float64Array;
  private readonly pendingTeleport: Uint8Array;
  /** Engine time of the knot `append` adds or of the point `evaluate` reads, s: set it first. A field, so that no double
   * crosses the call (V8 boxes one passed to a call it does not inline, docs/allocation.md). */
  at: Seconds = 0.5;
  /** TRACK_EXTRAPOLATE_SECONDS as a field: a module constant merged with a computed double made V8 box the double. */
  private readonly reach: Seconds = TRACK_EXTRAPOLATE_SECONDS;

  /** Preallocates `slots` rings of `knots` (≥ 4) knots. */
  constructor(slots: number, knots: number = TRACK_KNOTS) {
    const k = Math.max(4, Math.floor(knots));
    this.knots = k;
    this.time = new Float64Array(slots * k);
    this.pos = new Float64Array(3 * slots * k);
    this.vel = new Float64Array(3 * slots * k);
    this.given = new Uint8Array(slots * k);
    this.first = new Int32Array(slots);
    this.count = new Int32Array(slots);
    this.hint = new Int32Array(slots);
    this.hintBefore = new Int32Array(slots);
    this.epoch = new Int32Array(slots);
    this.maxSpeed = new Float64Array(slots);
    this.pendingTeleport = new Uint8Array(slots);
  }

  /** Forgets slot `slot`'s history (a new source, or a teleport) and starts a new epoch. */
  reset(slot: number): void {
    this.count[slot] = 0;
    this.first[slot] = 0;
    this.hint[slot] = 0;
    this.hintBefore[slot] = 0;
    this.maxSpeed[slot] = 0;
    this.epoch[slot]++;
  }

  /** Marks slot `slot` so that its next knot restarts the track (an explicit teleport). */
  requestTeleport(slot: number): void {
    this.pendingTeleport[slot] = 1;
  }

  /** Number of knots held by `slot`. */
  size(slot: number): number {
    return this.count[slot];
  }

  /** Appends a knot at engine time `at`; `velocity` (m/s, engine clock) or null to derive it from positions. */
  append(slot: number, p: Vec3Like, velocity: Vec3Like | null | undefined): number {
    const T = this.at;
    const lim = TRACK_MAX_COORDINATE;
    if (!(p.x >= -lim && p.x <= lim && p.y >= -lim && p.y <= lim && p.z >= -lim && p.z <= lim) || !Number.isFinite(T)) {
      this.dropped++;
      return APPEND_DROPPED;
    }
    let v = velocity ?? null;
    if (v !== null && !(Math.abs(v.x) < 1e9 && Math.abs(v.y) < 1e9 && Math.abs(v.z) < 1e9)) {
      this.dropped++;
      v = null;
    }
    let result = APPEND_OK;
    let n = this.count[slot];
    if (this.pendingTeleport[slot] === 1) {
      this.pendingTeleport[slot] = 0;
      if (n > 0) {
        this.reset(slot);
        this.teleports++;
        result = APPEND_TELEPORT;
        n = 0;
      }
    }
    if (n > 0) {
      const li = this.index(slot, n - 1);
      const h = T - this.time[li];
      if (!(h > 1e-6)) {
        this.dropped++;
        return APPEND_DROPPED;
      }
      if (n >= 2 || this.given[li] === 1 || v !== null) {
        // Predicted from the last knot's position and velocity (constant velocity over the step).
        const P = this.pos;
        const V = this.vel;
        const ex = P[3 * li] + V[3 * li] * h - p.x;
        const ey = P[3 * li + 1] + V[3 * li + 1] * h - p.y;
        const ez = P[3 * li + 2] + V[3 * li + 2] * h - p.z;
        const err = Math.sqrt(ex * ex + ey * ey + ez * ez);
        const step = h * Math.sqrt(V[3 * li] * V[3 * li] + V[3 * li + 1] * V[3 * li + 1] + V[3 * li + 2] * V[3 * li + 2]);
        if (err > TELEPORT_TOLERANCE_METERS + 0.5 * step) {
          this.reset(slot);
          this.teleports++;
          result = APPEND_TELEPORT;
          n = 0;
        }
      }
    }
    let i: number;
    if (n < this.knots) {
      i = this.index(slot, n);
      this.count[slot] = n + 1;
    } else {
      i = slot * this.knots + this.first[slot];
      this.first[slot] = (this.first[slot] + 1) % this.knots;
    }
    this.time[i] = T;
    this.pos[3 * i] = p.x;
    this.pos[3 * i + 1] = p.y;
    this.pos[3 * i + 2] = p.z;
    this.given[i] = v === null ? 0 : 1;
    if (v !== null) {
      this.vel[3 * i] = v.x;
      this.vel[3 * i + 1] = v.y;
      this.vel[3 * i + 2] = v.z;
    }
    this.estimate(slot);
    const V = this.vel;
    const speed = Math.sqrt(V[3 * i] * V[3 * i] + V[3 * i + 1] * V[3 * i + 1] + V[3 * i + 2] * V[3 * i + 2]);
    if (speed > this.maxSpeed[slot]) this.maxSpeed[slot] = speed;
    return result;
  }

  /**
   * Position and velocity (m/s, engine clock) of `slot` at engine time `at` into `outP`/`outV`; returns TRACK_INSIDE,
   * TRACK_BEFORE (first position held, velocity 0) or TRACK_AFTER. An empty slot gives the origin, velocity 0.
   */
  evaluate(slot: number, outP: Vec3Like, outV: Vec3Like): number {
    const T = this.at;
    const n = this.count[slot];
    const P = this.pos;
    const V = this.vel;
    // Coordinates are written field by field: a helper taking three doubles boxes them where V8 does not inline it.
    if (n === 0) {
      outP.x = 0;
      outP.y = 0;
      outP.z = 0;
      outV.x = 0;
      outV.y = 0;
      outV.z = 0;
      return TRACK_BEFORE;
    }
    const f = this.index(slot, 0);
    if (!(T > this.time[f])) {
      outP.x = P[3 * f];
      outP.y = P[3 * f + 1];
      outP.z = P[3 * f + 2];
      outV.x = 0;
      outV.y = 0;
      outV.z = 0;
      return n === 1 && T === this.time[f] ? TRACK_INSIDE : TRACK_BEFORE;
    }
    const l = this.index(slot, n - 1);
    if (T >= this.time[l]) {
      const dt = T - this.time[l];
      const reach = this.reach;
      const e = dt < reach ? dt : reach;
      const moving = dt < reach ? 1 : 0;
      outP.x = P[3 * l] + V[3 * l] * e;
      outP.y = P[3 * l + 1] + V[3 * l + 1] * e;
      outP.z = P[3 * l + 2] + V[3 * l + 2] * e;
      outV.x = V[3 * l] * moving;
      outV.y = V[3 * l + 1] * moving;
      outV.z = V[3 * l + 2] * moving;
      return TRACK_AFTER;
    }
    // Segment k … k+1 holding T (one only: knot times rise): the hint first, then the one before it (a solve moves
    // between the reception and the emission time, knots apart), then a binary search.
    let k = this.hint[slot];
    if (!this.holds(slot, k, n)) {
      if (this.holds(slot, k + 1, n)) k++;
      else {
        const other = this.hintBefore[slot];
        this.hintBefore[slot] = k;
        if (this.holds(slot, other, n)) k = other;
        else if (this.holds(slot, other + 1, n)) k = other + 1;
        else {
          let lo = 0;
          let hi = n - 1;
          while (hi - lo > 1) {
            const mid = (lo + hi) >> 1;
            if (this.time[this.index(slot, mid)] <= T) lo = mid;
            else hi = mid;
          }
          k = lo;
        }
      }
      this.hint[slot] = k;
    }
    const a = this.index(slot, k);
    const b = this.index(slot, k + 1);
    const h = this.time[b] - this.time[a];
    const x = (T - this.time[a]) / h;
    const x2 = x * x;
    const x3 = x2 * x;
    // Cubic Hermite basis and derivatives.
    const h00 = 2 * x3 - 3 * x2 + 1;
    const h10 = x3 - 2 * x2 + x;
    const h01 = -2 * x3 + 3 * x2;
    const h11 = x3 - x2;
    const d00 = (6 * x2 - 6 * x) / h;
    const d10 = 3 * x2 - 4 * x + 1;
    const d01 = (-6 * x2 + 6 * x) / h;
    const d11 = 3 * x2 - 2 * x;
    outP.x = h00 * P[3 * a] + h10 * h * V[3 * a] + h01 * P[3 * b] + h11 * h * V[3 * b];
    outP.y = h00 * P[3 * a + 1] + h10 * h * V[3 * a + 1] + h01 * P[3 * b + 1] + h11 * h * V[3 * b + 1];
    outP.z = h00 * P[3 * a + 2] + h10 * h * V[3 * a + 2] + h01 * P[3 * b + 2] + h11 * h * V[3 * b + 2];
    outV.x = d00 * P[3 * a] + d10 * V[3 * a] + d01 * P[3 * b] + d11 * V[3 * b];
    outV.y = d00 * P[3 * a + 1] + d10 * V[3 * a + 1] + d01 * P[3 * b + 1] + d11 * V[3 * b + 1];
    outV.z = d00 * P[3 * a + 2] + d10 * V[3 * a + 2] + d01 * P[3 * b + 2] + d11 * V[3 * b + 2];
    return TRACK_INSIDE;
  }

  /** Whether segment k … k+1 of `slot`'s n knots holds the time in `at` (k ≥ 0, k + 1 < n, t_k ≤ at < t_{k+1}; integers in, a boolean out). */
  private holds(slot: number, k: number, n: number): boolean {
    const T = this.at;
    return k >= 0 && k < n - 1 && this.time[this.index(slot, k)] <= T && T < this.time[this.index(slot, k + 1)];
  }

  /** Ring index of the j-th knot (0 = oldest, j < knots) of `slot`: first + j < 2 · knots, so a subtraction wraps it. */
  private index(slot: number, j: number): number {
    const r = this.first[slot] + j;
    return slot * this.knots + (r < this.knots ? r : r - this.knots);
  }

  /** Derives the velocities not given: the newest knot from the last three (or two), the one before it centrally. */
  private estimate(slot: number): void {
    const n = this.count[slot];
    const c = this.index(slot, n - 1);
    if (n === 1) {
      if (this.given[c] === 0) this.vel.fill(0, 3 * c, 3 * c + 3);
      return;
    }
    const b = this.index(slot, n - 2);
    if (n === 2) {
      const h = this.time[c] - this.time[b];
      const P = this.pos;
      const V = this.vel;
      for (let d = 0; d < 3; d++) {
        const v = (P[3 * c + d] - P[3 * b + d]) / h;
        if (this.given[c] === 0) V[3 * c + d] = v;
        if (this.given[b] === 0) V[3 * b + d] = v;
      }
      return;
    }
    const a = this.index(slot, n - 3);
    this.quadratic(a, b, c, c);
    this.quadratic(a, b, c, b);
  }

  /** Velocity at knot `at` (one of a, b, c) from the quadratic through knots a, b, c (unless given). */
  private quadratic(a: number, b: number, c: number, at: number): void {
    if (this.given[at] === 1) return;
    const T = this.time;
    const P = this.pos;
    const h0 = T[b] - T[a];
    const h1 = T[c] - T[b];
    const w = h1 / (h0 + h1);
    // Slopes of the two chords; the quadratic's derivative at b is their weighted mean, at c it extrapolates.
    for (let d = 0; d < 3; d++) {
      const s0 = (P[3 * b + d] - P[3 * a + d]) / h0;
      const s1 = (P[3 * c + d] - P[3 * b + d]) / h1;
      this.vel[3 * at + d] = at === c ? s1 + (s1 - s0) * w : (s0 * h1 + s1 * h0) / (h0 + h1);
    }
  }
}

