// Emission time of the sound heard now: the latest τ with c·(G(t) − G(τ)) = |L(t) − S(τ)| (retarded time of a moving
// point source; Morse & Ingard, Theoretical Acoustics §11.2), G the game clock. Solved per source and block by
// safeguarded Newton steps inside a bracket; the bracket comes from the last solution (subsonic sources) or from a
// backward scan with Lipschitz-bounded steps that cannot skip a root (supersonic sources: none before the Mach cone).
import type { Seconds, Vec3Like } from '../units';
import type { GameClock } from './game-clock';
import { TRACK_BEFORE, type SourceTracks } from './source-tracks';

/** No emission time reaches the listener now (a supersonic source before its Mach cone arrives). */
export const EMISSION_NONE = 0;
/** The emission time lies inside the source's history. */
export const EMISSION_HISTORY = 1;
/** The emission time lies before the source's first knot (it held its first position then). */
export const EMISSION_BEFORE = 2;

/** Longest propagation delay looked for, engine s (beyond: nothing arrives). */
export const MAX_DELAY_SECONDS = 600;
/** Largest game-clock Doppler factor reported (at the Mach cone it tends to infinity). */
export const MAX_EMISSION_DOPPLER = 64;

/** One solution: the latest emission time, where and how fast the source was then, and the Doppler factor. */
export interface EmissionSolution {
  /** EMISSION_NONE, EMISSION_HISTORY or EMISSION_BEFORE. */
  state: number;
  /** Emission time τ, engine s. */
  tau: Seconds;
  /** dG(τ)/dG(t): the heard frequency over the emitted one, game clock (1 with no motion). */
  doppler: number;
  /** Propagation distance |L(t) − S(τ)|, m. */
  distance: number;
  /** When a Mach cone arrived during the block that ended here: its estimated engine time, s (else NaN). */
  coneTime: Seconds;
  /** Mean of the Doppler factor over the block that ended here: ΔG(τ)/ΔG(t) (NaN when the block has no valid start). */
  meanDoppler: number;
  /** Source position at τ. */
  readonly position: Vec3Like;
  /** When the first point with a positive residual was found by the scan: its residual, m, and dResidual/dt, m/s. */
  scanResidual: number;
  scanRate: number;
  /** Newton and scan evaluations of the last solve (for the benchmark and tests). */
  evaluations: number;
}

/** Creates an empty solution object (allocate once per source slot). */
export function createEmissionSolution(): EmissionSolution {
  // Every field that will hold a double is created with one, then given its start value: a field first holding a small
  // integer changes the layout of every solution when a double arrives (the scan's fields, blocks into a run), which
  // throws away optimised code, and code compiled meanwhile can box doubles for good (docs/allocation.md).
  const s = { state: EMISSION_NONE, tau: NaN, doppler: 0.5, distance: 0.5, meanDoppler: NaN, coneTime: NaN, position: { x: 0.5, y: 0.5, z: 0.5 }, scanResidual: 0.5, scanRate: 0.5, evaluations: 0 };
  s.doppler = 1;
  s.distance = 0;
  s.position.x = 0;
  s.position.y = 0;
  s.position.z = 0;
  s.scanResidual = 0;
  s.scanRate = 0;
  return s;
}

/** Solves the emission-time equation for one source; creates no objects, and its steps pass doubles in fields, not calls (docs/allocation.md). */
export class EmissionSolver {
  /** Speed of sound, m per game second. */
  c = 343;
  private readonly sp: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly sv: Vec3Like = { x: 0, y: 0, z: 0 };
  /** Listener position and velocity (engine clock) at reception time; set by `setListener`. */
  private readonly lp: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly lv: Vec3Like = { x: 0, y: 0, z: 0 };
  private t: Seconds = 0.5;
  private gt: Seconds = 0.5;
  private st = 1;
  private region = 0;
  private dist = 0.5;
  private deriv = 0.5;
  private evals = 0;

  /** Sets the reception time t (engine s) and the listener's position and velocity (m/s, engine clock) then. */
  setListener(t: Seconds, clock: GameClock, p: Vec3Like, v: Vec3Like): void {
    this.t = t;
    this.listenAt(clock, p, v);
  }

  private listenAt(clock: GameClock, p: Vec3Like, v: Vec3Like): void {
    const t = this.t;
    // Through the clock's fields: V8 boxes a double passed to or returned from a call it does not inline.
    clock.query = t;
    clock.lookUp();
    this.gt = clock.gameFound;
    this.st = clock.slopeFound;
    copy(this.lp, p);
    copy(this.lv, v);
  }

