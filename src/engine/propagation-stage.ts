// The propagation stage: sources tracked from their first snapshot (trajectory rings on the engine clock), the game
// clock, the emission-time solution per source and block (delay, emission-time position, game-clock Doppler factor),
// Mach-cone arrivals reported as shockwave events; the inputs and results of each propagating voice's per-sample read
// ratios (ratio-ramp.ts).
import type { Seconds, Vec3Like } from '../units';
import type { EngineSnapshot, ShockwaveEvent } from './engine-types';
import type { SnapshotStore } from './snapshot-store';
import { MAX_RATIO, MIN_RATIO } from '../dsp';
import { GameClock } from './game-clock';
import { SourceTracks, TRACK_KNOTS } from './source-tracks';
import { EmissionSolver, createEmissionSolution, EMISSION_HISTORY, EMISSION_NONE, type EmissionSolution } from './emission-solver';
import { RatioRampBasis, fillRatioRamp, type RatioRampState } from './ratio-ramp';

/** Shockwave events kept until read (older ones are dropped and counted). */
export const SHOCKWAVE_QUEUE = 64;
/** Snapshots after which a source no longer sent is no longer solved for. */
const LIVE_PUSHES = 120;
/** Offset corrections larger than this re-synchronise snapshot time to engine time at once, s. */
const RESYNC_SECONDS = 0.25;
/** Share of the offset error corrected per snapshot (a slow slew keeps knot spacing, hence velocities, exact). */
const OFFSET_SLEW = 0.02;

/** Options of PropagationStage. */
export interface PropagationStageOptions {
  /** Source slots, as the engine's snapshot store (1…4096). */
  maxSources: number;
  /** Knots per source history (default TRACK_KNOTS). */
  knots?: number;
}

/** Tracks, clock and emission-time solutions for an engine; creates no objects after construction; its bodies take and return no doubles (docs/allocation.md). */
export class PropagationStage implements RatioRampState {
  /** The game clock over engine time. */
  readonly clock = new GameClock();
  /** Trajectories: one slot per source plus the listener's (slot `listenerSlot`). */
  readonly tracks: SourceTracks;
  /** Slot of the listener's track. */
  readonly listenerSlot: number;
  /** Solution per source slot at the end of the last block, and at its start. */
  readonly now: EmissionSolution[] = [];
  readonly before: EmissionSolution[] = [];
  /** Ratios clamped to the resampler's range (e.g. at a Mach cone), counted, never silent. */
  ratioClamps = 0;
  /** Shockwaves detected, and events dropped because the queue was full. */
  shockwaves = 0;
  droppedEvents = 0;
  /** The last shockwave's engine time (s, NaN before any) and source id (−1 before any, set in the constructor). */
  lastShockwaveTime: Seconds = NaN;
  // Declared with a double: ids are read from a Float64Array, and a double stored into a field that held a small
  // integer changes the object's layout, which throws away the optimised code of every method (docs/allocation.md).
  lastShockwaveSource = 0.5;
  private readonly solver = new EmissionSolver();
  private readonly ids: Float64Array;
  private readonly lastPush: Float64Array;
  private readonly solvedEpoch: Int32Array;
  private readonly needed: Uint8Array;
  private readonly events: ShockwaveEvent[] = [];
  private eventHead = 0;
  private eventCount = 0;
  private pushes = 0;
  private offset = NaN;
  private readonly lp: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly lv: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly sp: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly sv: Vec3Like = { x: 0, y: 0, z: 0 };
  /** Engine time at the start of the block `solveAll` solves, s (the render loop sets the three, then calls). */
  blockStart: Seconds = 0.5;
  // Doubles handed to solveAll and fillRamp in fields, not as arguments: V8 boxes a double passed to or returned from
  // a call it does not inline (docs/allocation.md).
  /** Engine time at the end of the block `solveAll` solves, s. */
  blockEnd: Seconds = 0.5;
  /** Time scale over that block (0…4). */
  blockScale = 0.5;
  /** Inputs of `fillRamp`: the time ratio at the block's start and end, the Doppler factor at both, and its mean. */
  readonly ramp = new Float64Array(5);
  /** Source frames advanced by the last `fillRamp` (the sum of its ratios). */
  rampSum = 0.5;
  /** The resampler's ratio range as fields: module constants merged with a computed double made V8 box the double. */
  readonly minRatio = MIN_RATIO;
  readonly maxRatio = MAX_RATIO;
  /** The Hermite basis of `fillRamp`'s cubic, shared by every voice of a block. */
  readonly basis = new RatioRampBasis();

