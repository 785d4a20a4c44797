import { describe, expect, it } from 'vitest';
import { checkScene } from '../../../runtime/check';
import { loadScene } from '../../../runtime/offline/render-scene';
import { defaultTuning, serializeTuning } from '../../../src/tuning';
import { engineTuning, withDopplerModel } from './engine-switch';

/** The built-in groups with motion 'instant' (the model the checker's expectation follows). */
const instantGroups = Object.fromEntries(Object.entries(defaultTuning.groups).map(([k, g]) => [k, { ...g, motion: 'instant' }]));

const cents = (a: number, b: number) => 1200 * Math.log2(a / b);

// A straight-line pass: a 440 Hz tone on a source running along x at v m/s, d m from a listener at rest at the origin,
// closest at t0, speed of sound c. Heard frequency f0·c/(c − v·cosθ), θ between the source velocity and the line to the
// listener: the moving-source formula f_o = f_s·c/(c − v_s) of OpenStax University Physics Vol. 1 §17.7
// (docs/references.md §1a, VERIFIED) with v_s = v·cosθ; Doppler factor DF scales v as in OpenAL 1.1 §3.5.2 (§1c).
const passes = [
  { v: 30, d: 8, c: 343 },
  { v: 50, d: 15, c: 331.3 },
];
const f0 = 440;
const t0 = 3;

function passScript(p: { v: number; d: number; c: number }) {
  return {
    duration: 6,
    sampleRate: 24000,
    // The same-instant model and no smoothing until the engine has propagation (engine-switch.ts).
    tuning: JSON.parse(serializeTuning({ ...engineTuning(defaultTuning), air: { ...defaultTuning.air, temperatureCelsius: 20, speedOfSound: p.c } })),
    sounds: { tone: { type: 'tone', frequency: f0, seconds: 1 } },
    sources: { car: { motion: { type: 'line', from: [-p.v * t0, 0, -p.d], velocity: [p.v, 0, 0] } } },
    voices: [{ sound: 'tone', source: 'car', group: 'vehicles', loop: true, gain: 4 }],
  };
}

/**
 * These checks compare with the same-instant closed form, so the scene asks every group for the instant model, with
 * no Doppler or ratio smoothing (the checker never expects smoothing; a smoothed render would fail, rightly).
 */
function instant(scene: ReturnType<typeof loadScene>): ReturnType<typeof loadScene> {
  let tuning = scene.tuning;
  for (const g of Object.keys(tuning.groups)) tuning = withDopplerModel(tuning, g, 'instant');
  tuning = { ...tuning, doppler: { ...tuning.doppler, smoothingSeconds: 0 }, smoothing: { ...tuning.smoothing, ratioSeconds: 0 } };
  return { ...scene, tuning };
}

function closedForm(p: { v: number; d: number; c: number }, factor: number) {
  return (t: number) => {
    const x = p.v * (t - t0);
    const cosTheta = -x / Math.hypot(x, p.d);
    return (f0 * p.c) / (p.c - factor * p.v * cosTheta);
  };
}

describe('checkScene on a rendered straight-line pass', () => {
  it.each(passes)('measures the closed-form pass curve within 5 cents and passes (v $v m/s, d $d m, c $c m/s)', (p) => {
    const result = checkScene(instant(loadScene(passScript(p))));
    expect(result.passed).toBe(true);
    const [s] = result.sources;
    const heard = closedForm(p, 1);
    let compared = 0;
    for (let i = 0; i < s.times.length; i++) {
      const t = s.times[i];
      // Away from the closest approach (where the 30 ms tracker window averages the steepest part of the raw
      // track; the check's own verdict judges it through its synthetic reference) and the edges.
      if (Math.abs(t - t0) < 0.25 || t < 0.1 || t > 5.9) continue;
      // 5 cents: the default tolerance, about the smallest audible shift (docs/references.md §10, VERIFIED).
      expect(Math.abs(cents(s.heardHz[i], heard(t)))).toBeLessThan(5);
      compared++;
    }
    expect(compared).toBeGreaterThan(400);
    // The heard pitch spans the pass: above f0 on approach, below it after (asymmetric, not linearised).
    expect(cents(heard(0.5), f0)).toBeGreaterThan(100);
    expect(cents(heard(5.5), f0)).toBeLessThan(-100);
  });

  it('fails a pass rendered with Doppler factor 2 against the expectation of factor 1, and passes it with 1', () => {
    const loaded = instant(loadScene(passScript(passes[0])));
    const doubled = { ...loaded.tuning, doppler: { ...loaded.tuning.doppler, factor: 2 } };
    const bad = checkScene(loaded, { renderTuning: doubled });
    expect(bad.passed).toBe(false);
    expect(bad.sources[0].figures.medianCents).toBeGreaterThan(50);
    expect(bad.sources[0].failures.join()).toMatch(/voice 0 \(tone on car\): .* \d+\.\d\d s/);
    // The render really followed factor 2: its steady approach matches the factor-2 closed form.
    const s = bad.sources[0];
    const i = Array.from(s.times).findIndex((t) => t >= 1);
    expect(Math.abs(cents(s.heardHz[i], closedForm(passes[0], 2)(s.times[i])))).toBeLessThan(5);
    expect(checkScene(loaded, { renderTuning: loaded.tuning }).passed).toBe(true);
  });

  it('reports no tonal voices and does not pass when the scene plays only noise', () => {
    const result = checkScene(loadScene({ duration: 1, sampleRate: 16000, sounds: { n: { type: 'noise' } }, voices: [{ sound: 'n' }] }));
    expect(result.sources).toEqual([]);
    expect(result.skipped).toBe(1);
    expect(result.passed).toBe(false);
  });

  it('fails a tonal voice whose sound never reaches the listener, saying nothing could be judged', () => {
    const tuning = JSON.parse(serializeTuning(defaultTuning));
    tuning.groups = instantGroups;
    tuning.distance = { ...tuning.distance, model: 'linear', maxDistance: 50 };
    const result = checkScene(
      instant(loadScene({
        duration: 1,
        sampleRate: 16000,
        tuning,
        sounds: { tone: { type: 'tone', frequency: 300 } },
        sources: { far: { motion: { type: 'fixed', position: [0, 0, -500] } } },
        voices: [{ sound: 'tone', source: 'far', loop: true }],
      })),
    );
    expect(result.passed).toBe(false);
    expect(result.sources[0].failures.join()).toMatch(/no frame could be judged/);
    expect(result.sources[0].unjudged.map((u) => u.reason)).toEqual(['level']);
  });
});
