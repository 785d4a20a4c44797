// What a caller of Engine.setTimeScale sees between the call and the next render: the request is read and applied
// during the call (by the render code, which is optimised: docs/allocation.md), so the stats change only with the next
// render, a later change to the request object is not heard, and a second call, a snapshot's time scale or a pause in
// between act in call order. Expected values are linear ramps in closed form: v(t) = from + (to − from)·(t − start)/ramp.
import { describe, expect, it } from 'vitest';
import { engineAt } from './engine-helpers';
import type { Engine } from '../../src/engine';
import type { EngineSnapshot, TimeScaleRequest } from '../../src/index';

const SR = 48000;
const B = 128;
/** Seconds of one block. */
const DT = B / SR;
const listener = { position: { x: 0, y: 0, z: 0 }, forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };

/** Renders `count` blocks of 128 frames. */
function render(engine: Engine, count: number): void {
  const out = [new Float32Array(B), new Float32Array(B)];
  for (let k = 0; k < count; k++) engine.render(out, B);
}

describe('Engine.setTimeScale between the call and the next render', () => {
  it('leaves the stats as they were until the next render, which reads the new ramp', () => {
    const engine = engineAt({ sampleRate: SR });
    render(engine, 10);
    const time = engine.stats.time;
    engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
    expect(engine.stats.timeScale).toBe(1);
    expect(engine.stats.time).toBe(time);
    expect(engine.time).toBe(time);
    render(engine, 1);
    expect(engine.stats.timeScale).toBe(0.5);
  });

  it('reads the request during the call: changing the object afterwards changes nothing', () => {
    const engine = engineAt({ sampleRate: SR });
    const request: TimeScaleRequest = { target: 0.25, rampSeconds: 1, easing: 'linear' };
    engine.setTimeScale(request);
    request.target = 2;
    request.rampSeconds = 0;
    request.easing = 'exponential';
    request.startTime = 100;
    render(engine, 40);
    // 1 → 0.25 over 1 s from engine time 0, read at the end of block 40.
    expect(engine.stats.timeScale).toBeCloseTo(1 + (0.25 - 1) * 40 * DT, 12);
  });

  it('reads each field of the request once, during the call, in the order startTime, target, rampSeconds, easing', () => {
    const engine = engineAt({ sampleRate: SR });
    const reads: string[] = [];
    const request = {
      get startTime() { reads.push('startTime'); return undefined; },
      get target() { reads.push('target'); return 0.5; },
      get rampSeconds() { reads.push('rampSeconds'); return 0; },
      get easing() { reads.push('easing'); return 'linear' as const; },
    };
    engine.setTimeScale(request);
    expect(reads).toEqual(['startTime', 'target', 'rampSeconds', 'easing']);
    render(engine, 5);
    expect(reads).toHaveLength(4);
    expect(engine.stats.timeScale).toBe(0.5);
  });

  it('starts a second call made before the render from the value the first ramp has then', () => {
    const engine = engineAt({ sampleRate: SR });
    render(engine, 8);
    engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
    engine.setTimeScale({ target: 1.5, rampSeconds: 1, easing: 'linear' });
    render(engine, 20);
    // 0.5 → 1.5 over 1 s from the second call (no time between the two calls), read 20 blocks later.
    expect(engine.stats.timeScale).toBeCloseTo(0.5 + (1.5 - 0.5) * 20 * DT, 12);
  });

  it('acts in call order with a snapshot that carries a time scale', () => {
    const snapshot = (time: number, timeScale: number): EngineSnapshot => ({ time, listener, sources: [], timeScale });
    const ramp: TimeScaleRequest = { target: 0, rampSeconds: 1, easing: 'linear' };
    // The ramp, then the snapshot: the snapshot's value holds.
    const a = engineAt({ sampleRate: SR });
    a.setTimeScale(ramp);
    a.pushSnapshot(snapshot(0, 0.75));
    render(a, 10);
    expect(a.stats.timeScale).toBe(0.75);
    // The snapshot, then the ramp: the ramp starts from the snapshot's value.
    const b = engineAt({ sampleRate: SR });
    b.pushSnapshot(snapshot(0, 0.75));
    b.setTimeScale(ramp);
    render(b, 10);
    expect(b.stats.timeScale).toBeCloseTo(0.75 * (1 - 10 * DT), 12);
  });

  it('holds a ramp asked for before a pause made before the render, and goes on after the resume', () => {
    const engine = engineAt({ sampleRate: SR });
    render(engine, 4);
    engine.setTimeScale({ target: 0, rampSeconds: 1, easing: 'linear' });
    engine.pause();
    render(engine, 30);
    // Flow time stops at the call: the ramp is at its start.
    expect(engine.stats.timeScale).toBe(1);
    engine.resume();
    render(engine, 12);
    expect(engine.stats.timeScale).toBeCloseTo(1 - 12 * DT, 12);
  });

  it('counts a non-finite target, ramp or start time as a clamp, as a ramp of 0 s to 0 from now', () => {
    const engine = engineAt({ sampleRate: SR });
    render(engine, 3);
    engine.setTimeScale({ target: Number.NaN, rampSeconds: -1, easing: 'linear', startTime: Number.POSITIVE_INFINITY });
    render(engine, 1);
    expect(engine.stats.timeScale).toBe(0);
    expect(engine.stats.clamps).toBe(3);
  });

  it('throws TypeError for a null request and keeps rendering', () => {
    const engine = engineAt({ sampleRate: SR });
    // A JavaScript caller's null (JSON.parse gives it without a cast).
    expect(() => engine.setTimeScale(JSON.parse('null'))).toThrow(TypeError);
    engine.setTimeScale({ target: 0.5, rampSeconds: 0, easing: 'linear' });
    render(engine, 2);
    expect(engine.stats.timeScale).toBe(0.5);
    expect(engine.stats.errors).toBe(0);
  });
});
