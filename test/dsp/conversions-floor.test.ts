// The floored level conversions: 20·log10 and 10^(dB/20) (the definition of the decibel for amplitude ratios;
// common practice) with a −120 dB floor that reads as exact silence.
import { describe, expect, it } from 'vitest';
import { DB_FLOOR, dbToGainFloor, gainToDbFloor } from '../../src/dsp';

describe('floored dB conversions', () => {
  it.each([
    [1, 0],
    [0.5, 20 * Math.log10(0.5)],
    [2e-6, 20 * Math.log10(2e-6)],
    [1e-6, -120],
    [0, -120],
    [NaN, -120],
  ])('gain %s reads as %s dB', (g, db) => {
    expect(gainToDbFloor(g)).toBeCloseTo(db, 12);
  });

  it.each([
    [0, 1],
    [-6, Math.pow(10, -6 / 20)],
    [-119.98, Math.pow(10, -119.98 / 20)],
    [-119.995, 0],
    [DB_FLOOR, 0],
    [-200, 0],
  ])('%s dB reads as gain %s', (db, g) => {
    expect(dbToGainFloor(db)).toBe(g);
  });
});
