// The curve blade's controller: turns pointer, keyboard and field input into edits of the curve value.
import { PointerHandler, createValue, type PointerHandlerEvent, type Value, type ValueController, type ViewProps } from '@tweakpane/core';
import { Curve } from '../../src/dilation';
import type { CurveInterpolation, CurveSpec } from '../../src';
import { addKey, clampY, fromUnitX, fromUnitY, insertionPoint, moveKey, removeKey, toUnitX, toUnitY, withInterpolation, type CurveRange } from './curve-model';
import { CurveView, PICK_RADIUS, type CurveViewState } from './curve-view';

/** Construction options of the controller. */
export interface CurveControllerConfig {
  value: Value<CurveSpec>;
  viewProps: ViewProps;
  range: CurveRange;
  title?: string;
  unit?: string;
}

const last = Object.freeze({ forceEmit: true, last: true });
const dragging = Object.freeze({ forceEmit: false, last: false });

/** Value controller of the curve blade (tweakpane's ValueController contract). */
export class CurveController implements ValueController<CurveSpec, CurveView> {
  readonly value: Value<CurveSpec>;
  readonly view: CurveView;
  readonly viewProps: ViewProps;
  /** Index of the selected key (−1 = none). */
  readonly selected: Value<number>;
  /** Live marker position on the x axis (the current time scale), or null for none. */
  readonly marker: Value<number | null>;
  private readonly range: CurveRange;
  private curve: Curve;
  private dragIndex = -1;

  constructor(doc: Document, config: CurveControllerConfig) {
    this.value = config.value;
    this.viewProps = config.viewProps;
    this.range = config.range;
    this.selected = createValue(config.value.rawValue.keys.length > 0 ? 0 : -1);
    this.marker = createValue<number | null>(null);
    this.curve = new Curve(this.value.rawValue);
    this.view = new CurveView(doc, { range: config.range, title: config.title, unit: config.unit ?? '', viewProps: config.viewProps });

    this.value.emitter.on('change', () => {
      this.curve = new Curve(this.value.rawValue);
      if (this.selected.rawValue >= this.value.rawValue.keys.length) this.selected.rawValue = this.value.rawValue.keys.length - 1;
      this.redraw();
    });
    this.selected.emitter.on('change', () => this.redraw());
    this.marker.emitter.on('change', () => this.view.updateMarker(this.state()));

    // PointerHandler is typed for HTMLElement but uses only Element members (bounds, events, ownerDocument): an SVG graph works.
    const ph = new PointerHandler(this.view.graphElement as unknown as HTMLElement);
    ph.emitter.on('down', (ev) => this.onPointerDown(ev));
    ph.emitter.on('move', (ev) => this.onPointerMove(ev));
    ph.emitter.on('up', (ev) => this.onPointerUp(ev));
    this.view.graphElement.addEventListener('dblclick', (ev) => this.onDoubleClick(ev));
    this.view.graphElement.addEventListener('keydown', (ev) => this.onKeyDown(ev));
    this.view.interpolationElement.addEventListener('change', () => {
      this.value.setRawValue(withInterpolation(this.value.rawValue, this.view.interpolationElement.value as CurveInterpolation), last);
    });
    for (const [input, axis] of [[this.view.xInput, 'x'], [this.view.yInput, 'y']] as const) {
      input.addEventListener('change', () => this.onFieldChange(input, axis));
      input.addEventListener('keydown', (ev) => {
        ev.stopPropagation();
        if (ev.key === 'Enter') this.onFieldChange(input, axis);
      });
    }
    this.view.addButton.addEventListener('click', () => this.addAfterSelected());
    this.view.removeButton.addEventListener('click', () => this.removeSelected());
    const RO = (doc.defaultView as (Window & typeof globalThis) | null)?.ResizeObserver;
    if (RO) {
      const ro = new RO(() => this.redraw());
      ro.observe(this.view.graphElement);
      this.viewProps.handleDispose(() => ro.disconnect());
    }
    this.redraw();
  }

  /** Evaluates the current curve at x (the shared src/dilation Curve). */
  evaluate(x: number): number {
    return this.curve.evaluate(x);
  }

  /** Selects the key at `index` (clamped; −1 clears). */
  select(index: number): void {
    const n = this.value.rawValue.keys.length;
    this.selected.rawValue = n === 0 ? -1 : Math.max(-1, Math.min(n - 1, index));
  }

  /** Adds a key halfway to the next one and selects it. */
  addAfterSelected(): void {
    const spec = this.value.rawValue;
    const x = insertionPoint(spec, Math.max(0, this.selected.rawValue), this.range);
    const r = addKey(spec, x, this.curve.evaluate(x), this.range);
    if (r.index < 0) return;
    this.value.setRawValue(r.spec, last);
    this.select(r.index);
  }

