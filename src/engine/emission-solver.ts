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
  return { state: EMISSION_NONE, tau: NaN, doppler: 1, distance: 0, meanDoppler: NaN, coneTime: NaN, position: { x: 0, y: 0, z: 0 }, scanResidual: 0, scanRate: 0, evaluations: 0 };
}

/** Solves the emission-time equation for one source; allocation-free. */
export class EmissionSolver {
  /** Speed of sound, m per game second. */
  c = 343;
  private readonly sp: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly sv: Vec3Like = { x: 0, y: 0, z: 0 };
  /** Listener position and velocity (engine clock) at reception time; set by `setListener`. */
  private readonly lp: Vec3Like = { x: 0, y: 0, z: 0 };
  private readonly lv: Vec3Like = { x: 0, y: 0, z: 0 };
  private t: Seconds = 0;
  private gt: Seconds = 0;
  private st = 1;
  private region = 0;
  private dist = 0;
  private deriv = 0;
  private evals = 0;

  /** Sets the reception time t (engine s) and the listener's position and velocity (m/s, engine clock) then. */
  setListener(t: Seconds, clock: GameClock, p: Vec3Like, v: Vec3Like): void {
    this.t = t;
    this.gt = clock.gameAt(t);
    this.st = clock.slopeAt(t);
    copy(this.lp, p);
    copy(this.lv, v);
  }

  /**
   * Solves for source `slot` into `out`. `previous` is the last solution's τ (NaN for none) and is used as the
   * bracket's lower end when the source cannot be supersonic (`subsonic`).
   */
  solve(tracks: SourceTracks, clock: GameClock, slot: number, previous: Seconds, subsonic: boolean, out: EmissionSolution): void {
    this.evals = 0;
    out.scanResidual = 0;
    out.scanRate = 0;
    const t = this.t;
    const fT = this.residual(tracks, clock, slot, t);
    if (this.dist < 1e-9) {
      this.finish(tracks, clock, slot, t, out);
      return;
    }
    if (subsonic && previous <= t) {
      const fa = this.residual(tracks, clock, slot, previous);
      if (fa >= 0) {
        this.bracket(tracks, clock, slot, previous, fa, t, fT);
        this.finish(tracks, clock, slot, this.root, out);
        return;
      }
    }
    // Backward scan from t: |df/dτ| ≤ K, so f stays negative for −f/K before a point where it is negative.
    const K = this.c * (clock.maxSlope > 0.05 ? clock.maxSlope : 0.05) + tracks.maxSpeed[slot] + 1;
    let x = t;
    let fx = fT;
    const floor = t - MAX_DELAY_SECONDS;
    for (let i = 0; i < 96; i++) {
      if (this.region === TRACK_BEFORE) {
        // Before the first knot the source stands still: f decreases with τ, Newton from the right converges.
        this.extension(tracks, clock, slot, x, fx);
        this.finish(tracks, clock, slot, this.root, out);
        return;
      }
      const step = -fx / K;
      const hi = x;
      const fhi = fx;
      x -= step > 1e-6 ? step : 1e-6;
      if (x < floor) break;
      fx = this.residual(tracks, clock, slot, x);
      if (fx > 0) {
        out.scanResidual = fx;
        out.scanRate = this.c * this.st - this.deriv; // ∂f/∂t at fixed τ (deriv holds û·L' from residual)
        this.bracket(tracks, clock, slot, x, fx, hi, fhi);
        this.finish(tracks, clock, slot, this.root, out);
        return;
      }
    }
    out.state = EMISSION_NONE;
    out.evaluations = this.evals;
  }

  private root = 0;

