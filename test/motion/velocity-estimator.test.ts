import { describe, expect, it } from 'vitest';
import { VelocityEstimator } from '../../src/motion';

const p = (x: number, y = 0, z = 0) => ({ x, y, z });

describe('VelocityEstimator', () => {
  it('returns zero velocity on the first sample', () => {
    const e = new VelocityEstimator({ smoothingSeconds: 0.08, teleportSpeed: 400 });
    expect(e.update(p(5), 1)).toEqual({ x: 0, y: 0, z: 0 });
  });

  it('returns the raw finite difference without smoothing', () => {
    const e = new VelocityEstimator({ smoothingSeconds: 0, teleportSpeed: 400 });
    e.update(p(0), 0);
    const v = e.update(p(1, -2, 0.5), 0.1);
    expect(v.x).toBeCloseTo(10, 12);
    expect(v.y).toBeCloseTo(-20, 12);
    expect(v.z).toBeCloseTo(5, 12);
  });

  it('approaches a constant velocity like setTargetAtTime (1 − e^(−t/τ))', () => {
    // Web Audio API setTargetAtTime: after t = τ the value covers 63.21 % of the step (docs/references.md §5, COMPUTED).
    const tau = 0.1;
    const e = new VelocityEstimator({ smoothingSeconds: tau, teleportSpeed: 400 });
    const dt = 1 / 600;
    e.update(p(0), 0);
    let t = 0;
    for (let i = 0; i < 60; i++) {
      t = (i + 1) * dt;
      e.update(p(20 * t), t);
    }
    expect(t).toBeCloseTo(tau, 12);
    expect(e.velocity.x / 20).toBeCloseTo(1 - Math.exp(-1), 6);
  });

  it('returns its own vector object from update', () => {
    const e = new VelocityEstimator({ smoothingSeconds: 0.05, teleportSpeed: 400 });
    expect(e.update(p(0), 0)).toBe(e.velocity);
    expect(e.update(p(1), 0.1)).toBe(e.velocity);
  });

  it.each([
    ['repeated', 0.1],
    ['backwards', 0.05],
    ['NaN', Number.NaN],
  ])('ignores a %s timestamp and keeps the estimate', (_name, time) => {
    const e = new VelocityEstimator({ smoothingSeconds: 0, teleportSpeed: 400 });
    e.update(p(0), 0);
    e.update(p(1), 0.1);
    const before = { ...e.velocity };
    expect(e.update(p(50), time)).toEqual(before);
    expect(e.ignored).toBe(1);
    // The reference point was not moved: the next good sample differences against (1, 0.1).
    expect(e.update(p(2), 0.2).x).toBeCloseTo(10, 9);
  });

  it('ignores non-finite positions', () => {
    const e = new VelocityEstimator({ smoothingSeconds: 0, teleportSpeed: 400 });
    e.update(p(0), 0);
    e.update(p(Number.NaN), 0.1);
    e.update(p(Infinity), 0.2);
    expect(e.ignored).toBe(2);
    expect(e.update(p(3), 0.3).x).toBeCloseTo(10, 9);
  });

  it('treats an implied speed above the limit as a teleport: resets to zero without a spike', () => {
    const e = new VelocityEstimator({ smoothingSeconds: 0, teleportSpeed: 400 });
    e.update(p(0), 0);
    e.update(p(1), 0.1);
    const v = e.update(p(1000), 0.2);
    expect(v).toEqual({ x: 0, y: 0, z: 0 });
    expect(e.teleports).toBe(1);
    // Motion continues from the new place.
    expect(e.update(p(1001), 0.3).x).toBeCloseTo(10, 9);
  });

  it('treats a 1e300 jump as a teleport, never a non-finite velocity', () => {
    const e = new VelocityEstimator({ smoothingSeconds: 0.05, teleportSpeed: 400 });
    e.update(p(0), 0);
    const v = e.update(p(1e300, -1e300, 1e300), 1e-9);
    expect(Number.isFinite(v.x + v.y + v.z)).toBe(true);
    expect(e.teleports).toBe(1);
  });

  it('starts over after reset', () => {
    const e = new VelocityEstimator({ smoothingSeconds: 0, teleportSpeed: 400 });
    e.update(p(0), 0);
    e.update(p(1), 0.1);
    e.reset();
    expect(e.velocity.x).toBe(0);
    expect(e.update(p(100), 0.2).x).toBe(0);
    expect(e.teleports).toBe(0);
  });
});
