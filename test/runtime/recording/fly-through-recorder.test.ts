import { describe, expect, it } from 'vitest';
import { FlyThroughRecorder, formatSceneScript, SceneReplay } from '../../../runtime/recording';
import { parseSceneScript } from '../../../runtime/offline/parse-scene-script';
import { evaluateMotion } from '../../../runtime/offline/scene-motion';
import { loadScene } from '../../../runtime/offline/render-scene';
import { checkScene } from '../../../runtime/check';
import { engineTuning } from '../check/engine-switch';
import { defaultTuning, serializeTuning } from '../../../src/tuning';
import { seededRandom } from '../../../src/random';

const orientation = { forward: { x: 0, y: 0, z: -1 }, up: { x: 0, y: 1, z: 0 } };

/** Seeded frame intervals of 0.8…1.2 × 1/60 s (mulberry32, common practice), as a browser's animation frames jitter. */
function frameTimes(seconds: number, seed: number): number[] {
  const rnd = seededRandom(seed);
  const out = [100];
  while (out[out.length - 1] < 100 + seconds) out.push(out[out.length - 1] + (1 / 60) * (0.8 + 0.4 * rnd()));
  return out;
}

/** A camera flying along −z at 8 m/s past a source that runs along x at 45 m/s (wrapping at ±90 m), slow motion between 1.5 and 3 s. */
function record(seconds = 4.5, rampIn = 0.25, rampOut = 0.4, slowUntil = 3) {
  const rec = new FlyThroughRecorder();
  const times = frameTimes(seconds, 7);
  rec.start(times[0], orientation, 1);
  let game = 0;
  let prev = times[0];
  for (const time of times) {
    const t = time - times[0];
    if (prev < times[0] + 1.5 && time >= times[0] + 1.5) rec.timeScale(time, 0.35, rampIn, 'smooth');
    if (prev < times[0] + slowUntil && time >= times[0] + slowUntil) rec.timeScale(time, 1, rampOut, 'smooth');
    game += (time - prev) * (t > 1.5 && t <= slowUntil ? 0.35 : 1);
    prev = time;
    const x = ((((game * 45 + 60) % 180) + 180) % 180) - 90;
    rec.frame(time, { x: 0, y: 2, z: 10 - 8 * t }, { drone: { x, y: 6, z: -6 }, pylon: { x: 5, y: 0, z: -5 } });
  }
  rec.stop(times[times.length - 1]);
  return { rec, times };
}

const content = {
  // The default tuning: emission-time propagation, which the checker expects with code of its own.
  tuning: JSON.parse(serializeTuning(defaultTuning)),
  sounds: { hum: { type: 'hum', frequency: 150, partials: [1, 0.5, 0.3], seconds: 2, gain: 0.5 }, buzz: { type: 'hum', frequency: 330, seconds: 2 } },
  voices: [
    { sound: 'hum', source: 'drone', group: 'vehicles', gain: 2 },
    { sound: 'buzz', source: 'pylon', group: 'effects', gain: 1 },
    { sound: 'hum', source: 'missing', group: 'effects', gain: 1 },
  ],
};

