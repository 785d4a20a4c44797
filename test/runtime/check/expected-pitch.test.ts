import { describe, expect, it } from 'vitest';
import { defaultTuning, type Tuning } from '../../../src/tuning';
import {
  expectedHeardFrequencies,
  ExpectedPitch,
  motionFromPositions,
  straightLine,
  type ExpectedPitchInput,
} from '../../../runtime/check/expected-pitch';

const still = straightLine({ x: 0, y: 0, z: 0 }, { x: 0, y: 0, z: 0 });
const steady = () => 1;
const cents = (measured: number, expected: number) => 1200 * Math.log2(measured / expected);

/** The default tuning with the given speed of sound, Doppler settings and smoothing times. */
function tuningWith(options: { c?: number; factor?: number; maxShiftCents?: number; dopplerSeconds?: number; ratioSeconds?: number; clock?: 'wall' | 'game' }): Tuning {
  return {
    ...defaultTuning,
    air: { ...defaultTuning.air, speedOfSound: options.c ?? 343 },
    doppler: {
      ...defaultTuning.doppler,
      factor: options.factor ?? 1,
      maxShiftCents: options.maxShiftCents ?? 2400,
      smoothingSeconds: options.dopplerSeconds ?? 0,
      velocityClock: options.clock ?? 'wall',
    },
    smoothing: { ...defaultTuning.smoothing, ratioSeconds: options.ratioSeconds ?? 0 },
  };
}

function input(partial: Partial<ExpectedPitchInput> & { tuning: Tuning }): ExpectedPitchInput {
  return { emittedHz: 440, group: 'effects', source: still, listener: still, timeScaleAt: steady, ...partial };
}

const times = (from: number, to: number, step: number) => Float64Array.from({ length: Math.round((to - from) / step) + 1 }, (_, i) => from + i * step);

