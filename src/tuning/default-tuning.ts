// The built-in tuning: values that sound right on the sample scene; the starting point of every tuning file.
import type { CurveSpec, GroupTuning, Tuning } from './tuning-types';
import { groupOptionalDefaults } from './tuning-limits';

/** Current schema version of the tuning document. */
export const TUNING_VERSION = 1;

function curve(interpolation: CurveSpec['interpolation'], keys: readonly (readonly [number, number])[]): CurveSpec {
  return { interpolation, keys: keys.map(([x, y]) => ({ x, y })) };
}

/** Pitch curve s → s: speed and pitch follow the time scale exactly (0 = frozen). */
const identityPitch = curve('linear', [
  [0, 0],
  [4, 4],
]);
/** Constant 1: speed unchanged. */
const unitPitch = curve('linear', [[0, 1]]);
/** Open tone: the low-pass is bypassed at every time scale. */
const openTone = curve('linear', [[0, 20000]]);
/** Level unchanged. */
const flatLevel = curve('linear', [[0, 0]]);

/** A built-in group: the optional fields take their defaults unless given. */
function group(g: Omit<GroupTuning, keyof typeof groupOptionalDefaults> & Partial<GroupTuning>): GroupTuning {
  return { ...g, stretchPitch: g.stretchPitch ?? groupOptionalDefaults.stretchPitch, stretchFreeze: g.stretchFreeze ?? groupOptionalDefaults.stretchFreeze };
}

function deepFreeze<T>(value: T): T {
  if (value !== null && typeof value === 'object' && !Object.isFrozen(value)) {
    for (const k of Object.keys(value)) deepFreeze((value as Record<string, unknown>)[k]);
    Object.freeze(value);
  }
  return value;
}

/** The built-in tuning (schema version 1), deeply frozen. */
export const defaultTuning: Tuning = deepFreeze<Tuning>({
  version: TUNING_VERSION,
  air: { temperatureCelsius: 20, speedOfSound: null, relativeHumidity: 50, pressureKilopascals: 101.325 },
  doppler: {
    factor: 1,
    maxShiftCents: 1200,
    smoothingSeconds: 0.05,
    velocityClock: 'wall',
    velocitySmoothingSeconds: 0.08,
    teleportSpeed: 400,
  },
  distance: { model: 'inverse', refDistance: 1, maxDistance: 10000, rolloffFactor: 1 },
  timeFlow: { slowMotionScale: 0.35, rampInSeconds: 0.25, rampOutSeconds: 0.4, easing: 'smooth' },
  smoothing: { ratioSeconds: 0, cutoffSeconds: 0.02, gainSeconds: 0.01 },
  resampler: { tier: 'standard' },
  master: { limiter: true, ceilingDb: -1, gainDb: 0 },
  groups: {
    effects: group({
      policy: 'follow-time',
      pitch: identityPitch,
      tone: curve('monotone', [
        [0, 1200],
        [0.1, 1500],
        [0.35, 4500],
        [0.7, 11000],
        [1, 20000],
      ]),
      level: curve('monotone', [
        [0, -6],
        [0.35, -3],
        [1, 0],
      ]),
      doppler: true,
      motion: 'propagation',
      priority: 100,
    }),
    vehicles: group({
      policy: 'follow-time',
      pitch: identityPitch,
      tone: curve('monotone', [
        [0, 1500],
        [0.1, 1800],
        [0.35, 5000],
        [0.7, 12000],
        [1, 20000],
      ]),
      level: curve('monotone', [
        [0, -5],
        [0.35, -2.5],
        [1, 0],
      ]),
      doppler: true,
      motion: 'propagation',
      priority: 120,
    }),
    ambience: group({
      policy: 'follow-time',
      // Roughly s^0.8: drops a little less than the time scale.
      pitch: curve('monotone', [
        [0, 0],
        [0.1, 0.16],
        [0.35, 0.43],
        [1, 1],
        [4, 3.03],
      ]),
      tone: curve('monotone', [
        [0, 1200],
        [0.1, 1400],
        [0.35, 4000],
        [0.7, 10000],
        [1, 20000],
      ]),
      level: curve('monotone', [
        [0, -4],
        [0.35, -2],
        [1, 0],
      ]),
      doppler: true,
      motion: 'propagation',
      priority: 60,
    }),
    interface: group({
      policy: 'exempt',
      pitch: unitPitch,
      tone: openTone,
      level: flatLevel,
      doppler: false,
      motion: 'propagation',
      priority: 200,
    }),
    radio: group({
      // Slows with the time scale but keeps its pitch (docs/time-stretch.md): dialogue stays intelligible.
      policy: 'stretch',
      pitch: identityPitch,
      stretchPitch: curve('linear', [[0, 0]]),
      stretchFreeze: 'silence',
      motion: 'propagation',
      tone: curve('monotone', [
        [0, 4000],
        [0.35, 9000],
        [1, 20000],
      ]),
      level: flatLevel,
      doppler: true,
      priority: 150,
    }),
    music: group({
      policy: 'tone-only',
      pitch: unitPitch,
      tone: curve('monotone', [
        [0, 3000],
        [0.35, 8000],
        [0.7, 14000],
        [1, 20000],
      ]),
      level: curve('monotone', [
        [0, -3],
        [0.35, -1.5],
        [1, 0],
      ]),
      doppler: false,
      motion: 'propagation',
      priority: 180,
    }),
  },
});

/** Name of the group that voices without a (known) group fall back to. */
export const DEFAULT_GROUP = 'effects';
