import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { TargetMapper, createVoiceTargets, MIN_TARGET_RATIO, MAX_TARGET_RATIO, type VoiceInput } from '../../src/dilation';
import { createDopplerStats, dopplerRatio, speedOfSound } from '../../src/motion';
import { defaultTuning, parseTuning, OPEN_CUTOFF_HZ, type Tuning } from '../../src/tuning';

const v = (x = 0, y = 0, z = 0) => ({ x, y, z });
const listener = () => ({ position: v(), forward: v(0, 0, -1), up: v(0, 1, 0), velocity: v() });

function input(over: Partial<VoiceInput> = {}): VoiceInput {
  return { timeScale: 1, group: 'effects', baseRatio: 1, gain: 1, listener: listener(), source: null, ...over };
}

/** The mapper's Doppler ratio is the 'instant' motion model (OpenAL 1.1 §3.5.2); 'propagation' lives in the engine. */
function tuningWith(patch: (doc: Record<string, any>) => void): Tuning {
  const doc = JSON.parse(JSON.stringify(defaultTuning));
  for (const g of Object.values(doc.groups) as Record<string, unknown>[]) g.motion = 'instant';
  patch(doc);
  return parseTuning(doc);
}

const instantTuning = tuningWith(() => {});

const db = (x: number) => Math.pow(10, x / 20);

describe('TargetMapper: time scale and group policies', () => {
  const m = new TargetMapper({ tuning: instantTuning });

  it('is transparent at time scale 1 for a non-positional voice', () => {
    const out = m.map(createVoiceTargets(), input());
    expect(out).toMatchObject({ ratio: 1, cutoffHz: OPEN_CUTOFF_HZ, gain: 1, left: 1, right: 1, doppler: 1, frozen: false });
  });

  it('slows a follow-time group by its pitch curve and applies its tone and level curves', () => {
    const out = m.map(createVoiceTargets(), input({ timeScale: 0.35 }));
    expect(out.ratio).toBeCloseTo(0.35, 12);
    expect(out.cutoffHz).toBeCloseTo(4500, 9);
    expect(out.gain).toBeCloseTo(db(-3), 12);
  });

  it('leaves an exempt group untouched by the time scale', () => {
    const out = m.map(createVoiceTargets(), input({ timeScale: 0.1, group: 'interface', gain: 0.5 }));
    expect(out).toMatchObject({ ratio: 1, cutoffHz: OPEN_CUTOFF_HZ, gain: 0.5, frozen: false });
  });

  it('keeps the speed of a tone-only group while its tone and level follow the time scale', () => {
    const out = m.map(createVoiceTargets(), input({ timeScale: 0.35, group: 'music' }));
    expect(out.ratio).toBe(1);
    expect(out.cutoffHz).toBeCloseTo(8000, 9);
    expect(out.gain).toBeCloseTo(db(-1.5), 12);
  });

  it('multiplies base ratio, pitch(s) and Doppler', () => {
    const src = { id: 1, position: v(0, 0, -100), velocity: v(0, 0, 30) };
    const out = m.map(createVoiceTargets(), input({ timeScale: 0.5, baseRatio: 1.5, source: src }));
    const d = dopplerRatio(src, listener(), { speedOfSound: speedOfSound(20), stats: createDopplerStats() });
    expect(out.doppler).toBeCloseTo(d, 12);
    expect(out.ratio).toBeCloseTo(1.5 * 0.5 * d, 12);
    expect(out.radialSpeed).toBeCloseTo(30, 12);
    expect(out.distance).toBeCloseTo(100, 12);
  });

  it('freezes a follow-time voice at time scale 0 (ratio held at the floor, flagged frozen)', () => {
    const out = m.map(createVoiceTargets(), input({ timeScale: 0 }));
    expect(out.frozen).toBe(true);
    expect(out.ratio).toBe(MIN_TARGET_RATIO);
    const ui = m.map(createVoiceTargets(), input({ timeScale: 0, group: 'interface' }));
    expect(ui.frozen).toBe(false);
    expect(ui.ratio).toBe(1);
  });

  it('maps an unknown group as effects and counts it', () => {
    const mm = new TargetMapper({ tuning: instantTuning });
    const out = mm.map(createVoiceTargets(), input({ timeScale: 0.35, group: 'no-such-group' }));
    expect(out.ratio).toBeCloseTo(0.35, 12);
    expect(mm.unknownGroups).toBe(1);
    expect(mm.hasGroup('no-such-group')).toBe(false);
    expect(mm.hasGroup('music')).toBe(true);
  });
});

