// A source circling at 63 m/s on a radius of 8 m, positions only (the three.js binding path), against the
// emission-time equation c·(t − τ) = |L − S(τ)| solved here for the circle (docs/references.md §11), both tracked by
// the project's YIN tracker (docs/references.md §7).
import { describe, expect, it } from 'vitest';
import { speedOfSound } from '../../src/motion';
import { PitchTracker } from '../../src/analysis';
import { absQuantile, circle, line, pitchErrors, referenceSignal, renderScene, tone } from './propagation-helpers';

const C = speedOfSound(20); // docs/references.md §2
const SR = 48000;

describe('propagation on a curved path (default tuning)', () => {
  it('hears a 63 m/s circle of radius 8 m from positions only within 10 cents p95', () => {
    const centre: [number, number, number] = [0, 0, -14];
    const r = 8;
    const speed = 63;
    const path = circle(centre, r, speed);
    const { out, engine } = renderScene({ source: path, listener: line([0, 0, 0], [0, 0, 0]), seconds: 1.2, exactVelocities: false, sound: tone(400, 12000, 1), soundRate: 12000 });
    // Emission time: Newton on g(τ) = c·(t − τ) − |S(τ)| (listener at the origin), from τ = t − |S(t)|/c.
    const tau = (t: number) => {
      let x = t - Math.hypot(...path(t).p) / C;
      for (let i = 0; i < 30; i++) {
        const { p, v } = path(x);
        const d = Math.hypot(p[0], p[1], p[2]);
        const g = C * (t - x) - d;
        const dg = -C - (p[0] * v[0] + p[1] * v[1] + p[2] * v[2]) / d;
        const nx = x - g / dg;
        if (Math.abs(nx - x) < 1e-13) break;
        x = nx;
      }
      return x;
    };
    const errs = pitchErrors(out, referenceSignal(out.length, SR, 400, tau, C), SR, 0.95, 0.15);
    expect(errs.length).toBeGreaterThan(100);
    expect(absQuantile(errs, 0.95)).toBeLessThanOrEqual(10);
    expect(engine.stats.teleports).toBe(0);
  });
});

describe('a voice started on a moving source', () => {
  it('has the right shift from its first heard frames (the source was tracked before the voice)', () => {
    // Straight radial approach at 30 m/s, positions only: the heard ratio is c/(c − 30) throughout
    // (docs/references.md §11); the voice starts after 15 snapshots of motion.
    const start = 0.25;
    const { out } = renderScene({
      source: line([0, 0, -60], [0, 0, 30]), listener: line([0, 0, 0], [0, 0, 0]), seconds: 0.5, exactVelocities: false,
      sound: tone(400, 12000, 1), soundRate: 12000, play: { loop: true, fadeInSeconds: 0 }, playAt: start,
    });
    let first = 0;
    while (first < out.length && out[first] === 0) first++;
    const tr = new PitchTracker({ sampleRate: SR, minHz: 100, maxHz: 2000, hopSeconds: 0.005, windowSeconds: 0.015 }).track(out.subarray(first));
    const expected = (400 * C) / (C - 30);
    // The first frame whose window lies wholly after the arrival, 7.5 ms in, and the next few.
    const cents = Array.from(tr.frequencies.slice(0, 6), (f) => 1200 * Math.log2(f / expected));
    expect(cents.length).toBe(6);
    for (const c of cents) expect(Math.abs(c)).toBeLessThanOrEqual(1);
  });
});