describe('FlyThroughRecorder', () => {
  it('writes a scene script that parses, with every frame a key of a cubic path (no velocity step at each frame) and the timestamps from the start', () => {
    const { rec, times } = record();
    const script = parseSceneScript(JSON.parse(formatSceneScript(rec.toScript(content))));
    expect(script.duration).toBeCloseTo(times[times.length - 1] - times[0], 4);
    expect(script.velocities).toBe('exact');
    const l = script.listener.motion;
    expect(l.type === 'keyframes' && l.interpolation).toBe('cubic');
    if (l.type !== 'keyframes') return;
    expect(l.keys.length).toBe(times.length);
    const p = { x: 0, y: 0, z: 0 };
    const v = { x: 0, y: 0, z: 0 };
    evaluateMotion(l, 2, p, v);
    expect(p.z).toBeCloseTo(10 - 16, 3);
    expect(v.z).toBeCloseTo(-8, 1);
    expect(script.listener.forward).toEqual([0, 0, -1]);
  });

  it('writes a still source as a fixed point and drops voices on sources it never saw', () => {
    const script = parseSceneScript(record().rec.toScript(content));
    expect(script.sources.pylon.motion).toEqual({ type: 'fixed', position: [5, 0, -5] });
    expect(script.voices.map((v) => v.source)).toEqual(['drone', 'pylon']);
  });

  it('writes the time-scale requests as keys at their times with their ramps', () => {
    const script = parseSceneScript(record().rec.toScript(content));
    expect(script.timeScale.map((k) => [k.target, k.rampSeconds, k.easing])).toEqual([[0.35, 0.25, 'smooth'], [1, 0.4, 'smooth']]);
    expect(script.timeScale[0].time).toBeGreaterThanOrEqual(1.5);
    expect(script.timeScale[0].time).toBeLessThan(1.5 + 1 / 30);
  });

  it('writes a wrap of the source path as a cut, so the path never moves faster than the source did', () => {
    const script = parseSceneScript(record().rec.toScript(content));
    const m = script.sources.drone.motion;
    expect(m.type === 'keyframes' && m.keys.filter((k) => k.cut).length).toBeGreaterThanOrEqual(1);
    const p = { x: 0, y: 0, z: 0 };
    const v = { x: 0, y: 0, z: 0 };
    let fastest = 0;
    for (let t = 0; t < script.duration; t += 0.001) {
      evaluateMotion(m, t, p, v);
      fastest = Math.max(fastest, Math.hypot(v.x, v.y, v.z));
    }
    // The cubic through the frames overshoots this test's abrupt speed step at 1.5 s (45 → 15.75 m/s)
    // (measured 50.1 m/s); a wrap written as motion would be about 180 m in one frame (over 10,000 m/s).
    expect(fastest).toBeLessThan(45 * 1.25);
  });

  it('keeps keys at least 0.75 / keyRate apart at a high frame rate, and the last frame always', () => {
    const rec = new FlyThroughRecorder({ keyRate: 30 });
    rec.start(0, orientation, 0.5);
    for (let i = 0; i <= 240; i++) rec.frame(i / 120, { x: i / 120, y: 0, z: 0 }, {});
    rec.stop(2);
    const script = parseSceneScript(rec.toScript(content));
    const l = script.listener.motion;
    if (l.type !== 'keyframes') throw new Error('expected keyframes');
    for (let i = 1; i < l.keys.length - 1; i++) expect(l.keys[i].time - l.keys[i - 1].time).toBeGreaterThanOrEqual(0.75 / 30 - 1e-9);
    expect(l.keys.length).toBeGreaterThanOrEqual(2 * 30);
    expect(l.keys.length).toBeLessThanOrEqual(2 * 40 + 2);
    expect(l.keys[l.keys.length - 1]).toEqual({ time: 2, position: [2, 0, 0] });
    // Started in slow motion: the running time scale is the first key.
    expect(script.timeScale[0]).toEqual({ time: 0, target: 0.5, rampSeconds: 0, easing: 'linear' });
  });

  it('starts at the first frame when its timestamp precedes the start call (animation frames are stamped at their start)', () => {
    const rec = new FlyThroughRecorder();
    rec.start(10.01, orientation, 1);
    rec.timeScale(10.02, 0.5, 0.2, 'smooth');
    for (let i = 0; i < 10; i++) rec.frame(10 + i / 50, { x: i, y: 0, z: 0 }, {});
    rec.stop(10.2);
    const script = parseSceneScript(rec.toScript(content));
    const l = script.listener.motion;
    if (l.type !== 'keyframes') throw new Error('expected keyframes');
    expect(l.keys[0].time).toBe(0);
    expect(script.timeScale[0].time).toBeCloseTo(0.02, 9);
    expect(script.duration).toBeCloseTo(0.2, 9);
  });

  it('refuses to write a script with fewer than two frames, and options out of range', () => {
    const rec = new FlyThroughRecorder();
    rec.start(0, orientation, 1);
    rec.frame(0, { x: 0, y: 0, z: 0 }, {});
    rec.stop(0);
    expect(() => rec.toScript(content)).toThrow(/at least two frames/);
    expect(() => new FlyThroughRecorder({ keyRate: 0 })).toThrow(/keyRate/);
  });

  it('gives a recording that passes the check: render, YIN and the expectation agree within the default limits', () => {
    // Ramps of 1.6 s at 48 kHz: the engine reaches each block's time scale at the block's end (half a 128-frame block
    // late), a lag the check rightly reports on the quarter-second ramp of the other recordings (docs/checker.md).
    const loaded = loadScene(record(6, 1.6, 1.6, 4).rec.toScript(content), { sampleRate: 48000 });
    // The engine's default tuning (test/runtime/check/engine-switch.ts).
    const tuning = engineTuning(loaded.tuning);
    const result = checkScene({ ...loaded, tuning }, { sampleRate: 48000 });
    expect(result.sources.map((s) => s.name)).toEqual(['voice 0 (hum on drone)', 'voice 1 (buzz on pylon)']);
    for (const s of result.sources) expect(s.figures.judgedFrames).toBeGreaterThan(100);
    for (const s of result.sources) expect(s.failures).toEqual([]);
    expect(result.passed).toBe(true);
  });
});

describe('SceneReplay', () => {
  it('follows the recorded listener path and hands out each time-scale key once, in order', () => {
    const script = parseSceneScript(record().rec.toScript(content));
    const replay = new SceneReplay({ script });
    const seen: number[] = [];
    const p = { x: 0, y: 0, z: 0 };
    const v = { x: 0, y: 0, z: 0 };
    while (!replay.finished) {
      for (const k of replay.advance(1 / 50)) seen.push(k.target);
      evaluateMotion(script.listener.motion, replay.time, p, v);
      expect(replay.listener.position).toEqual(p);
      expect(replay.source('drone')).not.toBeNull();
    }
    expect(seen).toEqual([0.35, 1]);
    expect(replay.time).toBe(script.duration);
    expect(replay.source('nothing')).toBeNull();
  });
});
