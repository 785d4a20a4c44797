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
    let start = request.startTime ?? now;
    if (!Number.isFinite(start)) {
      this.clamps += 1;
      start = Number.isFinite(now) ? now : this.start;
    }
    let ramp = request.rampSeconds;
    if (!(ramp >= 0) || ramp === Infinity) {
      this.clamps += 1;
      ramp = 0;
    }
    const from = this.valueAt(start);
    this.from = from;
    this.clampTarget(request.target);
    this.start = start;
    this.duration = ramp;
    this.easing = request.easing === 'smooth' || request.easing === 'exponential' ? request.easing : 'linear';
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
    if (this.duration <= 0) {
      if (time >= this.start) this.value = this.to;
      else this.value = this.from;
      return;
    }
    if (!(time > this.start)) {
      this.value = this.from;
      return;
    }
    const io = this.io;
    io[0] = this.from;
    io[1] = this.to;
    io[2] = (time - this.start) / this.duration;
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