  /** Preallocates the tracks of `maxSources` sources and the listener. */
  constructor(options: PropagationStageOptions) {
    const n = Math.max(1, Math.min(4096, Math.floor(options.maxSources)));
    this.tracks = new SourceTracks(n + 1, options.knots ?? TRACK_KNOTS);
    this.listenerSlot = n;
    this.lastShockwaveSource = -1;
    this.ids = new Float64Array(n).fill(NaN);
    this.lastPush = new Float64Array(n).fill(-Infinity);
    this.solvedEpoch = new Int32Array(n).fill(-1);
    this.needed = new Uint8Array(n);
    for (let i = 0; i < n; i++) {
      this.now.push(createEmissionSolution());
      this.before.push(createEmissionSolution());
    }
    for (let i = 0; i < SHOCKWAVE_QUEUE; i++) this.events.push({ time: 0.5, gameTime: 0.5, sourceId: 0.5 });
  }

  /** Speed of sound in metres per game second. */
  set speedOfSound(c: number) {
    this.solver.c = c;
  }

  /**
   * Records one snapshot's listener and sources, after `store` took it (its arrival time and interval, and its slots).
   * It takes no double: called once per snapshot, its caller may run unoptimised for minutes, and unoptimised code
   * boxes every double it reads or computes (docs/allocation.md).
   */
  push(s: EngineSnapshot, store: SnapshotStore): void {
    this.pushes++;
    // The knot's engine time: the snapshot's time plus an offset slewed towards arrival + interval − time.
    const time = s.time;
    const target = store.arrival + store.interval - time;
    if (!Number.isFinite(target)) {
      this.tracks.dropped++;
      return;
    }
    if (!(Math.abs(target - this.offset) < RESYNC_SECONDS)) this.offset = target;
    else this.offset += (target - this.offset) * OFFSET_SLEW;
    const T = time + this.offset;
    const tracks = this.tracks;
    tracks.at = T;
    tracks.append(this.listenerSlot, s.listener.position, s.listener.velocity);
    const list = s.sources;
    for (let i = 0; i < list.length; i++) {
      const src = list[i];
      const slot = store.find(src.id);
      if (slot < 0 || slot >= this.ids.length) continue;
      if (this.ids[slot] !== src.id) {
        this.ids[slot] = src.id;
        this.tracks.reset(slot);
      }
      this.lastPush[slot] = this.pushes;
      tracks.at = T;
      tracks.append(slot, src.position, src.velocity);
    }
  }

  /** Restarts source `id`'s track at its next snapshot (an explicit teleport); unknown ids are ignored. */
  teleport(id: number): void {
    for (let i = 0; i < this.ids.length; i++) if (this.ids[i] === id) this.tracks.requestTeleport(i);
  }

  /** Keeps source slot `slot` solved in the next `advance` even when its snapshots stopped (a voice still plays on it). */
  need(slot: number): void {
    if (slot >= 0 && slot < this.needed.length) this.needed[slot] = 1;
  }

  /** Advances the game clock over the block [start, end] at time scale `scale` and solves every live source at `end`. */
  advance(start: Seconds, end: Seconds, scale: number): void {
    this.blockStart = start;
    this.blockEnd = end;
    this.blockScale = scale;
    this.solveAll();
  }

  /** The body of `advance`, over [blockStart, blockEnd] at `blockScale`. */
  solveAll(): void {
    const start = this.blockStart;
    const end = this.blockEnd;
    const scale = this.blockScale;
    const gStart = this.clock.game;
    this.clock.advance(end, scale);
    const tracks = this.tracks;
    tracks.at = end;
    tracks.evaluate(this.listenerSlot, this.lp, this.lv);
    const solver = this.solver;
    solver.setListener(end, this.clock, this.lp, this.lv);
    const c = solver.c;
    // Through the clock's fields: V8 boxes a double passed to or returned from a call it does not inline. The slope at
    // the block's end is the same for every source: looked up once.
    const clock = this.clock;
    clock.query = end;
    clock.lookUp();
    const sNow = clock.slopeFound;
    for (let slot = 0; slot < this.ids.length; slot++) {
      const wanted = this.needed[slot] === 1 || this.pushes - this.lastPush[slot] <= LIVE_PUSHES;
      this.needed[slot] = 0;
      if (!wanted || tracks.size(slot) === 0) continue;
      const cur = this.now[slot];
      const prev = this.before[slot];
      copySolution(prev, cur);
      const epoch = tracks.epoch[slot];
      const same = this.solvedEpoch[slot] === epoch;
      this.solvedEpoch[slot] = epoch;
      let sLow = sNow;
      // G(previous τ), kept for the mean Doppler factor below (the same look-up).
      let gPrev = 0.5;
      if (same && prev.state !== EMISSION_NONE) {
        clock.query = prev.tau;
        clock.lookUp();
        sLow = Math.min(sNow, clock.slopeFound);
        gPrev = clock.gameFound;
      }
      const subsonic = same && prev.state !== EMISSION_NONE && tracks.maxSpeed[slot] < 0.9 * c * sLow;
      // The previous τ is used only when `subsonic` (which implies a valid previous solution).
      solver.solve(tracks, this.clock, slot, prev.tau, subsonic, cur);
      cur.coneTime = NaN;
      // A new or teleported track starts the block from this solution (no glide). The copy runs on every pass (prev onto
      // itself otherwise): a first call in a rare branch ran unoptimised for several spans (docs/allocation.md).
      copySolution(prev, same ? prev : cur);
      if (!same) {
        cur.meanDoppler = NaN;
        continue;
      }
      const gBlock = this.clock.game - gStart;
      if (prev.state !== EMISSION_NONE && cur.state !== EMISSION_NONE && gBlock > 1e-9) {
        // A solution other than EMISSION_NONE ends in the solver's `finish`, which leaves the clock looked up at its τ;
        // G(prev.tau) was looked up above (same, and prev unchanged since).
        cur.meanDoppler = (clock.gameFound - gPrev) / gBlock;
      }
      else cur.meanDoppler = NaN;
      this.detectCone(slot, prev, cur);
    }
  }

