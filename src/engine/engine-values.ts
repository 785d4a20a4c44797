// Value checks of the engine: option ranges validated on the main thread (typed errors naming the field), and the
// clamping and target copies of the audio thread (no allocation, no throw).
import type { VoiceTargets } from '../dilation';

/** Returns `v` when it is an integer in min…max; otherwise throws RangeError naming EngineOptions.`name`. */
export function checkRange(name: string, v: number, min: number, max: number): number {
  if (!(Number.isInteger(v) && v >= min && v <= max)) throw new RangeError(`EngineOptions.${name} must be an integer in ${min}…${max}, got ${v}`);
  return v;
}

/** `v` clamped to min…max, or `fallback` when `v` is NaN. */
export function clampNumber(v: number, min: number, max: number, fallback: number): number {
  if (!(v === v)) return fallback;
  return v < min ? min : v > max ? max : v;
}

/** Copies every field of one voice's mapped targets into another's. */
export function copyTargets(from: VoiceTargets, to: VoiceTargets): void {
  to.ratio = from.ratio;
  to.cutoffHz = from.cutoffHz;
  to.gain = from.gain;
  to.left = from.left;
  to.right = from.right;
  to.doppler = from.doppler;
  to.radialSpeed = from.radialSpeed;
  to.distance = from.distance;
  to.frozen = from.frozen;
  to.pitch = from.pitch;
}
