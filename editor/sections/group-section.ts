// Sound groups: a one-row strip of group names (scrolls sideways past what fits, so 6 or 64 groups take one row),
// and the selected group's page: bus mute/solo/volume and meter, policy, Doppler, priority and the three curves.
// The page is built from `groupPageParts`, a list other features extend (e.g. a stretch policy) without touching this file.
import type { BladeApi, FolderApi, Pane } from 'tweakpane';
import type { CurveSpec } from '../../src';
import { CurveBladeApi, addCurveBlade, type CurveBladeParams } from '../curve-blade';
import type { MutableGroup } from '../tuning-store';
import { curveFieldSpecs, groupChoiceSpecs, groupPrioritySpec, roundToStep, tooltipOf } from '../field-specs';
import { addStretchControls } from './stretch-controls';
import { addChoiceField, addNumberField } from '../controls/number-field';
import type { GroupControls } from '../group-controls';
import { PeakMeter } from '../monitors/peak-meter';
import type { TunableContext } from './tunable-sections';

/** What a part of a group page gets: the folder to add to, the group's name and draft, and the panel's context. */
export interface GroupPageArgs {
  folder: FolderApi;
  name: string;
  group: MutableGroup;
  ctx: TunableContext;
  buses: GroupControls;
  /** Registers the group's meter so that the panel feeds it. */
  meter(m: PeakMeter): void;
}

/** One part of a group page; returns the blades it added (removed when another group is selected). */
export type GroupPagePart = (args: GroupPageArgs) => BladeApi[];

const timeAxis = Object.freeze({ xMin: 0, xMax: 4, xKnee: 1 });

function addCurve(a: GroupPageArgs, key: 'pitch' | 'tone' | 'level', params: Partial<CurveBladeParams>): CurveBladeApi {
  const spec = curveFieldSpecs[key];
  const owner = a.group;
  const title = `${a.name} · ${spec.label}`;
  const blade = addCurveBlade(a.folder, { view: 'curve', value: owner[key], title, unit: spec.unit, yMin: spec.limit.min, yMax: spec.limit.max, ...timeAxis, ...params });
  blade.element.dataset.curve = title;
  blade.element.title = `${tooltipOf(spec)} x: time scale 0…4 (the part above 1 is drawn compressed; see the knee mark).`;
  blade.on('change', (ev) => {
    // While dragging, the exact position plays; on release the keys are stored rounded to the field's steps.
    const spec = ev.value as CurveSpec;
    const stored = ev.last ? roundCurveKeys(spec, curveFieldSpecs[key].step, curveFieldSpecs[key].limit) : spec;
    owner[key] = stored;
    if (stored !== spec) blade.value = stored;
    a.ctx.changed(ev.last);
  });
  a.ctx.curves.push(blade);
  return blade;
}

/** The curve with y rounded to `yStep` inside the range and x to 0.001 where that keeps x strictly increasing; the same object when nothing changes. */
export function roundCurveKeys(spec: CurveSpec, yStep: number, y: { min: number; max: number }): CurveSpec {
  let changed = false;
  let prevX = -Infinity;
  const keys = spec.keys.map((k, i) => {
    const next = spec.keys[i + 1];
    const rx = roundToStep(k.x, 0.001);
    const x = rx > prevX && (next === undefined || rx < roundToStep(next.x, 0.001)) ? rx : k.x;
    prevX = x;
    const ky = Math.min(y.max, Math.max(y.min, roundToStep(k.y, yStep)));
    if (x !== k.x || ky !== k.y) changed = true;
    return { x, y: ky };
  });
  return changed ? { interpolation: spec.interpolation, keys } : spec;
}

/** Bus controls of the group (when the runtime has group buses) and its meter. */
export function busPart(a: GroupPageArgs): BladeApi[] {
  const doc = a.folder.element.ownerDocument;
  const row = doc.createElement('div');
  row.className = 'rl-bus';
  const state = a.buses.state(a.name);
  const button = (text: string, on: boolean, title: string, click: (b: HTMLButtonElement) => void) => {
    const b = doc.createElement('button');
    b.type = 'button';
    b.textContent = text;
    b.title = title;
    b.setAttribute('aria-pressed', String(on));
    b.disabled = !a.buses.available;
    b.addEventListener('click', () => click(b));
    row.appendChild(b);
    return b;
  };
  const why = a.buses.available ? '' : ' (needs a runtime with group buses)';
  button('mute', state?.muted ?? false, `Silence this group while listening (not saved in the tuning)${why}.`, (b) => {
    const on = b.getAttribute('aria-pressed') !== 'true';
    a.buses.setMute(a.name, on);
    b.setAttribute('aria-pressed', String(on));
  });
  button('solo', state?.solo ?? false, `Hear only soloed groups (not saved in the tuning)${why}.`, (b) => {
    const on = b.getAttribute('aria-pressed') !== 'true';
    a.buses.setSolo(a.name, on);
    b.setAttribute('aria-pressed', String(on));
  });
  const meter = new PeakMeter(doc, a.name, `True peak of the ${a.name} bus over each report interval, with a 2 s hold (dBFS)${why}.`);
  row.appendChild(meter.element);
  a.meter(meter);
  return [a.folder.addBlade({ view: 'ralenti-element', element: row })];
}

