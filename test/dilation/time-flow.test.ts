import { describe, expect, it } from 'vitest';
import { TimeFlow, easeValue } from '../../src/dilation';

describe('TimeFlow', () => {
  it('rests at its initial value (default 1)', () => {
    expect(new TimeFlow().valueAt(123)).toBe(1);
    expect(new TimeFlow({ initial: 0.5 }).valueAt(0)).toBe(0.5);
  });

  // Expected values: linear interpolation; smoothstep 3u² − 2u³ (common practice) gives 0.15625 at u = 0.25;
  // exponential is geometric interpolation v0·(v1/v0)^u, the form of Web Audio's exponentialRampToValueAtTime (from memory).
  it.each([
    ['linear', 0.5, 0.675],
    ['smooth', 0.25, 1 - 0.65 * 0.15625],
    ['exponential', 0.5, Math.sqrt(0.35)],
  ] as const)('ramps with %s easing: at u = %s the value is %s', (easing, u, expected) => {
    const f = new TimeFlow();
    f.set({ target: 0.35, rampSeconds: 2, easing }, 10);
    expect(f.valueAt(10)).toBe(1);
    expect(f.valueAt(10 + 2 * u)).toBeCloseTo(expected, 12);
    expect(f.valueAt(12)).toBe(0.35);
    expect(f.valueAt(100)).toBe(0.35);
    expect(f.target).toBe(0.35);
  });

  it('is a pure function of time: evaluation order does not matter', () => {
    const a = new TimeFlow();
    const b = new TimeFlow();
    a.set({ target: 0.2, rampSeconds: 1, easing: 'smooth' }, 0);
    b.set({ target: 0.2, rampSeconds: 1, easing: 'smooth' }, 0);
    const times = [0.9, 0.1, 0.5, 0.3, 0.7];
    const forward = [...times].sort().map((t) => a.valueAt(t));
    times.forEach((t) => b.valueAt(t));
    const again = [...times].sort().map((t) => b.valueAt(t));
    expect(again).toEqual(forward);
  });

  it('starts a new ramp from the value the old one had at the new start time (no step)', () => {
    const f = new TimeFlow();
    f.set({ target: 0, rampSeconds: 1, easing: 'linear' }, 0);
    const mid = f.valueAt(0.5);
    f.set({ target: 1, rampSeconds: 1, easing: 'linear' }, 0.5);
    expect(f.valueAt(0.5)).toBeCloseTo(mid, 12);
    expect(f.valueAt(1.5)).toBe(1);
  });

  it('honours an explicit start time', () => {
    const f = new TimeFlow();
    f.set({ target: 0.5, rampSeconds: 1, easing: 'linear', startTime: 5 }, 0);
    expect(f.valueAt(4)).toBe(1);
    expect(f.valueAt(5.5)).toBeCloseTo(0.75, 12);
  });

  it('jumps to the new value at the given time and keeps the old value before it', () => {
    const f = new TimeFlow();
    f.jump(0.25, 3);
    expect(f.valueAt(3)).toBe(0.25);
    expect(f.valueAt(2.9)).toBe(1);
  });

  it.each([
    [Number.NaN, 0],
    [-1, 0],
    [Number.NEGATIVE_INFINITY, 0],
    [Number.POSITIVE_INFINITY, 4],
    [9, 4],
  ])('clamps a target of %s to %s and counts it', (target, expected) => {
    const f = new TimeFlow();
    f.set({ target, rampSeconds: 0, easing: 'linear' }, 0);
    expect(f.valueAt(1)).toBe(expected);
    expect(f.clamps).toBe(1);
  });

  it.each([0, 0.35, 1, 4])('keeps a target of %s as is, uncounted (0 and 4 included)', (target) => {
    const f = new TimeFlow();
    f.set({ target, rampSeconds: 0, easing: 'linear' }, 0);
    expect(f.valueAt(1)).toBe(target);
    expect(f.clamps).toBe(0);
  });

  it('treats a NaN or negative ramp as an instant change, counted', () => {
    const f = new TimeFlow();
    f.set({ target: 0.5, rampSeconds: Number.NaN, easing: 'linear' }, 0);
    f.set({ target: 0.25, rampSeconds: -3, easing: 'linear' }, 1);
    expect(f.valueAt(1)).toBe(0.25);
    expect(f.clamps).toBe(2);
  });

  it('stays within [min(from, to), max(from, to)] for every easing', () => {
    for (const easing of ['linear', 'smooth', 'exponential'] as const) {
      for (const [a, b] of [[1, 0], [0, 1], [0.35, 1], [1, 0.005], [2, 0.001]]) {
        let prev = a;
        for (let i = 0; i <= 100; i++) {
          const v = easeValue(a, b, i / 100, easing);
          expect(v).toBeGreaterThanOrEqual(Math.min(a, b) - 1e-12);
          expect(v).toBeLessThanOrEqual(Math.max(a, b) + 1e-12);
          // Monotone towards the target.
          expect((v - prev) * (b - a)).toBeGreaterThanOrEqual(-1e-12);
          prev = v;
        }
      }
    }
  });
});
