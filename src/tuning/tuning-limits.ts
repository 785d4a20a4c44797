// Field-by-field description of the tuning document (types, ranges, enums, key order): the parser,
// the serializer, the JSON Schema test and the editor's slider ranges all read this one table.
import { MAX_TIME_SCALE, OPEN_CUTOFF_HZ } from './tuning-types';

/** A numeric field: inclusive range; `integer` requires a whole number; `nullable` also accepts null. */
export interface NumberField {
  readonly kind: 'number';
  readonly min: number;
  readonly max: number;
  readonly integer?: boolean;
  readonly nullable?: boolean;
  /** Value taken when the field is absent (fields added after schema version 1 shipped); absent = required. */
  readonly optional?: number;
}
/** A string field taking one of `values`. */
export interface EnumField {
  readonly kind: 'enum';
  readonly values: readonly string[];
  /** Value taken when the field is absent; absent = required. */
  readonly optional?: string;
}
/** A true/false field. */
export interface BooleanField {
  readonly kind: 'boolean';
}
/** Any scalar field of the document. */
export type FieldLimit = NumberField | EnumField | BooleanField;

const num = (min: number, max: number, extra: Partial<NumberField> = {}): NumberField => ({ kind: 'number', min, max, ...extra });
const oneOf = (...values: string[]): EnumField => ({ kind: 'enum', values });
const bool: BooleanField = { kind: 'boolean' };

/** Sections of the document other than `version` and `groups`, in serialization order, with their fields. */
export const sectionLimits = {
  air: {
    temperatureCelsius: num(-50, 60),
    speedOfSound: num(1, 10000, { nullable: true }),
    relativeHumidity: num(0, 100, { optional: 50 }),
    pressureKilopascals: num(50, 120, { optional: 101.325 }),
  },
  doppler: {
    factor: num(0, 10),
    maxShiftCents: num(0, 2400),
    smoothingSeconds: num(0, 2),
    velocityClock: oneOf('wall', 'game'),
    velocitySmoothingSeconds: num(0, 2),
    teleportSpeed: num(1, 100000),
  },
  distance: {
    model: oneOf('linear', 'inverse', 'exponential'),
    refDistance: num(0.01, 100000),
    maxDistance: num(0.01, 10000000),
    rolloffFactor: num(0, 100),
  },
  timeFlow: {
    slowMotionScale: num(0, 1),
    rampInSeconds: num(0, 10),
    rampOutSeconds: num(0, 10),
    easing: oneOf('linear', 'smooth', 'exponential'),
  },
  smoothing: {
    ratioSeconds: num(0, 1),
    cutoffSeconds: num(0, 1),
    gainSeconds: num(0, 1),
  },
  resampler: {
    tier: oneOf('draft', 'standard', 'high'),
  },
  master: {
    limiter: bool,
    ceilingDb: num(-24, 0),
    gainDb: num(-60, 12),
  },
} as const satisfies Record<string, Record<string, FieldLimit>>;

/** Whether a scalar field may be absent (it then takes its `optional` value). */
export function isOptionalField(limit: FieldLimit): boolean {
  return limit.kind !== 'boolean' && limit.optional !== undefined;
}

/** Name of a section described by sectionLimits. */
export type SectionName = keyof typeof sectionLimits;

/** Fields of one group, in serialization order ('pitch', 'tone' and 'level' are curves). */
export const groupLimits = {
  policy: oneOf('follow-time', 'exempt', 'tone-only', 'stretch'),
  pitch: 'curve',
  tone: 'curve',
  level: 'curve',
  doppler: bool,
  motion: { kind: 'enum', values: ['propagation', 'instant', 'off'], optional: 'propagation' } as EnumField,
  priority: num(0, 255, { integer: true }),
} as const;

/** Optional fields of one group (files may omit them; the parser fills `groupOptionalDefaults`), in serialization order. */
export const groupOptionalLimits = {
  stretchPitch: 'curve',
  stretchFreeze: oneOf('silence', 'hold'),
} as const;

/** Values of the optional group fields when a file omits them: pitch kept (0 cents), silence at time scale 0. */
export const groupOptionalDefaults = Object.freeze({
  stretchPitch: Object.freeze({ interpolation: 'linear' as const, keys: Object.freeze([Object.freeze({ x: 0, y: 0 })]) }),
  stretchFreeze: 'silence' as const,
});

/** Curve limits: x is the time scale; y ranges per curve kind (pitch: speed multiplier, tone: Hz, level: dB, stretchPitch: cents). */
export const curveLimits = {
  interpolation: oneOf('linear', 'monotone'),
  minKeys: 1,
  maxKeys: 64,
  /** Smallest x distance between neighbouring keys (keeps monotone tangents finite). */
  minSpacing: 1e-6,
  x: num(0, MAX_TIME_SCALE),
  y: {
    pitch: num(0, 4),
    tone: num(20, OPEN_CUTOFF_HZ),
    level: num(-96, 24),
    stretchPitch: num(-2400, 2400),
  },
} as const;

/** Group-map limits: name pattern, reserved names, count, and the group every tuning must have. */
export const groupsLimits = {
  namePattern: /^[A-Za-z][A-Za-z0-9_-]{0,63}$/,
  minGroups: 1,
  maxGroups: 64,
  requiredGroup: 'effects',
} as const;

/** Keys rejected anywhere in a document (prototype-pollution guard). */
export const forbiddenKeys: readonly string[] = ['__proto__', 'constructor', 'prototype'];

/** Top-level keys of a version-1 document, in serialization order. */
export const topLevelKeys: readonly string[] = ['version', ...Object.keys(sectionLimits), 'groups'];

/** Everything above as one object (ranges for editors and schema checks). */
export const tuningLimits = Object.freeze({
  sections: sectionLimits,
  group: groupLimits,
  groupOptional: groupOptionalLimits,
  curve: curveLimits,
  groups: groupsLimits,
  forbiddenKeys,
  topLevelKeys,
});