/** Policy, Doppler switch, motion model and stealing priority. */
export function behaviourPart(a: GroupPageArgs): BladeApi[] {
  const changed = (last: boolean) => a.ctx.changed(last);
  const c = groupChoiceSpecs;
  const policy = addChoiceField(a.folder, a.group, 'policy', c.policy, changed, { 'follows time': 'follow-time', 'tone only': 'tone-only', exempt: 'exempt', 'stretch (keeps pitch)': 'stretch' });
  const doppler = addChoiceField(a.folder, a.group, 'doppler', c.doppler, changed);
  const motion = addChoiceField(a.folder, a.group, 'motion', c.motion, changed, { 'sound travels': 'propagation', 'same instant': 'instant', off: 'off' });
  const priority = addNumberField(a.folder, a.group, 'priority', groupPrioritySpec, a.ctx.notice, changed);
  return [policy, doppler, motion, priority];
}

/** The three curves of the group. */
export function curvesPart(a: GroupPageArgs): BladeApi[] {
  return [
    addCurve(a, 'pitch', { yKnee: 1 }),
    addCurve(a, 'tone', { yScale: 'log' }),
    addCurve(a, 'level', {}),
  ];
}

/** The 'stretch' policy's controls (freeze mode and pitch curve in cents). */
export function stretchPart(a: GroupPageArgs): BladeApi[] {
  return addStretchControls(a.folder, a.ctx, a.name, a.group);
}

/** Parts of every group page, in order (push to extend). */
export const groupPageParts: GroupPagePart[] = [busPart, behaviourPart, curvesPart, stretchPart];

/** The groups folder: name strip and the selected group's page. */
export class GroupSection {
  readonly folder: FolderApi;
  /** Selected group's name. */
  selected: string;
  /** Meters of the selected group's page by group name. */
  readonly meters = new Map<string, PeakMeter>();
  private readonly strip: HTMLDivElement;
  private blades: BladeApi[] = [];
  private readonly ctx: TunableContext;
  private readonly buses: GroupControls;

  constructor(pane: Pane, ctx: TunableContext, buses: GroupControls, selected: string | null) {
    this.ctx = ctx;
    this.buses = buses;
    this.folder = pane.addFolder({ title: 'Sound groups' });
    const doc = this.folder.element.ownerDocument;
    this.strip = doc.createElement('div');
    this.strip.className = 'rl-groups';
    this.strip.setAttribute('role', 'tablist');
    this.folder.addBlade({ view: 'ralenti-element', element: this.strip });
    const names = Object.keys(ctx.draft.groups);
    for (const name of names) {
      const b = doc.createElement('button');
      b.type = 'button';
      b.className = 'rl-group-tab';
      b.textContent = name;
      b.title = `Show the ${name} group (${names.length} groups; the row scrolls sideways).`;
      b.dataset.group = name;
      b.setAttribute('role', 'tab');
      b.addEventListener('click', () => this.select(name));
      this.strip.appendChild(b);
    }
    this.selected = selected !== null && names.includes(selected) ? selected : names[0];
    this.select(this.selected);
  }

  /** Shows the page of group `name`. */
  select(name: string): void {
    for (const b of this.blades) b.dispose();
    for (const c of this.blades) {
      const i = c instanceof CurveBladeApi ? this.ctx.curves.indexOf(c) : -1;
      if (i >= 0) this.ctx.curves.splice(i, 1);
    }
    this.meters.clear();
    this.selected = name;
    for (const b of this.strip.querySelectorAll<HTMLButtonElement>('button')) {
      const on = b.dataset.group === name;
      b.setAttribute('aria-selected', String(on));
      if (on && typeof b.scrollIntoView === 'function') b.scrollIntoView({ block: 'nearest', inline: 'nearest' });
    }
    const group = this.ctx.draft.groups[name];
    const args: GroupPageArgs = { folder: this.folder, name, group, ctx: this.ctx, buses: this.buses, meter: (m) => this.meters.set(name, m) };
    this.blades = groupPageParts.flatMap((part) => part(args));
    this.folder.element.dataset.group = name;
  }
}
