import { describe, expect, it } from 'vitest';
import { Curve, fritschCarlsonTangents } from '../../src/dilation';

// Akima (1970) data, a standard example for monotone interpolation (docs/references.md §8, VERIFIED).
const akima: [number, number][] = [
  [0, 10], [2, 10], [3, 10], [5, 10], [6, 10], [8, 10], [9, 10.5], [11, 15], [12, 50], [14, 60], [15, 85],
];
const spec = (interpolation: 'linear' | 'monotone', keys: [number, number][]) => ({ interpolation, keys: keys.map(([x, y]) => ({ x, y })) });

describe('Curve (Fritsch–Carlson monotone cubic)', () => {
  const curve = new Curve(spec('monotone', akima));

  // Fritsch & Carlson, SIAM J. Numer. Anal. 17(2), 1980: the interpolant must be monotone on monotone data and stay
  // within [y_k, y_{k+1}] on every interval (docs/references.md §8); a natural cubic spline undershoots to ≈ 4.61 here.
  it('is non-decreasing and stays inside each interval on Akima’s data', () => {
    let prev = -Infinity;
    for (let k = 0; k < akima.length - 1; k++) {
      const [x0, y0] = akima[k];
      const [x1, y1] = akima[k + 1];
      for (let i = 0; i <= 200; i++) {
        const y = curve.evaluate(x0 + ((x1 - x0) * i) / 200);
        expect(y).toBeGreaterThanOrEqual(Math.min(y0, y1) - 1e-12);
        expect(y).toBeLessThanOrEqual(Math.max(y0, y1) + 1e-12);
        expect(y).toBeGreaterThanOrEqual(prev - 1e-12);
        prev = y;
      }
    }
  });

  it('stays above 10 near x ≈ 10.15 where a natural cubic spline undershoots to 4.61', () => {
    expect(curve.evaluate(10.15)).toBeGreaterThanOrEqual(10.5);
  });

  // docs/references.md §8: our rule's tangents on Akima's data (COMPUTED — regression value only).
  it('computes the documented Fritsch–Carlson tangents on Akima’s data', () => {
    const expected = [0, 0, 0, 0, 0, 0, 0.49697, 6.73168, 12, 9, 25];
    const t = fritschCarlsonTangents(akima.map((k) => k[0]), akima.map((k) => k[1]), new Float64Array(akima.length));
    expected.forEach((m, i) => expect(t[i]).toBeCloseTo(m, 4));
  });

  it('passes through every key', () => {
    for (const [x, y] of akima) expect(curve.evaluate(x)).toBeCloseTo(y, 12);
  });

  // docs/references.md §8: linear data are reproduced exactly, e.g. (0,1),(1,3),(2,5): f(0.5) = 2.0, f(1.7) = 4.4.
  it.each([
    [0.5, 2.0],
    [1.7, 4.4],
    [1, 3],
  ])('reproduces linear data exactly at x = %s', (x, y) => {
    const lin = new Curve(spec('monotone', [[0, 1], [1, 3], [2, 5]]));
    expect(lin.evaluate(x)).toBeCloseTo(y, 12);
  });
});

describe('Curve (linear)', () => {
  const c = new Curve(spec('linear', [[0, 0], [0.5, 10], [1, 0]]));
  it.each([
    [0.25, 5],
    [0.5, 10],
    [0.75, 5],
  ])('interpolates straight lines: f(%s) = %s', (x, y) => expect(c.evaluate(x)).toBeCloseTo(y, 12));

  it.each([
    [-1, 0],
    [2, 0],
    [Number.NEGATIVE_INFINITY, 0],
    [Number.POSITIVE_INFINITY, 0],
    [Number.NaN, 0],
  ])('clamps outside the keys: f(%s) = %s', (x, y) => expect(c.evaluate(x)).toBe(y));

  it('is constant with a single key', () => {
    const one = new Curve(spec('monotone', [[0.3, 7]]));
    expect([one.evaluate(0), one.evaluate(0.3), one.evaluate(4)]).toEqual([7, 7, 7]);
  });
});

describe('Curve construction', () => {
  it.each([
    ['no keys', []],
    ['unsorted keys', [[1, 0], [0, 1]]],
    ['duplicate x', [[0, 0], [0, 1]]],
    ['keys closer than 1e-6', [[0, 0], [1e-9, 1]]],
    ['NaN y', [[0, Number.NaN]]],
  ] as [string, [number, number][]][])('rejects %s with a RangeError', (_n, keys) => {
    expect(() => new Curve(spec('linear', keys))).toThrow(RangeError);
  });
});