describe('expected heard frequency', () => {
  it.each([
    // OpenStax University Physics Vol. 1 §17.7, "Calculating a Doppler Shift": 150 Hz horn, c = 340 m/s, 35 m/s
    // (docs/references.md §1a, VERIFIED): 167.2131 Hz approaching, 136.0000 Hz receding (exact values).
    { label: 'approaching', vx: 35, expected: 167.2131 },
    { label: 'receding', vx: -35, expected: 136.0 },
  ])('gives the textbook train horn $label at 35 m/s ($expected Hz)', ({ vx, expected }) => {
    const source = straightLine({ x: -1000, y: 0, z: 0 }, { x: vx, y: 0, z: 0 }); // listener at the origin
    const hz = expectedHeardFrequencies(input({ emittedHz: 150, tuning: tuningWith({ c: 340 }), source }), [0, 1, 2]);
    for (const f of hz) expect(f).toBeCloseTo(expected, 3);
  });

  it('follows the closed-form straight-line pass f0·c/(c − v·cosθ) when nothing is smoothed', () => {
    // Moving-source formula of OpenStax §17.7 with the line-of-sight component v·cosθ (docs/references.md §1a).
    const v = 30;
    const d = 5;
    const t0 = 2;
    const source = straightLine({ x: -v * t0, y: d, z: 0 }, { x: v, y: 0, z: 0 });
    const ts = times(0, 4, 0.01);
    const hz = expectedHeardFrequencies(input({ tuning: tuningWith({ c: 343 }), source }), ts);
    ts.forEach((t, i) => {
      const x = v * (t - t0);
      const closed = (440 * 343) / (343 + (v * x) / Math.hypot(x, d));
      expect(hz[i] / closed - 1).toBeCloseTo(0, 9);
    });
  });

  it('clamps the Doppler shift to the tuning maximum', () => {
    const source = straightLine({ x: -1000, y: 0, z: 0 }, { x: 100, y: 0, z: 0 }); // 100 m/s ≈ +549 cents unclamped
    const [hz] = expectedHeardFrequencies(input({ tuning: tuningWith({ maxShiftCents: 100 }), source }), [0]);
    expect(cents(hz, 440)).toBeCloseTo(100, 9);
  });

  it('scales the shift with the Doppler factor (OpenAL 1.1 §3.5.2: f′ = f·(SS − DF·vls)/(SS − DF·vss))', () => {
    // docs/references.md §1c, COMPUTED from the formula: source at (0,0,−100) approaching at 30 m/s, SS 343.3, DF 2 → 1.2117896223.
    const source = straightLine({ x: 0, y: 0, z: -100 }, { x: 0, y: 0, z: 30 });
    const [hz] = expectedHeardFrequencies(input({ emittedHz: 1, tuning: tuningWith({ c: 343.3, factor: 2 }), source }), [0]);
    expect(hz).toBeCloseTo(1.2117896223, 9);
  });

  it('measures velocities on the game clock when the tuning says so (wall velocity ÷ time scale)', () => {
    // A group exempt from the time scale but with Doppler, so that only the velocity clock differs.
    const base = tuningWith({});
    const probe = { ...base.groups.interface, doppler: true };
    const game: Tuning = { ...tuningWith({ clock: 'game' }), groups: { ...base.groups, probe } };
    const wall: Tuning = { ...base, groups: { ...base.groups, probe } };
    const at15 = straightLine({ x: 0, y: 0, z: -1000 }, { x: 0, y: 0, z: 15 });
    const at30 = straightLine({ x: 0, y: 0, z: -1000 }, { x: 0, y: 0, z: 30 });
    const [slow] = expectedHeardFrequencies(input({ emittedHz: 1, tuning: game, group: 'probe', source: at15, timeScaleAt: () => 0.5 }), [0]);
    const [fast] = expectedHeardFrequencies(input({ emittedHz: 1, tuning: wall, group: 'probe', source: at30 }), [0]);
    expect(fast).toBeCloseTo(343 / (343 - 30), 12);
    expect(slow).toBeCloseTo(fast, 12);
  });

  it('applies the group pitch curve at the time scale, glides by the ratio smoothing time, and leaves exempt groups alone', () => {
    // One-pole approach v(t) = V1 + (V0 − V1)·e^(−t/τ) in cents (Web Audio setTargetAtTime, docs/references.md §5).
    const tau = 0.05;
    const timeScaleAt = (t: number) => (t < 1 ? 1 : 0.5);
    const ts = times(0.5, 1.5, 0.01);
    const tuning = tuningWith({ ratioSeconds: tau });
    // A jump in the target is spread over one integration step (1e-5 s here): under 0.2 cent of error after it.
    const follow = expectedHeardFrequencies(input({ tuning, timeScaleAt, startTime: 0, stepSeconds: 1e-5 }), ts);
    const exempt = expectedHeardFrequencies(input({ tuning, timeScaleAt, group: 'interface', startTime: 0 }), ts);
    ts.forEach((t, i) => {
      const glide = t < 1 ? 0 : -1200 * (1 - Math.exp(-(t - 1) / tau)); // identity pitch curve: s = 0.5 → −1200 cents
      expect(Math.abs(cents(follow[i], 440) - glide)).toBeLessThan(0.2);
      expect(exempt[i]).toBeCloseTo(440, 9);
    });
  });

  it('smooths the Doppler part by its own time constant from a settled start', () => {
    const tau = 0.1;
    // Source still until t = 1, then approaching at 34.3 m/s: target ratio 343/(343 − 34.3) = 10/9.
    const source = (t: number, out: { position: { x: number; y: number; z: number }; velocity: { x: number; y: number; z: number } }) => {
      const moving = t >= 1;
      out.position.x = -1000 + (moving ? 34.3 * (t - 1) : 0);
      out.position.y = 0;
      out.position.z = 0;
      out.velocity.x = moving ? 34.3 : 0;
      out.velocity.y = 0;
      out.velocity.z = 0;
    };
    const ts = times(0.9, 1.5, 0.05);
    const hz = expectedHeardFrequencies(input({ tuning: tuningWith({ dopplerSeconds: tau }), source, startTime: 0, stepSeconds: 1e-5 }), ts);
    const full = 1200 * Math.log2(10 / 9);
    ts.forEach((t, i) => {
      // Motion along the line of sight: the target is exactly 10/9 from t = 1 on; the start is spread over one 1e-5 s step.
      const expected = t <= 1 ? 0 : full * (1 - Math.exp(-(t - 1) / tau));
      expect(Math.abs(cents(hz[i], 440) - expected)).toBeLessThan(0.05);
    });
  });

  it('expects no pitch while a follow-time voice is frozen at time scale 0', () => {
    const hz = expectedHeardFrequencies(input({ tuning: tuningWith({}), timeScaleAt: () => 0 }), [0, 0.5]);
    expect(hz[0]).toBeNaN();
    expect(hz[1]).toBeNaN();
  });

  it('gives no Doppler to a non-positional voice and NaN before the voice starts', () => {
    const hz = new ExpectedPitch(input({ tuning: tuningWith({}), source: null, startTime: 1 })).frequencies([0.5, 1, 2]);
    expect(hz[0]).toBeNaN();
    expect(hz[1]).toBe(440);
    expect(hz[2]).toBe(440);
  });

  it('derives velocity from positions by central difference', () => {
    const motion = motionFromPositions((t, out) => {
      out.x = 3 * t * t;
      out.y = -2 * t;
      out.z = 7;
    });
    const sample = { position: { x: 0, y: 0, z: 0 }, velocity: { x: 0, y: 0, z: 0 } };
    motion(2, sample);
    expect(sample.position).toEqual({ x: 12, y: -4, z: 7 });
    expect(sample.velocity.x).toBeCloseTo(12, 9);
    expect(sample.velocity.y).toBeCloseTo(-2, 9);
    expect(sample.velocity.z).toBe(0);
  });
});
