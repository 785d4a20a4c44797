import { describe, expect, it } from 'vitest';
import { evaluateMotion } from '../../../runtime/offline/scene-motion';
import { generateSound } from '../../../runtime/offline/scene-sounds';
import type { MotionSpec } from '../../../runtime/offline/scene-types';

const p = { x: 0, y: 0, z: 0 };
const v = { x: 0, y: 0, z: 0 };

describe('evaluateMotion', () => {
  it.each<[string, MotionSpec, number, [number, number, number], [number, number, number]]>([
    ['a line from its start time', { type: 'line', from: [-100, 0, -10], velocity: [40, 0, 0], time: 1 }, 3.5, [0, 0, -10], [40, 0, 0]],
    ['a circle a quarter turn in', { type: 'circle', center: [1, 2, 3], radius: 10, periodSeconds: 4, plane: 'xz', phaseDegrees: 0 }, 1, [1, 2, 13], [-10 * (Math.PI / 2), 0, 0]],
    ['linear keys halfway', { type: 'keyframes', interpolation: 'linear', keys: [{ time: 0, position: [0, 0, 0] }, { time: 2, position: [4, 2, 0] }] }, 1, [2, 1, 0], [2, 1, 0]],
    ['keys before the first key', { type: 'keyframes', interpolation: 'cubic', keys: [{ time: 1, position: [5, 0, 0] }, { time: 2, position: [6, 0, 0] }] }, 0, [5, 0, 0], [0, 0, 0]],
  ])('places %s (circle: v = ω r, tangent)', (_name, motion, t, pos, vel) => {
    evaluateMotion(motion, t, p, v);
    expect([p.x, p.y, p.z].map((x, i) => x - pos[i]).every((d) => Math.abs(d) < 1e-9)).toBe(true);
    expect([v.x, v.y, v.z].map((x, i) => x - vel[i]).every((d) => Math.abs(d) < 1e-9)).toBe(true);
  });

  it('gives cubic keyframe velocities that match the finite difference of positions', () => {
    const m: MotionSpec = { type: 'keyframes', interpolation: 'cubic', keys: [0, 1, 2.5, 3].map((time, i) => ({ time, position: [i * i, Math.sin(i), -i] as [number, number, number] })) };
    for (const t of [0.3, 1.2, 2.0, 2.9]) {
      const h = 1e-6;
      evaluateMotion(m, t + h, p, v);
      const a = { ...p };
      evaluateMotion(m, t - h, p, v);
      const b = { ...p };
      evaluateMotion(m, t, p, v);
      expect(Math.abs((a.x - b.x) / (2 * h) - v.x)).toBeLessThan(1e-5);
      expect(Math.abs((a.y - b.y) / (2 * h) - v.y)).toBeLessThan(1e-5);
    }
  });

  it('passes through every key of a cubic path', () => {
    const keys = [{ time: 0, position: [0, 0, 0] as const }, { time: 1, position: [3, 1, 0] as const }, { time: 3, position: [-2, 0, 4] as const }];
    for (const k of keys) {
      evaluateMotion({ type: 'keyframes', interpolation: 'cubic', keys }, k.time, p, v);
      expect([p.x, p.y, p.z]).toEqual([...k.position]);
    }
  });
});

describe('generateSound', () => {
  it('makes a tone of a whole number of cycles so that its loop is seamless', () => {
    const s = generateSound({ type: 'tone', frequency: 441.1, seconds: 1, gain: 0.5, sampleRate: 48000 }, 44100);
    expect(s.sampleRate).toBe(48000);
    expect(s.frequency).toBe(441);
    const x = s.channels[0];
    expect((x.length * s.frequency!) % s.sampleRate).toBe(0); // a whole number of cycles fits the buffer
    // The sample after the last one (index 0 again) continues the sine: compare with the analytic value.
    expect(Math.abs(x[0] - 0)).toBeLessThan(1e-7);
    expect(Math.abs(x[x.length - 1] - 0.5 * Math.sin((2 * Math.PI * 441 * (x.length - 1)) / 48000))).toBeLessThan(1e-6);
  });

  it('normalises a hum to its gain and drops partials above Nyquist', () => {
    const s = generateSound({ type: 'hum', frequency: 5000, partials: [1, 1, 1, 1, 1], seconds: 0.1, gain: 0.8, sampleRate: null }, 16000);
    // Only partial 1 (5 kHz) is below 8 kHz: amplitude 0.8 × 1/5.
    let m = 0;
    for (const y of s.channels[0]) m = Math.max(m, Math.abs(y));
    expect(m).toBeCloseTo(0.16, 3);
  });

  it.each(['white', 'pink', 'brown'] as const)('repeats %s noise for the same seed and changes it for another', (colour) => {
    const a = generateSound({ type: 'noise', colour, seed: 7, seconds: 0.05, gain: 0.3, sampleRate: null }, 48000).channels[0];
    const b = generateSound({ type: 'noise', colour, seed: 7, seconds: 0.05, gain: 0.3, sampleRate: null }, 48000).channels[0];
    const c = generateSound({ type: 'noise', colour, seed: 8, seconds: 0.05, gain: 0.3, sampleRate: null }, 48000).channels[0];
    expect(a).toEqual(b);
    expect(a).not.toEqual(c);
    expect(Math.max(...Array.from(a, Math.abs))).toBeCloseTo(0.3, 6);
  });
});