  /** Safeguarded Newton in [lo, hi] with f(lo) ≥ 0 ≥ f(hi); leaves the root in `root`. */
  private bracket(tracks: SourceTracks, clock: GameClock, slot: number, lo: Seconds, flo: number, hi: Seconds, fhi: number): void {
    let x = flo - fhi > 0 ? lo + (hi - lo) * (flo / (flo - fhi)) : hi;
    for (let i = 0; i < 24; i++) {
      const fx = this.residual(tracks, clock, slot, x);
      if (fx > 0) lo = x;
      else hi = x;
      if (Math.abs(fx) < 1e-9 || hi - lo < 1e-12) break;
      const fp = this.slope(clock, x);
      let nx = fp < 0 ? x - fx / fp : NaN;
      if (!(nx > lo && nx < hi)) nx = 0.5 * (lo + hi);
      x = nx;
    }
    this.root = x;
  }

  /** Root before the first knot (source at its first position): Newton on a decreasing function. */
  private extension(tracks: SourceTracks, clock: GameClock, slot: number, x: Seconds, fx: number): void {
    for (let i = 0; i < 24 && Math.abs(fx) > 1e-9; i++) {
      const s = clock.slopeAt(x);
      const nx = x + fx / (this.c * (s > 1e-3 ? s : 1e-3));
      if (!(nx < x) && fx < 0) break;
      x = nx;
      fx = this.residual(tracks, clock, slot, x);
    }
    this.root = x;
  }

  /** f(τ) = c·(G(t) − G(τ)) − |L(t) − S(τ)|; leaves S(τ), S'(τ), the distance and û·L' in scratch. */
  private residual(tracks: SourceTracks, clock: GameClock, slot: number, tau: Seconds): number {
    this.evals++;
    this.region = tracks.evaluate(slot, tau, this.sp, this.sv);
    const dx = this.lp.x - this.sp.x;
    const dy = this.lp.y - this.sp.y;
    const dz = this.lp.z - this.sp.z;
    const d = Math.sqrt(dx * dx + dy * dy + dz * dz);
    this.dist = d;
    this.deriv = d > 1e-12 ? (dx * this.lv.x + dy * this.lv.y + dz * this.lv.z) / d : 0;
    return this.c * (this.gt - clock.gameAt(tau)) - d;
  }

  /** df/dτ at the last residual's τ: −c·s(τ) + û·S'(τ). */
  private slope(clock: GameClock, tau: Seconds): number {
    const d = this.dist;
    const us = d > 1e-12 ? ((this.lp.x - this.sp.x) * this.sv.x + (this.lp.y - this.sp.y) * this.sv.y + (this.lp.z - this.sp.z) * this.sv.z) / d : 0;
    return -this.c * clock.slopeAt(tau) + us;
  }

  /** Fills `out` at emission time tau: position, distance and the game-clock Doppler factor dG(τ)/dG(t). */
  private finish(tracks: SourceTracks, clock: GameClock, slot: number, tau: Seconds, out: EmissionSolution): void {
    this.residual(tracks, clock, slot, tau);
    out.state = this.region === TRACK_BEFORE ? EMISSION_BEFORE : EMISSION_HISTORY;
    out.tau = tau;
    out.distance = this.dist;
    copy(out.position, this.sp);
    const d = this.dist;
    const sTau = clock.slopeAt(tau);
    const st = this.st;
    let D = out.doppler;
    if (d > 1e-9 && st > 1e-4 && sTau > 1e-4) {
      const us = ((this.lp.x - this.sp.x) * this.sv.x + (this.lp.y - this.sp.y) * this.sv.y + (this.lp.z - this.sp.z) * this.sv.z) / d;
      const num = this.c * st - this.deriv;
      const den = this.c * sTau - us;
      D = den > 0 ? (sTau * num) / (st * den) : MAX_EMISSION_DOPPLER;
      if (!(D < MAX_EMISSION_DOPPLER)) D = MAX_EMISSION_DOPPLER;
      else if (!(D > 0)) D = 1 / MAX_EMISSION_DOPPLER;
    } else if (d <= 1e-9) D = 1;
    out.doppler = D;
    out.evaluations = this.evals;
  }
}

function copy(o: Vec3Like, p: Vec3Like): void {
  o.x = p.x;
  o.y = p.y;
  o.z = p.z;
}
