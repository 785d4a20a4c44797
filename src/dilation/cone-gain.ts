// Sound cones of the Web Audio API PannerNode (W3C Web Audio API, PannerNode "Sound Cones"): full gain inside the
// inner cone, coneOuterGain outside the outer cone, linear in angle between (docs/references.md §16).
import type { Vec3Like } from '../units';

/**
 * Cone gain (0…1) for a source at `source` facing `orientation` (any length; zero = no cone) heard at `listener`.
 * Angles are whole cone angles in degrees (0…360, as PannerNode.coneInnerAngle / coneOuterAngle); outerGain 0…1.
 */
export function coneGain(source: Vec3Like, orientation: Vec3Like, listener: Vec3Like, innerAngle: number, outerAngle: number, outerGain: number): number {
  const ox = orientation.x;
  const oy = orientation.y;
  const oz = orientation.z;
  const ol = Math.sqrt(ox * ox + oy * oy + oz * oz);
  if (!(ol > 0) || ol === Infinity || (innerAngle === 360 && outerAngle === 360)) return 1;
  const dx = listener.x - source.x;
  const dy = listener.y - source.y;
  const dz = listener.z - source.z;
  const dl = Math.sqrt(dx * dx + dy * dy + dz * dz);
  // The spec normalises a zero source→listener vector to zero: the angle is then 90°.
  let c = dl > 0 ? (dx * ox + dy * oy + dz * oz) / (dl * ol) : 0;
  c = c > 1 ? 1 : c < -1 ? -1 : c;
  const angle = (180 / Math.PI) * Math.acos(c);
  const inner = Math.abs(innerAngle) / 2;
  const outer = Math.abs(outerAngle) / 2;
  if (angle <= inner) return 1;
  if (angle >= outer) return outerGain;
  const x = (angle - inner) / (outer - inner);
  return 1 - x + outerGain * x;
}
