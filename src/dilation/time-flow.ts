// Time-scale transitions: a ramp from the value at the start time to a target, eased linearly, by smoothstep
// (3u² − 2u³, common practice) or exponentially (equal ratio per unit time); a pure function of time.
import type { Easing } from '../tuning';
import type { Seconds } from '../units';
import type { TimeScaleRequest } from './snapshot-types';
import { MAX_TIME_SCALE } from '../tuning';

/** Lowest value used for the exponential easing's geometric interpolation (values below ramp linearly to 0). */
export const EXPONENTIAL_FLOOR = 0.01;

/** Options of TimeFlow. */
export interface TimeFlowOptions {
  /** Initial time scale, 0…4 (default 1). */
  initial?: number;
}

/** Frozen defaults of TimeFlow. */
export const timeFlowDefaults: Readonly<Required<TimeFlowOptions>> = Object.freeze({ initial: 1 });


/** Eases u ∈ [0, 1] from `from` to `to`. */
export function easeValue(from: number, to: number, u: number, easing: Easing): number {
  const io = EASE_SCRATCH;
  io[0] = from;
  io[1] = to;
  io[2] = u;
  easeInto(io, easing);
  return io[3];
}

/** The doubles of `easeValue` handed to easeInto. */
const EASE_SCRATCH = easeScratch();

/** A Float64Array for easeInto: [from, to, u, result, EXPONENTIAL_FLOOR] (the floor as a double, not a module constant). */
function easeScratch(): Float64Array {
  const io = new Float64Array(5);
  io[4] = EXPONENTIAL_FLOOR;
  return io;
}

/**
 * `easeValue` of io = [from, to, u] into io[3]: its doubles in a Float64Array, since V8 boxes a double passed to or
 * returned from a call it does not inline (docs/allocation.md). One store, after the branches: a store inside a branch
 * first taken after optimisation (a ramp's end, u ≥ 1) has no type feedback and deoptimises the function.
 */
function easeInto(io: Float64Array, easing: Easing): void {
  const from = io[0];
  const to = io[1];
  const u = io[2];
  let v: number;
  if (u <= 0) v = from;
  else if (u >= 1) v = to;
  else if (easing === 'smooth') v = from + (to - from) * u * u * (3 - 2 * u);
  else if (easing === 'exponential') {
    const floor = io[4];
    const a = from > floor ? from : floor;
    const b = to > floor ? to : floor;
    v = a * Math.pow(b / a, u);
    // Values under the floor: blend linearly toward the true endpoint near the ends so the ramp starts/ends exactly.
    if (from < floor) v += (from - a) * (1 - u);
    if (to < floor) v += (to - b) * u;
  } else v = from + (to - from) * u;
  io[3] = v;
}

/** The global time scale over time: the current ramp (start, duration, easing, endpoints), evaluated on demand. */
export class TimeFlow {
  /** Requests whose target, ramp or start time were non-finite or out of range and were clamped. */
  clamps = 0;
  private from = 0.5;
  private to = 0.5;
  /** The time `lookUp` reads, s (a field declared with a double). */
  time = 0.5;
  /** The time scale `lookUp` wrote: valueAt(time). */
  value = 0.5;
  private readonly io = easeScratch();
  /** MAX_TIME_SCALE as a field: a module constant merged with a double makes V8 box the result (docs/allocation.md). */
  private readonly maxScale = MAX_TIME_SCALE;
  // Declared with doubles, set to 0 in the constructor: a field first stored with a small integer and later with a
  // double changes the layout of the object and throws away optimised code using it (docs/allocation.md).
  private start: Seconds = 0.5;
  private duration: Seconds = 0.5;
  private easing: Easing = 'linear';
  /** A request's start time (its startTime, or the time it was made when it has none), flow time s, for `propose`. */
  requestStart: Seconds = 0.5;
  /** Flow time the request was made at, s, for `propose`. */
  requestNow: Seconds = 0.5;
  /** A request's rampSeconds, for `propose`. */
  requestRamp: Seconds = 0.5;
  /** A request's target, for `propose`. */
  requestTarget = 0.5;
  /** A request's easing, for `propose`. */
  requestEasing: Easing = 'linear';
  // The ramp `propose` computed, which `commit` makes current.
  private nextFrom = 0.5;
  private nextTo = 0.5;
  private nextStart: Seconds = 0.5;
  private nextDuration: Seconds = 0.5;
  private nextEasing: Easing = 'linear';
  private nextClamps = 0;

  /** Creates a flow resting at `initial` (default 1, clamped to 0…4). */
  constructor(options: TimeFlowOptions = timeFlowDefaults) {
    this.start = 0;
    this.duration = 0;
    const initial = options.initial ?? timeFlowDefaults.initial;
    this.clampTarget(initial);
    this.from = this.to;
  }

