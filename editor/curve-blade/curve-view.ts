// The curve blade's view: an SVG graph (grid, curve, keys, live marker) and a row of fields for the selected key.
import { ClassName, SVG_NS, type ViewProps, type View } from '@tweakpane/core';
import type { CurveSpec } from '../../src';
import { curveInterpolations, fromUnitX, fromUnitY, kneeCompression, toUnitX, toUnitY, type CurveRange } from './curve-model';

const cn = ClassName('rlcurve');

/** Default graph size in CSS pixels (the width follows the panel). */
export const GRAPH_HEIGHT = 118;
const FALLBACK_WIDTH = 236;
const PAD = Object.freeze({ left: 40, right: 7, top: 7, bottom: 16 });
/** Pointer distance in pixels within which a key is picked. */
export const PICK_RADIUS = 9;

/** Everything the view draws from; the controller passes it to update(). */
export interface CurveViewState {
  spec: CurveSpec;
  selected: number;
  marker: number | null;
  evaluate: (x: number) => number;
}

/** Construction options of the view. */
export interface CurveViewConfig {
  range: CurveRange;
  title: string | undefined;
  unit: string;
  viewProps: ViewProps;
}

/** Plain-DOM view; knows layout and drawing only, never edits the value. */
export class CurveView implements View {
  readonly element: HTMLElement;
  /** The focusable graph (pointer and keyboard input). */
  readonly graphElement: SVGSVGElement;
  readonly interpolationElement: HTMLSelectElement;
  readonly xInput: HTMLInputElement;
  readonly yInput: HTMLInputElement;
  readonly addButton: HTMLButtonElement;
  readonly removeButton: HTMLButtonElement;
  private readonly doc: Document;
  private readonly range: CurveRange;
  private readonly unit: string;
  private readonly gridGroup: SVGGElement;
  private readonly pathElement: SVGPathElement;
  private readonly markerLine: SVGLineElement;
  private readonly markerDot: SVGCircleElement;
  private readonly keysGroup: SVGGElement;
  private width = FALLBACK_WIDTH;

  constructor(doc: Document, config: CurveViewConfig) {
    this.doc = doc;
    this.range = config.range;
    this.unit = config.unit;
    this.element = doc.createElement('div');
    this.element.classList.add(cn());
    config.viewProps.bindClassModifiers(this.element);

    if (config.title) {
      const title = doc.createElement('div');
      title.classList.add(cn('t'));
      title.textContent = config.title;
      this.element.appendChild(title);
    }

    this.graphElement = doc.createElementNS(SVG_NS, 'svg') as SVGSVGElement;
    this.graphElement.classList.add(cn('g'));
    this.graphElement.setAttribute('role', 'application');
    this.graphElement.setAttribute('aria-label', `${config.title ?? 'curve'}: arrows move the selected key, [ ] select, + adds, Delete removes`);
    config.viewProps.bindTabIndex(this.graphElement);
    this.gridGroup = this.svg('g', { class: cn('grid') });
    this.pathElement = this.svg('path', { class: cn('path') });
    this.markerLine = this.svg('line', { class: cn('mk') });
    this.markerDot = this.svg('circle', { class: cn('mkd'), r: '3' });
    this.keysGroup = this.svg('g', { class: cn('keys') });
    this.graphElement.append(this.gridGroup, this.pathElement, this.markerLine, this.markerDot, this.keysGroup);
    this.element.appendChild(this.graphElement);

    const row = doc.createElement('div');
    row.classList.add(cn('row'));
    this.interpolationElement = doc.createElement('select');
    this.interpolationElement.classList.add(cn('sel'));
    this.interpolationElement.title = 'interpolation between keys';
    for (const mode of curveInterpolations) {
      const opt = doc.createElement('option');
      opt.value = mode;
      opt.textContent = mode === 'monotone' ? 'smooth (monotone)' : 'straight';
      this.interpolationElement.appendChild(opt);
    }
    const r = this.range;
    this.xInput = this.field(`time scale of the selected key (${r.xMin}…${r.xMax})`);
    this.yInput = this.field(`value of the selected key (${this.unit ? `${this.unit}, ` : ''}${r.yMin}…${r.yMax})`);
    this.addButton = this.button('+', 'add a key after the selected one');
    this.removeButton = this.button('−', 'remove the selected key');
    row.append(this.interpolationElement, this.labelled('s', this.xInput), this.labelled(this.unit || 'y', this.yInput), this.addButton, this.removeButton);
    this.element.appendChild(row);
    config.viewProps.bindDisabled(this.interpolationElement);
  }

  /** Graph width in pixels as last laid out. */
  get graphWidth(): number {
    return this.width;
  }

