import { describe, expect, it } from 'vitest';
import { CheckCurve, EmissionSolver, ExpectedVoice, TimeScaleTrack, CheckPath, dopplerModelOf } from '../../../runtime/check';
import { parseSceneScript, type SceneScript } from '../../../runtime/offline';
import { defaultTuning, type Tuning } from '../../../src/tuning';
import { ENGINE_HAS_PROPAGATION, withDopplerModel } from './engine-switch';

const cents = (a: number, b: number) => 1200 * Math.log2(a / b);

function script(source: unknown, listener: unknown = { type: 'fixed', position: [0, 0, 0] }, extra: Record<string, unknown> = {}): SceneScript {
  return parseSceneScript({
    version: 1,
    duration: 10,
    sounds: { t: { type: 'tone', frequency: 100 } },
    sources: { s: { motion: source } },
    listener: { motion: listener },
    voices: [{ sound: 't', source: 's', group: 'vehicles', loop: true }],
    ...extra,
  });
}

function tuning(c: number, model: 'propagation' | 'instant', factor = 1): Tuning {
  return withDopplerModel({ ...defaultTuning, air: { ...defaultTuning.air, temperatureCelsius: 20, speedOfSound: c }, doppler: { ...defaultTuning.doppler, factor } }, 'vehicles', model);
}

const ratioAt = (sc: SceneScript, t: Tuning, time: number) => new ExpectedVoice(sc, sc.voices[0], t, 100).at(time).hz / 100;

describe('same-instant expectation (OpenAL 1.1 §3.5.2)', () => {
  // COMPUTED cases of docs/references.md §1c (tolerance 1e-9 relative).
  it.each([
    ['approaching', [0, 0, 30], [0, 0, 0], 1, 1.0957548675],
    ['receding', [0, 0, -30], [0, 0, 0], 1, 0.9196356818],
    ['perpendicular', [30, 0, 0], [0, 0, 0], 1, 1],
    ['approaching, factor 2', [0, 0, 30], [0, 0, 0], 2, 1.2117896223],
    ['listener toward the source', [0, 0, 0], [0, 0, -10], 1, 1.0291290417],
  ] as const)('gives the published-formula ratio: source %s', (_n, sv, lv, factor, expected) => {
    const sc = script({ type: 'line', from: [0, 0, -100], velocity: sv }, { type: 'line', from: [0, 0, 0], velocity: lv });
    expect(ratioAt(sc, tuning(343.3, 'instant', factor), 0)).toBeCloseTo(expected, 9);
  });

  it('matches the textbook train horn, 150 Hz at 35 m/s, c = 340 m/s: 167.2131 Hz approaching (docs/references.md §1a)', () => {
    const sc = script({ type: 'line', from: [0, 0, -1000], velocity: [0, 0, 35] });
    expect(150 * ratioAt(sc, tuning(340, 'instant'), 0)).toBeCloseTo(167.2131, 4);
  });
});

describe('emission-time expectation (docs/references.md §11)', () => {
  it('gives c/(c − v) for a source coming straight at a listener at rest: the train horn again, 167.2131 Hz (§1a)', () => {
    const sc = script({ type: 'line', from: [0, 0, -1000], velocity: [0, 0, 35] });
    expect(150 * ratioAt(sc, tuning(340, 'propagation'), 5)).toBeCloseTo(167.2131, 4);
  });

  it('solves c·(t − τ) = |L − S(τ)| and its ratio equals a finite difference of τ(t)', () => {
    const path = new CheckPath({ type: 'line', from: [-120, 3, -7], velocity: [45, 0, 2], time: 0 });
    const clock = new TimeScaleTrack([], 10);
    const solver = new EmissionSolver(path, 343, clock);
    const L = { x: 0, y: 0, z: 0 };
    const still = { x: 0, y: 0, z: 0 };
    const S = { x: 0, y: 0, z: 0 };
    const v = { x: 0, y: 0, z: 0 };
    for (const t of [0.5, 2.4, 2.7, 3, 6]) {
      const e = solver.emissionAt(t, L, still);
      expect(e.method).toBe('closed-form');
      path.at(e.tau, S, v);
      expect(343 * (t - e.tau)).toBeCloseTo(Math.hypot(S.x, S.y, S.z), 7);
      const h = 1e-5;
      const slope = (solver.emissionAt(t + h, L, still).tau - solver.emissionAt(t - h, L, still).tau) / (2 * h);
      expect(e.ratio).toBeCloseTo(slope, 6);
    }
  });

  it('finds the same emission time by root search on a curved path as in closed form on the straight one it traces', () => {
    // Collinear keys at equal spacing: the Catmull–Rom cubic traces the straight line exactly (tangents equal the speed).
    const keys = Array.from({ length: 11 }, (_, k) => ({ time: k, position: [-200 + 40 * k, 0, -10] }));
    const curved = script({ type: 'keyframes', interpolation: 'cubic', keys });
    const straight = script({ type: 'line', from: [-200, 0, -10], velocity: [40, 0, 0] });
    for (const t of [1.5, 4.9, 5.03, 5.2, 8]) expect(ratioAt(curved, tuning(343.3, 'propagation'), t)).toBeCloseTo(ratioAt(straight, tuning(343.3, 'propagation'), t), 8);
  });

  it.each([
    [10, 1.5],
    [30, 13],
    [80, 97],
  ])('differs from the same-instant formula by about the figures of §11 on a fly-by at %s m/s, 5 m (%s cents)', (v, published) => {
    // docs/references.md §11 (from memory, measured there with an outside tracker): largest difference over the pass.
    const sc = script({ type: 'line', from: [-5 * v, 0, -5], velocity: [v, 0, 0] });
    const prop = new ExpectedVoice(sc, sc.voices[0], tuning(343, 'propagation'), 100);
    const inst = new ExpectedVoice(sc, sc.voices[0], tuning(343, 'instant'), 100);
    let worst = 0;
    for (let t = 3; t < 7; t += 0.0005) worst = Math.max(worst, Math.abs(cents(prop.at(t).hz, inst.at(t).hz)));
    expect(worst).toBeGreaterThan(published * 0.8);
    expect(worst).toBeLessThan(published * 1.25);
  });

  it('is silent before the first sound arrives and for a supersonic source inside no single emission', () => {
    const sc = script({ type: 'fixed', position: [0, 0, -343] });
    const e = new ExpectedVoice(sc, sc.voices[0], tuning(343, 'propagation'), 100);
    expect(e.at(0.99).silentWhy).toBe('not-started');
    expect(e.at(1.01).hz).toBeCloseTo(100, 9);
  });
});

