// Edits of the curve blade's model keep a valid curve: sorted keys, at least one key, values inside the range.
import { describe, expect, it } from 'vitest';
import { addKey, curveEquals, freezeCurve, fromUnitX, fromUnitY, toUnitX, insertionPoint, moveKey, removeKey, toUnitY, withInterpolation, type CurveRange } from '../../editor/curve-blade';
import type { CurveSpec } from '../../src';
import { kneeCompression } from '../../editor/curve-blade/curve-model';

const range: CurveRange = { xMin: 0, xMax: 4, yMin: 0, yMax: 4, yScale: 'linear' };
const spec: CurveSpec = freezeCurve({ interpolation: 'linear', keys: [{ x: 0, y: 0 }, { x: 1, y: 1 }, { x: 4, y: 4 }] });

describe('curve model', () => {
  it.each([
    ['inside its neighbours', 1, 2, 0.5, { x: 2, y: 0.5 }],
    ['past the next key (clamped one gap before it)', 1, 9, 1, { x: 4 - 0.02, y: 1 }],
    ['before the previous key (clamped one gap after it)', 1, -3, 1, { x: 0.02, y: 1 }],
    ['above the range (y clamped)', 1, 1, 99, { x: 1, y: 4 }],
    ['first key below the range', 0, -1, -1, { x: 0, y: 0 }],
  ])('moves a key %s', (_name, index, x, y, expected) => {
    const next = moveKey(spec, index, x, y, range);
    expect(next.keys[index].x).toBeCloseTo(expected.x, 12);
    expect(next.keys[index].y).toBeCloseTo(expected.y, 12);
    for (let i = 1; i < next.keys.length; i++) expect(next.keys[i].x).toBeGreaterThan(next.keys[i - 1].x);
  });

  it('returns the very same spec for a no-op move, so no change is emitted', () => {
    expect(moveKey(spec, 1, 1, 1, range)).toBe(spec);
  });

  it('adds a key in x order and refuses one on top of an existing key', () => {
    const r = addKey(spec, 2.5, 3, range);
    expect(r.index).toBe(2);
    expect(r.spec.keys.map((k) => k.x)).toEqual([0, 1, 2.5, 4]);
    expect(addKey(spec, 1.001, 3, range)).toEqual({ spec, index: -1 });
  });

  it('removes a key but never the last one', () => {
    expect(removeKey(spec, 1).keys.map((k) => k.x)).toEqual([0, 4]);
    const single = freezeCurve({ interpolation: 'linear', keys: [{ x: 0, y: 1 }] });
    expect(removeKey(single, 0)).toBe(single);
  });

  it('switches interpolation without touching keys and compares by value', () => {
    const m = withInterpolation(spec, 'monotone');
    expect(m.interpolation).toBe('monotone');
    expect(m.keys).toEqual(spec.keys);
    expect(curveEquals(m, spec)).toBe(false);
    expect(curveEquals(withInterpolation(m, 'linear'), spec)).toBe(true);
  });

  it('puts a new key halfway to the next key', () => {
    expect(insertionPoint(spec, 1, range)).toBe(2.5);
    expect(insertionPoint(spec, 0, range)).toBe(0.5);
  });

  it.each([
    [20, 0],
    [20000, 1],
    [632.455532, 0.5],
  ])('maps %f Hz to %f on a 20 Hz…20 kHz log axis and back', (hz, u) => {
    const log: CurveRange = { xMin: 0, xMax: 1, yMin: 20, yMax: 20000, yScale: 'log' };
    expect(toUnitY(hz, log)).toBeCloseTo(u, 6);
    expect(fromUnitY(u, log)).toBeCloseTo(hz, 3);
  });
});

describe('curve x axis with a knee', () => {
  const knee: CurveRange = { xMin: 0, xMax: 4, yMin: 0, yMax: 4, yScale: 'linear', xKnee: 1 };
  it.each([
    [0, 0],
    [0.5, 0.375],
    [1, 0.75],
    [2.5, 0.875],
    [4, 1],
  ])('draws time scale %f at %f of the width and maps back', (x, u) => {
    expect(toUnitX(x, knee)).toBeCloseTo(u, 12);
    expect(fromUnitX(u, knee)).toBeCloseTo(x, 12);
  });
});

describe('curve y axis with a knee', () => {
  const knee: CurveRange = { xMin: 0, xMax: 4, yMin: 0, yMax: 4, yScale: 'linear', yKnee: 1 };
  it.each([
    [0, 0],
    [0.5, 0.3],
    [1, 0.6],
    [2.5, 0.8],
    [4, 1],
  ])('draws pitch %f at %f of the height and maps back', (y, u) => {
    expect(toUnitY(y, knee)).toBeCloseTo(u, 12);
    expect(fromUnitY(u, knee)).toBeCloseTo(y, 12);
  });
});

describe('kneeCompression', () => {
  it.each([
    // x: 0…1 on 75 % of the width, 1…4 on 25 %: (0.75 / 1) / (0.25 / 3) = 9.
    [0, 4, 1, 0.75, 9],
    // y: 0…1 on 60 % of the height, 1…4 on 40 %: (0.6 / 1) / (0.4 / 3) = 4.5.
    [0, 4, 1, 0.6, 4.5],
    [0, 4, undefined, 0.75, 1],
    [0, 1, 1, 0.75, 1],
  ])('min %s max %s knee %s share %s draws the far side %s× tighter', (min, max, knee, share, want) => {
    expect(kneeCompression(min, max, knee, share)).toBeCloseTo(want, 12);
  });
});