  /**
   * Solves for source `slot` into `out`. `previous` is the last solution's τ (NaN for none) and is used as the
   * bracket's lower end when the source cannot be supersonic (`subsonic`).
   */
  solve(tracks: SourceTracks, clock: GameClock, slot: number, previous: Seconds, subsonic: boolean, out: EmissionSolution): void {
    this.previous = previous;
    this.solveSlot(tracks, clock, slot, subsonic, out);
  }

  // Doubles move between the steps below in fields (x, fx, lo, hi, …), never as arguments or return values: V8 boxes a
  // double passed to or returned from a call it does not inline, and these steps are too large to be always inlined.
  private previous: Seconds = 0.5;
  /** Point of the last residual evaluation (τ, engine s) and its residual f(τ), m. */
  private x: Seconds = 0.5;
  private fx = 0.5;
  /** Where `residual` last evaluated, engine s (its scratch results are of this point; `x` may since have moved on). */
  private evaluatedAt: Seconds = 0.5;
  /** Bracket of `bracket`: f(lo) ≥ 0 ≥ f(hi). */
  private lo: Seconds = 0.5;
  private flo = 0.5;
  private hi: Seconds = 0.5;
  private fhi = 0.5;
  private root: Seconds = 0.5;
  /** Loop state of `bracket` and of the backward scan: lo, hi, x. */
  private readonly box = new Float64Array(4);
  /** MAX_EMISSION_DOPPLER as a field: a module constant merged with a computed double made V8 box the double. */
  private readonly maxDoppler = MAX_EMISSION_DOPPLER;

  private solveSlot(tracks: SourceTracks, clock: GameClock, slot: number, subsonic: boolean, out: EmissionSolution): void {
    this.evals = 0;
    out.scanResidual = 0;
    out.scanRate = 0;
    const t = this.t;
    const previous = this.previous;
    this.x = t;
    this.residual(tracks, clock, slot);
    const fT = this.fx;
    if (this.dist < 1e-9) {
      this.root = t;
      this.finish(tracks, clock, slot, out);
      return;
    }
    if (subsonic && previous <= t) {
      this.x = previous;
      this.residual(tracks, clock, slot);
      const fa = this.fx;
      if (fa >= 0) {
        this.lo = previous;
        this.flo = fa;
        this.hi = t;
        this.fhi = fT;
        this.bracket(tracks, clock, slot);
        this.finish(tracks, clock, slot, out);
        return;
      }
    }
    // Backward scan from t: |df/dτ| ≤ K, so f stays negative for −f/K before a point where it is negative.
    const K = this.c * (clock.maxSlope > 0.05 ? clock.maxSlope : 0.05) + tracks.maxSpeed[slot] + 1;
    const b = this.box;
    b[2] = t;
    b[3] = fT;
    const floor = t - MAX_DELAY_SECONDS;
    for (let i = 0; i < 96; i++) {
      if (this.region === TRACK_BEFORE) {
        // Before the first knot the source stands still: f decreases with τ, Newton from the right converges.
        this.x = b[2];
        this.fx = b[3];
        this.extension(tracks, clock, slot);
        this.finish(tracks, clock, slot, out);
        return;
      }
      const step = -b[3] / K;
      b[1] = b[2];
      const fhi = b[3];
      b[2] -= step > 1e-6 ? step : 1e-6;
      if (b[2] < floor) break;
      this.x = b[2];
      this.residual(tracks, clock, slot);
      b[3] = this.fx;
      if (this.fx > 0) {
        out.scanResidual = this.fx;
        out.scanRate = this.c * this.st - this.deriv; // ∂f/∂t at fixed τ (deriv holds û·L' from residual)
        this.lo = b[2];
        this.flo = this.fx;
        this.hi = b[1];
        this.fhi = fhi;
        this.bracket(tracks, clock, slot);
        this.finish(tracks, clock, slot, out);
        return;
      }
    }
    out.state = EMISSION_NONE;
    out.evaluations = this.evals;
  }