describe('TargetMapper: Doppler settings', () => {
  const approaching = () => ({ id: 1, position: v(0, 0, -100), velocity: v(0, 0, 30) });

  it('applies Doppler only to groups that have it on', () => {
    const m = new TargetMapper({ tuning: instantTuning });
    expect(m.map(createVoiceTargets(), input({ group: 'music', source: approaching() })).doppler).toBe(1);
    expect(m.map(createVoiceTargets(), input({ group: 'interface', source: approaching() })).ratio).toBe(1);
    expect(m.map(createVoiceTargets(), input({ group: 'vehicles', source: approaching() })).doppler).toBeGreaterThan(1.09);
  });

  it('measures velocities on the game clock when tuned so (wall ÷ time scale)', () => {
    const game = new TargetMapper({ tuning: tuningWith((d) => (d.doppler.velocityClock = 'game')) });
    const wall = new TargetMapper({ tuning: instantTuning });
    const s = 0.5;
    const g = game.map(createVoiceTargets(), input({ timeScale: s, source: approaching() })).doppler;
    const w = wall.map(createVoiceTargets(), input({ timeScale: s, source: approaching() })).doppler;
    const c = speedOfSound(20);
    // Classical Doppler for a source approaching a listener at rest, f'/f = c / (c − v_s) (OpenStax Univ. Phys. Vol. 1 §17.7,
    // docs/references.md §1, VERIFIED); on the game clock the 30 m/s wall-clock velocity reads 30 / 0.5 = 60 m/s.
    expect(w).toBeCloseTo(c / (c - 30), 12);
    expect(g).toBeCloseTo(c / (c - 60), 12);
  });

  it('clamps the Doppler shift to the tuning’s maximum in cents, each way', () => {
    const m = new TargetMapper({ tuning: tuningWith((d) => (d.doppler.maxShiftCents = 100)) });
    const up = m.map(createVoiceTargets(), input({ source: { id: 1, position: v(0, 0, -100), velocity: v(0, 0, 1000) } }));
    const down = m.map(createVoiceTargets(), input({ source: { id: 1, position: v(0, 0, -100), velocity: v(0, 0, -300) } }));
    // A shift of n cents is the ratio 2^(n/1200) (docs/references.md §9, VERIFIED).
    expect(up.doppler).toBeCloseTo(Math.pow(2, 100 / 1200), 12);
    expect(down.doppler).toBeCloseTo(Math.pow(2, -100 / 1200), 12);
  });

  it('scales the shift by the Doppler factor and disables it at factor 0', () => {
    const two = new TargetMapper({ tuning: tuningWith((d) => (d.doppler.factor = 2)) });
    const off = new TargetMapper({ tuning: tuningWith((d) => (d.doppler.factor = 0)) });
    const c = speedOfSound(20);
    // OpenAL 1.1 §3.5.2: f'/f = SS / (SS − DF·vss), so factor 2 doubles the effective source speed (docs/references.md §1c, VERIFIED (secondary)).
    expect(two.map(createVoiceTargets(), input({ source: approaching() })).doppler).toBeCloseTo(c / (c - 60), 12);
    expect(off.map(createVoiceTargets(), input({ source: approaching() })).doppler).toBe(1);
  });

  it('uses the tuning’s explicit speed of sound', () => {
    const m = new TargetMapper({ tuning: tuningWith((d) => (d.air.speedOfSound = 343.3)) });
    // OpenAL 1.1 §3.5.2 case of docs/references.md §1c (COMPUTED): 1.0957548675.
    expect(m.map(createVoiceTargets(), input({ source: approaching() })).doppler).toBeCloseTo(1.0957548675, 9);
  });
});

