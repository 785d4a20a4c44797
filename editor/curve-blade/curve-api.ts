// Public API object of the curve blade, returned by pane.addBlade({ view: 'curve', ... }).
import { BladeApi, TpChangeEvent, type LabeledValueBladeController } from '@tweakpane/core';
import type { CurveSpec } from '../../src';
import type { CurveController } from './curve-controller';
import { freezeCurve } from './curve-model';

/** Events of the curve blade: 'change' fires while dragging (last = false) and on release (last = true). */
export interface CurveBladeEvents {
  change: TpChangeEvent<CurveSpec, CurveBladeApi>;
}

/** The curve blade's API: value, label, live marker and selection. */
export class CurveBladeApi extends BladeApi<LabeledValueBladeController<CurveSpec, CurveController>> {
  /** The curve (a frozen spec; assigning replaces it and emits 'change'). */
  get value(): CurveSpec {
    return this.controller.valueController.value.rawValue;
  }

  set value(spec: CurveSpec) {
    this.controller.valueController.value.rawValue = freezeCurve(spec);
  }

  /** Label shown beside the graph (undefined = full width). */
  get label(): string | null | undefined {
    return this.controller.labelController.props.get('label');
  }

  set label(label: string | null | undefined) {
    this.controller.labelController.props.set('label', label);
  }

  /** Live marker on the x axis (the current time scale), null to hide it. */
  get marker(): number | null {
    return this.controller.valueController.marker.rawValue;
  }

  set marker(x: number | null) {
    this.controller.valueController.marker.rawValue = x;
  }

  /** Index of the selected key (−1 = none). */
  get selectedIndex(): number {
    return this.controller.valueController.selected.rawValue;
  }

  set selectedIndex(index: number) {
    this.controller.valueController.select(index);
  }

  /** Subscribes to value changes. */
  on<K extends keyof CurveBladeEvents>(eventName: K, handler: (ev: CurveBladeEvents[K]) => void): this {
    const bound = handler.bind(this);
    this.controller.valueController.value.emitter.on(
      eventName,
      (ev) => bound(new TpChangeEvent(this, ev.rawValue, ev.options.last) as CurveBladeEvents[K]),
      { key: handler },
    );
    return this;
  }

  /** Removes a handler added with on(). */
  off<K extends keyof CurveBladeEvents>(eventName: K, handler: (ev: CurveBladeEvents[K]) => void): this {
    this.controller.valueController.value.emitter.off(eventName, handler);
    return this;
  }
}
