import { describe, expect, it } from 'vitest';
import { azimuthDegrees, distanceGain, equalPowerFromSine, equalPowerGains } from '../../src/dilation';

describe('distanceGain (Web Audio API PannerNode distance models)', () => {
  // W3C Web Audio API, PannerNode distance models; check values COMPUTED from the spec formulas (docs/references.md §5), 1e-12.
  it.each([
    ['linear', 5, 1, 10000, 1, 0.99959996],
    ['linear', 5000.5, 1, 10000, 1, 0.5],
    ['linear', 20, 1, 10, 1, 0],
    ['inverse', 10, 1, 10000, 1, 0.1],
    ['inverse', 2, 1, 10000, 1, 0.5],
    ['inverse', 0.5, 1, 10000, 1, 1],
    ['exponential', 10, 1, 10000, 1, 0.1],
    ['exponential', 10, 1, 10000, 2, 0.01],
    ['exponential', 4, 2, 10000, 0.5, 0.70710678],
  ] as const)('%s model at d = %s (ref %s, max %s, rolloff %s) gives %s', (model, d, ref, max, f, expected) => {
    expect(distanceGain(model, d, ref, max, f)).toBeCloseTo(expected, 8);
  });

  it('falls 6.02 dB per doubling for the inverse model far from the reference (spec formula, docs/references.md §5)', () => {
    const db = 20 * Math.log10(distanceGain('inverse', 2000, 1, 10000, 1) / distanceGain('inverse', 1000, 1, 10000, 1));
    expect(db).toBeCloseTo(-6.0206, 2);
  });

  it('gives 1 − rolloff when ref equals max in the linear model (spec)', () => {
    expect(distanceGain('linear', 50, 10, 10, 0.25)).toBeCloseTo(0.75, 12);
  });

  it('gives 0 for a zero reference distance in the inverse and exponential models (spec)', () => {
    expect(distanceGain('inverse', 3, 0, 100, 1)).toBe(0);
    expect(distanceGain('exponential', 3, 0, 100, 1)).toBe(0);
  });
});

describe('equalPowerGains (Web Audio API equal-power panning, mono input)', () => {
  const out = new Float64Array(2);
  // Check values COMPUTED from the spec's equal-power formula (docs/references.md §5), 1e-8.
  it.each([
    [0, 0.70710678, 0.70710678],
    [-45, 0.92387953, 0.38268343],
    [-90, 1, 0],
    [90, 0, 1],
    [180, 0.70710678, 0.70710678],
    [135, 0.38268343, 0.92387953],
  ])('at azimuth %s° gives L %s, R %s', (az, l, r) => {
    equalPowerGains(az, out);
    expect(out[0]).toBeCloseTo(l, 8);
    expect(out[1]).toBeCloseTo(r, 8);
  });

  it('keeps L² + R² = 1 at every azimuth', () => {
    for (let az = -200; az <= 200; az += 7) {
      equalPowerGains(az, out);
      expect(out[0] ** 2 + out[1] ** 2).toBeCloseTo(1, 12);
    }
  });
});

describe('azimuthDegrees (Web Audio API azimuth from listener orientation)', () => {
  // Expected angles are plane geometry; the convention (clockwise from ahead, right positive, elevation projected out)
  // follows the W3C Web Audio API PannerNode azimuth/elevation algorithm — from memory, not among docs/references.md's values.
  const forward = { x: 0, y: 0, z: -1 };
  const right = { x: 1, y: 0, z: 0 };
  it.each([
    ['ahead', { x: 0, y: 0, z: -1 }, 0],
    ['to the right', { x: 1, y: 0, z: 0 }, 90],
    ['to the left', { x: -1, y: 0, z: 0 }, -90],
    ['behind', { x: 0, y: 0, z: 1 }, -180],
    ['front-right', { x: Math.SQRT1_2, y: 0, z: -Math.SQRT1_2 }, 45],
    ['back-left', { x: -Math.SQRT1_2, y: 0, z: Math.SQRT1_2 }, -135],
    ['right and above (elevation removed)', { x: 0.6, y: 0.8, z: 0 }, 90],
  ])('places a source %s at %s°', (_name, dir, az) => {
    const a = azimuthDegrees(dir, forward, right);
    // Behind is ±180 (both fold to the centre).
    if (Math.abs(az) === 180) expect(Math.abs(a)).toBeCloseTo(180, 9);
    else expect(a).toBeCloseTo(az, 9);
  });
});

describe('equalPowerFromSine (trigonometry-free form of the spec’s equal-power law)', () => {
  it('equals the spec’s azimuth + cos/sin computation for directions all around the listener', () => {
    const forward = { x: 0, y: 0, z: -1 };
    const right = { x: 1, y: 0, z: 0 };
    const spec = new Float64Array(2);
    const fast = new Float64Array(2);
    for (let i = 0; i < 720; i++) {
      const a = (i * Math.PI) / 360;
      const el = Math.sin(i * 0.37) * 1.2;
      const dir = { x: Math.cos(el) * Math.sin(a), y: Math.sin(el), z: -Math.cos(el) * Math.cos(a) };
      equalPowerGains(azimuthDegrees(dir, forward, right), spec);
      const h = Math.hypot(dir.x, dir.z);
      equalPowerFromSine(dir.x / h, fast);
      expect(fast[0]).toBeCloseTo(spec[0], 12);
      expect(fast[1]).toBeCloseTo(spec[1], 12);
    }
  });

  it('centres NaN and clamps out-of-range sines', () => {
    const out = new Float64Array(2);
    expect([...equalPowerFromSine(Number.NaN, out)]).toEqual([Math.SQRT1_2, Math.SQRT1_2]);
    expect([...equalPowerFromSine(2, out)]).toEqual([0, 1]);
  });
});
