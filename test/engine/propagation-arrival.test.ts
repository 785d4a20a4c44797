// Arrival time and the Mach cone with default settings, against closed forms written here (docs/references.md §11):
// a click 343.3 m away at c = 343.3 m/s arrives after 1 s of game time; a straight supersonic pass is silent until
// t = τc + b·√(M² − 1)/v, the earliest arrival of any emitted sound (closest approach b at τc, M = v/c).
import { describe, expect, it } from 'vitest';
import type { ShockwaveEvent } from '../../src/engine';
import { tuningWith } from './engine-helpers';
import { line, renderScene, tone } from './propagation-helpers';

const SR = 48000;

function click(rate: number): Float32Array {
  const x = new Float32Array(rate / 10);
  x[0] = 1;
  return x;
}

/** Index of the largest |sample|. */
function peakIndex(x: Float32Array): number {
  let best = 0;
  for (let i = 1; i < x.length; i++) if (Math.abs(x[i]) > Math.abs(x[best])) best = i;
  return best;
}

describe('arrival delay on the game clock (c = 343.3 m/s)', () => {
  const tuning = tuningWith((t) => (t.air.speedOfSound = 343.3));
  it.each([
    [1, 1.0],
    [0.25, 4.0],
  ])('hears a click emitted 343.3 m away at time scale %d after %d s of wall time (1 s of game time) ± 1 ms', (scale, wall) => {
    const { out, engine } = renderScene({
      source: line([0, 0, -343.3], [0, 0, 0]), listener: line([0, 0, 0], [0, 0, 0]), seconds: wall + 0.1, exactVelocities: false,
      sound: click(SR), soundRate: SR, play: { loop: false }, tuning, timeScale: scale,
    });
    const t = peakIndex(out) / SR;
    expect(Math.abs(t - wall)).toBeLessThanOrEqual(0.001);
    // Nothing before: below −120 dBFS until 1 ms before the arrival.
    let before = 0;
    for (let i = 0; i < (wall - 0.001) * SR; i++) before = Math.max(before, Math.abs(out[i]));
    expect(before).toBeLessThan(1e-6);
    expect(engine.stats.ratioClamps).toBe(0);
  });
});

describe('supersonic passes from positions only (default tuning)', () => {
  const c = 343.2; // speedOfSound(20), docs/references.md §2
  it.each([
    ['Mach 2', 2 * c],
    ['1,000 m/s', 1000],
  ])('%s: silent before the cone, a shockwave event within 5 ms of the closed form, finite and faded in', (_name, v) => {
    const b = 5;
    const tc = 0.5;
    const events: ShockwaveEvent[] = [{ time: 0, gameTime: 0, sourceId: 0 }];
    let event: ShockwaveEvent | null = null;
    const { out, engine } = renderScene({
      source: line([-v * tc, 0, -b], [v, 0, 0]), listener: line([0, 0, 0], [0, 0, 0]), seconds: 0.8, exactVelocities: false,
      sound: tone(400, 12000, 1), soundRate: 12000, play: { fadeInSeconds: undefined },
      each: (e) => {
        if (event === null && e.drainShockwaves(events) > 0) event = { ...events[0] };
      },
    });
    const M = v / c;
    const cone = tc + (b * Math.sqrt(M * M - 1)) / v;
    const ev = event as ShockwaveEvent | null;
    expect(ev).not.toBeNull();
    expect(Math.abs(ev!.time - cone)).toBeLessThanOrEqual(0.005);
    expect(ev!.sourceId).toBe(7);
    expect(engine.stats.shockwaves).toBe(1);
    expect(engine.stats.teleports).toBe(0); // a straight 1,000 m/s path is motion, not a jump
    // Silence (below −120 dBFS) before the cone.
    let before = 0;
    for (let i = 0; i < Math.floor((cone - 0.001) * SR); i++) before = Math.max(before, Math.abs(out[i]));
    expect(before).toBeLessThan(1e-6);
    // Finite everywhere; the onset is a fade, not a step: the first millisecond after the cone peaks below half the
    // following 10 ms (the click bound of docs/physics.md).
    expect(out.every(Number.isFinite)).toBe(true);
    const on = Math.ceil((cone - 0.003) * SR);
    let first = 0;
    let next = 0;
    for (let i = on; i < on + SR * 0.004; i++) first = Math.max(first, Math.abs(out[i]));
    for (let i = on + SR * 0.004; i < on + SR * 0.014; i++) next = Math.max(next, Math.abs(out[i]));
    expect(next).toBeGreaterThan(1e-3);
    expect(first).toBeLessThan(0.5 * next);
  });
});

describe('time scale 0 and slow motion with propagation', () => {
  it('freezes sound in flight and resumes it, with no shockwave from a subsonic source made "fast" by slow motion', () => {
    // The world follows the game clock: smoothstep ramps (common practice) 1 → 0 at 0.5 s and 0 → 1 at 1.5 s, 0.3 s each.
    const ease = (u: number) => (u <= 0 ? 0 : u >= 1 ? 1 : u * u * (3 - 2 * u));
    const scale = (t: number) => (t < 1.5 ? 1 - ease((t - 0.5) / 0.3) : ease((t - 1.5) / 0.3));
    const game = (t: number) => {
      let g = 0;
      const steps = Math.ceil(t / 1e-4);
      for (let i = 0; i < steps; i++) g += scale((i + 0.5) * (t / steps)) * (t / steps);
      return g;
    };
    const { out, engine } = renderScene({
      worldClock: game,
      source: line([-40, 0, -5], [60, 0, 0]), listener: line([0, 0, 0], [0, 0, 0]), seconds: 2.5, exactVelocities: false,
      sound: tone(400, 12000, 1), soundRate: 12000,
      each: (e, t) => {
        if (Math.abs(t - 0.5) < 1e-3) e.setTimeScale({ target: 0, rampSeconds: 0.3, easing: 'smooth' });
        if (Math.abs(t - 1.5) < 1e-3) e.setTimeScale({ target: 1, rampSeconds: 0.3, easing: 'smooth' });
      },
    });
    expect(out.every(Number.isFinite)).toBe(true);
    expect(engine.stats.shockwaves).toBe(0);
    let tail = 0;
    for (let i = out.length - SR / 4; i < out.length; i++) tail = Math.max(tail, Math.abs(out[i]));
    expect(tail).toBeGreaterThan(1e-3);
  });
});
