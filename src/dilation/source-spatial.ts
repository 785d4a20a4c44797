// Per-source spatial settings that override the tuning's distance model, and the source's sound cone, with the
// Web Audio API PannerNode's names, units and defaults (W3C Web Audio API, PannerNode attributes).
import type { DistanceModel } from '../tuning';
import type { Meters, Vec3Like } from '../units';

/** Spatial settings of one source; every field is optional: absent distance fields use the tuning's. */
export interface SourceSpatial {
  /** Distance model; default the tuning's. */
  distanceModel?: DistanceModel;
  /** Reference distance in metres (≥ 0); default the tuning's. */
  refDistance?: Meters;
  /** Maximum distance in metres (> 0); default the tuning's. */
  maxDistance?: Meters;
  /** Rolloff factor (≥ 0; the linear model clamps it to 0…1); default the tuning's. */
  rolloffFactor?: number;
  /** Whole inner cone angle in degrees, 0…360 (default 360: no cone). */
  coneInnerAngle?: number;
  /** Whole outer cone angle in degrees, 0…360 (default 360). */
  coneOuterAngle?: number;
  /** Linear gain outside the outer cone, 0…1 (default 0; linear as in the Web Audio API). */
  coneOuterGain?: number;
  /** Direction the source faces (any length; zero = no cone), default (1, 0, 0) as PannerNode's orientation. */
  orientation?: Vec3Like;
}

/** Frozen defaults of the cone fields (PannerNode's own defaults). */
export const sourceSpatialDefaults = Object.freeze({
  coneInnerAngle: 360,
  coneOuterAngle: 360,
  coneOuterGain: 0,
  orientation: Object.freeze({ x: 1, y: 0, z: 0 }),
});

/**
 * Problems with a settings object, as [field, message] pairs (empty when valid); the main thread throws on the first,
 * the engine refuses the whole object (counted).
 */
export function sourceSpatialProblems(s: SourceSpatial): [string, string][] {
  const out: [string, string][] = [];
  const num = (field: keyof SourceSpatial, min: number, max: number) => {
    const v = s[field];
    if (v !== undefined && !(typeof v === 'number' && v >= min && v <= max)) out.push([field, `expected a number in ${min}…${max}, got ${String(v)}`]);
  };
  if (s.distanceModel !== undefined && s.distanceModel !== 'linear' && s.distanceModel !== 'inverse' && s.distanceModel !== 'exponential')
    out.push(['distanceModel', `expected 'linear', 'inverse' or 'exponential', got ${String(s.distanceModel)}`]);
  num('refDistance', 0, 1e6);
  num('maxDistance', 1e-6, 1e9);
  num('rolloffFactor', 0, 1e6);
  num('coneInnerAngle', 0, 360);
  num('coneOuterAngle', 0, 360);
  num('coneOuterGain', 0, 1);
  const o = s.orientation;
  if (o !== undefined && !(typeof o === 'object' && o !== null && Number.isFinite(o.x) && Number.isFinite(o.y) && Number.isFinite(o.z)))
    out.push(['orientation', 'expected { x, y, z } of finite numbers']);
  return out;
}
