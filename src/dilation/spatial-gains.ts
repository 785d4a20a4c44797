// Web Audio API PannerNode distance models (linear, inverse, exponential) and equal-power panning with the
// spec's azimuth computation (W3C Web Audio API, PannerNode "Distance Effects" and "Azimuth and Elevation").
import type { DistanceModel } from '../tuning';
import type { Meters } from '../units';
import type { Vec3Like } from '../units';

/** Distance gain of the Web Audio distance `model` at distance d (m), refDistance, maxDistance, rolloffFactor. */
export function distanceGain(model: DistanceModel, d: Meters, ref: Meters, max: Meters, rolloff: number): number {
  const q = DISTANCE_SCRATCH;
  q[0] = d;
  q[1] = ref;
  q[2] = max;
  q[3] = rolloff;
  distanceGainAt(model, q);
  return q[0];
}

/** The doubles of `distanceGain` handed to distanceGainAt. */
const DISTANCE_SCRATCH = new Float64Array(4);

/**
 * `distanceGain` in place: reads [d, refDistance, maxDistance, rolloffFactor] from `q` and writes the gain into q[0].
 * For the render path: a double passed to or returned from a call V8 does not inline is boxed (docs/allocation.md).
 */
export function distanceGainAt(model: DistanceModel, q: Float64Array): void {
  const d = q[0];
  const ref = q[1];
  const max = q[2];
  const rolloff = q[3];
  let g: number;
  if (model === 'linear') {
    const lo = Math.min(ref, max);
    const hi = Math.max(ref, max);
    // The spec clamps the linear model's rolloff factor to [0, 1].
    const f = rolloff < 0 ? 0 : rolloff > 1 ? 1 : rolloff;
    const dc = d < lo ? lo : d > hi ? hi : d;
    g = lo === hi ? 1 - f : 1 - (f * (dc - lo)) / (hi - lo);
  } else if (!(ref > 0)) g = 0;
  else {
    const dm = d > ref ? d : ref;
    g = model === 'exponential' ? Math.pow(dm / ref, -rolloff) : ref / (ref + rolloff * (dm - ref));
  }
  q[0] = g;
}

/**
 * Azimuth in degrees (−180…180; + = right) of the direction `dir` (unit vector from listener to source)
 * for a listener with unit `forward` and unit `right` (= forward × up normalised), per the Web Audio spec.
 */
export function azimuthDegrees(dir: Vec3Like, forward: Vec3Like, right: Vec3Like): number {
  // up' = right × forward; remove dir's component along up' and normalise.
  const ux = right.y * forward.z - right.z * forward.y;
  const uy = right.z * forward.x - right.x * forward.z;
  const uz = right.x * forward.y - right.y * forward.x;
  const upProj = dir.x * ux + dir.y * uy + dir.z * uz;
  let px = dir.x - upProj * ux;
  let py = dir.y - upProj * uy;
  let pz = dir.z - upProj * uz;
  const len = Math.sqrt(px * px + py * py + pz * pz);
  if (!(len > 1e-12)) return 0; // straight above or below: the spec's projection is empty; centre it
  px /= len;
  py /= len;
  pz /= len;
  let c = px * right.x + py * right.y + pz * right.z;
  c = c > 1 ? 1 : c < -1 ? -1 : c;
  let az = (180 / Math.PI) * Math.acos(c);
  const frontBack = px * forward.x + py * forward.y + pz * forward.z;
  if (frontBack < 0) az = 360 - az;
  az = az >= 0 && az <= 270 ? 90 - az : 450 - az;
  return az;
}

/** Equal-power pan of a mono input at `azimuth` degrees: writes gainL and gainR (cos/sin law) into out[0], out[1]. */
export function equalPowerGains(azimuth: number, out: Float64Array): Float64Array {
  let az = azimuth < -180 ? -180 : azimuth > 180 ? 180 : azimuth;
  if (az < -90) az = -180 - az;
  else if (az > 90) az = 180 - az;
  const x = (az + 90) / 180;
  out[0] = Math.cos((x * Math.PI) / 2);
  out[1] = Math.sin((x * Math.PI) / 2);
  return out;
}

/**
 * Equal-power gains from the sine of the azimuth (the source direction's component along the listener's right,
 * over its length in the listener's horizontal plane), −1…1: the spec's folding and cos/sin law reduce exactly to
 * gainL = sqrt((1 − a)/2), gainR = sqrt((1 + a)/2). Writes out[0], out[1]; no trigonometry.
 */
export function equalPowerFromSine(sinAzimuth: number, out: Float64Array): Float64Array {
  out[0] = sinAzimuth;
  equalPowerFromSineAt(out);
  return out;
}

/** In place: equalPowerFromSine of out[0], written to out[0] (left) and out[1] (right); no double crosses the call. */
export function equalPowerFromSineAt(out: Float64Array): void {
  const s = out[0];
  const a = s > 1 ? 1 : s < -1 ? -1 : s === s ? s : 0;
  out[0] = Math.sqrt((1 - a) * 0.5);
  out[1] = Math.sqrt((1 + a) * 0.5);
}