describe('TargetMapper: spatial gains', () => {
  const m = new TargetMapper({ tuning: instantTuning });
  it.each([
    // Web Audio inverse model (ref 1, rolloff 1) × equal-power pan; values COMPUTED from the spec formulas (docs/references.md §5).
    ['right at 10 m', v(10, 0, 0), 0, 0.1],
    ['left at 2 m', v(-2, 0, 0), 0.5, 0],
    ['ahead at 4 m', v(0, 0, -4), 0.25 * Math.SQRT1_2, 0.25 * Math.SQRT1_2],
    ['front-left at 1 m (inside refDistance)', v(-Math.SQRT1_2, 0, -Math.SQRT1_2), 0.92387953, 0.38268343],
  ])('pans a source %s', (_name, position, left, right) => {
    const out = m.map(createVoiceTargets(), input({ source: { id: 1, position, velocity: v() } }));
    expect(out.left).toBeCloseTo(left, 8);
    expect(out.right).toBeCloseTo(right, 8);
  });

  it('pans from the listener’s orientation (listener facing +x hears +z on its right)', () => {
    const l = { ...listener(), forward: v(1, 0, 0) };
    const out = m.map(createVoiceTargets(), input({ listener: l, source: { id: 1, position: v(0, 0, 1), velocity: v() } }));
    expect(out.left).toBeCloseTo(0, 12);
    expect(out.right).toBeCloseTo(1, 12);
  });

  it('uses the tuning’s distance model', () => {
    const lin = new TargetMapper({ tuning: tuningWith((d) => (d.distance = { model: 'linear', refDistance: 1, maxDistance: 10000, rolloffFactor: 1 })) });
    const out = lin.map(createVoiceTargets(), input({ source: { id: 1, position: v(0, 0, -5000.5), velocity: v() } }));
    // Web Audio linear model: linear(5000.5, 1, 10000, 1) = 0.5 (docs/references.md §5, COMPUTED).
    expect(out.left).toBeCloseTo(0.5 * Math.SQRT1_2, 12);
  });

  it('centres a listener inside the source at full distance gain with no Doppler', () => {
    const out = m.map(createVoiceTargets(), input({ source: { id: 1, position: v(), velocity: v(0, 0, 300) } }));
    expect(out.left).toBeCloseTo(Math.SQRT1_2, 12);
    expect(out.right).toBeCloseTo(Math.SQRT1_2, 12);
    expect(out.doppler).toBe(1);
  });
});

describe('TargetMapper: bad input is clamped and counted', () => {
  it.each([
    ['NaN time scale', input({ timeScale: Number.NaN }), { ratio: MIN_TARGET_RATIO, frozen: true }],
    ['negative time scale', input({ timeScale: -2 }), { ratio: MIN_TARGET_RATIO, frozen: true }],
    ['infinite time scale', input({ timeScale: Infinity }), { ratio: MAX_TARGET_RATIO }],
    ['NaN base ratio', input({ baseRatio: Number.NaN }), { ratio: 1 }],
    ['zero base ratio', input({ baseRatio: 0 }), { ratio: 1 }],
    ['base ratio above 4', input({ baseRatio: 10 }), { ratio: 4 }],
    ['NaN gain', input({ gain: Number.NaN }), { gain: 0 }],
    ['huge gain', input({ gain: 1e300 }), { gain: 16 }],
    ['NaN source position', input({ source: { id: 1, position: v(Number.NaN, 0, 0), velocity: v() } }), { left: 1, right: 1, doppler: 1 }],
    ['1e300 source position', input({ source: { id: 1, position: v(1e300, 0, 0), velocity: v() } }), { left: 1, right: 1, doppler: 1 }],
    ['infinite listener position', input({ listener: { ...listener(), position: v(0, -Infinity, 0) }, source: { id: 1, position: v(1, 0, 0), velocity: v() } }), { doppler: 1 }],
    ['NaN source velocity', input({ source: { id: 1, position: v(0, 0, -10), velocity: v(Number.NaN, 0, 0) } }), { doppler: 1 }],
    ['zero forward vector', input({ listener: { ...listener(), forward: v() }, source: { id: 1, position: v(3, 0, 0), velocity: v() } }), { left: 0 }],
    ['up parallel to forward', input({ listener: { ...listener(), up: v(0, 0, -1) }, source: { id: 1, position: v(3, 0, 0), velocity: v() } }), { left: 0 }],
  ] as [string, VoiceInput, Record<string, number | boolean>][])('handles a %s', (_name, inp, expected) => {
    const m = new TargetMapper({ tuning: instantTuning });
    const out = m.map(createVoiceTargets(), inp);
    for (const [k, val] of Object.entries(expected)) {
      if (typeof val === 'number') expect((out as unknown as Record<string, number>)[k]).toBeCloseTo(val, 9);
      else expect((out as unknown as Record<string, boolean>)[k]).toBe(val);
    }
    expect(m.clamps).toBeGreaterThanOrEqual(1);
  });

  it('caps a supersonic approach at the max shift and counts it in the Doppler stats', () => {
    const m = new TargetMapper({ tuning: instantTuning });
    const out = m.map(createVoiceTargets(), input({ source: { id: 1, position: v(0, 0, -10), velocity: v(0, 0, 5000) } }));
    expect(out.doppler).toBeCloseTo(2, 12);
    expect(m.dopplerStats.capped).toBe(1);
  });

  it('counts nothing for good input', () => {
    const m = new TargetMapper({ tuning: instantTuning });
    m.map(createVoiceTargets(), input({ timeScale: 0.35, source: { id: 1, position: v(3, 1, -4), velocity: v(5, 0, 1) } }));
    expect(m.clamps).toBe(0);
  });
});

