import { describe, expect, it } from 'vitest';
import { speedOfSound } from '../../src/motion';

describe('speedOfSound', () => {
  // OpenStax University Physics Vol. 1 §17.3 "Speed of Sound": 331 m/s at 0 °C and 343 m/s at 20.0 °C
  // (docs/references.md §2, VERIFIED); tolerance ±0.5 m/s because the book's law uses 331 and 273 where ours uses 331.3 and 273.15.
  it.each([
    [0, 331],
    [20, 343],
  ])('gives the OpenStax value at %s °C within 0.5 m/s', (celsius, published) => {
    expect(Math.abs(speedOfSound(celsius) - published)).toBeLessThanOrEqual(0.5);
  });

  // docs/references.md §2 table, COMPUTED from 331.3·sqrt(1 + T/273.15): checks the closed form itself. That 331.3/273.15
  // refinement is labelled MEMORY there (not found in a textbook copy); the OpenStax test above is the published anchor.
  it.each([
    [-10, 325.18],
    [15, 340.28],
    [25, 346.13],
    [30, 349.02],
  ])('follows the ideal-gas square-root law at %s °C', (celsius, value) => {
    expect(speedOfSound(celsius)).toBeCloseTo(value, 2);
    expect(speedOfSound(celsius)).toBeCloseTo(331.3 * Math.sqrt(1 + celsius / 273.15), 9);
  });

  // docs/references.md §2 (COMPUTED claim): the linear form 331.3 + 0.606·T stays within 0.5 % over −30…+50 °C; the linear
  // form itself is labelled weak / MEMORY there (textbooks usually give 331 + 0.6·T).
  it('stays within 0.5 % of the linear textbook approximation over −30…50 °C', () => {
    for (let t = -30; t <= 50; t += 5) {
      const linear = 331.3 + 0.606 * t;
      expect(Math.abs(speedOfSound(t) - linear) / linear).toBeLessThan(0.005);
    }
  });

  it('returns 0 at absolute zero and below, and the 20 °C value for non-finite input', () => {
    expect(speedOfSound(-273.15)).toBe(0);
    expect(speedOfSound(-400)).toBe(0);
    expect(speedOfSound(Number.NaN)).toBe(speedOfSound(20));
    expect(speedOfSound(Infinity)).toBe(speedOfSound(20));
  });
});
