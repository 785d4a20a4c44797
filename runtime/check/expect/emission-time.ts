// Emission time and heard/emitted ratio of a moving source for a moving listener, air at rest (docs/references.md §11):
// the sound heard at t left the source at τ with c·(G(t) − G(τ)) = |L(t) − S(τ)|, G the game clock sound travels on
// (G(t) = t at time scale 1). On a straight piece at a steady clock this is a quadratic in τ, solved in closed form;
// otherwise τ is found by a bracketed root search (bisection). Then dτ/dt = (c·s(t) − û·v_L) / (c·s(τ) − û·v_S).
import { CheckPath, type StraightPiece, type Vec } from './check-path';
import type { TimeScaleTrack } from './time-scale-track';

/** Result of emissionAt. */
export interface Emission {
  /** Emission time τ in scene seconds (NaN when no single emission exists: supersonic, frozen clock). */
  tau: number;
  /** dτ/dt: heard over emitted frequency from the motion (NaN with tau). */
  ratio: number;
  /** Distance travelled by the sound, m. */
  distance: number;
  /** How τ was found: 'closed-form', 'root-find' or 'none'. */
  method: 'closed-form' | 'root-find' | 'none';
}

/** Solves the emission time for the listener at L (m) moving at vL (m/s, wall clock) at scene time t. */
export class EmissionSolver {
  private readonly sp: Vec = { x: 0, y: 0, z: 0 };
  private readonly sv: Vec = { x: 0, y: 0, z: 0 };

  /** `c`: speed of sound in m/s (> 0) on the game clock of `clock`. */
  constructor(
    private readonly source: CheckPath,
    private readonly c: number,
    private readonly clock: TimeScaleTrack,
  ) {}

  /** Emission time and ratio for reception at scene time t. */
  emissionAt(t: number, L: Vec, vL: Vec): Emission {
    const pieces = this.source.straight;
    let tau = NaN;
    let method: Emission['method'] = 'none';
    if (pieces !== null && this.clock.constant) {
      tau = this.closedForm(t, L, pieces);
      if (Number.isFinite(tau)) method = 'closed-form';
    }
    if (method === 'none') {
      tau = this.rootFind(t, L);
      if (Number.isFinite(tau)) method = 'root-find';
    }
    if (method === 'none') return { tau: NaN, ratio: NaN, distance: NaN, method };
    this.source.at(tau, this.sp, this.sv);
    const dx = L.x - this.sp.x;
    const dy = L.y - this.sp.y;
    const dz = L.z - this.sp.z;
    const d = Math.hypot(dx, dy, dz);
    if (d < 1e-9) return { tau, ratio: 1, distance: d, method };
    const uL = (vL.x * dx + vL.y * dy + vL.z * dz) / d;
    const uS = (this.sv.x * dx + this.sv.y * dy + this.sv.z * dz) / d;
    const den = this.c * this.clock.valueAt(tau) - uS;
    const ratio = den > 0 ? (this.c * this.clock.valueAt(t) - uL) / den : NaN;
    return { tau, ratio: ratio >= 0 ? ratio : NaN, distance: d, method };
  }

  /** |L − p0 − v·τ| = c·(t − τ) on each straight piece, latest first; NaN when two roots (inside a Mach cone) or none. */
  private closedForm(t: number, L: Vec, pieces: readonly StraightPiece[]): number {
    const c2 = this.c * this.c;
    for (let i = pieces.length - 1; i >= 0; i--) {
      const p = pieces[i];
      if (p.t0 > t) continue;
      const wx = L.x - p.p0.x;
      const wy = L.y - p.p0.y;
      const wz = L.z - p.p0.z;
      const vv = p.v.x * p.v.x + p.v.y * p.v.y + p.v.z * p.v.z;
      const wv = wx * p.v.x + wy * p.v.y + wz * p.v.z;
      const ww = wx * wx + wy * wy + wz * wz;
      const a = vv - c2;
      const b = 2 * (c2 * t - wv);
      const q = ww - c2 * t * t;
      const roots: number[] = [];
      if (Math.abs(a) < 1e-12 * c2) {
        if (b !== 0) roots.push(-q / b);
      } else {
        const disc = b * b - 4 * a * q;
        if (disc >= 0) {
          const s = Math.sqrt(disc);
          // Numerically stable pair of roots.
          const k = -0.5 * (b + (b >= 0 ? s : -s));
          if (k !== 0) roots.push(k / a, q / k);
          else roots.push(0);
        }
      }
      const eps = 1e-9 * Math.max(1, Math.abs(t));
      const valid = roots.filter((r) => r <= t + eps && r >= p.t0 - eps && r <= p.t1 + eps);
      if (valid.length === 1) return Math.min(valid[0], t);
      if (valid.length > 1) return NaN;
      if (p.t0 === -Infinity) return NaN;
    }
    return NaN;
  }

  /** Bisection on h(τ) = c·(G(t) − G(τ)) − |L − S(τ)|, which falls as τ rises while the source is subsonic. */
  private rootFind(t: number, L: Vec): number {
    const h = (tau: number): number => {
      this.source.at(tau, this.sp, this.sv);
      const d = Math.hypot(L.x - this.sp.x, L.y - this.sp.y, L.z - this.sp.z);
      return this.c * (this.clock.gameTime(t) - this.clock.gameTime(tau)) - d;
    };
    let hi = t;
    if (h(hi) >= 0) return t;
    let step = 1e-3;
    let lo = t - step;
    while (h(lo) < 0) {
      hi = lo;
      step *= 2;
      if (step > 1e5) return NaN;
      lo = t - step;
    }
    for (let i = 0; i < 80 && hi - lo > 1e-10; i++) {
      const mid = 0.5 * (lo + hi);
      if (h(mid) >= 0) lo = mid;
      else hi = mid;
    }
    return 0.5 * (lo + hi);
  }
}