  /** The value the current ramp ends at. */
  get target(): number {
    return this.to;
  }

  /** Engine time the current ramp starts at, s. */
  get startTime(): Seconds {
    return this.start;
  }

  /** Duration of the current ramp, s. */
  get rampSeconds(): Seconds {
    return this.duration;
  }

  /**
   * Starts a ramp at request.startTime (default `now`, s) from the value at that time to request.target
   * (clamped to 0…4; NaN or negative gives 0, counted), over request.rampSeconds (≥ 0) with request.easing.
   */
  set(request: TimeScaleRequest, now: Seconds): void {
    this.requestStart = request.startTime ?? now;
    this.requestNow = now;
    this.requestRamp = request.rampSeconds;
    this.requestTarget = request.target;
    this.requestEasing = request.easing;
    this.propose();
    this.commit(true);
  }

  /**
   * `set` of the request fields (`requestStart`, already defaulted to `requestNow`; `requestRamp`, `requestTarget`,
   * `requestEasing`) into the `next…` fields, leaving the ramp as it is: the render path runs it on every call, with
   * `commit`, so that it is optimised with type feedback and takes and returns no double (docs/allocation.md). Every
   * value is computed on every pass, the rare ones (a clamp) included: a branch first taken after optimisation would
   * deoptimise it.
   */
  propose(): void {
    const asked = this.requestStart;
    const now = this.requestNow;
    const startOk = Number.isFinite(asked);
    const prev = this.start;
    const fallback = Number.isFinite(now) ? now : prev;
    const start = startOk ? asked : fallback;
    const ramp = this.requestRamp;
    const rampOk = ramp >= 0 && ramp < Infinity;
    this.time = start;
    this.lookUp();
    this.nextFrom = this.value;
    const value = this.requestTarget;
    const max = this.maxScale;
    let to: number;
    if (!(value > 0)) to = 0;
    else if (value < max) to = value;
    else to = max;
    this.nextTo = to;
    this.nextStart = start;
    this.nextDuration = rampOk ? ramp : 0;
    const e = this.requestEasing;
    this.nextEasing = e === 'smooth' || e === 'exponential' ? e : 'linear';
    this.nextClamps = (startOk ? 0 : 1) + (rampOk ? 0 : 1) + (to !== value ? 1 : 0);
  }

  /** Makes the `next…` ramp of `propose` the current one when `apply` is true; stores every field either way (no branch). */
  commit(apply: boolean): void {
    this.from = apply ? this.nextFrom : this.from;
    this.to = apply ? this.nextTo : this.to;
    this.start = apply ? this.nextStart : this.start;
    this.duration = apply ? this.nextDuration : this.duration;
    this.easing = apply ? this.nextEasing : this.easing;
    this.clamps += apply ? this.nextClamps : 0;
  }

  /** Sets the value at once (clamped to 0…4, counted when out of range) from time `now`. */
  jump(value: number, now: Seconds): void {
    this.set({ target: value, rampSeconds: 0, easing: 'linear' }, now);
  }

  /** Time scale at `time` (s): the start value up to the ramp start (and for NaN), eased during it, the target after; within 0…4. */
  valueAt(time: Seconds): number {
    this.time = time;
    this.lookUp();
    return this.value;
  }

  /**
   * `valueAt` of the `time` field into the `value` field: the render path's form, taking and returning no double (V8
   * boxes one passed to or returned from a call it does not inline; docs/allocation.md).
   */
  lookUp(): void {
    const time = this.time;
    const start = this.start;
    const duration = this.duration;
    // u = 0 before the ramp (and for NaN), 1 at or after its end; easeInto gives `from` at 0 and `to` at 1. Eased on
    // every pass, resting or not: a function called only during ramps stays unoptimised for thousands of calls and
    // boxes every double it reads (docs/allocation.md).
    const step = time >= start ? 1 : 0;
    const u = duration <= 0 ? step : time > start ? (time - start) / duration : 0;
    const io = this.io;
    io[0] = this.from;
    io[1] = this.to;
    io[2] = u;
    easeInto(io, this.easing);
    this.value = io[3];
  }

  /**
   * Sets `to` to `value` clamped to 0…MAX_TIME_SCALE (NaN gives 0), counting a change. Writes the field, returning nothing: a
   * double returned from a call V8 does not inline is boxed (docs/allocation.md).
   */
  private clampTarget(value: number): void {
    const max = this.maxScale;
    if (!(value > 0)) this.to = 0;
    else if (value < max) this.to = value;
    else this.to = max;
    if (this.to !== value) this.clamps += 1;
  }
}
