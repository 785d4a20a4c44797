// The curve blade plugin (tweakpane 4 / @tweakpane/core 2.x): params parsing, controller and API wiring.
import {
  LabeledValueBladeController,
  ValueMap,
  createPlugin,
  createValue,
  parseRecord,
  type BaseBladeParams,
  type BladeApi,
  type BladePlugin,
  type TpPluginBundle,
} from '@tweakpane/core';
import type { CurveKey, CurveSpec } from '../../src';
import { CurveBladeApi } from './curve-api';
import { CurveController } from './curve-controller';
import { curveEquals, curveInterpolations, freezeCurve, type CurveRange } from './curve-model';
import { curveBladeCss } from './curve-style';

/** Params of pane.addBlade({ view: 'curve', ... }). */
export interface CurveBladeParams extends BaseBladeParams {
  view: 'curve';
  /** Initial curve; keys with strictly increasing x. */
  value: CurveSpec;
  label?: string;
  /** Title drawn above the graph (use it instead of label for a full-width graph). */
  title?: string;
  /** Unit of y shown beside its field (e.g. 'Hz', 'dB', '×'). */
  unit?: string;
  xMin?: number;
  xMax?: number;
  yMin?: number;
  yMax?: number;
  yScale?: 'linear' | 'log';
  /** x value drawn at 75 % of the width (e.g. 1 so that slow motion 0…1 gets most of the graph). */
  xKnee?: number;
  /** y value drawn at 60 % of the height on a linear y axis (e.g. 1 for pitch). */
  yKnee?: number;
}

function parseSpec(v: unknown): CurveSpec | undefined {
  if (typeof v !== 'object' || v === null) return undefined;
  const s = v as { interpolation?: unknown; keys?: unknown };
  if (!curveInterpolations.includes(s.interpolation as never) || !Array.isArray(s.keys) || s.keys.length === 0) return undefined;
  const keys: CurveKey[] = [];
  for (const k of s.keys) {
    if (typeof k !== 'object' || k === null || !Number.isFinite((k as CurveKey).x) || !Number.isFinite((k as CurveKey).y)) return undefined;
    keys.push({ x: (k as CurveKey).x, y: (k as CurveKey).y });
  }
  for (let i = 1; i < keys.length; i++) if (!(keys[i].x > keys[i - 1].x)) return undefined;
  return freezeCurve({ interpolation: s.interpolation as CurveSpec['interpolation'], keys });
}

function parseScale(v: unknown): 'linear' | 'log' | undefined {
  return v === 'linear' || v === 'log' ? v : undefined;
}

function rangeOf(p: CurveBladeParams): CurveRange | null {
  const r: CurveRange = {
    xMin: p.xMin ?? 0,
    xMax: p.xMax ?? 1,
    yMin: p.yMin ?? 0,
    yMax: p.yMax ?? 1,
    yScale: p.yScale ?? 'linear',
    xKnee: p.xKnee,
    yKnee: p.yKnee,
  };
  if (!(r.xMax > r.xMin) || !(r.yMax > r.yMin) || (r.yScale === 'log' && !(r.yMin > 0))) return null;
  return Object.freeze(r);
}

/** The blade plugin; register it through curveBladeBundle. */
export const CurveBladePlugin: BladePlugin<CurveBladeParams> = createPlugin<BladePlugin<CurveBladeParams>>({
  id: 'ralenti-curve',
  type: 'blade',
  accept(params) {
    const result = parseRecord<CurveBladeParams>(params, (p) => ({
      view: p.required.constant('curve'),
      value: p.required.custom(parseSpec),
      label: p.optional.string,
      title: p.optional.string,
      unit: p.optional.string,
      xMin: p.optional.number,
      xMax: p.optional.number,
      yMin: p.optional.number,
      yMax: p.optional.number,
      yScale: p.optional.custom(parseScale),
      xKnee: p.optional.number,
      yKnee: p.optional.number,
    }));
    if (!result || !rangeOf(result)) return null;
    return { params: result };
  },
  controller(args) {
    const range = rangeOf(args.params) as CurveRange;
    const value = createValue<CurveSpec>(args.params.value, { equals: curveEquals });
    const vc = new CurveController(args.document, {
      value,
      viewProps: args.viewProps,
      range,
      title: args.params.title,
      unit: args.params.unit,
    });
    return new LabeledValueBladeController<CurveSpec, CurveController>(args.document, {
      blade: args.blade,
      props: ValueMap.fromObject<{ label: string | null | undefined }>({ label: args.params.label }),
      value,
      valueController: vc,
    });
  },
  api(args) {
    if (!(args.controller instanceof LabeledValueBladeController)) return null;
    if (!(args.controller.valueController instanceof CurveController)) return null;
    return new CurveBladeApi(args.controller as LabeledValueBladeController<CurveSpec, CurveController>);
  },
});

/** Anything blades are added to (a pane, folder or tab page). */
export interface BladeParent {
  addBlade(params: BaseBladeParams): BladeApi;
}

/** Adds a curve blade to `parent` and returns its API; throws unless curveBladeBundle is registered on the pane. */
export function addCurveBlade(parent: BladeParent, params: CurveBladeParams): CurveBladeApi {
  const blade = parent.addBlade(params);
  if (!(blade instanceof CurveBladeApi)) throw new Error('addCurveBlade: the curve blade plugin is not registered on this pane (curveBladeBundle)');
  return blade;
}

/** Bundle for Pane.registerPlugin: the curve blade and its CSS. */
export const curveBladeBundle: TpPluginBundle = { id: 'ralenti-curve', css: curveBladeCss, plugins: [CurveBladePlugin] };
