// The checker's expectation where the engine's propagation model meets the time scale and the voice's own end: no
// same-instant shift clamp in propagation, the pitch curve at the listener, and a voice that does not loop ending.
import { describe, expect, it } from 'vitest';
import { ExpectedVoice } from '../../../runtime/check';
import { parseSceneScript, type SceneScript } from '../../../runtime/offline';
import { defaultTuning, type Tuning } from '../../../src/tuning';
import { withDopplerModel } from './engine-switch';

function script(extra: Record<string, unknown>, voice: Record<string, unknown>): SceneScript {
  return parseSceneScript({
    version: 1,
    duration: 6,
    sounds: { t: { type: 'tone', frequency: 100, seconds: 0.6 } },
    sources: { s: { motion: { type: 'fixed', position: [0, 0, -34.3] } } },
    listener: { motion: { type: 'fixed', position: [0, 0, 0] } },
    voices: [{ sound: 't', source: 's', group: 'vehicles', loop: true, ...voice }],
    ...extra,
  });
}

/** Propagation at c = 343 m/s in 'vehicles', with that group's pitch curve replaced by `pitch` (x: time scale). */
function tuning(pitch: { x: number; y: number }[], maxShiftCents = 1200): Tuning {
  const t = withDopplerModel({ ...defaultTuning, air: { ...defaultTuning.air, speedOfSound: 343 }, doppler: { ...defaultTuning.doppler, maxShiftCents } }, 'vehicles', 'propagation');
  return { ...t, groups: { ...t.groups, vehicles: { ...t.groups.vehicles, policy: 'follow-time', pitch: { interpolation: 'linear', keys: pitch } } } };
}

const IDENTITY = [
  { x: 0, y: 0 },
  { x: 4, y: 4 },
];
// A designer's curve that slows the pitch less than time: p(s) = 0.2 + 0.8·s on 0…1.
const GENTLE = [
  { x: 0, y: 0.2 },
  { x: 1, y: 1 },
];
// Time scale 1 until 2 s, then a linear ramp to 0.5 over 1 s.
const RAMP = { timeScale: [{ time: 2, target: 0.5, rampSeconds: 1, easing: 'linear' }] };

describe('checker expectation, propagation model', () => {
  it('applies no maxShiftCents clamp: a source at 150 m/s straight at the listener is heard at c/(c − v) = 1.7778', () => {
    // Closed form for a source coming straight at a listener at rest, docs/references.md §1a and §11.
    const moving = parseSceneScript({
      version: 1,
      duration: 6,
      sounds: { t: { type: 'tone', frequency: 100 } },
      sources: { s: { motion: { type: 'line', from: [0, 0, -1000], velocity: [0, 0, 150] } } },
      listener: { motion: { type: 'fixed', position: [0, 0, 0] } },
      voices: [{ sound: 't', source: 's', group: 'vehicles', loop: true }],
    });
    const e = new ExpectedVoice(moving, moving.voices[0], tuning(IDENTITY, 100), 100);
    expect(e.at(5).hz / 100).toBeCloseTo(343 / (343 - 150), 6);
  });

  it('hears a still source through a time-scale ramp at the curve of the listener time scale: 100·p(s(t))', () => {
    // Source and listener at rest 34.3 m apart: the game-time delay is a constant 0.1 s, so dG(τ)/dG(t) = 1 and the
    // heard ratio is the pitch curve at the listener's time scale (docs/physics.md "Decision"), s(t) = 1 − 0.5·(t − 2).
    const sc = script(RAMP, {});
    for (const [t, s] of [
      [1.9, 1],
      [2.5, 0.75],
      [2.9, 0.55],
      [3.5, 0.5],
    ]) {
      expect(new ExpectedVoice(sc, sc.voices[0], tuning(GENTLE), 100).at(t).hz).toBeCloseTo(100 * (0.2 + 0.8 * s), 3);
      expect(new ExpectedVoice(sc, sc.voices[0], tuning(IDENTITY), 100).at(t).hz).toBeCloseTo(100 * s, 3);
    }
  });

  it('equals the emission-time physics for the identity curve: 100·s(τ)·dτ/dt from a finite difference of τ(t)', () => {
    // Still source and listener: G(τ) = G(t) − d/c; emitted content runs on the game clock, so the heard frequency is
    // 100·dG(τ)/dt = 100·s(t) (common practice: a clock change in flight compresses the wave train as time does).
    const sc = script(RAMP, {});
    const e = new ExpectedVoice(sc, sc.voices[0], tuning(IDENTITY), 100);
    expect(e.at(2.25).hz).toBeCloseTo(100 * (1 - 0.5 * 0.25), 3);
  });
});

describe('checker expectation, a voice that does not loop', () => {
  it('ends when its 0.6 s sound has been read: at start + 0.6 s at ratio 1, start + 1.2 s at time scale 0.5', () => {
    const still = script({}, { loop: false, start: 1 });
    const e = new ExpectedVoice(still, still.voices[0], tuning(IDENTITY), 100, 0.6);
    const arrive = 1 + 34.3 / 343;
    expect(e.at(arrive + 0.59).hz).toBeCloseTo(100, 6);
    expect(e.at(arrive + 0.61).silentWhy).toBe('ended');
    const slow = script({ timeScale: [{ time: 0, target: 0.5, rampSeconds: 0, easing: 'linear' }] }, { loop: false, start: 1 });
    const f = new ExpectedVoice(slow, slow.voices[0], tuning(IDENTITY), 100, 0.6);
    const arriveSlow = 1 + 34.3 / 343 / 0.5;
    expect(f.at(arriveSlow + 1.19).hz).toBeCloseTo(50, 6);
    expect(f.at(arriveSlow + 1.21).silentWhy).toBe('ended');
  });

  it('never ends a looping voice, nor one whose sound length is unknown', () => {
    const looped = script({}, { loop: true, start: 1 });
    expect(new ExpectedVoice(looped, looped.voices[0], tuning(IDENTITY), 100, 0.6).at(5).hz).toBeCloseTo(100, 6);
    const once = script({}, { loop: false, start: 1 });
    expect(new ExpectedVoice(once, once.voices[0], tuning(IDENTITY), 100).at(5).hz).toBeCloseTo(100, 6);
  });
});
