// A recorded or scripted path as the checker reads it: position and velocity at any time, and, where the path is
// made of straight pieces (fixed points, lines, linear keyframes), the piece holding a time, for closed-form solving.
import type { MotionSpec } from '../../offline/scene-types';
import { evaluateMotion } from '../../offline/scene-motion';

/** A point in metres (or a velocity in m/s). */
export interface Vec {
  x: number;
  y: number;
  z: number;
}

/** A straight piece: position p0 + v·t for t in [t0, t1] (seconds; ±Infinity allowed); p0 is where the line is at t = 0. */
export interface StraightPiece {
  t0: number;
  t1: number;
  p0: Vec;
  v: Vec;
}

/** A path over scene time (s). */
export class CheckPath {
  private readonly pieces: StraightPiece[] | null;

  /** Reads a script's motion; circles and cubic keyframes have no straight pieces. */
  constructor(private readonly motion: MotionSpec) {
    this.pieces = straightPieces(motion);
  }

  /** Whether the path is made of straight pieces only. */
  get piecewiseStraight(): boolean {
    return this.pieces !== null;
  }

  /** The straight pieces in time order (null for curved paths). */
  get straight(): readonly StraightPiece[] | null {
    return this.pieces;
  }

  /** Writes position (m) and velocity (m/s) at scene time t. */
  at(t: number, position: Vec, velocity: Vec): void {
    evaluateMotion(this.motion, t, position, velocity);
  }
}

const v3 = (a: readonly number[]): Vec => ({ x: a[0], y: a[1], z: a[2] });
const still = (p: readonly number[], t0: number, t1: number): StraightPiece => ({ t0, t1, p0: v3(p), v: { x: 0, y: 0, z: 0 } });

function straightPieces(m: MotionSpec): StraightPiece[] | null {
  if (m.type === 'fixed') return [still(m.position, -Infinity, Infinity)];
  if (m.type === 'line') {
    const v = v3(m.velocity);
    return [{ t0: -Infinity, t1: Infinity, p0: { x: m.from[0] - v.x * m.time, y: m.from[1] - v.y * m.time, z: m.from[2] - v.z * m.time }, v }];
  }
  if (m.type !== 'keyframes' || (m.interpolation !== 'linear' && m.keys.length > 1)) return null;
  const keys = m.keys;
  const out: StraightPiece[] = [still(keys[0].position, -Infinity, keys[0].time)];
  for (let i = 0; i + 1 < keys.length; i++) {
    const a = keys[i];
    const b = keys[i + 1];
    const h = b.time - a.time;
    if (b.cut === true || !(h > 0)) {
      out.push(still(a.position, a.time, b.time));
      continue;
    }
    const v = { x: (b.position[0] - a.position[0]) / h, y: (b.position[1] - a.position[1]) / h, z: (b.position[2] - a.position[2]) / h };
    out.push({ t0: a.time, t1: b.time, p0: { x: a.position[0] - v.x * a.time, y: a.position[1] - v.y * a.time, z: a.position[2] - v.z * a.time }, v });
  }
  out.push(still(keys[keys.length - 1].position, keys[keys.length - 1].time, Infinity));
  return out;
}
