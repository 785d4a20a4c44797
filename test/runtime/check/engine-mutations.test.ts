// The checker against engine variants made in the test (no product code edited): each wrong variant must FAIL with a
// message naming the source and a time, and the engine as shipped must PASS. Variants are built by composition:
// the engine's snapshot input is rewritten on its way in (Doppler source term, listener sign, a 50 ms lag), or the
// engine is given a tuning other than the one the checker expects (propagation removed, a pitch curve 10 cents off).
import { describe, expect, it } from 'vitest';
import { checkScene, type SceneRenderer } from '../../../runtime/check';
import { loadScene, renderLoadedScene } from '../../../runtime/offline';
import { Engine } from '../../../src/engine';
import type { EngineSnapshot } from '../../../src/engine';
import { defaultTuning, type Tuning } from '../../../src/tuning';
import { ENGINE_HAS_PROPAGATION, engineTuning, withDopplerModel } from './engine-switch';

type Vec = { x: number; y: number; z: number };

/** A renderer whose engine sees every snapshot through `rewrite` (the prototype is restored after the render). */
function rewritingRenderer(rewrite: (s: EngineSnapshot, engine: Engine) => EngineSnapshot): SceneRenderer {
  return (script, sounds, tuning, options) => {
    const original = Engine.prototype.pushSnapshot;
    Engine.prototype.pushSnapshot = function (this: Engine, s: EngineSnapshot) {
      original.call(this, rewrite(s, this));
    };
    try {
      return renderLoadedScene(script, sounds, tuning, options);
    } finally {
      Engine.prototype.pushSnapshot = original;
    }
  };
}

// A hum on a car passing at 40 m/s, 10 m from a listener who walks toward it at 6 m/s; closest at 1.74 s.
const T_CA = 80 / 46;
const flyBy = loadScene({
  version: 1,
  duration: 3.5,
  sampleRate: 24000,
  sounds: { hum: { type: 'hum', frequency: 330, partials: [1, 0.5, 0.3], seconds: 2, gain: 0.5 } },
  sources: { car: { motion: { type: 'line', from: [-80, 0, -10], velocity: [40, 0, 0] } } },
  listener: { motion: { type: 'line', from: [0, 0, 0], velocity: [-6, 0, 0] } },
  voices: [{ sound: 'hum', source: 'car', group: 'vehicles', loop: true, gain: 4 }],
});
// A non-positional hum in the 'ambience' group (monotone pitch curve) through a slow-motion ramp and back. The ramps
// are gentle (≤ about 1000 cents/s): the engine evaluates the time scale once per 128-frame block and reaches it at the
// block's end, a lag of about 2.7 ms at 24 kHz that the checker rightly reports on steep ramps (see docs/checker.md).
const slowMotion = loadScene({
  version: 1,
  duration: 4,
  sampleRate: 24000,
  sounds: { hum: { type: 'hum', frequency: 300, partials: [1, 0.4], seconds: 2, gain: 0.5 } },
  timeScale: [
    { time: 0.4, target: 0.5, rampSeconds: 1.6, easing: 'smooth' },
    { time: 2.4, target: 1, rampSeconds: 1.3, easing: 'linear' },
  ],
  voices: [{ sound: 'hum', group: 'ambience', loop: true, gain: 1 }],
});

const air = { ...defaultTuning.air, temperatureCelsius: 20, speedOfSound: 343.3 };
/** The tuning the checker expects: the default one with the fly-by's speed of sound; propagation once the engine has it. */
const expectedTuning: Tuning = ENGINE_HAS_PROPAGATION ? { ...defaultTuning, air } : withDopplerModel({ ...defaultTuning, air }, 'vehicles', 'instant');
/** The tuning the unmodified engine renders with (see engine-switch.ts). */
const shippedEngine: Tuning = engineTuning({ ...defaultTuning, air });

const scale = (v: Vec, k: number): Vec => ({ x: v.x * k, y: v.y * k, z: v.z * k });
const along = (p: Vec, v: Vec, dt: number): Vec => ({ x: p.x + v.x * dt, y: p.y + v.y * dt, z: p.z + v.z * dt });

/** Source term doubled: the source's velocity (and, for propagation, its travel about closest approach) twice as large. */
const sourceDoubled = rewritingRenderer((s) => ({
  ...s,
  sources: s.sources.map((src) => {
    const v = src.velocity!;
    return { ...src, velocity: scale(v, 2), position: ENGINE_HAS_PROPAGATION ? along(src.position, v, s.time - T_CA) : src.position };
  }),
}));

