// @vitest-environment jsdom
// The curve blade plugin in a jsdom document: params parsing, keyboard editing, fields, buttons and the live marker.
import { describe, expect, it } from 'vitest';
import { createBladeController, LabeledValueBladeController, type PluginPool } from '@tweakpane/core';
import { CurveBladeApi, CurveBladePlugin, CurveController } from '../../editor/curve-blade';
import type { CurveSpec } from '../../src';

const value: CurveSpec = { interpolation: 'linear', keys: [{ x: 0, y: 0 }, { x: 1, y: 1 }, { x: 4, y: 4 }] };
const params = { view: 'curve', value, title: 'pitch', xMin: 0, xMax: 4, yMin: 0, yMax: 4 };

function make(extra: Record<string, unknown> = {}) {
  const bc = createBladeController(CurveBladePlugin, { document, params: { ...params, ...extra } });
  if (!(bc instanceof LabeledValueBladeController)) throw new Error('no controller');
  const api = CurveBladePlugin.api({ controller: bc, pool: {} as PluginPool }) as CurveBladeApi;
  document.body.appendChild(bc.view.element);
  return { bc, vc: bc.valueController as CurveController, api };
}

function key(el: Element, k: string, opts: KeyboardEventInit = {}) {
  el.dispatchEvent(new KeyboardEvent('keydown', { key: k, bubbles: true, cancelable: true, ...opts }));
}

describe('curve blade plugin', () => {
  it.each([
    ['another view', { view: 'slider' }],
    ['no keys', { value: { interpolation: 'linear', keys: [] } }],
    ['keys out of order', { value: { interpolation: 'linear', keys: [{ x: 1, y: 0 }, { x: 0, y: 1 }] } }],
    ['an unknown interpolation', { value: { interpolation: 'cubic', keys: [{ x: 0, y: 0 }] } }],
    ['an empty x range', { xMin: 2, xMax: 2 }],
    ['a log y axis through zero', { yScale: 'log', yMin: 0 }],
  ])('rejects params with %s', (_name, extra) => {
    expect(createBladeController(CurveBladePlugin, { document, params: { ...params, ...extra } })).toBeNull();
  });

  it('accepts a curve and draws one circle per key with the first key selected', () => {
    const { bc, api } = make();
    const circles = bc.view.element.querySelectorAll('circle[data-index]');
    expect(circles.length).toBe(3);
    expect(api.selectedIndex).toBe(0);
    expect(bc.view.element.querySelector('path')?.getAttribute('d')).toMatch(/^M/);
  });

  it('moves the selected key with arrow keys and selects keys with [ and ]', () => {
    const { vc, api } = make();
    const changes: { last: boolean; y: number }[] = [];
    api.on('change', (ev) => changes.push({ last: ev.last, y: ev.value.keys[1].y }));
    const g = vc.view.graphElement;
    key(g, ']');
    expect(api.selectedIndex).toBe(1);
    key(g, 'ArrowDown');
    expect(api.value.keys[1].y).toBeCloseTo(1 - 0.04, 12);
    key(g, 'ArrowUp', { shiftKey: true });
    expect(api.value.keys[1].y).toBeCloseTo(1 - 0.04 + 0.4, 12);
    key(g, '[');
    expect(api.selectedIndex).toBe(0);
    expect(changes).toEqual([
      { last: true, y: expect.closeTo(0.96, 12) },
      { last: true, y: expect.closeTo(1.36, 12) },
    ]);
  });

  it('adds and removes keys from the keyboard and the buttons', () => {
    const { vc, api } = make();
    key(vc.view.graphElement, '+');
    expect(api.value.keys.map((k) => k.x)).toEqual([0, 0.5, 1, 4]);
    expect(api.selectedIndex).toBe(1);
    // A key added on the curve keeps the curve's shape: y = 0.5 on the straight line.
    expect(api.value.keys[1].y).toBeCloseTo(0.5, 12);
    vc.view.removeButton.click();
    expect(api.value.keys.map((k) => k.x)).toEqual([0, 1, 4]);
    key(vc.view.graphElement, 'Delete');
    key(vc.view.graphElement, 'Delete');
    expect(api.value.keys.length).toBe(1);
    expect(vc.view.removeButton.disabled).toBe(true);
    vc.view.addButton.click();
    expect(api.value.keys.length).toBe(2);
  });

  it('edits the selected key through its numeric fields and ignores text that is not a number', () => {
    const { vc, api } = make();
    api.selectedIndex = 1;
    vc.view.yInput.value = '0.5';
    vc.view.yInput.dispatchEvent(new Event('change'));
    expect(api.value.keys[1]).toEqual({ x: 1, y: 0.5 });
    vc.view.xInput.value = 'fast';
    vc.view.xInput.dispatchEvent(new Event('change'));
    expect(api.value.keys[1]).toEqual({ x: 1, y: 0.5 });
    expect(vc.view.xInput.value).toBe('1');
  });

  it('switches interpolation from its menu', () => {
    const { vc, api } = make();
    vc.view.interpolationElement.value = 'monotone';
    vc.view.interpolationElement.dispatchEvent(new Event('change'));
    expect(api.value.interpolation).toBe('monotone');
  });

  it('places the live marker at the time scale on the curve, and hides it for null', () => {
    const { vc, api } = make();
    const line = vc.view.element.querySelector('line.tp-rlcurvev_mk') as SVGLineElement;
    api.marker = 0.35;
    expect(line.getAttribute('data-x')).toBe('0.35');
    const dot = vc.view.element.querySelector('circle.tp-rlcurvev_mkd') as SVGCircleElement;
    const p = vc.view.valueToPoint(0.35, 0.35);
    expect(Number(dot.getAttribute('cy'))).toBeCloseTo(p.py, 1);
    api.marker = null;
    expect(line.style.display).toBe('none');
  });

  it('replaces its value through the API and keeps it frozen', () => {
    const { api } = make();
    api.value = { interpolation: 'monotone', keys: [{ x: 0, y: 2 }] };
    expect(api.value.keys).toEqual([{ x: 0, y: 2 }]);
    expect(Object.isFrozen(api.value.keys[0])).toBe(true);
    expect(api.selectedIndex).toBe(0);
  });
});
