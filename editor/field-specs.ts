// Every scalar field of the tuning format as the editor shows it: label, unit, step and the range, read from the
// format's one limits table (src/tuning/tuning-limits.ts) so that the panel can never be narrower or wider.
import { curveLimits, groupLimits, groupOptionalLimits, sectionLimits, type FieldLimit, type NumberField, type SectionName } from '../src/tuning/index';

/** How one numeric field is shown: label, unit, step and an optional slider span inside the format's range. */
export interface FieldSpec {
  /** JSON path of the field, e.g. 'doppler.factor' ('groups.*.priority' for every group). */
  readonly path: string;
  readonly label: string;
  /** Unit shown in tooltips ('' for plain numbers). */
  readonly unit: string;
  /** Granularity of stored values; values are rounded to it (a power of ten, or 1 for integers). */
  readonly step: number;
  /** The format's limit (the same object the parser checks against). */
  readonly limit: FieldLimit;
  /** Longer description for the tooltip. */
  readonly about: string;
}

type Described = { label: string; unit: string; step: number; about: string };

/** Editor descriptions of every field of sectionLimits (the test checks that none is missing). */
const described: { [S in SectionName]: { [K in keyof (typeof sectionLimits)[S]]: Described } } = {
  air: {
    temperatureCelsius: { label: 'air (°C)', unit: '°C', step: 0.1, about: 'Air temperature; sets the speed of sound unless it is overridden' },
    speedOfSound: { label: 'sound override', unit: 'm/s', step: 0.1, about: 'Speed of sound override; off = derived from the temperature' },
    relativeHumidity: { label: 'humidity (%)', unit: '%', step: 1, about: 'Relative humidity of the air (air absorption of high frequencies with distance)' },
    pressureKilopascals: { label: 'pressure (kPa)', unit: 'kPa', step: 0.1, about: 'Air pressure (air absorption of high frequencies with distance)' },
  },
  doppler: {
    factor: { label: 'Doppler factor', unit: '×', step: 0.01, about: 'Scales the Doppler shift; 0 turns it off' },
    maxShiftCents: { label: 'max shift (¢)', unit: 'cents', step: 1, about: 'Largest Doppler shift allowed each way' },
    smoothingSeconds: { label: 'smoothing (s)', unit: 's', step: 0.001, about: 'Time constant of the Doppler ratio smoothing' },
    velocityClock: { label: 'velocity clock', unit: '', step: 1, about: 'Clock velocities are measured in: wall (physical) or game (÷ time scale)' },
    velocitySmoothingSeconds: { label: 'velocity avg (s)', unit: 's', step: 0.001, about: 'Time constant of the velocity estimate' },
    teleportSpeed: { label: 'teleport (m/s)', unit: 'm/s', step: 1, about: 'Implied speeds above this count as a teleport (no Doppler jump)' },
  },
  distance: {
    model: { label: 'distance law', unit: '', step: 1, about: 'Web Audio API distance model' },
    refDistance: { label: 'ref distance (m)', unit: 'm', step: 0.01, about: 'Distance at which the distance gain is 1' },
    maxDistance: { label: 'max distance (m)', unit: 'm', step: 0.01, about: 'Distance beyond which the gain stops falling' },
    rolloffFactor: { label: 'rolloff', unit: '×', step: 0.01, about: 'How fast the gain falls with distance' },
  },
  timeFlow: {
    slowMotionScale: { label: 'slow-mo target', unit: '×', step: 0.01, about: 'Time scale the slow-motion control ramps to' },
    rampInSeconds: { label: 'ramp in (s)', unit: 's', step: 0.01, about: 'Ramp time into slow motion' },
    rampOutSeconds: { label: 'ramp out (s)', unit: 's', step: 0.01, about: 'Ramp time out of slow motion' },
    easing: { label: 'easing', unit: '', step: 1, about: 'Shape of the time-scale ramp' },
  },
  smoothing: {
    ratioSeconds: { label: 'ratio glide (s)', unit: 's', step: 0.001, about: 'Time constant of playback-ratio changes (in cents)' },
    cutoffSeconds: { label: 'cutoff glide (s)', unit: 's', step: 0.001, about: 'Time constant of cutoff changes (in log frequency)' },
    gainSeconds: { label: 'gain glide (s)', unit: 's', step: 0.001, about: 'Time constant of gain changes (in dB)' },
  },
  resampler: {
    tier: { label: 'resampler', unit: '', step: 1, about: 'Resampler quality tier' },
  },
  master: {
    limiter: { label: 'safety limiter', unit: '', step: 1, about: 'Safety limiter on the master bus (keep it on)' },
    ceilingDb: { label: 'ceiling (dBFS)', unit: 'dBFS', step: 0.1, about: 'Limiter ceiling' },
    gainDb: { label: 'engine gain (dB)', unit: 'dB', step: 0.1, about: 'Master gain of the engine' },
  },
};