  /** Safeguarded Newton in [lo, hi] with f(lo) ≥ 0 ≥ f(hi); leaves the root in `root`. */
  private bracket(tracks: SourceTracks, clock: GameClock, slot: number): void {
    // Loop-carried values live in a Float64Array: V8 kept them in tagged loop variables here and boxed every update.
    const b = this.box;
    b[0] = this.lo;
    b[1] = this.hi;
    const flo = this.flo;
    const fhi = this.fhi;
    b[2] = flo - fhi > 0 ? b[0] + (b[1] - b[0]) * (flo / (flo - fhi)) : b[1];
    for (let i = 0; i < 24; i++) {
      this.x = b[2];
      this.residual(tracks, clock, slot);
      const fx = this.fx;
      if (fx > 0) b[0] = b[2];
      else b[1] = b[2];
      if (Math.abs(fx) < 1e-9 || b[1] - b[0] < 1e-12) break;
      // df/dτ at x: −c·s(τ) + û·S'(τ).
      const d = this.dist;
      const us = d > 1e-12 ? ((this.lp.x - this.sp.x) * this.sv.x + (this.lp.y - this.sp.y) * this.sv.y + (this.lp.z - this.sp.z) * this.sv.z) / d : 0;
      // s(τ) at x: the residual just looked the clock up at x (b[2]) and nothing has moved it since.
      const fp = -this.c * clock.slopeFound + us;
      // (No NaN literal in a merge here: a global read V8 has no feedback for is a tagged value, and boxes the other.)
      const nx = b[2] - fx / fp;
      // The bisection point is computed on every step, not only in the rare step that takes it: code that never ran
      // before V8 optimised the function has no type feedback, and reaching it throws the optimised code away.
      const mid = 0.5 * (b[0] + b[1]);
      b[2] = fp < 0 && nx > b[0] && nx < b[1] ? nx : mid;
    }
    this.root = b[2];
  }

  /** Root before the first knot (source at its first position), from (x, fx): Newton on a decreasing function. */
  private extension(tracks: SourceTracks, clock: GameClock, slot: number): void {
    const b = this.box;
    b[2] = this.x;
    b[3] = this.fx;
    for (let i = 0; i < 24 && Math.abs(b[3]) > 1e-9; i++) {
      clock.query = b[2];
      clock.lookUp();
      const s = clock.slopeFound;
      const nx = b[2] + b[3] / (this.c * (s > 1e-3 ? s : 1e-3));
      if (!(nx < b[2]) && b[3] < 0) break;
      b[2] = nx;
      this.x = nx;
      this.residual(tracks, clock, slot);
      b[3] = this.fx;
    }
    this.root = b[2];
  }

  /** fx = f(x) = c·(G(t) − G(x)) − |L(t) − S(x)|; leaves S(x), S'(x), the distance and û·L' in scratch. */
  private residual(tracks: SourceTracks, clock: GameClock, slot: number): void {
    this.evals++;
    const tau = this.x;
    this.evaluatedAt = tau;
    tracks.at = tau;
    this.region = tracks.evaluate(slot, this.sp, this.sv);
    const dx = this.lp.x - this.sp.x;
    const dy = this.lp.y - this.sp.y;
    const dz = this.lp.z - this.sp.z;
    const d = Math.sqrt(dx * dx + dy * dy + dz * dz);
    this.dist = d;
    this.deriv = d > 1e-12 ? (dx * this.lv.x + dy * this.lv.y + dz * this.lv.z) / d : 0;
    clock.query = tau;
    clock.lookUp();
    this.fx = this.c * (this.gt - clock.gameFound) - d;
  }

  /** Fills `out` at emission time τ = `root`: position, distance and the game-clock Doppler factor dG(τ)/dG(t); leaves the clock's look-up at τ. */
  private finish(tracks: SourceTracks, clock: GameClock, slot: number, out: EmissionSolution): void {
    const tau = this.root;
    // When the search ended on τ itself (a converged Newton step, a source at the listener) the last residual's results —
    // position, velocity, distance, region and the clock's look-up — are τ's: no second evaluation.
    if (this.evaluatedAt !== tau) {
      this.x = tau;
      this.residual(tracks, clock, slot);
    }
    out.state = this.region === TRACK_BEFORE ? EMISSION_BEFORE : EMISSION_HISTORY;
    out.tau = tau;
    out.distance = this.dist;
    copy(out.position, this.sp);
    const d = this.dist;
    // The residual at τ left the clock's look-up at τ (and `solveAll` reads its game time from there too).
    const sTau = clock.slopeFound;
    const st = this.st;
    // Straight-line branches, each storing its own value: a double merged from branches (and from a field) was boxed.
    if (d > 1e-9 && st > 1e-4 && sTau > 1e-4) {
      const us = ((this.lp.x - this.sp.x) * this.sv.x + (this.lp.y - this.sp.y) * this.sv.y + (this.lp.z - this.sp.z) * this.sv.z) / d;
      const num = this.c * st - this.deriv;
      const den = this.c * sTau - us;
      const cap = this.maxDoppler;
      const D = den > 0 ? (sTau * num) / (st * den) : cap;
      out.doppler = !(D < cap) ? cap : !(D > 0) ? 1 / cap : D;
    } else if (d <= 1e-9) out.doppler = 1;
    out.evaluations = this.evals;
  }
}

function copy(o: Vec3Like, p: Vec3Like): void {
  o.x = p.x;
  o.y = p.y;
  o.z = p.z;
}
