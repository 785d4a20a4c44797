// Panel sections that edit the tuning: time flow, sound groups, Doppler and air, listening.
import type { FolderApi, Pane, TabPageApi } from 'tweakpane';
import { speedOfSound } from '../../src/motion';
import type { CurveSpec, GroupTuning } from '../../src';
import { addStretchControls } from './stretch-controls';
import type { CurveBladeApi, CurveBladeParams } from '../curve-blade';
import type { MutableTuning } from '../tuning-store';
import { LISTENING_FLOOR_DB } from '../listening-level';

/** What the tunable sections need from the panel. */
export interface TunableContext {
  draft: MutableTuning;
  /** Called after every edit; the panel validates and applies the draft. */
  changed(last: boolean): void;
  /** Curve blades built, so that the panel can move their live markers. */
  curves: CurveBladeApi[];
}

type Container = Pane | FolderApi | TabPageApi;

const timeAxis = Object.freeze({ xMin: 0, xMax: 4, xKnee: 1 });

function addCurve(parent: Container, ctx: TunableContext, owner: { [k: string]: CurveSpec }, key: string, params: Partial<CurveBladeParams>): void {
  const blade = parent.addBlade({ view: 'curve', value: owner[key], ...timeAxis, ...params }) as unknown as CurveBladeApi;
  blade.element.dataset.curve = params.title ?? key;
  blade.on('change', (ev) => {
    owner[key] = ev.value as CurveSpec;
    ctx.changed(ev.last);
  });
  ctx.curves.push(blade);
}

/** Time flow: slow-motion target, ramps and easing. */
export function addTimeFlowSection(pane: Pane, ctx: TunableContext, live: { timeScale: number }): FolderApi {
  const f = pane.addFolder({ title: 'Time flow' });
  f.addBinding(live, 'timeScale', { label: 'time scale now', readonly: true, format: (v: number) => v.toFixed(3) });
  f.addBinding(live, 'timeScale', { label: 'history', readonly: true, view: 'graph', min: 0, max: 1.1 });
  const tf = ctx.draft.timeFlow;
  f.addBinding(tf, 'slowMotionScale', { label: 'slow-mo target', min: 0, max: 1, step: 0.01 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(tf, 'rampInSeconds', { label: 'ramp in (s)', min: 0, max: 3, step: 0.01 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(tf, 'rampOutSeconds', { label: 'ramp out (s)', min: 0, max: 3, step: 0.01 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(tf, 'easing', { label: 'easing', options: { linear: 'linear', smooth: 'smooth', exponential: 'exponential' } }).on('change', (e) => ctx.changed(e.last));
  return f;
}

/** Sound groups: one tab per group with policy, Doppler, priority and the three curves. */
export function addGroupsSection(pane: Pane, ctx: TunableContext): FolderApi {
  const f = pane.addFolder({ title: 'Sound groups' });
  const names = Object.keys(ctx.draft.groups);
  const tab = f.addTab({ pages: names.map((title) => ({ title })) });
  names.forEach((name, i) => {
    const page = tab.pages[i];
    const g = ctx.draft.groups[name];
    page.addBinding(g, 'policy', {
      label: 'policy',
      options: { 'follows time': 'follow-time', 'tone only': 'tone-only', exempt: 'exempt', 'stretch (keeps pitch)': 'stretch' },
    }).on('change', (e) => ctx.changed(e.last));
    page.addBinding(g, 'doppler', { label: 'Doppler' }).on('change', (e) => ctx.changed(e.last));
    page.addBinding(g, 'motion', {
      label: 'motion',
      options: { 'sound travels': 'propagation', 'same instant': 'instant', off: 'off' },
    }).on('change', (e) => ctx.changed(e.last));
    page.addBinding(g, 'priority', { label: 'priority', min: 0, max: 255, step: 1 }).on('change', (e) => ctx.changed(e.last));
    const curves = g as unknown as { [k: string]: CurveSpec };
    addCurve(page, ctx, curves, 'pitch', { title: `${name} · speed & pitch ×`, unit: '×', yMin: 0, yMax: 4, yKnee: 1 });
    addCurve(page, ctx, curves, 'tone', { title: `${name} · tone cutoff`, unit: 'Hz', yMin: 20, yMax: 20000, yScale: 'log' });
    addCurve(page, ctx, curves, 'level', { title: `${name} · level`, unit: 'dB', yMin: -48, yMax: 12 });
    addStretchControls(page, ctx, name, g as unknown as GroupTuning);
    page.element.dataset.group = name;
  });
  return f;
}

/** Doppler and air: temperature (speed of sound shown), factor, maximum shift, smoothing, velocity clock. */
export function addDopplerSection(pane: Pane, ctx: TunableContext): FolderApi {
  const f = pane.addFolder({ title: 'Doppler & air', expanded: false });
  const air = ctx.draft.air;
  const shown = { c: speedOfSound(air.temperatureCelsius) };
  f.addBinding(air, 'temperatureCelsius', { label: 'air (°C)', min: -50, max: 60, step: 0.5 }).on('change', (e) => {
    shown.c = speedOfSound(air.temperatureCelsius);
    ctx.changed(e.last);
  });
  f.addBinding(shown, 'c', { label: 'sound (m/s)', readonly: true, format: (v: number) => v.toFixed(1) });
  f.addBinding(air, 'relativeHumidity', { label: 'humidity (%)', min: 0, max: 100, step: 1 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(air, 'pressureKilopascals', { label: 'pressure (kPa)', min: 50, max: 120, step: 0.1 }).on('change', (e) => ctx.changed(e.last));
  const d = ctx.draft.doppler;
  f.addBinding(d, 'factor', { label: 'Doppler factor', min: 0, max: 4, step: 0.05 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(d, 'maxShiftCents', { label: 'max shift (¢)', min: 0, max: 2400, step: 10 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(d, 'smoothingSeconds', { label: 'smoothing (s)', min: 0, max: 2, step: 0.01 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(d, 'velocityClock', { label: 'velocity clock', options: { 'wall clock': 'wall', 'game clock': 'game' } }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(d, 'velocitySmoothingSeconds', { label: 'velocity avg (s)', min: 0, max: 2, step: 0.01 }).on('change', (e) => ctx.changed(e.last));
  const dist = ctx.draft.distance;
  f.addBinding(dist, 'model', { label: 'distance law', options: { inverse: 'inverse', linear: 'linear', exponential: 'exponential' } }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(dist, 'refDistance', { label: 'ref distance (m)', min: 0.1, max: 50, step: 0.1 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(dist, 'rolloffFactor', { label: 'rolloff', min: 0, max: 4, step: 0.05 }).on('change', (e) => ctx.changed(e.last));
  return f;
}

/** Listening: master volume (a user setting, not tuning), the safety limiter and its ceiling. */
export function addListeningSection(pane: Pane, ctx: TunableContext, volume: { db: number }, onVolume: () => void): FolderApi {
  const f = pane.addFolder({ title: 'Listening', expanded: false });
  f.addBinding(volume, 'db', { label: 'volume (dB)', min: LISTENING_FLOOR_DB, max: 0, step: 1 }).on('change', onVolume);
  const m = ctx.draft.master;
  f.addBinding(m, 'limiter', { label: 'safety limiter' }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(m, 'ceilingDb', { label: 'ceiling (dBFS)', min: -24, max: 0, step: 0.5 }).on('change', (e) => ctx.changed(e.last));
  f.addBinding(m, 'gainDb', { label: 'engine gain (dB)', min: -60, max: 12, step: 0.5 }).on('change', (e) => ctx.changed(e.last));
  return f;
}
