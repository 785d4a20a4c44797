// Small allocation-free 3-vector helpers on plain {x, y, z} objects (three.js Vector3 fits).
import type { Vec3Like } from '../units';

/** Creates a new vector (allocates; use at construction time only). */
export function vec3(x = 0, y = 0, z = 0): Vec3Like {
  return { x, y, z };
}

/** Writes (x, y, z) into out and returns out. */
export function setVec3(out: Vec3Like, x: number, y: number, z: number): Vec3Like {
  out.x = x;
  out.y = y;
  out.z = z;
  return out;
}

/** Copies a into out and returns out. */
export function copyVec3(out: Vec3Like, a: Vec3Like): Vec3Like {
  out.x = a.x;
  out.y = a.y;
  out.z = a.z;
  return out;
}

/** out = a − b; returns out. */
export function subVec3(out: Vec3Like, a: Vec3Like, b: Vec3Like): Vec3Like {
  out.x = a.x - b.x;
  out.y = a.y - b.y;
  out.z = a.z - b.z;
  return out;
}

/** out = a · k; returns out. */
export function scaleVec3(out: Vec3Like, a: Vec3Like, k: number): Vec3Like {
  out.x = a.x * k;
  out.y = a.y * k;
  out.z = a.z * k;
  return out;
}

/** Dot product a·b. */
export function dotVec3(a: Vec3Like, b: Vec3Like): number {
  return a.x * b.x + a.y * b.y + a.z * b.z;
}

/** out = a × b (out may alias a or b); returns out. */
export function crossVec3(out: Vec3Like, a: Vec3Like, b: Vec3Like): Vec3Like {
  const x = a.y * b.z - a.z * b.y;
  const y = a.z * b.x - a.x * b.z;
  const z = a.x * b.y - a.y * b.x;
  out.x = x;
  out.y = y;
  out.z = z;
  return out;
}

/** Euclidean length, overflow-safe (scales by the largest component first); NaN if any part is NaN. */
export function lengthVec3(a: Vec3Like): number {
  const m = Math.max(Math.abs(a.x), Math.abs(a.y), Math.abs(a.z));
  if (m === 0 || m === Infinity || m !== m) return m;
  const x = a.x / m;
  const y = a.y / m;
  const z = a.z / m;
  return m * Math.sqrt(x * x + y * y + z * z);
}

/** Normalises a into out (out may alias a); returns the original length (0 leaves out = 0, non-finite leaves out = 0). */
export function normalizeVec3(out: Vec3Like, a: Vec3Like): number {
  const len = lengthVec3(a);
  if (!(len > 0) || len === Infinity) {
    out.x = 0;
    out.y = 0;
    out.z = 0;
    return len;
  }
  out.x = a.x / len;
  out.y = a.y / len;
  out.z = a.z / len;
  return len;
}

/** True when all three components are finite numbers. */
export function isFiniteVec3(a: Vec3Like): boolean {
  return Number.isFinite(a.x) && Number.isFinite(a.y) && Number.isFinite(a.z);
}
