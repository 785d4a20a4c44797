import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { createDopplerStats, dopplerRatio, DOPPLER_RATIO_CAP, type MovingPoint } from '../../src/motion';

const origin = { x: 0, y: 0, z: 0 };
const still = (x: number, y: number, z: number): MovingPoint => ({ position: { x, y, z }, velocity: { ...origin } });
const moving = (p: [number, number, number], v: [number, number, number]): MovingPoint => ({
  position: { x: p[0], y: p[1], z: p[2] },
  velocity: { x: v[0], y: v[1], z: v[2] },
});

describe('dopplerRatio: OpenStax train horn', () => {
  // OpenStax University Physics Vol. 1 §17.7, Example "Calculating a Doppler Shift": 150 Hz horn, c = 340 m/s,
  // train at 35.0 m/s (docs/references.md §1a, VERIFIED). Published 167 Hz / 136 Hz / 150 Hz, tolerance ±0.5 Hz;
  // exact values 167.2131 and 136.0000 at 1e-9 relative.
  const c = 340;
  it('raises the horn to 167 Hz while the train approaches', () => {
    const f = 150 * dopplerRatio(moving([-1000, 0, 0], [35, 0, 0]), still(0, 0, 0), { speedOfSound: c });
    expect(Math.abs(f - 167)).toBeLessThanOrEqual(0.5);
    expect(f / 167.21311475409837).toBeCloseTo(1, 9);
  });
  it('lowers the horn to 136 Hz while the train recedes', () => {
    const f = 150 * dopplerRatio(moving([1000, 0, 0], [35, 0, 0]), still(0, 0, 0), { speedOfSound: c });
    expect(Math.abs(f - 136)).toBeLessThanOrEqual(0.5);
    expect(f / 136).toBeCloseTo(1, 9);
  });
  it('leaves the horn at 150 Hz for the engineer riding the train (shifts cancel)', () => {
    const f = 150 * dopplerRatio(moving([-10, 0, 0], [35, 0, 0]), moving([0, 0, 0], [35, 0, 0]), { speedOfSound: c });
    expect(f).toBeCloseTo(150, 10);
  });
  it('shifts up by more when approaching than down when receding (not linearised)', () => {
    // Same example (OpenStax §17.7): the book states shifts of +17.0 Hz approaching and −14.0 Hz receding; ±0.5 Hz.
    const up = 150 * dopplerRatio(moving([-1000, 0, 0], [35, 0, 0]), still(0, 0, 0), { speedOfSound: c }) - 150;
    const down = 150 - 150 * dopplerRatio(moving([1000, 0, 0], [35, 0, 0]), still(0, 0, 0), { speedOfSound: c });
    expect(Math.abs(up - 17.0)).toBeLessThanOrEqual(0.5);
    expect(Math.abs(down - 14.0)).toBeLessThanOrEqual(0.5);
    expect(up).toBeGreaterThan(down + 2);
  });
});

describe('dopplerRatio: OpenAL 1.1 §3.5.2 vector cases', () => {
  // OpenAL 1.1 Specification §3.5.2 "Velocity Dependent Doppler Effect" (docs/references.md §1c, VERIFIED (secondary));
  // expected ratios COMPUTED from the spec's formula, tolerance 1e-9 relative.
  const cases: [string, MovingPoint, MovingPoint, number, number, number][] = [
    ['source approaching at 30 m/s', moving([0, 0, -100], [0, 0, 30]), still(0, 0, 0), 343.3, 1, 1.0957548675],
    ['source receding at 30 m/s', moving([0, 0, -100], [0, 0, -30]), still(0, 0, 0), 343.3, 1, 0.9196356818],
    ['source moving perpendicular', moving([0, 0, -100], [30, 0, 0]), still(0, 0, 0), 343.3, 1, 1],
    ['source approaching with Doppler factor 2', moving([0, 0, -100], [0, 0, 30]), still(0, 0, 0), 343.3, 2, 1.2117896223],
    ['listener approaching at 10 m/s', still(0, 0, -100), moving([0, 0, 0], [0, 0, -10]), 343.3, 1, 1.0291290417],
    ['listener receding faster than sound (clamped to SS)', still(0, 0, -100), moving([0, 0, 0], [0, 0, 400]), 343.3, 1, 0],
  ];
  it.each(cases)('matches the spec for a %s', (_name, source, listener, speedOfSound, dopplerFactor, expected) => {
    const r = dopplerRatio(source, listener, { speedOfSound, dopplerFactor, stats: createDopplerStats() });
    if (expected === 0) expect(r).toBe(0);
    else expect(r / expected).toBeCloseTo(1, 9);
  });
});

/** The OpenAL 1.1 §3.5.2 formula written out directly from the spec text (no guards), for the property test. */
function openAlFormula(s: MovingPoint, l: MovingPoint, ss: number, df: number): number {
  const slx = l.position.x - s.position.x;
  const sly = l.position.y - s.position.y;
  const slz = l.position.z - s.position.z;
  const mag = Math.hypot(slx, sly, slz);
  let vls = (l.velocity.x * slx + l.velocity.y * sly + l.velocity.z * slz) / mag;
  let vss = (s.velocity.x * slx + s.velocity.y * sly + s.velocity.z * slz) / mag;
  vls = Math.min(vls, ss / df);
  vss = Math.min(vss, ss / df);
  return (ss - df * vls) / (ss - df * vss);
}

