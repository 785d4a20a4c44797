// Bad motion input under the propagation model: each case has a defined outcome (docs/physics.md, "Bad input"), and
// none reaches the speakers as a non-finite sample, a click or an unexplained silence.
import { describe, expect, it } from 'vitest';
import { maxStep, tuningWith } from './engine-helpers';
import { line, renderScene, tone, type Scene } from './propagation-helpers';

const SR = 48000;
const F0 = 400;

/**
 * Click bound (common practice): a tone of peak A below f Hz changes by at most 2π·f·A/SR per sample; twice that
 * with f = 2·F0 (room for the Doppler shift) is the largest step a continuous signal here may take.
 */
function clickBound(x: Float32Array): number {
  let peak = 0;
  for (let i = 0; i < x.length; i++) peak = Math.max(peak, Math.abs(x[i]));
  return (2 * 2 * Math.PI * 2 * F0 * peak) / SR;
}

const base: Omit<Scene, 'mangle'> = {
  source: line([-20, 0, -10], [20, 0, 0]),
  listener: line([0, 0, 0], [0, 0, 0]),
  seconds: 2,
  exactVelocities: false,
  sound: tone(F0, 12000, 1),
  soundRate: 12000,
  play: { fadeInSeconds: undefined },
};

type Mangle = NonNullable<Scene['mangle']>;
const at = (from: number, to: number, f: Mangle): Mangle => (t, p) => (t >= from && t < to ? f(t, p) : p);

describe('propagation: bad motion input', () => {
  it.each<[string, Mangle, (s: ReturnType<typeof renderScene>['engine']['stats']) => void]>([
    ['NaN positions are dropped and counted; the source coasts on its track', at(0.8, 0.9, () => ({ x: NaN, y: 0, z: -10 })), (s) => expect(s.clamps).toBeGreaterThan(0)],
    ['infinite positions are dropped and counted', at(0.8, 0.9, () => ({ x: Infinity, y: -Infinity, z: 0 })), (s) => expect(s.clamps).toBeGreaterThan(0)],
    ['absurd positions (1e15 m) are dropped and counted', at(0.8, 0.9, () => ({ x: 1e15, y: 0, z: -10 })), (s) => expect(s.clamps).toBeGreaterThan(0)],
    ['a source removed mid-flight stops where it was last seen and keeps sounding', (t, p) => (t > 1 ? null : p), (s) => expect(s.teleports).toBe(0)],
    ['a 50 m jump in one frame is a teleport: the track restarts, the read does not jump', at(1, 9, (_t, p) => ({ x: p.x + 50, y: p.y, z: p.z })), (s) => expect(s.teleports).toBe(1)],
  ])('%s', (_name, mangle, check) => {
    const { out, engine } = renderScene({ ...base, mangle });
    expect(out.every(Number.isFinite)).toBe(true);
    expect(maxStep(out, Math.round(0.2 * SR))).toBeLessThanOrEqual(clickBound(out));
    let tail = 0;
    for (let i = out.length - SR / 5; i < out.length; i++) tail = Math.max(tail, Math.abs(out[i]));
    expect(tail).toBeGreaterThan(1e-3); // still heard at the end
    expect(engine.stats.errors).toBe(0);
    check(engine.stats);
  });

  it('an explicit teleport restarts the track at the next snapshot, without a click', () => {
    let asked = false;
    const { out, engine } = renderScene({
      ...base,
      mangle: (t, p) => (t >= 1 ? { x: p.x - 30, y: p.y, z: p.z } : p),
      each: (e, t) => {
        if (!asked && t >= 1 - 1 / 60) {
          e.teleport(7);
          asked = true;
        }
      },
    });
    expect(engine.stats.teleports).toBe(1);
    expect(out.every(Number.isFinite)).toBe(true);
    expect(maxStep(out, Math.round(0.2 * SR))).toBeLessThanOrEqual(clickBound(out));
  });

  it('snapshot time going backwards re-synchronises the snapshot clock: finite, click-free, still heard', () => {
    let k = 0;
    const { out, engine } = renderScene({
      ...base,
      each: (e, t) => {
        // One extra snapshot stamped 5 s in the past, in the middle of the pass.
        if (k++ === Math.round((1 * SR) / 128)) e.pushSnapshot({ time: t - 5, listener: { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } }, sources: [{ id: 7, position: { x: 0, y: 0, z: -10 } }] });
      },
    });
    expect(out.every(Number.isFinite)).toBe(true);
    expect(maxStep(out, Math.round(0.2 * SR))).toBeLessThanOrEqual(clickBound(out));
    expect(engine.stats.errors).toBe(0);
  });

  it('a delay longer than the history holds the source at its oldest known position: a click 343.3 m away still arrives after 1 s', () => {
    const click = new Float32Array(SR / 10);
    click[0] = 1;
    const { out } = renderScene({
      source: line([0, 0, -343.3], [0, 0, 0]), listener: line([0, 0, 0], [0, 0, 0]), seconds: 1.1, exactVelocities: false,
      sound: click, soundRate: SR, play: { loop: false }, tuning: tuningWith((t) => (t.air.speedOfSound = 343.3)),
      engine: { trackKnots: 16 }, // 16 knots of 60 Hz snapshots: 0.27 s of history for a 1 s delay
    });
    let best = 0;
    for (let i = 1; i < out.length; i++) if (Math.abs(out[i]) > Math.abs(out[best])) best = i;
    expect(Math.abs(best / SR - 1)).toBeLessThanOrEqual(0.001);
  });
});
