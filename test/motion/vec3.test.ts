import { describe, expect, it } from 'vitest';
import { crossVec3, dotVec3, isFiniteVec3, lengthVec3, normalizeVec3, scaleVec3, setVec3, subVec3, vec3 } from '../../src/motion';

describe('vec3 helpers', () => {
  it('write into the given output object and return it', () => {
    const out = vec3();
    expect(subVec3(out, vec3(3, 2, 1), vec3(1, 1, 1))).toBe(out);
    expect(out).toEqual({ x: 2, y: 1, z: 0 });
    expect(scaleVec3(out, out, 2)).toEqual({ x: 4, y: 2, z: 0 });
    expect(setVec3(out, 1, 2, 3)).toEqual({ x: 1, y: 2, z: 3 });
  });

  it('compute dot and right-handed cross products (x × y = z), with aliasing allowed', () => {
    expect(dotVec3(vec3(1, 2, 3), vec3(4, -5, 6))).toBe(12);
    const a = vec3(1, 0, 0);
    expect(crossVec3(a, a, vec3(0, 1, 0))).toEqual({ x: 0, y: 0, z: 1 });
  });

  it('measure length without overflow or underflow', () => {
    expect(lengthVec3(vec3(3, 4, 12))).toBeCloseTo(13, 12);
    expect(lengthVec3(vec3(3e300, 4e300, 0))).toBeCloseTo(5e300, -288);
    expect(lengthVec3(vec3(3e-300, 4e-300, 0)) / 5e-300).toBeCloseTo(1, 12);
    expect(lengthVec3(vec3(0, 0, 0))).toBe(0);
    expect(lengthVec3(vec3(Number.NaN, 0, 0))).toBeNaN();
  });

  it('normalise to unit length and zero a degenerate vector', () => {
    const out = vec3();
    expect(normalizeVec3(out, vec3(0, 0, -5))).toBe(5);
    expect(out).toEqual({ x: 0, y: 0, z: -1 });
    normalizeVec3(out, vec3(Infinity, 0, 0));
    expect(out).toEqual({ x: 0, y: 0, z: 0 });
    expect(isFiniteVec3(vec3(1, Number.NaN, 0))).toBe(false);
    expect(isFiniteVec3(vec3(1, 2, 3))).toBe(true);
  });
});
