// The curve blade's value model: immutable curve specs and the edits the blade can make to them.
import type { CurveInterpolation, CurveKey, CurveSpec } from '../../src';

/** The editable area of a curve: x is the time scale, y the curve's unit; 'log' spaces y logarithmically. */
export interface CurveRange {
  readonly xMin: number;
  readonly xMax: number;
  readonly yMin: number;
  readonly yMax: number;
  readonly yScale: 'linear' | 'log';
  /** Optional x value drawn at 75 % of the width (the slow-motion range 0…1 gets room); undefined = linear. */
  readonly xKnee?: number;
  /** Optional y value drawn at 60 % of the height on a linear y axis (e.g. 1 for pitch 0…4); undefined = linear. */
  readonly yKnee?: number;
}

/** Interpolation modes the blade offers. */
export const curveInterpolations: readonly CurveInterpolation[] = Object.freeze(['linear', 'monotone']);

/** Smallest x distance kept between neighbouring keys, as a fraction of the x range. */
export const MIN_KEY_GAP_FRACTION = 0.005;

function freezeSpec(interpolation: CurveInterpolation, keys: readonly CurveKey[]): CurveSpec {
  return Object.freeze({ interpolation, keys: Object.freeze(keys.map((k) => Object.freeze({ x: k.x, y: k.y }))) });
}

/** Value equality of two specs, so that no-op edits do not emit changes. */
export function curveEquals(a: CurveSpec, b: CurveSpec): boolean {
  if (a === b) return true;
  if (a.interpolation !== b.interpolation || a.keys.length !== b.keys.length) return false;
  for (let i = 0; i < a.keys.length; i++) if (a.keys[i].x !== b.keys[i].x || a.keys[i].y !== b.keys[i].y) return false;
  return true;
}

/** A frozen copy of `spec`, keys sorted by x (the blade's raw value is always such a copy). */
export function freezeCurve(spec: CurveSpec): CurveSpec {
  return freezeSpec(spec.interpolation, [...spec.keys].sort((p, q) => p.x - q.x));
}

function clamp(v: number, lo: number, hi: number): number {
  return Math.min(hi, Math.max(lo, v));
}

function gap(range: CurveRange): number {
  return (range.xMax - range.xMin) * MIN_KEY_GAP_FRACTION;
}

/** Clamps y into the range (log ranges keep y > 0). */
export function clampY(y: number, range: CurveRange): number {
  return clamp(Number.isFinite(y) ? y : range.yMin, range.yMin, range.yMax);
}

/**
 * Moves key `index` to (x, y), keeping the keys in strictly increasing x order: x is clamped
 * between its neighbours (one minimum gap away) and into the range; y into the range.
 */
export function moveKey(spec: CurveSpec, index: number, x: number, y: number, range: CurveRange): CurveSpec {
  if (index < 0 || index >= spec.keys.length) return spec;
  const g = gap(range);
  const lo = index > 0 ? spec.keys[index - 1].x + g : range.xMin;
  const hi = index < spec.keys.length - 1 ? spec.keys[index + 1].x - g : range.xMax;
  const keys = spec.keys.slice();
  const nx = clamp(Number.isFinite(x) ? x : spec.keys[index].x, Math.min(lo, hi), Math.max(lo, hi));
  keys[index] = { x: nx, y: clampY(y, range) };
  const next = freezeSpec(spec.interpolation, keys);
  return curveEquals(next, spec) ? spec : next;
}

/** Adds a key at (x, y); returns the new spec and the new key's index, or the same spec and −1 when too close to a key. */
export function addKey(spec: CurveSpec, x: number, y: number, range: CurveRange): { spec: CurveSpec; index: number } {
  const cx = clamp(x, range.xMin, range.xMax);
  const g = gap(range);
  if (!Number.isFinite(cx) || spec.keys.some((k) => Math.abs(k.x - cx) < g)) return { spec, index: -1 };
  const keys = [...spec.keys, { x: cx, y: clampY(y, range) }].sort((p, q) => p.x - q.x);
  return { spec: freezeSpec(spec.interpolation, keys), index: keys.findIndex((k) => k.x === cx) };
}

