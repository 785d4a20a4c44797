// Velocity from successive positions: finite differences smoothed by a one-pole exponential filter
// (the discrete form of Web Audio's setTargetAtTime, weight 1 − e^(−Δt/τ)), with a teleport guard.
import type { MetersPerSecond, Seconds, Vec3Like } from '../units';

/** Options of VelocityEstimator. */
export interface VelocityEstimatorOptions {
  /** Smoothing time constant τ, 0…2 s (0 = raw finite differences). */
  smoothingSeconds: Seconds;
  /** Implied speeds above this (m/s, > 0) are teleports: the estimate resets to 0 instead of spiking. */
  teleportSpeed: MetersPerSecond;
}

/** Frozen defaults of VelocityEstimator (the built-in tuning's values). */
export const velocityEstimatorDefaults: Readonly<VelocityEstimatorOptions> = Object.freeze({
  smoothingSeconds: 0.08,
  teleportSpeed: 400,
});

/** Estimates a smoothed wall-clock velocity (m/s) from (position, time) samples; creates no objects after construction (what V8 may still box: docs/allocation.md). */
export class VelocityEstimator {
  /** Current estimate in m/s (the same object is returned by update). */
  readonly velocity: Vec3Like = { x: 0, y: 0, z: 0 };
  /** Number of teleports detected since construction. */
  teleports = 0;
  /** Samples ignored: repeated or backwards timestamps, non-finite positions or times. */
  ignored = 0;
  private smoothing: Seconds;
  private teleportSpeed: MetersPerSecond;
  private readonly last: Vec3Like = { x: 0, y: 0, z: 0 };
  private lastTime: Seconds = 0.5;
  private primed = false;
  /** Wall-clock time of the sample `updateAt` reads, s (a field: V8 boxes a double passed to a call it does not inline). */
  at: Seconds = 0.5;

  /** Creates an estimator; options as VelocityEstimatorOptions (invalid values fall back to the defaults). */
  constructor(options: VelocityEstimatorOptions = velocityEstimatorDefaults) {
    this.smoothing = velocityEstimatorDefaults.smoothingSeconds;
    this.teleportSpeed = velocityEstimatorDefaults.teleportSpeed;
    this.lastTime = 0;
    this.configure(options);
  }

  /** Changes the smoothing time constant (s, ≥ 0) and teleport speed (m/s, > 0); keeps the estimate. */
  configure(options: VelocityEstimatorOptions): void {
    const s = options.smoothingSeconds;
    const t = options.teleportSpeed;
    if (s >= 0 && s < Infinity) this.smoothing = s;
    if (t > 0) this.teleportSpeed = t;
  }

  /**
   * Feeds the position (m) at wall-clock `time` (s) and returns the smoothed velocity in m/s (own vector).
   * The first sample, and the sample after a teleport, only set the reference point (velocity 0).
   * Repeated or backwards times and non-finite inputs are ignored (counted in `ignored`).
   */
  update(position: Vec3Like, time: Seconds): Vec3Like {
    this.at = time;
    return this.updateAt(position);
  }

  /** `update` at the time in `at` (set it first): the form for hot callers, no double crosses the call. */
  updateAt(position: Vec3Like): Vec3Like {
    const time = this.at;
    const px = position.x;
    const py = position.y;
    const pz = position.z;
    if (!Number.isFinite(px) || !Number.isFinite(py) || !Number.isFinite(pz) || !Number.isFinite(time)) {
      this.ignored += 1;
      return this.velocity;
    }
    if (!this.primed) {
      this.setReference(position);
      this.primed = true;
      return this.velocity;
    }
    const dt = time - this.lastTime;
    if (!(dt > 0)) {
      this.ignored += 1;
      return this.velocity;
    }
    const rx = (px - this.last.x) / dt;
    const ry = (py - this.last.y) / dt;
    const rz = (pz - this.last.z) / dt;
    const m = Math.max(Math.abs(rx), Math.abs(ry), Math.abs(rz));
    // Overflow-safe speed test: the max component bounds the speed within a factor √3.
    const speed = m > 0 && m < Infinity ? m * Math.sqrt((rx / m) ** 2 + (ry / m) ** 2 + (rz / m) ** 2) : m;
    if (!(speed <= this.teleportSpeed)) {
      this.teleports += 1;
      this.velocity.x = 0;
      this.velocity.y = 0;
      this.velocity.z = 0;
      this.setReference(position);
      return this.velocity;
    }
    const a = this.smoothing > 0 ? 1 - Math.exp(-dt / this.smoothing) : 1;
    const v = this.velocity;
    v.x += a * (rx - v.x);
    v.y += a * (ry - v.y);
    v.z += a * (rz - v.z);
    this.setReference(position);
    return v;
  }

  /** Forgets the reference point and zeroes the estimate (counters are kept). */
  reset(): void {
    this.primed = false;
    this.velocity.x = 0;
    this.velocity.y = 0;
    this.velocity.z = 0;
  }

  /** The reference point becomes `p` at time `at` (no double crosses the call). */
  private setReference(p: Vec3Like): void {
    this.last.x = p.x;
    this.last.y = p.y;
    this.last.z = p.z;
    this.lastTime = this.at;
  }
}
