// Controls of the 'stretch' group policy on a group's page: what time scale 0 does and the pitch curve in cents
// (the speed curve is the group's pitch curve, shown above them). Ranges and tooltips from field-specs.ts.
import type { BladeApi, FolderApi, TabPageApi } from 'tweakpane';
import type { CurveSpec } from '../../src';
import { addCurveBlade } from '../curve-blade';
import type { MutableGroup } from '../tuning-store';
import { curveFieldSpecs, groupChoiceSpecs, tooltipOf } from '../field-specs';
import { addChoiceField } from '../controls/number-field';
import type { TunableContext } from './tunable-sections';

/** Adds the freeze mode and the stretchPitch curve (time scale → cents) to a group's page; returns the blades added. */
export function addStretchControls(page: TabPageApi | FolderApi, ctx: TunableContext, name: string, g: MutableGroup): BladeApi[] {
  const freeze = addChoiceField(page, g, 'stretchFreeze', groupChoiceSpecs.stretchFreeze, (last) => ctx.changed(last), {
    'fade to silence': 'silence',
    'hold the sound': 'hold',
  });
  const spec = curveFieldSpecs.stretchPitch;
  const blade = addCurveBlade(page, {
    view: 'curve',
    value: g.stretchPitch,
    xMin: 0,
    xMax: 4,
    xKnee: 1,
    title: `${name} · ${spec.label}`,
    unit: spec.unit,
    yMin: spec.limit.min,
    yMax: spec.limit.max,
  });
  blade.element.dataset.curve = `${name} · ${spec.label}`;
  blade.element.title = `${tooltipOf(spec)} x: time scale 0…4.`;
  blade.on('change', (ev) => {
    g.stretchPitch = ev.value as CurveSpec;
    ctx.changed(ev.last);
  });
  ctx.curves.push(blade);
  return [freeze, blade];
}