  /** Removes the selected key (a curve keeps at least one). */
  removeSelected(): void {
    const i = this.selected.rawValue;
    const next = removeKey(this.value.rawValue, i);
    if (next === this.value.rawValue) return;
    this.value.setRawValue(next, last);
    this.select(Math.min(i, next.keys.length - 1));
  }

  private state(): CurveViewState {
    return { spec: this.value.rawValue, selected: this.selected.rawValue, marker: this.marker.rawValue, evaluate: (x) => this.curve.evaluate(x) };
  }

  private redraw(): void {
    this.view.update(this.state());
  }

  private pick(px: number, py: number): number {
    let best = -1;
    let bestD = PICK_RADIUS;
    this.value.rawValue.keys.forEach((k, i) => {
      const p = this.view.valueToPoint(k.x, k.y);
      const d = Math.hypot(p.px - px, p.py - py);
      if (d <= bestD) (best = i), (bestD = d);
    });
    return best;
  }

  private onPointerDown(ev: PointerHandlerEvent): void {
    const pt = ev.data.point;
    if (!pt) return;
    const hit = this.pick(pt.x, pt.y);
    if (hit >= 0) {
      this.select(hit);
      this.dragIndex = hit;
      return;
    }
    if (ev.shiftKey) {
      const v = this.view.pointToValue(pt.x, pt.y, ev.data.bounds.width);
      const r = addKey(this.value.rawValue, v.x, v.y, this.range);
      if (r.index >= 0) {
        this.value.setRawValue(r.spec, last);
        this.select(r.index);
        this.dragIndex = r.index;
      }
    }
  }

  private onPointerMove(ev: PointerHandlerEvent): void {
    const pt = ev.data.point;
    if (this.dragIndex < 0 || !pt) return;
    const v = this.view.pointToValue(pt.x, pt.y, ev.data.bounds.width);
    this.value.setRawValue(moveKey(this.value.rawValue, this.dragIndex, v.x, v.y, this.range), dragging);
  }

  private onPointerUp(_ev: PointerHandlerEvent): void {
    if (this.dragIndex < 0) return;
    this.dragIndex = -1;
    this.value.setRawValue(this.value.rawValue, last);
  }

  private onDoubleClick(ev: MouseEvent): void {
    const rect = this.view.graphElement.getBoundingClientRect();
    const px = ev.clientX - rect.left;
    const py = ev.clientY - rect.top;
    const hit = this.pick(px, py);
    if (hit >= 0) {
      this.select(hit);
      this.removeSelected();
      return;
    }
    const v = this.view.pointToValue(px, py, rect.width);
    const r = addKey(this.value.rawValue, v.x, v.y, this.range);
    if (r.index >= 0) {
      this.value.setRawValue(r.spec, last);
      this.select(r.index);
    }
  }

  private onKeyDown(ev: KeyboardEvent): void {
    const spec = this.value.rawValue;
    const i = this.selected.rawValue;
    const key = spec.keys[i];
    const fine = ev.altKey ? 0.1 : ev.shiftKey ? 10 : 1;
    const dx = 0.01 * fine;
    const dy = 0.01 * fine;
    let handled = true;
    switch (ev.key) {
      case 'ArrowLeft':
      case 'ArrowRight':
        if (key) {
          const u = toUnitX(key.x, this.range) + (ev.key === 'ArrowRight' ? dx : -dx);
          this.value.setRawValue(moveKey(spec, i, fromUnitX(u, this.range), key.y, this.range), last);
        }
        break;
      case 'ArrowUp':
      case 'ArrowDown':
        if (key) {
          const u = toUnitY(key.y, this.range) + (ev.key === 'ArrowUp' ? dy : -dy);
          this.value.setRawValue(moveKey(spec, i, key.x, clampY(fromUnitY(u, this.range), this.range), this.range), last);
        }
        break;
      case '[':
        this.select(i - 1 < 0 ? spec.keys.length - 1 : i - 1);
        break;
      case ']':
        this.select((i + 1) % spec.keys.length);
        break;
      case 'Home':
        this.select(0);
        break;
      case 'End':
        this.select(spec.keys.length - 1);
        break;
      case '+':
      case '=':
      case 'Insert':
        this.addAfterSelected();
        break;
      case 'Delete':
      case 'Backspace':
      case '-':
        this.removeSelected();
        break;
      default:
        handled = false;
    }
    if (handled) {
      ev.preventDefault();
      ev.stopPropagation();
    }
  }

  private onFieldChange(input: HTMLInputElement, axis: 'x' | 'y'): void {
    const i = this.selected.rawValue;
    const key = this.value.rawValue.keys[i];
    const n = Number(input.value.trim().replace(',', '.'));
    if (!key || input.value.trim() === '' || !Number.isFinite(n)) {
      this.redraw();
      return;
    }
    const next = moveKey(this.value.rawValue, i, axis === 'x' ? n : key.x, axis === 'y' ? n : key.y, this.range);
    input.blur?.();
    if (next !== this.value.rawValue) this.value.setRawValue(next, last);
    else this.redraw();
  }
}
