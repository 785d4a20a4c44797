// Motion paths of the scene script: fixed points, straight lines, circles and keyframes (linear, or
// cubic Hermite with Catmull–Rom tangents — Catmull & Rom, "A class of local interpolating splines", 1974).
import type { Vec3Like } from '../../src/index';
import type { MotionSpec } from './scene-types';

/** Writes the position (m) and velocity (m/s, the exact time derivative) of `motion` at scene time t (s). */
export function evaluateMotion(motion: MotionSpec, t: number, position: Vec3Like, velocity: Vec3Like): void {
  switch (motion.type) {
    case 'fixed':
      set(position, motion.position[0], motion.position[1], motion.position[2]);
      set(velocity, 0, 0, 0);
      return;
    case 'line': {
      const dt = t - motion.time;
      const [vx, vy, vz] = motion.velocity;
      set(position, motion.from[0] + vx * dt, motion.from[1] + vy * dt, motion.from[2] + vz * dt);
      set(velocity, vx, vy, vz);
      return;
    }
    case 'circle': {
      const w = (2 * Math.PI) / motion.periodSeconds;
      const a = (motion.phaseDegrees * Math.PI) / 180 + w * t;
      const r = motion.radius;
      const u = r * Math.cos(a);
      const v = r * Math.sin(a);
      const du = -r * w * Math.sin(a);
      const dv = r * w * Math.cos(a);
      const [cx, cy, cz] = motion.center;
      if (motion.plane === 'xz') {
        set(position, cx + u, cy, cz + v);
        set(velocity, du, 0, dv);
      } else if (motion.plane === 'xy') {
        set(position, cx + u, cy + v, cz);
        set(velocity, du, dv, 0);
      } else {
        set(position, cx, cy + u, cz + v);
        set(velocity, 0, du, dv);
      }
      return;
    }
    case 'keyframes': {
      const keys = motion.keys;
      const n = keys.length;
      if (n === 1 || t <= keys[0].time || t >= keys[n - 1].time) {
        const k = n === 1 || t <= keys[0].time ? keys[0] : keys[n - 1];
        set(position, k.position[0], k.position[1], k.position[2]);
        set(velocity, 0, 0, 0);
        return;
      }
      // Segment [keys[i].time, keys[i + 1].time) holding t, by bisection (recorded paths hold thousands of keys).
      let i = 0;
      let hi = n - 1;
      while (hi - i > 1) {
        const mid = (i + hi) >> 1;
        if (t >= keys[mid].time) i = mid;
        else hi = mid;
      }
      const k0 = keys[i];
      const k1 = keys[i + 1];
      if (k1.cut === true) {
        // A jump: hold the previous key, at rest, until the cut key's time.
        set(position, k0.position[0], k0.position[1], k0.position[2]);
        set(velocity, 0, 0, 0);
        return;
      }
      const h = k1.time - k0.time;
      const s = (t - k0.time) / h;
      const coords = ['x', 'y', 'z'] as const;
      for (let c = 0; c < 3; c++) {
        const p0 = k0.position[c];
        const p1 = k1.position[c];
        if (motion.interpolation === 'linear') {
          position[coords[c]] = p0 + (p1 - p0) * s;
          velocity[coords[c]] = (p1 - p0) / h;
          continue;
        }
        const m0 = tangent(keys, i, c) * h;
        const m1 = tangent(keys, i + 1, c) * h;
        const s2 = s * s;
        const s3 = s2 * s;
        position[coords[c]] = (2 * s3 - 3 * s2 + 1) * p0 + (s3 - 2 * s2 + s) * m0 + (-2 * s3 + 3 * s2) * p1 + (s3 - s2) * m1;
        velocity[coords[c]] = ((6 * s2 - 6 * s) * p0 + (3 * s2 - 4 * s + 1) * m0 + (-6 * s2 + 6 * s) * p1 + (3 * s2 - 2 * s) * m1) / h;
      }
      return;
    }
  }
}

/** Catmull–Rom tangent (units per second) at key i, one-sided at the ends and beside a cut. */
function tangent(keys: readonly { time: number; position: readonly number[]; cut?: boolean }[], i: number, c: number): number {
  const a = keys[i > 0 && keys[i].cut !== true ? i - 1 : i];
  const b = keys[i + 1 < keys.length && keys[i + 1].cut !== true ? i + 1 : i];
  return a === b ? 0 : (b.position[c] - a.position[c]) / (b.time - a.time);
}

function set(v: Vec3Like, x: number, y: number, z: number): void {
  v.x = x;
  v.y = y;
  v.z = z;
}
