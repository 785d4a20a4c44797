// Panel sections that edit the tuning's scalar fields: time flow, Doppler & air, distance & smoothing, listening.
// Every field's range, step and tooltip come from field-specs.ts (the format's limits table).
import type { FolderApi, Pane } from 'tweakpane';
import { speedOfSound } from '../../src/motion';
import { tuningLimits } from '../../src';
import type { CurveBladeApi } from '../curve-blade';
import type { MutableTuning } from '../tuning-store';
import { LISTENING_FLOOR_DB } from '../listening-level';
import { fieldSpec, roundToStep } from '../field-specs';
import type { Announcer } from '../controls/announcer';
import { addChoiceField, addNumberField, type FieldParent } from '../controls/number-field';

/** What the tunable sections need from the panel. */
export interface TunableContext {
  draft: MutableTuning;
  /** Called after every edit; the panel validates and applies the draft (`last`: the gesture ended). */
  changed(last: boolean): void;
  /** Curve blades built, so that the panel can move their live markers. */
  curves: CurveBladeApi[];
  /** Status line for clamps and refused text. */
  notice: Announcer;
}

type SectionName = keyof typeof tuningLimits.sections;
const isSectionName = (name: string): name is SectionName => Object.prototype.hasOwnProperty.call(tuningLimits.sections, name);

/** Adds the field at `path` ('section.key') of the draft, number or choice, with the labels of `options` for enums. */
export function addField(parent: FieldParent, ctx: TunableContext, path: string, options?: Record<string, string>) {
  const [section, key] = path.split('.');
  const spec = fieldSpec(path);
  if (!isSectionName(section)) throw new Error(`no tuning section ${section}`);
  const target = ctx.draft[section];
  return spec.limit.kind === 'number'
    ? addNumberField(parent, target, key, spec, ctx.notice, (last) => ctx.changed(last))
    : addChoiceField(parent, target, key, spec, (last) => ctx.changed(last), options);
}

/** Time flow: live time scale, slow-motion target, ramps and easing. */
export function addTimeFlowSection(pane: Pane, ctx: TunableContext, live: { timeScale: number }): FolderApi {
  const f = pane.addFolder({ title: 'Time flow' });
  const now = f.addBinding(live, 'timeScale', { label: 'time scale now', readonly: true, format: (v: number) => v.toFixed(3) });
  now.element.title = 'The time scale the engine runs at now (0 = frozen, 1 = normal).';
  f.addBinding(live, 'timeScale', { label: 'history', readonly: true, view: 'graph', min: 0, max: 1.1 }).element.title = 'Time scale over the last seconds (0…1.1).';
  for (const p of ['timeFlow.slowMotionScale', 'timeFlow.rampInSeconds', 'timeFlow.rampOutSeconds', 'timeFlow.easing']) addField(f, ctx, p);
  return f;
}

/** Doppler and air: temperature, speed-of-sound override (and the speed in use), Doppler factor, shift, smoothing, velocity. */
export function addDopplerSection(pane: Pane, ctx: TunableContext): FolderApi {
  const f = pane.addFolder({ title: 'Doppler & air', expanded: false });
  const air = ctx.draft.air;
  const inUse = () => air.speedOfSound ?? speedOfSound(air.temperatureCelsius);
  const shown = { c: inUse(), override: air.speedOfSound !== null, value: air.speedOfSound ?? roundToStep(inUse(), 0.1) };
  addField(f, ctx, 'air.temperatureCelsius');
  addField(f, ctx, 'air.relativeHumidity');
  addField(f, ctx, 'air.pressureKilopascals');
  const overrideOn = f.addBinding(shown, 'override', { label: 'override sound' });
  overrideOn.element.title = 'Use a fixed speed of sound instead of the one the temperature gives. Off clears the override (null).';
  const speedSpec = fieldSpec('air.speedOfSound');
  const speed = addNumberField(f, shown, 'value', speedSpec, ctx.notice, (last) => {
    if (!shown.override) return;
    air.speedOfSound = shown.value;
    shown.c = inUse();
    ctx.changed(last);
  });
  speed.disabled = !shown.override;
  overrideOn.on('change', () => {
    speed.disabled = !shown.override;
    air.speedOfSound = shown.override ? shown.value : null;
    shown.c = inUse();
    ctx.changed(true);
  });
  const readout = f.addBinding(shown, 'c', { label: 'sound (m/s)', readonly: true, format: (v: number) => v.toFixed(1) });
  readout.element.title = 'Speed of sound the engine uses: the override when set, else derived from the air temperature (m/s).';
  f.on('change', () => (shown.c = inUse()));
  for (const p of ['doppler.factor', 'doppler.maxShiftCents', 'doppler.smoothingSeconds']) addField(f, ctx, p);
  addField(f, ctx, 'doppler.velocityClock', { 'wall clock': 'wall', 'game clock': 'game' });
  for (const p of ['doppler.velocitySmoothingSeconds', 'doppler.teleportSpeed']) addField(f, ctx, p);
  return f;
}

/** Distance law and the per-voice glide times. */
export function addDistanceSection(pane: Pane, ctx: TunableContext): FolderApi {
  const f = pane.addFolder({ title: 'Distance & glides', expanded: false });
  for (const p of ['distance.model', 'distance.refDistance', 'distance.maxDistance', 'distance.rolloffFactor', 'smoothing.ratioSeconds', 'smoothing.cutoffSeconds', 'smoothing.gainSeconds'])
    addField(f, ctx, p);
  return f;
}

/** Listening: master volume (a user setting, not tuning), the safety limiter, its ceiling and the engine gain. */
export function addListeningSection(pane: Pane, ctx: TunableContext, volume: { db: number } | null, onVolume: () => void): FolderApi {
  const f = pane.addFolder({ title: 'Listening', expanded: false });
  if (volume) {
    const v = f.addBinding(volume, 'db', { label: 'volume (dB)', min: LISTENING_FLOOR_DB, max: 0, step: 1 });
    v.element.title = `Listening volume of this page (not saved in the tuning). Range ${LISTENING_FLOOR_DB}…0 dB; ${LISTENING_FLOOR_DB} is silence.`;
    v.on('change', onVolume);
  }
  for (const p of ['master.limiter', 'master.ceilingDb', 'master.gainDb']) addField(f, ctx, p);
  return f;
}
