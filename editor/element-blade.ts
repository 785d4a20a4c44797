// A minimal blade that hosts an element the editor draws itself (readout tables, canvases, error lists).
import { BladeApi, BladeController, createPlugin, parseRecord, type BaseBladeParams, type BladePlugin, type TpPluginBundle } from '@tweakpane/core';

/** Params of pane.addBlade({ view: 'ralenti-element', element }). */
export interface ElementBladeParams extends BaseBladeParams {
  view: 'ralenti-element';
  element: HTMLElement;
}

/** Controller of the element blade (its own class, so that api() recognises only its own blades). */
export class ElementBladeController extends BladeController {}

function asElement(v: unknown): HTMLElement | undefined {
  return typeof v === 'object' && v !== null && (v as Node).nodeType === 1 ? (v as HTMLElement) : undefined;
}

/** Blade plugin that shows `element` full width inside a folder. */
export const ElementBladePlugin: BladePlugin<ElementBladeParams> = createPlugin<BladePlugin<ElementBladeParams>>({
  id: 'ralenti-element',
  type: 'blade',
  accept(params) {
    const r = parseRecord<ElementBladeParams>(params, (p) => ({
      view: p.required.constant('ralenti-element'),
      element: p.required.custom(asElement),
    }));
    return r ? { params: r } : null;
  },
  controller(args) {
    const wrap = args.document.createElement('div');
    wrap.className = 'rl-elblade';
    wrap.appendChild(args.params.element);
    args.viewProps.bindClassModifiers(wrap);
    return new ElementBladeController({ blade: args.blade, view: { element: wrap }, viewProps: args.viewProps });
  },
  api(args) {
    return args.controller instanceof ElementBladeController ? new BladeApi(args.controller) : null;
  },
});

/** Bundle for Pane.registerPlugin. */
export const elementBladeBundle: TpPluginBundle = {
  id: 'ralenti-element',
  css: '.rl-elblade { padding: 2px var(--cnt-hp, 4px); }',
  plugins: [ElementBladePlugin],
};