  /** Converts an element-relative pointer position to curve coordinates. */
  pointToValue(px: number, py: number, width: number): { x: number; y: number } {
    const w = width > 0 ? width : this.width;
    const ux = (px - PAD.left) / (w - PAD.left - PAD.right);
    const uy = 1 - (py - PAD.top) / (GRAPH_HEIGHT - PAD.top - PAD.bottom);
    return { x: fromUnitX(ux, this.range), y: this.fromUnitYClamped(uy) };
  }

  /** Pixel position of a curve point in the graph. */
  valueToPoint(x: number, y: number): { px: number; py: number } {
    const w = this.width;
    return {
      px: PAD.left + toUnitX(x, this.range) * (w - PAD.left - PAD.right),
      py: PAD.top + (1 - Math.min(1, Math.max(0, toUnitY(y, this.range)))) * (GRAPH_HEIGHT - PAD.top - PAD.bottom),
    };
  }

  /** Redraws everything from `state`. */
  update(state: CurveViewState): void {
    const measured = this.graphElement.getBoundingClientRect?.().width ?? 0;
    this.width = measured > 0 ? measured : FALLBACK_WIDTH;
    this.graphElement.setAttribute('viewBox', `0 0 ${this.width} ${GRAPH_HEIGHT}`);
    this.graphElement.setAttribute('height', String(GRAPH_HEIGHT));
    this.drawGrid();
    const steps = 96;
    let d = '';
    for (let i = 0; i <= steps; i++) {
      const x = fromUnitX(i / steps, this.range);
      const p = this.valueToPoint(x, state.evaluate(x));
      d += `${i === 0 ? 'M' : 'L'}${p.px.toFixed(1)},${p.py.toFixed(1)}`;
    }
    this.pathElement.setAttribute('d', d);
    this.keysGroup.replaceChildren();
    state.spec.keys.forEach((k, i) => {
      const p = this.valueToPoint(k.x, k.y);
      const c = this.svg('circle', { class: i === state.selected ? `${cn('key')} ${cn('key', 'sel')}` : cn('key'), cx: p.px.toFixed(1), cy: p.py.toFixed(1), r: i === state.selected ? '5' : '4' });
      c.setAttribute('data-index', String(i));
      c.setAttribute('data-x', String(k.x));
      this.keysGroup.appendChild(c);
    });
    this.updateMarker(state);
    this.interpolationElement.value = state.spec.interpolation;
    const key = state.spec.keys[state.selected];
    this.setField(this.xInput, key ? formatNumber(key.x) : '');
    this.setField(this.yInput, key ? formatNumber(key.y) : '');
    this.xInput.disabled = this.yInput.disabled = this.removeButton.disabled = !key;
    if (key && state.spec.keys.length <= 1) this.removeButton.disabled = true;
  }

  /** Moves only the live marker (cheap; called every frame). */
  updateMarker(state: CurveViewState): void {
    const visible = state.marker !== null && Number.isFinite(state.marker);
    this.markerLine.style.display = this.markerDot.style.display = visible ? '' : 'none';
    if (!visible) return;
    const x = Math.min(this.range.xMax, Math.max(this.range.xMin, state.marker as number));
    const p = this.valueToPoint(x, state.evaluate(x));
    this.attrs(this.markerLine, { x1: p.px, x2: p.px, y1: PAD.top, y2: GRAPH_HEIGHT - PAD.bottom });
    this.attrs(this.markerDot, { cx: p.px, cy: p.py });
    this.markerLine.setAttribute('data-x', String(x));
  }

  private drawGrid(): void {
    this.gridGroup.replaceChildren();
    this.drawKnees();
    const r = this.range;
    const xTicks =
      r.xKnee !== undefined
        ? [0, 0.25, 0.5, 0.75, 1, 2, 3, 4].filter((v) => v >= r.xMin && v <= r.xMax)
        : [0, 0.25, 0.5, 0.75, 1].map((u) => fromUnitX(u, r));
    for (const x of xTicks) {
      const p = this.valueToPoint(x, r.yMin);
      this.gridGroup.appendChild(this.svg('line', { class: x === 1 ? `${cn('gl')} ${cn('gl', 'one')}` : cn('gl'), x1: p.px, x2: p.px, y1: PAD.top, y2: GRAPH_HEIGHT - PAD.bottom }));
      const t = this.svg('text', { class: cn('tx'), x: p.px, y: GRAPH_HEIGHT - 4, 'text-anchor': 'middle' });
      t.textContent = x === 0.25 || x === 0.75 ? '' : formatNumber(x);
      this.gridGroup.appendChild(t);
    }
    const yTicks =
      r.yScale === 'log'
        ? [100, 1000, 10000].filter((v) => v > r.yMin && v < r.yMax)
        : r.yKnee !== undefined
          ? [r.yKnee / 2, r.yKnee, (r.yKnee + r.yMax) / 2, r.yMax]
          : [0.5, 1].map((u) => r.yMin + u * (r.yMax - r.yMin)).concat(r.yMin < 0 && r.yMax > 0 ? [0] : []);
    for (const y of yTicks) {
      const p = this.valueToPoint(r.xMin, y);
      this.gridGroup.appendChild(this.svg('line', { class: cn('gl'), x1: PAD.left, x2: this.width - PAD.right, y1: p.py, y2: p.py }));
      const t = this.svg('text', { class: cn('tx'), x: PAD.left - 8, y: p.py + 3, 'text-anchor': 'end' });
      t.textContent = y >= 1000 ? `${y / 1000}k` : formatNumber(y);
      this.gridGroup.appendChild(t);
    }
  }