describe('tuning reading', () => {
  it('reads the Doppler model per group: the motion switch, or instant for tunings from before it', () => {
    // The default tuning: propagation once the engine has it (its tuning fills the switch), instant before.
    expect(dopplerModelOf(defaultTuning, 'vehicles')).toBe(ENGINE_HAS_PROPAGATION ? 'propagation' : 'instant');
    expect(dopplerModelOf(defaultTuning, 'interface')).toBe('off');
    expect(dopplerModelOf(withDopplerModel(defaultTuning, 'vehicles', 'propagation'), 'vehicles')).toBe('propagation');
    expect(dopplerModelOf({ ...defaultTuning, doppler: { ...defaultTuning.doppler, factor: 0 } }, 'vehicles')).toBe('off');
  });

  it('evaluates linear and monotone curves by the published rule (docs/references.md §8)', () => {
    const lin = new CheckCurve({ interpolation: 'monotone', keys: [{ x: 0, y: 1 }, { x: 1, y: 3 }, { x: 2, y: 5 }] });
    expect(lin.valueAt(0.5)).toBeCloseTo(2, 12);
    expect(lin.valueAt(1.7)).toBeCloseTo(4.4, 12);
    // Akima's data: a Fritsch–Carlson curve stays within each interval's key values and never falls.
    const akima = [[0, 10], [2, 10], [3, 10], [5, 10], [6, 10], [8, 10], [9, 10.5], [11, 15], [12, 50], [14, 60], [15, 85]];
    const c = new CheckCurve({ interpolation: 'monotone', keys: akima.map(([x, y]) => ({ x, y })) });
    let prev = -Infinity;
    for (let x = 0; x <= 15; x += 0.01) {
      const y = c.valueAt(x);
      const k = Math.min(akima.length - 2, akima.findIndex((p, i) => i + 1 < akima.length && x >= p[0] && x <= akima[i + 1][0]));
      expect(y).toBeGreaterThanOrEqual(akima[k][1] - 1e-9);
      expect(y).toBeLessThanOrEqual(akima[k + 1][1] + 1e-9);
      expect(y).toBeGreaterThanOrEqual(prev - 1e-9);
      prev = y;
    }
  });

  it('ramps the time scale by the declared easings and integrates the game clock', () => {
    const track = new TimeScaleTrack(
      [
        { time: 1, target: 0.5, rampSeconds: 2, easing: 'smooth' },
        { time: 4, target: 2, rampSeconds: 2, easing: 'exponential' },
      ],
      8,
    );
    expect(track.valueAt(2)).toBeCloseTo(0.75, 12); // smoothstep at u = 0.5 is the midpoint (common practice)
    expect(track.valueAt(5)).toBeCloseTo(1, 12); // equal ratio per second: geometric mean of 0.5 and 2
    // ∫ over the smooth ramp = its mean (0.75) × 2 s by symmetry; then 1 s at 0.5: G(4) = 1 + 1.5 + 0.5.
    expect(track.gameTime(4)).toBeCloseTo(3, 5);
  });
});