/** Specs of every field of every section, in the format's order. */
export const sectionFieldSpecs: readonly FieldSpec[] = Object.freeze(
  (Object.keys(sectionLimits) as SectionName[]).flatMap((s) =>
    Object.entries(sectionLimits[s]).map(([k, limit]) => {
      const d = (described[s] as Record<string, Described>)[k];
      return Object.freeze({ path: `${s}.${k}`, limit: limit as FieldLimit, ...d });
    }),
  ),
);

/** The group fields that are choices: policy, motion model, stretch at time scale 0, Doppler. */
export const groupChoiceSpecs = Object.freeze({
  policy: Object.freeze({ path: 'groups.*.policy', label: 'policy', unit: '', step: 1, limit: groupLimits.policy, about: 'How the group reacts to the time scale' }),
  motion: Object.freeze({ path: 'groups.*.motion', label: 'motion', unit: '', step: 1, limit: groupLimits.motion, about: 'How motion is heard: sound travels (emission time), same instant, or off' }),
  stretchFreeze: Object.freeze({ path: 'groups.*.stretchFreeze', label: 'stretch at 0', unit: '', step: 1, limit: groupOptionalLimits.stretchFreeze, about: 'What a stretched group does at time scale 0' }),
  doppler: Object.freeze({ path: 'groups.*.doppler', label: 'Doppler', unit: '', step: 1, limit: groupLimits.doppler, about: 'Whether voices of this group get the Doppler shift' }),
}) satisfies Record<string, FieldSpec>;

/** The group fields that are numbers (priority). */
export const groupPrioritySpec: FieldSpec = Object.freeze({
  path: 'groups.*.priority', label: 'priority', unit: '', step: 1, limit: groupLimits.priority, about: 'Stealing priority: higher survives longer',
});

/** Curve y ranges and units (from curveLimits.y) with the steps of their key fields. */
export const curveFieldSpecs = Object.freeze({
  pitch: Object.freeze({ path: 'groups.*.pitch', label: 'speed & pitch ×', unit: '×', step: 0.001, limit: curveLimits.y.pitch, about: 'Speed multiplier by time scale' }),
  tone: Object.freeze({ path: 'groups.*.tone', label: 'tone cutoff', unit: 'Hz', step: 1, limit: curveLimits.y.tone, about: 'Low-pass cutoff by time scale; at 20 kHz it is open' }),
  level: Object.freeze({ path: 'groups.*.level', label: 'level', unit: 'dB', step: 0.1, limit: curveLimits.y.level, about: 'Level by time scale' }),
  stretchPitch: Object.freeze({ path: 'groups.*.stretchPitch', label: 'stretch pitch', unit: '¢', step: 1, limit: curveLimits.y.stretchPitch, about: 'Pitch of a stretched group by time scale, in cents' }),
}) satisfies Record<string, FieldSpec>;

/** The spec of a section field by path; throws for a path the format does not have. */
export function fieldSpec(path: string): FieldSpec {
  const s = sectionFieldSpecs.find((f) => f.path === path);
  if (!s) throw new Error(`no tuning field ${path}`);
  return s;
}

/** Decimal places of a step (0.01 → 2, 1 → 0). */
export function stepDecimals(step: number): number {
  const s = String(step);
  const dot = s.indexOf('.');
  return dot < 0 ? 0 : s.length - dot - 1;
}

/** Rounds `v` to the nearest multiple of `step` and returns the shortest decimal (typing 0.1 stores 0.1). */
export function roundToStep(v: number, step: number): number {
  if (!Number.isFinite(v)) return v;
  return Number((Math.round(v / step) * step).toFixed(stepDecimals(step)));
}

/** Tooltip text: what the field is, its unit and the format's range. */
export function tooltipOf(spec: Pick<FieldSpec, 'about' | 'unit' | 'limit'>): string {
  const l = spec.limit;
  const unit = spec.unit ? ` ${spec.unit}` : '';
  if (l.kind === 'number') return `${spec.about}. Range ${l.min}…${l.max}${unit}${l.nullable ? ', or off' : ''}.`;
  if (l.kind === 'enum') return `${spec.about}. One of: ${l.values.join(', ')}.`;
  return `${spec.about}. On or off.`;
}

/** Range of a numeric limit (throws for other kinds). */
export function numberLimit(spec: FieldSpec): NumberField {
  if (spec.limit.kind !== 'number') throw new Error(`${spec.path} is not a number field`);
  return spec.limit;
}