  /** Shades the part of each axis beyond its knee and labels how much tighter it is drawn (a straight line bends there). */
  private drawKnees(): void {
    const r = this.range;
    const fx = kneeCompression(r.xMin, r.xMax, r.xKnee, 0.75);
    if (fx > 1 && r.xKnee !== undefined) {
      const a = this.valueToPoint(r.xKnee, r.yMax);
      const b = this.valueToPoint(r.xMax, r.yMin);
      this.gridGroup.appendChild(this.svg('rect', { class: cn('knee'), x: a.px, y: PAD.top, width: b.px - a.px, height: GRAPH_HEIGHT - PAD.top - PAD.bottom }));
      const t = this.svg('text', { class: `${cn('tx')} ${cn('kneetx')}`, x: (a.px + b.px) / 2, y: PAD.top + 9, 'text-anchor': 'middle', 'data-knee': 'x' });
      t.textContent = `x ${formatNumber(Math.round(fx * 10) / 10)}× tighter`;
      this.gridGroup.appendChild(t);
    }
    const fy = r.yScale === 'log' ? 1 : kneeCompression(r.yMin, r.yMax, r.yKnee, 0.6);
    if (fy > 1 && r.yKnee !== undefined) {
      const a = this.valueToPoint(r.xMin, r.yMax);
      const b = this.valueToPoint(r.xMin, r.yKnee);
      this.gridGroup.appendChild(this.svg('rect', { class: cn('knee'), x: PAD.left, y: a.py, width: this.width - PAD.left - PAD.right, height: b.py - a.py }));
      const t = this.svg('text', { class: `${cn('tx')} ${cn('kneetx')}`, x: PAD.left + 4, y: b.py - 3, 'text-anchor': 'start', 'data-knee': 'y' });
      t.textContent = `y above ${formatNumber(r.yKnee)}: ${formatNumber(Math.round(fy * 10) / 10)}× tighter`;
      this.gridGroup.appendChild(t);
    }
  }

  private fromUnitYClamped(u: number): number {
    return fromUnitY(Math.min(1, Math.max(0, u)), this.range);
  }

  private setField(input: HTMLInputElement, text: string): void {
    if (this.doc.activeElement !== input) input.value = text;
  }

  private field(title: string): HTMLInputElement {
    const input = this.doc.createElement('input');
    input.type = 'text';
    input.inputMode = 'decimal';
    input.classList.add(cn('num'));
    input.title = title;
    input.setAttribute('aria-label', title);
    return input;
  }

  private labelled(text: string, input: HTMLInputElement): HTMLLabelElement {
    const l = this.doc.createElement('label');
    l.classList.add(cn('fl'));
    const s = this.doc.createElement('span');
    s.textContent = text;
    l.append(s, input);
    return l;
  }

  private button(text: string, title: string): HTMLButtonElement {
    const b = this.doc.createElement('button');
    b.type = 'button';
    b.classList.add(cn('btn'));
    b.textContent = text;
    b.title = title;
    b.setAttribute('aria-label', title);
    return b;
  }

  private svg<K extends keyof SVGElementTagNameMap>(tag: K, attrs: Record<string, string | number | undefined>): SVGElementTagNameMap[K] {
    const el = this.doc.createElementNS(SVG_NS, tag) as SVGElementTagNameMap[K];
    this.attrs(el, attrs);
    return el;
  }

  private attrs(el: Element, attrs: Record<string, string | number | undefined>): void {
    for (const [k, v] of Object.entries(attrs)) if (v !== undefined) el.setAttribute(k, typeof v === 'number' ? v.toFixed(1) : v);
  }
}

/** Short, readable number text for fields and ticks. */
export function formatNumber(v: number): string {
  if (!Number.isFinite(v)) return '';
  const a = Math.abs(v);
  if (a >= 1000) return v.toFixed(0);
  if (a >= 10) return String(Math.round(v * 10) / 10);
  return String(Math.round(v * 1000) / 1000);
}