/** Removes key `index`; a curve keeps at least one key, so removing the last one is refused. */
export function removeKey(spec: CurveSpec, index: number): CurveSpec {
  if (spec.keys.length <= 1 || index < 0 || index >= spec.keys.length) return spec;
  return freezeSpec(spec.interpolation, spec.keys.filter((_, i) => i !== index));
}

/** The same keys with another interpolation mode. */
export function withInterpolation(spec: CurveSpec, interpolation: CurveInterpolation): CurveSpec {
  return spec.interpolation === interpolation ? spec : freezeSpec(interpolation, spec.keys);
}

/** Where a new key goes by default: halfway to the next key after `index` (or to the previous one at the end). */
export function insertionPoint(spec: CurveSpec, index: number, range: CurveRange): number {
  const keys = spec.keys;
  if (keys.length === 0) return (range.xMin + range.xMax) / 2;
  const i = clamp(index, 0, keys.length - 1);
  if (i < keys.length - 1) return (keys[i].x + keys[i + 1].x) / 2;
  if (keys[i].x < range.xMax - 2 * gap(range)) return (keys[i].x + range.xMax) / 2;
  return i > 0 ? (keys[i - 1].x + keys[i].x) / 2 : (range.xMin + keys[i].x) / 2;
}

/** Maps a value to the unit interval of the range (x linear, y linear or log). */
export function toUnitX(x: number, range: CurveRange): number {
  const k = range.xKnee;
  if (k !== undefined && k > range.xMin && k < range.xMax) {
    if (x <= k) return (0.75 * (x - range.xMin)) / (k - range.xMin);
    return 0.75 + (0.25 * (x - k)) / (range.xMax - k);
  }
  return (x - range.xMin) / (range.xMax - range.xMin);
}

/** Inverse of toUnitX. */
export function fromUnitX(u: number, range: CurveRange): number {
  const k = range.xKnee;
  if (k !== undefined && k > range.xMin && k < range.xMax) {
    if (u <= 0.75) return range.xMin + (u / 0.75) * (k - range.xMin);
    return k + ((u - 0.75) / 0.25) * (range.xMax - k);
  }
  return range.xMin + u * (range.xMax - range.xMin);
}

/** Maps y to 0…1 along the range's y scale. */
export function toUnitY(y: number, range: CurveRange): number {
  if (range.yScale === 'log') return Math.log(Math.max(y, range.yMin) / range.yMin) / Math.log(range.yMax / range.yMin);
  const k = range.yKnee;
  if (k !== undefined && k > range.yMin && k < range.yMax) {
    if (y <= k) return (0.6 * (y - range.yMin)) / (k - range.yMin);
    return 0.6 + (0.4 * (y - k)) / (range.yMax - k);
  }
  return (y - range.yMin) / (range.yMax - range.yMin);
}

/** Inverse of toUnitY. */
export function fromUnitY(u: number, range: CurveRange): number {
  if (range.yScale === 'log') return range.yMin * (range.yMax / range.yMin) ** u;
  const k = range.yKnee;
  if (k !== undefined && k > range.yMin && k < range.yMax) {
    if (u <= 0.6) return range.yMin + (u / 0.6) * (k - range.yMin);
    return k + ((u - 0.6) / 0.4) * (range.yMax - k);
  }
  return range.yMin + u * (range.yMax - range.yMin);
}

/** How many times tighter the axis draws values beyond its knee than below it (1 = no knee: a linear axis). */
export function kneeCompression(min: number, max: number, knee: number | undefined, share: number): number {
  if (knee === undefined || !(knee > min && knee < max)) return 1;
  return (share / (knee - min)) / ((1 - share) / (max - knee));
}