describe('TargetMapper: property tests over arbitrary snapshots', () => {
  const wild = fc.oneof(
    fc.constantFrom(Number.NaN, Infinity, -Infinity, 1e300, -1e300, 0, -0, 1e-300, Number.MAX_VALUE, -Number.MAX_VALUE),
    fc.double({ min: -1e4, max: 1e4, noNaN: true }),
    fc.double(),
  );
  const vec = fc.record({ x: wild, y: wild, z: wild });
  const voice = fc.record({
    timeScale: wild,
    group: fc.constantFrom('effects', 'vehicles', 'ambience', 'interface', 'music', 'unknown', ''),
    baseRatio: wild,
    gain: wild,
    listener: fc.record({ position: vec, forward: vec, up: vec, velocity: vec }),
    source: fc.option(fc.record({ id: fc.integer(), position: vec, velocity: vec }), { nil: null }),
  });
  const tunings = [
    defaultTuning,
    tuningWith((d) => {
      d.doppler.velocityClock = 'game';
      d.doppler.factor = 10;
      d.doppler.maxShiftCents = 2400;
    }),
    tuningWith((d) => (d.distance = { model: 'exponential', refDistance: 0.01, maxDistance: 0.01, rolloffFactor: 100 })),
    tuningWith((d) => (d.distance = { model: 'linear', refDistance: 100000, maxDistance: 0.01, rolloffFactor: 100 })),
  ];

  it('never returns a non-finite target and keeps the ratio inside (0, 4] (seeded)', () => {
    const mappers = tunings.map((tuning) => new TargetMapper({ tuning }));
    const out = createVoiceTargets();
    fc.assert(
      fc.property(voice, fc.integer({ min: 0, max: tunings.length - 1 }), (inp, which) => {
        mappers[which].map(out, inp as VoiceInput);
        for (const k of ['ratio', 'cutoffHz', 'gain', 'left', 'right', 'doppler', 'radialSpeed', 'distance'] as const) {
          expect(Number.isFinite(out[k]), k).toBe(true);
        }
        expect(out.ratio).toBeGreaterThan(0);
        expect(out.ratio).toBeLessThanOrEqual(4);
        expect(out.cutoffHz).toBeGreaterThanOrEqual(20);
        expect(out.cutoffHz).toBeLessThanOrEqual(OPEN_CUTOFF_HZ);
        expect(out.gain).toBeGreaterThanOrEqual(0);
        for (const g of [out.left, out.right]) {
          expect(g).toBeGreaterThanOrEqual(0);
          expect(g).toBeLessThanOrEqual(1);
        }
        expect(out.doppler).toBeGreaterThan(0);
      }),
      { seed: 31337, numRuns: 5000 },
    );
  });

  it('maps into the caller’s object and returns it', () => {
    const m = new TargetMapper({ tuning: instantTuning });
    const out = createVoiceTargets();
    expect(m.map(out, input())).toBe(out);
  });
});
