import { describe, expect, it } from 'vitest';
import { centsBetween, pitchErrorStats, quantileSorted } from '../../src/analysis';

describe('centsBetween', () => {
  it.each([
    // 1200 cents per octave, 100 per equal-tempered semitone (definition of the cent, A. J. Ellis 1885 — from memory).
    { from: 440, to: 880, cents: 1200 },
    { from: 440, to: 220, cents: -1200 },
    { from: 440, to: 440 * 2 ** (1 / 12), cents: 100 },
    { from: 1000, to: 1000 * 1.0028923, cents: 5 }, // docs/references.md §10: 5 cents = ratio 1.0028923 (COMPUTED).
  ])('gives $cents cents from $from Hz to $to Hz', ({ from, to, cents }) => {
    expect(centsBetween(from, to)).toBeCloseTo(cents, 4);
  });

  it.each([NaN, 0, -5, Infinity])('is NaN when a frequency is %s', (bad) => {
    expect(centsBetween(440, bad)).toBeNaN();
    expect(centsBetween(bad, 440)).toBeNaN();
  });
});

describe('quantileSorted', () => {
  it.each([
    // Hyndman & Fan 1996 definition 7 (linear between order statistics; R's and NumPy's default), worked by hand:
    { values: [1, 2, 3, 4], p: 0.5, q: 2.5 },
    { values: [1, 2, 3, 4], p: 0.95, q: 3.85 }, // h = 3·0.95 = 2.85 → 3 + 0.85·(4 − 3)
    { values: [10, 20, 30, 40, 50], p: 0.25, q: 20 },
    { values: [7], p: 0.95, q: 7 },
    { values: [0, 100], p: 1, q: 100 },
  ])('gives $q for p = $p of $values', ({ values, p, q }) => {
    expect(quantileSorted(values, p)).toBeCloseTo(q, 12);
  });

  it('is NaN for an empty list', () => {
    expect(quantileSorted([], 0.5)).toBeNaN();
  });
});

describe('pitchErrorStats', () => {
  const up = (cents: number) => 100 * 2 ** (cents / 1200);

  it('summarises absolute errors and excludes frames where either series is missing', () => {
    const expected = [100, 100, 100, 100, 100, NaN, 100, 100];
    const measured = [up(1), up(-2), up(3), up(-4), up(10), up(0), NaN, 0];
    const stats = pitchErrorStats(expected, measured);
    expect(stats.count).toBe(5);
    expect(stats.excluded).toBe(3);
    // |errors| sorted: 1, 2, 3, 4, 10 → median 3; p95: h = 4·0.95 = 3.8 → 4 + 0.8·6 = 8.8; max 10.
    expect(stats.medianCents).toBeCloseTo(3, 9);
    expect(stats.p95Cents).toBeCloseTo(8.8, 9);
    expect(stats.maxCents).toBeCloseTo(10, 9);
    expect(stats.meanSignedCents).toBeCloseTo((1 - 2 + 3 - 4 + 10) / 5, 9);
  });

  it('returns NaN statistics and counts every frame as excluded when nothing overlaps', () => {
    const stats = pitchErrorStats(new Float64Array([NaN, 100]), new Float64Array([100, NaN]));
    expect(stats.count).toBe(0);
    expect(stats.excluded).toBe(2);
    expect(stats.medianCents).toBeNaN();
    expect(stats.maxCents).toBeNaN();
  });

  it('rejects series of different lengths', () => {
    expect(() => pitchErrorStats([1, 2], [1])).toThrow(RangeError);
  });
});
