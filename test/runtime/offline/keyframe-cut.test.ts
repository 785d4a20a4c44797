import { describe, expect, it } from 'vitest';
import { evaluateMotion } from '../../../runtime/offline/scene-motion';
import { parseSceneScript } from '../../../runtime/offline/parse-scene-script';
import { ScriptError } from '../../../runtime/offline/script-error';
import type { MotionSpec } from '../../../runtime/offline/scene-types';

const p = { x: 0, y: 0, z: 0 };
const v = { x: 0, y: 0, z: 0 };

// A wrapping pass recorded at 0.5 s per key: 0 → 10 m, then a teleport back to −10 m at t = 1.5 s.
const keys = [
  { time: 0, position: [0, 0, 0] as const },
  { time: 1, position: [10, 0, 0] as const },
  { time: 1.5, position: [-10, 0, 0] as const, cut: true },
  { time: 2.5, position: [0, 0, 0] as const },
];

describe('keyframe cuts (teleports in recorded paths)', () => {
  it.each<[string, number, [number, number, number], [number, number, number]]>([
    ['moves straight before the cut', 0.5, [5, 0, 0], [10, 0, 0]],
    ['holds the previous key at rest until the cut', 1.25, [10, 0, 0], [0, 0, 0]],
    ['lands on the cut key at its time', 1.5, [-10, 0, 0], [10, 0, 0]],
    ['moves on from the cut key after it', 2, [-5, 0, 0], [10, 0, 0]],
  ])('%s (linear)', (_name, t, pos, vel) => {
    evaluateMotion({ type: 'keyframes', interpolation: 'linear', keys }, t, p, v);
    expect([p.x, p.y, p.z]).toEqual(pos);
    expect([v.x, v.y, v.z]).toEqual(vel);
  });

  it('keeps a cubic path from bending across the cut (tangents one-sided beside it)', () => {
    const m: MotionSpec = { type: 'keyframes', interpolation: 'cubic', keys };
    // Just after the cut, a two-sided tangent would point from 10 m to 0 m (backwards); one-sided it points forward.
    evaluateMotion(m, 1.5001, p, v);
    expect(v.x).toBeGreaterThan(0);
    expect(p.x).toBeGreaterThan(-10);
    evaluateMotion(m, 1.2, p, v);
    expect([p.x, v.x]).toEqual([10, 0]);
  });

  it('finds the right segment among many keys (bisection agrees with the direct formula)', () => {
    const many = Array.from({ length: 2001 }, (_, i) => ({ time: i / 60, position: [i * 0.5, 0, 0] as const }));
    const m: MotionSpec = { type: 'keyframes', interpolation: 'linear', keys: many };
    for (const t of [0, 0.01, 7.777, 16.66, 33.3]) {
      evaluateMotion(m, t, p, v);
      expect(p.x).toBeCloseTo(Math.min(t, 2000 / 60) * 30, 9);
    }
  });

  it('parses "cut" on keys, leaves it out when false, and refuses a non-boolean with its JSON path', () => {
    const s = parseSceneScript({ duration: 3, sources: { d: { motion: { type: 'keyframes', keys: [{ time: 0, position: [0, 0, 0], cut: false }, { time: 1, position: [1, 0, 0], cut: true }] } } }, voices: [] });
    const motion = s.sources.d.motion;
    expect(motion.type === 'keyframes' && motion.keys.map((k) => k.cut)).toEqual([undefined, true]);
    try {
      parseSceneScript({ duration: 3, sources: { d: { motion: { type: 'keyframes', keys: [{ time: 0, position: [0, 0, 0], cut: 'yes' }] } } }, voices: [] });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(ScriptError);
      expect((e as ScriptError).issues.map((i) => i.path)).toEqual(['sources.d.motion.keys[0].cut']);
    }
  });
});