  /** Copies up to out.length pending shockwave events (oldest first) into `out` and returns how many. */
  drainShockwaves(out: ShockwaveEvent[]): number {
    let k = 0;
    while (this.eventCount > 0 && k < out.length) {
      const e = this.events[this.eventHead];
      const o = out[k++];
      o.time = e.time;
      o.gameTime = e.gameTime;
      o.sourceId = e.sourceId;
      this.eventHead = (this.eventHead + 1) % SHOCKWAVE_QUEUE;
      this.eventCount--;
    }
    return k;
  }

  /** Writes one voice's per-sample read ratios for a block of `frames` from `ramp` into `out` (ratio-ramp.ts). */
  fillRamp(out: Float32Array, frames: number): void {
    fillRatioRamp(this, out, frames);
  }

  /** Engine time of the start of the last solved block, s. */
  get lastBlockStart(): Seconds {
    return this.blockStart;
  }

  /**
   * Whether a Mach cone of source `slot` reached the listener during the block (solutions `prev` → `cur`): if so, sets
   * `cur.coneTime` and queues a shockwave. Called for every solved source and block, with the speed test and the
   * queueing in its own body: V8 optimises only code that runs often or is inlined into such code, and rare code left
   * to its interpreter boxes every double (docs/allocation.md).
   */
  private detectCone(slot: number, prev: EmissionSolution, cur: EmissionSolution): void {
    if (cur.state !== EMISSION_HISTORY) return;
    const start = this.blockStart;
    const end = this.blockEnd;
    // A cone shows as the first root in the history, found by the scan, or as the latest root jumping forward.
    const first = prev.state !== EMISSION_HISTORY;
    if (first ? !(cur.scanRate > 0) : !(cur.tau - prev.tau > (end - start) * 8 + 1e-4)) return;
    // Only a source that moved at least at the speed of sound (game clock) at τ makes one.
    const tau = cur.tau;
    const tracks = this.tracks;
    tracks.at = tau;
    tracks.evaluate(slot, this.sp, this.sv);
    const v = this.sv;
    const clock = this.clock;
    clock.query = tau;
    clock.lookUp();
    if (!(Math.sqrt(v.x * v.x + v.y * v.y + v.z * v.z) > 0.99 * this.solver.c * clock.slopeFound)) return;
    // Arrival: when the scanned residual crossed zero (first root), else at the block's start.
    let time = start;
    if (first) {
      time = end - cur.scanResidual / cur.scanRate;
      if (!(time >= start)) time = start;
    }
    cur.coneTime = time;
    const sourceId = this.ids[slot];
    this.shockwaves++;
    this.lastShockwaveTime = time;
    this.lastShockwaveSource = sourceId;
    if (this.eventCount === SHOCKWAVE_QUEUE) {
      this.droppedEvents++;
      this.eventHead = (this.eventHead + 1) % SHOCKWAVE_QUEUE;
      this.eventCount--;
    }
    const e = this.events[(this.eventHead + this.eventCount) % SHOCKWAVE_QUEUE];
    e.time = time;
    clock.query = time;
    clock.lookUp();
    e.gameTime = clock.gameFound;
    e.sourceId = sourceId;
    this.eventCount++;
  }
}

function copySolution(to: EmissionSolution, from: EmissionSolution): void {
  to.state = from.state;
  to.tau = from.tau;
  to.doppler = from.doppler;
  to.distance = from.distance;
  to.position.x = from.position.x;
  to.position.y = from.position.y;
  to.position.z = from.position.z;
}