describe('dopplerRatio: equivalence to the OpenAL formula', () => {
  const coord = fc.double({ min: -1000, max: 1000, noNaN: true });
  const vel = fc.double({ min: -150, max: 150, noNaN: true });
  const v3 = (a: fc.Arbitrary<number>) => fc.tuple(a, a, a);
  it('agrees with the spec formula for random vectors below the clamps (seeded)', () => {
    fc.assert(
      fc.property(v3(coord), v3(vel), v3(coord), v3(vel), fc.double({ min: 300, max: 360, noNaN: true }), fc.double({ min: 0.1, max: 2, noNaN: true }), (sp, sv, lp, lv, ss, df) => {
        const s = moving(sp, sv);
        const l = moving(lp, lv);
        fc.pre(Math.hypot(lp[0] - sp[0], lp[1] - sp[1], lp[2] - sp[2]) > 1e-3);
        const expected = openAlFormula(s, l, ss, df);
        fc.pre(expected <= DOPPLER_RATIO_CAP);
        const r = dopplerRatio(s, l, { speedOfSound: ss, dopplerFactor: df, stats: createDopplerStats() });
        expect(Math.abs(r - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, expected));
      }),
      { seed: 20240611, numRuns: 2000 },
    );
  });
});

describe('dopplerRatio: guards', () => {
  it('caps the ratio at 4 and counts it when the source approaches at or above the speed of sound', () => {
    const stats = createDopplerStats();
    for (const speed of [343.3, 400, 1e6, 1e300]) {
      expect(dopplerRatio(moving([0, 0, -100], [0, 0, speed]), still(0, 0, 0), { speedOfSound: 343.3, stats })).toBe(DOPPLER_RATIO_CAP);
    }
    expect(stats.capped).toBe(4);
    expect(stats.nonFinite).toBe(0);
  });
  it('caps a finite ratio above 4 (source just below the speed of sound)', () => {
    const stats = createDopplerStats();
    expect(dopplerRatio(moving([0, 0, -100], [0, 0, 300]), still(0, 0, 0), { speedOfSound: 343.3, stats })).toBe(4);
    expect(stats.capped).toBe(1);
  });
  it('gives 1 when source and listener both move at the clamp along the line (shifts cancel)', () => {
    const stats = createDopplerStats();
    expect(dopplerRatio(moving([0, 0, -100], [0, 0, 500]), moving([0, 0, 0], [0, 0, 500]), { speedOfSound: 343.3, stats })).toBe(1);
  });
  it('gives 1 at zero distance (listener inside the source)', () => {
    const stats = createDopplerStats();
    expect(dopplerRatio(moving([5, 5, 5], [0, 0, 300]), moving([5, 5, 5], [10, 0, 0]), { stats })).toBe(1);
    expect(stats.nonFinite).toBe(0);
  });
  it('gives 1 when the Doppler factor is 0', () => {
    expect(dopplerRatio(moving([0, 0, -100], [0, 0, 30]), still(0, 0, 0), { dopplerFactor: 0, stats: createDopplerStats() })).toBe(1);
  });
  it.each([
    ['NaN source position', moving([Number.NaN, 0, 0], [0, 0, 0]), still(0, 0, 0), {}],
    ['infinite listener position', still(0, 0, -10), moving([0, Infinity, 0], [0, 0, 0]), {}],
    ['NaN source velocity', moving([0, 0, -10], [0, Number.NaN, 0]), still(0, 0, 0), {}],
    ['−Infinity listener velocity', still(0, 0, -10), moving([0, 0, 0], [-Infinity, 0, 0]), {}],
    ['NaN speed of sound', moving([0, 0, -10], [0, 0, 30]), still(0, 0, 0), { speedOfSound: Number.NaN }],
    ['zero speed of sound', moving([0, 0, -10], [0, 0, 30]), still(0, 0, 0), { speedOfSound: 0 }],
    ['negative Doppler factor', moving([0, 0, -10], [0, 0, 30]), still(0, 0, 0), { dopplerFactor: -1 }],
  ] as const)('returns 1 and counts a %s', (_name, s, l, opts) => {
    const stats = createDopplerStats();
    expect(dopplerRatio(s, l, { ...opts, stats })).toBe(1);
    expect(stats.nonFinite).toBe(1);
  });
  it('handles 1e300 coordinates without overflow', () => {
    const stats = createDopplerStats();
    const r = dopplerRatio(moving([-1e300, 0, 0], [30, 0, 0]), still(1e300, 0, 0), { speedOfSound: 343.3, stats });
    expect(r).toBeCloseTo(343.3 / 313.3, 12);
    expect(stats.nonFinite).toBe(0);
  });
});
