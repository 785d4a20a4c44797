// Controls of the 'stretch' group policy on a group's page: what time scale 0 does and the pitch curve in cents
// (the speed curve is the group's pitch curve, shown above them).
import type { FolderApi, TabPageApi } from 'tweakpane';
import type { CurveSpec, GroupTuning } from '../../src';
import type { CurveBladeApi } from '../curve-blade';
import type { TunableContext } from './tunable-sections';

type Mutable<T> = { -readonly [K in keyof T]: T[K] };

/** Adds the freeze mode and the stretchPitch curve (time scale → cents, ±1200 shown) to a group's page. */
export function addStretchControls(page: TabPageApi | FolderApi, ctx: TunableContext, name: string, group: GroupTuning): void {
  const g = group as Mutable<GroupTuning>;
  page.addBinding(g, 'stretchFreeze', { label: 'stretch at 0', options: { 'fade to silence': 'silence', 'hold the sound': 'hold' } }).on('change', (e) => ctx.changed(e.last));
  const blade = page.addBlade({
    view: 'curve',
    value: g.stretchPitch,
    xMin: 0,
    xMax: 4,
    xKnee: 1,
    title: `${name} · stretch pitch`,
    unit: '¢',
    yMin: -1200,
    yMax: 1200,
  }) as unknown as CurveBladeApi;
  blade.element.dataset.curve = `${name} · stretch pitch`;
  blade.on('change', (ev) => {
    g.stretchPitch = ev.value as CurveSpec;
    ctx.changed(ev.last);
  });
  ctx.curves.push(blade);
}