/** Listener sign flipped: the listener's velocity (and, for propagation, its travel about closest approach) reversed. */
const listenerFlipped = rewritingRenderer((s) => {
  const v = s.listener.velocity!;
  return { ...s, listener: { ...s.listener, velocity: scale(v, -1), position: ENGINE_HAS_PROPAGATION ? along(s.listener.position, v, -2 * (s.time - T_CA)) : s.listener.position } };
});

/** A 50 ms smoothing lag: every position and velocity the engine sees goes through a one-pole low-pass, τ = 50 ms. */
function laggingRenderer(tau: number): SceneRenderer {
  const state = new WeakMap<Engine, { t: number; values: number[] }>();
  return rewritingRenderer((s, engine) => {
    const flat = [s.listener.position, s.listener.velocity!, ...s.sources.flatMap((x) => [x.position, x.velocity!])].flatMap((v) => [v.x, v.y, v.z]);
    const prev = state.get(engine);
    const values = prev ? flat.map((x, i) => prev.values[i] + (x - prev.values[i]) * (1 - Math.exp(-(s.time - prev.t) / tau))) : flat;
    state.set(engine, { t: s.time, values });
    const vec = (i: number): Vec => ({ x: values[3 * i], y: values[3 * i + 1], z: values[3 * i + 2] });
    return { ...s, listener: { ...s.listener, position: vec(0), velocity: vec(1) }, sources: s.sources.map((x, k) => ({ ...x, position: vec(2 + 2 * k), velocity: vec(3 + 2 * k) })) };
  });
}

function curveOff(t: Tuning, group: string, cents: number): Tuning {
  const g = t.groups[group];
  const k = 2 ** (cents / 1200);
  return { ...t, groups: { ...t.groups, [group]: { ...g, pitch: { ...g.pitch, keys: g.pitch.keys.map((key) => ({ x: key.x, y: key.y * k })) } } } };
}

// An 80 m/s pass at 5 m: the heard pitch sweeps about 6400 cents/s at closest approach (4.5 s).
const fastPass = loadScene({
  version: 1,
  duration: 6,
  sampleRate: 24000,
  sounds: { hum: { type: 'hum', frequency: 330, partials: [1, 0.5, 0.3], seconds: 2, gain: 0.5 } },
  sources: { car: { motion: { type: 'line', from: [-360, 0, -5], velocity: [80, 0, 0] } } },
  voices: [{ sound: 'hum', source: 'car', group: 'vehicles', loop: true, gain: 4, start: 3 }],
});

describe('check passes the engine as shipped', () => {
  it.each([
    ['an 80 m/s pass at 5 m', fastPass],
    ['a fly-by with a walking listener', flyBy],
    ['a slow-motion ramp on a monotone pitch curve', slowMotion],
  ])('passes %s, judging every voiced frame', (_name, scene) => {
    const r = checkScene({ ...scene, tuning: expectedTuning }, { renderTuning: shippedEngine });
    const [s] = r.sources;
    expect(s.failures).toEqual([]);
    expect(r.passed).toBe(true);
    expect(s.figures.judgedShare).toBe(1);
    if (s.closestApproach !== null) expect(s.figures.closestApproachShare).toBe(1);
  });
});

describe('check fails engine variants, naming the source and the time', () => {
  const propagationRemoved: [string, () => ReturnType<typeof checkScene>] = [
    'propagation removed (instant formula heard, propagation expected)',
    () => checkScene({ ...flyBy, tuning: withDopplerModel(expectedTuning, 'vehicles', 'propagation') }, { renderTuning: withDopplerModel(shippedEngine, 'vehicles', 'instant') }),
  ];
  it.each<[string, () => ReturnType<typeof checkScene>]>([
    ['Doppler source term doubled', () => checkScene({ ...flyBy, tuning: expectedTuning }, { renderTuning: shippedEngine, render: sourceDoubled })],
    ['listener sign flipped', () => checkScene({ ...flyBy, tuning: expectedTuning }, { renderTuning: shippedEngine, render: listenerFlipped })],
    ['a 50 ms smoothing lag', () => checkScene({ ...flyBy, tuning: expectedTuning }, { renderTuning: shippedEngine, render: laggingRenderer(0.05) })],
    propagationRemoved,
    ['a time-scale pitch curve 10 cents off', () => checkScene({ ...slowMotion, tuning: expectedTuning }, { renderTuning: curveOff(shippedEngine, 'ambience', 10) })],
  ])('fails %s', (_name, run) => {
    const r = run();
    expect(r.passed).toBe(false);
    const [s] = r.sources;
    expect(s.passed).toBe(false);
    expect(s.failures.join('\n')).toMatch(/^voice 0 \(hum( on car)?\): .*\d+\.\d\d s/m);
  });
});
